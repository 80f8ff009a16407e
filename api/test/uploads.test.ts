// Resumable uploads through the real server (tus-js-client 4 over HTTP): resuming after an
// abort and after the server process was killed, ten at once, and every refusal the issue lists.
// Protocol references: tus 1.0 core (HEAD/PATCH, Upload-Offset, 409 on a wrong offset),
// creation, expiration (410 once expired) and termination (DELETE → 204).
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { mkdtemp, readdir, rm, stat } from 'node:fs/promises';
import type { AddressInfo, Server } from 'node:net';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Episode, Footage, UploadRecord } from '@midgray/db';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { authHeaders, cookieOf, makeClip, sha256File, startTus, tusErrorOf, waitFor } from './upload-helpers.ts';
import { Upload } from '@tus/utils';
import { UploadRecords, UploadRefusal, type UploadLimits } from '../src/uploads/upload-store.ts';

const MiB = 1024 * 1024;
const REPO = resolve(import.meta.dirname, '..', '..');
const MAX_BYTES = 300 * MiB;

let ctx: TestContext;
let server: Server;
let base: string;
let storage: string;
let work: string;
let team: Record<'host' | 'editor' | 'producer' | 'admin', Client>;
let outsider: Client;
let episodeId: string;
let bigClip: string;
let bigSha: string;
const children: ChildProcess[] = [];

const uploadEnv = () => ({
  // Its own job queue: other test files keep their files elsewhere, so their workers must not take these jobs.
  JOBS_SCHEMA: 'uploads_api_test',
  STORAGE_DIR: storage,
  UPLOAD_MAX_BYTES: String(MAX_BYTES),
  UPLOAD_MAX_OPEN_BYTES_PER_USER: String(1024 * MiB),
  UPLOAD_MAX_OPEN_PER_USER: String(40),
  UPLOAD_EXPIRY_HOURS: '72',
});

const meta = (name: string, extra: Record<string, string> = {}) => ({ episodeId, kind: 'camera_original', filename: name, ...extra });
const encodeMeta = (m: Record<string, string>) => Object.entries(m).map(([k, v]) => `${k} ${Buffer.from(v).toString('base64')}`).join(',');
const idOf = (url: string) => url.split('/').pop()!;

/** A raw tus request with the client's session; the path goes out byte for byte (no URL normalising of "%2e%2e"). */
function tusRequest(client: Client | null, method: string, path: string, headers: Record<string, string> = {}, body?: Uint8Array) {
  return new Promise<{ status: number; headers: Headers; text: string }>((resolveP, reject) => {
    const req = httpRequest(`${base}/`, { method, path, headers: { 'Tus-Resumable': '1.0.0', ...(client ? authHeaders(client) : {}), ...headers, ...(body ? { 'Content-Length': String(body.length) } : {}) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const h = new Headers();
        for (const [k, v] of Object.entries(res.headers)) if (typeof v === 'string') h.set(k, v);
        resolveP({ status: res.statusCode!, headers: h, text: Buffer.concat(chunks).toString('utf8') });
      });
    });
    req.on('error', reject);
    req.end(body);
  });
}

async function footageOfUpload(id: string) {
  return Footage.findOne({ where: { uploadId: id } });
}

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'midgray-uploads-'));
  storage = join(work, 'storage');
  ctx = await startTestApp({ env: uploadEnv() });
  await ctx.built.startWorkers();
  server = ctx.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const made = await channelWithTeam(ctx);
  team = made.team;
  outsider = await newUser(ctx, 'Olu Outsider');
  episodeId = (await Episode.create({ channelId: made.channelId, title: 'Upload test episode', stage: 'shoot', position: 0 })).id;
  // About 200 MB of real video: 49 uncompressed 1080p 4:2:2 frames (2vuy) in a MOV file.
  bigClip = await makeClip(join(work, 'big.mov'), 'testsrc2=size=1920x1080:rate=25', { frames: 49, args: ['-c:v', 'rawvideo', '-pix_fmt', 'uyvy422'] });
  bigSha = await sha256File(bigClip);
}, 120_000);

afterAll(async () => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
  await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
  await ctx?.close();
  await rm(work, { recursive: true, force: true });
});

describe('resumable uploads', () => {
  it('when a 200 MB upload is aborted halfway, then it resumes from the server\'s offset and the stored file has the source\'s SHA-256', async () => {
    const size = (await stat(bigClip)).size;
    expect(size).toBeGreaterThan(200_000_000); // 200 MB (SI, IEC 80000-13)
    const first = startTus({
      endpoint: `${base}/api/uploads`,
      path: bigClip,
      headers: authHeaders(team.host),
      metadata: meta('A001_C001.mov', { sha256: bigSha }),
      onProgress: (sent, _total, upload) => {
        if (sent >= size / 2) void upload.abort();
      },
    });
    // abort() ends the request without calling onSuccess/onError: wait for the upload URL instead.
    await waitFor(async () => first.upload.url, 30_000, 'upload URL');
    await waitFor(async () => ((await tusRequest(team.host, 'HEAD', new URL(first.upload.url!).pathname)).headers.get('upload-offset') ?? '0') !== '0', 30_000, 'bytes on the server');
    await new Promise((r) => setTimeout(r, 300));
    const url = first.upload.url!;
    const head = await tusRequest(team.host, 'HEAD', new URL(url).pathname);
    expect(head.status).toBe(200);
    const offset = Number(head.headers.get('upload-offset'));
    expect(offset).toBeGreaterThan(size * 0.3);
    expect(offset).toBeLessThan(size);
    expect(head.headers.get('upload-length')).toBe(String(size));

    let resumedFrom = -1;
    const second = startTus({
      endpoint: `${base}/api/uploads`,
      uploadUrl: url,
      path: bigClip,
      headers: authHeaders(team.host),
      metadata: meta('A001_C001.mov'),
      onProgress: (sent) => {
        if (resumedFrom < 0) resumedFrom = sent;
      },
    });
    expect(await second.done).toBe(url);
    expect(resumedFrom).toBeGreaterThanOrEqual(offset);
    const id = idOf(url);
    expect(await sha256File(join(storage, 'uploads', id))).toBe(bigSha);
    const f = await waitFor(async () => {
      const row = await footageOfUpload(id);
      return row && ['verified', 'flagged'].includes(row.status) ? row : null;
    }, 60_000, 'checks');
    expect(f.serverSha256).toBe(bigSha);
    expect(f.status).toBe('verified');
    expect(Number(f.sizeBytes)).toBe(size);
    expect((f.probe as { codec: string }).codec).toBe('rawvideo');
  }, 180_000);

  it('when the server process is killed (SIGKILL) mid-upload and restarted, then the upload continues from the bytes on disk and matches the source', async () => {
    const port = await freePort();
    const childBase = `http://127.0.0.1:${port}`;
    const startChild = async () => {
      // node with tsx's loader, not the tsx CLI: the CLI runs the server in a second process that SIGKILL would miss.
      const child = spawn(process.execPath, ['--import', 'tsx', 'api/src/server.ts'], {
        cwd: REPO,
        env: { ...process.env, ...uploadEnv(), NODE_ENV: 'test', FAKES: '0', PORT: String(port), HOST: '127.0.0.1', PUBLIC_URL: 'http://127.0.0.1:4999', WEB_DIST: join(work, 'no-web') },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      children.push(child);
      let log = '';
      child.stdout!.on('data', (d) => (log += d));
      child.stderr!.on('data', (d) => (log += d));
      await waitFor(async () => (await fetch(`${childBase}/api/health`).catch(() => null))?.ok, 60_000, `child server (${log})`);
      return child;
    };
    const size = (await stat(bigClip)).size;
    let child = await startChild();
    const killed = new Promise<void>((r) => child.once('exit', () => r()));
    const first = startTus({
      endpoint: `${childBase}/api/uploads`,
      path: bigClip,
      headers: authHeaders(team.host),
      metadata: meta('A001_C002.mov', { sha256: bigSha }),
      onProgress: (sent) => {
        if (sent >= size / 2 && child.exitCode === null && !child.killed) child.kill('SIGKILL');
      },
    });
    const err = await first.done.then(() => null, (e: unknown) => e);
    expect(err, 'the upload fails while the server is down').not.toBeNull();
    await killed;
    const url = first.upload.url!;
    const id = idOf(url);
    const onDisk = (await stat(join(storage, 'uploads', id))).size;
    expect(onDisk).toBeGreaterThan(0);
    expect(onDisk).toBeLessThan(size);

    child = await startChild();
    const head = await fetch(`${childBase}${new URL(url).pathname}`, { method: 'HEAD', headers: { 'Tus-Resumable': '1.0.0', Cookie: cookieOf(team.host) } });
    expect(head.status).toBe(200);
    expect(Number(head.headers.get('upload-offset'))).toBe(onDisk);
    const second = startTus({ endpoint: `${childBase}/api/uploads`, uploadUrl: url, path: bigClip, headers: authHeaders(team.host), metadata: meta('A001_C002.mov') });
    await second.done;
    expect(await sha256File(join(storage, 'uploads', id))).toBe(bigSha);
    const f = await waitFor(async () => {
      const row = await footageOfUpload(id);
      return row && ['verified', 'flagged'].includes(row.status) ? row : null;
    }, 60_000, 'checks');
    expect(f.status).toBe('verified');
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
  }, 240_000);

  it('when ten uploads run at once, then all complete and verify', async () => {
    const clips = await Promise.all(
      Array.from({ length: 10 }, (_, i) => makeClip(join(work, `multi-${i}.mp4`), `testsrc=size=${320 + 16 * i}x240:rate=25`, { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p'] })),
    );
    const shas = await Promise.all(clips.map(sha256File));
    const runs = clips.map((path, i) => startTus({ endpoint: `${base}/api/uploads`, path, headers: authHeaders(team.editor), metadata: meta(`multi-${i}.mp4`, { sha256: shas[i] }), chunkSize: 64 * 1024 }));
    const urls = await Promise.all(runs.map((r) => r.done));
    expect(new Set(urls).size).toBe(10);
    for (const [i, url] of urls.entries()) expect(await sha256File(join(storage, 'uploads', idOf(url)))).toBe(shas[i]);
    const rows = await waitFor(async () => {
      const all = await Promise.all(urls.map((u) => footageOfUpload(idOf(u))));
      return all.every((f) => f && ['verified', 'flagged'].includes(f.status)) ? all : null;
    }, 60_000, 'ten checks');
    expect(rows.map((f) => f!.status)).toEqual(Array(10).fill('verified'));
    expect(rows.map((f) => (f!.probe as { width: number }).width)).toEqual(Array.from({ length: 10 }, (_, i) => 320 + 16 * i));
  }, 180_000);
});

describe('refusals: nothing is stored', () => {
  const countRows = async () => {
    const [r] = await ctx.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM uploads WHERE episode_id = :episodeId', { replacements: { episodeId }, type: QueryTypes.SELECT });
    return Number(r.n);
  };
  const filesOnDisk = async () => (existsSync(join(storage, 'uploads')) ? (await readdir(join(storage, 'uploads'))).length : 0);
  const create = (client: Client | null, m: Record<string, string>, length: number, headers: Record<string, string> = {}) =>
    tusRequest(client, 'POST', '/api/uploads', { 'Upload-Length': String(length), 'Upload-Metadata': encodeMeta(m), ...headers });

  it('when not signed in, then 401', async () => {
    const before = [await countRows(), await filesOnDisk()];
    const r = await create(null, meta('A.mov'), 1000);
    expect(r.status).toBe(401);
    expect([await countRows(), await filesOnDisk()]).toEqual(before);
  });

  it('when signed in without the CSRF token, then 403', async () => {
    const r = await tusRequest(null, 'POST', '/api/uploads', { Cookie: cookieOf(team.host), 'Upload-Length': '1000', 'Upload-Metadata': encodeMeta(meta('A.mov')) });
    expect(r.status).toBe(403);
    expect(JSON.parse(r.text).error.code).toBe('csrf_failed');
  });

  it('when the episode belongs to another channel, then 404; and another channel\'s upload URL answers 404 too', async () => {
    const before = await countRows();
    const r = await create(outsider, meta('A.mov'), 1000);
    expect(r.status).toBe(404);
    expect(await countRows()).toBe(before);
    const mine = await create(team.host, meta('B.mov'), 1000);
    expect(mine.status).toBe(201);
    const path = mine.headers.get('location')!;
    expect(path).toMatch(/^\/api\/uploads\/[0-9a-f]{32}$/); // relative Location: works behind a proxy
    expect((await tusRequest(outsider, 'HEAD', path)).status).toBe(404);
    expect((await tusRequest(outsider, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, Buffer.alloc(10))).status).toBe(404);
    expect((await tusRequest(outsider, 'DELETE', path)).status).toBe(404);
    // A colleague in the channel may not continue someone else's upload, but a producer may cancel it.
    expect((await tusRequest(team.editor, 'HEAD', path)).status).toBe(403);
    expect((await tusRequest(team.editor, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, Buffer.alloc(10))).status).toBe(403);
    expect((await tusRequest(team.editor, 'DELETE', path)).status).toBe(403);
    expect((await tusRequest(team.producer, 'DELETE', path)).status).toBe(204);
    expect(await UploadRecord.findByPk(idOf(path))).toBeNull();
    expect(existsSync(join(storage, 'uploads', idOf(path)))).toBe(false);
  });

  it('when the file is larger than the limit, then 413 with the limit in the message', async () => {
    const before = await countRows();
    const r = await create(team.host, meta('huge.mov'), MAX_BYTES + 1);
    expect(r.status).toBe(413);
    expect(JSON.parse(r.text).error.message).toMatch(/largest file Midgray accepts is 300 MiB/);
    expect(await countRows()).toBe(before);
  });

  it('when the extension does not fit the kind, then 415; when the bytes do not match the name, then 415 at the first bytes and the upload is removed', async () => {
    const before = await countRows();
    const exe = await create(team.host, meta('tool.exe'), 1000);
    expect(exe.status).toBe(415);
    expect(JSON.parse(exe.text).error.message).toMatch(/\.exe is not accepted as a camera original: use \.mp4/);
    const still = await create(team.host, { ...meta('A001.mov'), kind: 'frame_grab' }, 1000);
    expect(still.status).toBe(415);
    expect(await countRows()).toBe(before);

    // An executable renamed to .mov passes the name check but not the content check.
    const disguised = await create(team.host, meta('disguised.mov'), 8192);
    expect(disguised.status).toBe(201);
    const path = disguised.headers.get('location')!;
    const elf = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), randomBytes(8184)]);
    const patch = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, elf);
    expect(patch.status).toBe(415);
    expect(patch.text).toMatch(/not a video container or still image/);
    expect(await UploadRecord.findByPk(idOf(path))).toBeNull();
    expect(await Footage.findOne({ where: { uploadId: idOf(path) } })).toBeNull();
    expect(existsSync(join(storage, 'uploads', idOf(path)))).toBe(false);
    expect(await countRows()).toBe(before);

    // A PNG named .mov: the name says MOV, the bytes say PNG.
    const png = await create(team.host, meta('grab.mov'), 100);
    const pngBytes = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(92)]);
    const r2 = await tusRequest(team.host, 'PATCH', png.headers.get('location')!, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, pngBytes);
    expect(r2.status).toBe(415);
    expect(r2.text).toMatch(/name says MP4 \/ MOV but its contents are PNG/);
  });

  it('when Upload-Offset does not match the bytes the server has, then 409 and the upload is unchanged', async () => {
    const clip = await makeClip(join(work, 'offset.mp4'), 'testsrc=size=320x240:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast'] });
    const bytes = await import('node:fs/promises').then((fs) => fs.readFile(clip));
    const created = await create(team.host, meta('offset.mp4'), bytes.length);
    const path = created.headers.get('location')!;
    const ok = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(0, 5000));
    expect(ok.status).toBe(204);
    expect(ok.headers.get('upload-offset')).toBe('5000');
    const bad = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '4000', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(4000, 6000));
    expect(bad.status).toBe(409);
    expect(bad.text).toMatch(/Upload-Offset does not match/);
    const head = await tusRequest(team.host, 'HEAD', path);
    expect(head.headers.get('upload-offset')).toBe('5000');
    // Resume from the right offset and finish.
    const rest = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '5000', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(5000));
    expect(rest.status).toBe(204);
    expect((await footageOfUpload(idOf(path)))!.status).not.toBe('receiving');
  });

  it('when a first PATCH brings fewer bytes than the content check needs, then they wait on disk and the next PATCH decides', async () => {
    const clip = await makeClip(join(work, 'tiny-first.mp4'), 'testsrc=size=320x240:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast'] });
    const bytes = await import('node:fs/promises').then((fs) => fs.readFile(clip));
    const created = await create(team.host, meta('tiny-first.mp4'), bytes.length);
    const path = created.headers.get('location')!;
    const first = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(0, 3));
    expect(first.status).toBe(204);
    expect(first.headers.get('upload-offset')).toBe('3');
    expect((await UploadRecord.findByPk(idOf(path)))!.format).toBeNull();
    const rest = await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '3', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(3));
    expect(rest.status).toBe(204);
    expect((await UploadRecord.findByPk(idOf(path)))!.format).toBe('isobmff');
    expect(await sha256File(join(storage, 'uploads', idOf(path)))).toBe(await sha256File(clip));
  });

  it('when the file name carries a path (traversal), then 400 and nothing is stored', async () => {
    const before = [await countRows(), await filesOnDisk()];
    for (const name of ['../../etc/passwd.mov', '..\\..\\boot.mov', 'clips/../../x.mov', 'bad\u0000name.mov']) {
      const r = await create(team.host, meta(name), 1000);
      expect(r.status, name).toBe(400);
      expect(JSON.parse(r.text).error.message).toMatch(/folder path|control characters/);
    }
    expect([await countRows(), await filesOnDisk()]).toEqual(before);
  });

  it('when the upload id in the URL is not of the server\'s form (encoded slashes, dots), then 404 and no file outside the folder is touched', async () => {
    for (const bad of ['..%2F..%2F..%2Fetc%2Fpasswd', '%2e%2e', '..', 'abc', `${'a'.repeat(32)}%2F..`, `${'A'.repeat(32)}`, '%2Fetc%2Fpasswd']) {
      for (const method of ['HEAD', 'PATCH', 'DELETE']) {
        const r = await tusRequest(team.host, method, `/api/uploads/${bad}`, method === 'PATCH' ? { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' } : {}, method === 'PATCH' ? Buffer.alloc(4) : undefined);
        expect(r.status, `${method} ${bad}`).toBe(404);
      }
    }
    expect(existsSync('/etc/passwd')).toBe(true);
  });

  it('when a person\'s unfinished uploads would pass their byte limit, then 429; cancelled uploads free it again', async () => {
    const producer = team.producer;
    const made: string[] = [];
    for (let i = 0; i < 3; i++) {
      const r = await create(producer, meta(`limit-${i}.mov`), 280 * MiB);
      expect(r.status).toBe(201);
      made.push(r.headers.get('location')!);
    }
    const over = await create(producer, meta('limit-3.mov'), 280 * MiB);
    expect(over.status).toBe(429);
    expect(over.text).toMatch(/840 MiB.*limit of 1.0 GiB/);
    for (const p of made) expect((await tusRequest(producer, 'DELETE', p)).status).toBe(204);
    const again = await create(producer, meta('limit-4.mov'), 280 * MiB);
    expect(again.status).toBe(201);
    expect((await tusRequest(producer, 'DELETE', again.headers.get('location')!)).status).toBe(204);
  });

  it('when a finished upload is deleted through tus, then 409: footage is not cancelled by its upload URL', async () => {
    const clip = await makeClip(join(work, 'done.mp4'), 'testsrc=size=320x240:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast'] });
    const url = await startTus({ endpoint: `${base}/api/uploads`, path: clip, headers: authHeaders(team.host), metadata: meta('done.mp4') }).done;
    const r = await tusRequest(team.host, 'DELETE', new URL(url).pathname);
    expect(r.status).toBe(409);
    expect(existsSync(join(storage, 'uploads', idOf(url)))).toBe(true);
  });
});

describe('expiry', () => {
  it('when an unfinished upload is older than the expiry, then HEAD answers 410 and the sweep removes its bytes and rows', async () => {
    const clip = await makeClip(join(work, 'abandoned.mp4'), 'testsrc=size=320x240:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast'] });
    const bytes = await import('node:fs/promises').then((fs) => fs.readFile(clip));
    const created = await tusRequest(team.host, 'POST', '/api/uploads', { 'Upload-Length': String(bytes.length), 'Upload-Metadata': encodeMeta(meta('abandoned.mp4')) });
    const path = created.headers.get('location')!;
    expect(created.headers.get('upload-expires')).toBeTruthy(); // tus expiration extension
    await tusRequest(team.host, 'PATCH', path, { 'Upload-Offset': '0', 'Content-Type': 'application/offset+octet-stream' }, bytes.subarray(0, 6000));
    const id = idOf(path);
    await ctx.sequelize.query(`UPDATE uploads SET created_at = now() - interval '73 hours', expires_at = now() - interval '1 hour' WHERE id = :id`, { replacements: { id } });
    expect((await tusRequest(team.host, 'HEAD', path)).status).toBe(410);
    await ctx.built.jobs.send('uploads-expire', {});
    await waitFor(async () => !(await UploadRecord.findByPk(id)), 20_000, 'the sweep');
    expect(existsSync(join(storage, 'uploads', id))).toBe(false);
    expect(await Footage.findOne({ where: { uploadId: id } })).toBeNull();
    expect((await tusRequest(team.host, 'HEAD', path)).status).toBe(404);
    const [activity] = await ctx.sequelize.query<{ action: string }>(`SELECT action FROM activities WHERE subject_id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
    expect(activity.action).toBe('upload.expired');
  });
});

function freePort(): Promise<number> {
  return new Promise((resolveP, reject) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as AddressInfo).port;
      s.close(() => resolveP(port));
    });
    s.on('error', reject);
  });
}

// The creation checks themselves, on the real tables with a given free space (the running app's own
// check reads the disk, which a test cannot set): the open-upload count, and the disk reserve.
describe('limits checked when an upload is created', () => {
  const GiB = 1024 ** 3;
  const records = (limits: Partial<UploadLimits>) =>
    new UploadRecords(ctx.sequelize, { expiryMs: 3_600_000, maxOpenPerUser: 50, maxOpenBytesPerUser: 4 * 1024 * GiB, diskReserveBytes: 0, freeBytes: async () => null, ...limits });
  async function create(store: UploadRecords, ownerId: string, size: number) {
    const channelId = (await Episode.findByPk(episodeId))!.channelId;
    const upload = new Upload({ id: randomBytes(16).toString('hex'), size, offset: 0, metadata: {} });
    store.bind(upload, { ownerId, channelId, episodeId, stepId: null, kind: 'camera_original', originalName: 'limit.mov', claimedFormat: 'isobmff', clientSha256: null });
    await store.set(upload.id, upload);
    return upload.id;
  }
  const rowsOf = async (ids: string[]) => ({ uploads: await UploadRecord.count({ where: { id: ids } }), footage: await Footage.count({ where: { uploadId: ids } }) });

  it('when a person already has their limit of unfinished uploads open, the next one is refused with 429 and nothing is written', async () => {
    const owner = (await newUser(ctx)).userId;
    const store = records({ maxOpenPerUser: 3 });
    const ids = [await create(store, owner, 1000), await create(store, owner, 1000), await create(store, owner, 1000)];
    const refused = await create(store, owner, 1000).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(UploadRefusal);
    expect(refused).toMatchObject({ status_code: 429 });
    expect((refused as UploadRefusal).body).toMatch(/already have 3 unfinished uploads \(the limit is 3\)/);
    expect(await rowsOf(ids)).toEqual({ uploads: 3, footage: 3 });
    expect(await UploadRecord.count({ where: { ownerId: owner } })).toBe(3);
  });

  it('when a file would eat into the disk reserve once the uploads under way arrive, 507 says so; a smaller file fits', async () => {
    const owner = (await newUser(ctx)).userId;
    const pendingBefore = Number((await ctx.sequelize.query<{ b: string }>(`SELECT coalesce(sum(length - "offset"), 0) AS b FROM uploads WHERE completed_at IS NULL AND expires_at > now()`, { type: QueryTypes.SELECT }))[0].b);
    // Free: what is still to come + 1 GiB reserve + 100 MiB of room.
    const store = records({ diskReserveBytes: GiB, freeBytes: async () => pendingBefore + GiB + 100 * MiB });
    const refused = await create(store, owner, 101 * MiB).catch((e: unknown) => e);
    expect(refused).toMatchObject({ status_code: 507 });
    expect((refused as UploadRefusal).body).toMatch(/keeps free\. Ask an admin to make room/);
    expect(await UploadRecord.count({ where: { ownerId: owner } })).toBe(0);
    const fits = await create(store, owner, 99 * MiB);
    expect(await rowsOf([fits])).toEqual({ uploads: 1, footage: 1 });
    // That upload's missing bytes now count: the same 99 MiB no longer fits.
    expect(await create(store, owner, 99 * MiB).catch((e: unknown) => e)).toMatchObject({ status_code: 507 });
  });
});
