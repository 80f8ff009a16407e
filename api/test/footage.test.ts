// Footage after upload: the probe compared with the test's spec sheet (clips made with ffmpeg's
// test sources), the browser's checksum, pickup/release/reassign, ranged downloads (RFC 9110 §14),
// the thumbnail, and the PostgreSQL upload locker across two sessions.
import { readFile } from 'node:fs/promises';
import { mkdtemp, rm } from 'node:fs/promises';
import type { AddressInfo, Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Episode, Footage, SpecSheetLine, Test, TestStep } from '@midgray/db';
import type { Footage as FootageDto, FootageList } from '@midgray/shared';
import { settledState } from '../src/modules/footage/footage.service.ts';
import { PgLocker } from '../src/uploads/pg-locker.ts';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { authHeaders, makeClip, sha256File, startTus, waitFor } from './upload-helpers.ts';

let ctx: TestContext;
let server: Server;
let base: string;
let work: string;
let team: Record<'host' | 'editor' | 'producer' | 'admin', Client>;
let episodeId: string;
let stepId: string;
let channelId: string;

const idOf = (url: string) => url.split('/').pop()!;

async function upload(client: Client, path: string, name: string, extra: Record<string, string> = {}) {
  const url = await startTus({ endpoint: `${base}/api/uploads`, path, headers: authHeaders(client), metadata: { episodeId, kind: 'camera_original', filename: name, ...extra } }).done;
  return idOf(url);
}

async function settled(client: Client, uploadId: string): Promise<FootageDto> {
  const row = await waitFor(async () => {
    const f = await Footage.findOne({ where: { uploadId } });
    return f && ['verified', 'flagged'].includes(f.status) && f.probe ? f : null;
  }, 60_000, 'footage checks');
  return (await client.get(`/api/footage/${row.id}`).expect(200)).body;
}

beforeAll(async () => {
  work = await mkdtemp(join(tmpdir(), 'midgray-footage-'));
  // Its own job queue and storage: no other test file's worker takes these jobs.
  ctx = await startTestApp({ env: { STORAGE_DIR: join(work, 'storage'), JOBS_SCHEMA: 'footage_api_test' } });
  await ctx.built.startWorkers();
  server = ctx.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const made = await channelWithTeam(ctx);
  team = made.team;
  channelId = made.channelId;
  episodeId = (await Episode.create({ channelId, title: 'Probe test episode', stage: 'shoot', position: 0 })).id;
  const test = await Test.create({ episodeId, kind: 'custom', name: 'UHD sweep', position: 0, inputs: {} });
  stepId = (await TestStep.create({ testId: test.id, index: 0, label: 'ISO 800', planned: {} })).id;
  const sheet: [string, string, string][] = [
    ['resolution', 'Resolution', '3840×2160 (UHD)'],
    ['frame_rate', 'Frame rate', '23.976 fps'],
    ['codec', 'Codec', 'H.264 in MOV'],
    ['bit_depth', 'Bit depth', '8-bit'],
    ['chroma_subsampling', 'Chroma subsampling', '4:2:0'],
  ];
  for (const [i, [key, label, value]] of sheet.entries()) await SpecSheetLine.create({ testId: test.id, key, label, value, position: i, required: true });
}, 60_000);

afterAll(async () => {
  await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
  await ctx?.close();
  await rm(work, { recursive: true, force: true });
});

describe('probe against the spec sheet', () => {
  it('when a 2-second 3840×2160 clip at 24000/1001 fps meets a sheet saying UHD at 23.976, then it is verified with every value read', async () => {
    const clip = await makeClip(join(work, 'uhd.mov'), 'testsrc=size=3840x2160:rate=24000/1001', {
      seconds: 2,
      args: ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p', '-timecode', '01:00:00:00'],
    });
    const sha = await sha256File(clip);
    const id = await upload(team.host, clip, 'A001_C001_UHD.mov', { stepId, sha256: sha });
    const f = await settled(team.host, id);
    expect(f.status).toBe('verified');
    expect(f.serverSha256).toBe(sha);
    expect(f.clientSha256).toBe(sha);
    expect(f.probe).toMatchObject({ codec: 'h264', width: 3840, height: 2160, frameRate: '24000/1001', bitDepth: 8, chromaSubsampling: '4:2:0', pixelFormat: 'yuv420p', timecode: '01:00:00:00' });
    expect(f.probe!.durationSeconds).toBeCloseTo(2, 1); // 48 frames at 24000/1001 fps = 2.002 s
    expect(f.specMismatches).toEqual([]);
    expect(f.specTestName).toBe('UHD sweep');
    expect(f.stepLabel).toBe('UHD sweep · ISO 800');
    expect(f.hasThumbnail).toBe(true);
    const thumb = await team.editor.get(`/api/footage/${f.id}/thumbnail`).buffer(true).expect(200);
    expect(thumb.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect(Math.max(meta.width!, meta.height!)).toBe(480);
    expect(meta.width! / meta.height!).toBeCloseTo(16 / 9, 1);
  }, 120_000);

  it('when a 1920×1080 25 fps clip meets that sheet, then it is flagged with the exact differences', async () => {
    const clip = await makeClip(join(work, 'hd25.mov'), 'testsrc=size=1920x1080:rate=25', { seconds: 2, args: ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv422p'] });
    const id = await upload(team.host, clip, 'A001_C002_HD.mov', { stepId, sha256: await sha256File(clip) });
    const f = await settled(team.host, id);
    expect(f.status).toBe('flagged');
    const by = Object.fromEntries(f.specMismatches!.map((m) => [m.key, m.difference]));
    expect(by.resolution).toBe('recorded 1920×1080, the spec sheet says 3840×2160 (width −1920 px, height −1080 px)');
    expect(by.frame_rate).toBe('recorded 25 fps, the spec sheet says 23.976 fps (24000/1001) (+1.024 fps)');
    expect(by.chroma_subsampling).toBe('recorded 4:2:2, the spec sheet says 4:2:0');
    expect(Object.keys(by).sort()).toEqual(['chroma_subsampling', 'frame_rate', 'resolution']);
    const list = (await team.editor.get(`/api/episodes/${episodeId}/footage`).expect(200)).body as FootageList;
    expect(list.footage.find((x) => x.id === f.id)!.status).toBe('flagged');
    expect(list.steps).toEqual([{ id: stepId, label: 'ISO 800', testName: 'UHD sweep' }]);
    const activity = await ctx.sequelize.query<{ action: string; reason: string }>(`SELECT action, reason FROM activities WHERE subject_id = :id ORDER BY id`, { replacements: { id: f.id }, type: 'SELECT' as never });
    expect(activity.map((a) => a.action)).toEqual(['footage.received', 'footage.flagged']);
    expect(activity[1].reason).toBe('3 values differ from the spec sheet');
  }, 120_000);

  it('when the browser sends its checksum after the upload and it differs, then the footage is flagged; the same checksum again is accepted', async () => {
    const clip = await makeClip(join(work, 'late.mp4'), 'testsrc=size=640x360:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p'] });
    // An episode without tests: nothing to compare, so only the checksums decide.
    const other = await Episode.create({ channelId, title: 'No plan yet', stage: 'shoot', position: 1 });
    const id = await upload(team.editor, clip, 'late.mp4', { episodeId: other.id });
    // Without the browser's checksum the file stays received (checked but unconfirmed).
    const row = await waitFor(async () => {
      const f = await Footage.findOne({ where: { uploadId: id } });
      return f?.serverSha256 && f.probe ? f : null;
    }, 60_000, 'checks');
    expect(row.status).toBe('received');
    expect((await team.host.put(`/api/upload-checksums/${id}`, { sha256: 'a'.repeat(64) })).status).toBe(403); // not the uploader
    const wrong = 'b'.repeat(64);
    const r = await team.editor.put(`/api/upload-checksums/${id}`, { sha256: wrong }).expect(200);
    expect(r.body.status).toBe('flagged');
    expect(r.body.clientSha256).toBe(wrong);
    expect((await team.editor.put(`/api/upload-checksums/${id}`, { sha256: 'c'.repeat(64) })).status).toBe(409);
    expect((await team.editor.put(`/api/upload-checksums/${id}`, { sha256: 'not hex' })).status).toBe(400);
  }, 120_000);

  it('settles states from the checks (pure rule)', () => {
    const ok = { clientSha256: 'a', serverSha256: 'a', probeDone: true, probeError: null, mismatches: [] };
    expect(settledState(ok).state).toBe('verified');
    expect(settledState({ ...ok, serverSha256: 'b' }).state).toBe('flagged');
    expect(settledState({ ...ok, mismatches: [{}] }).state).toBe('flagged');
    expect(settledState({ ...ok, probeError: 'ffprobe could not read the file' }).state).toBe('flagged');
    expect(settledState({ ...ok, clientSha256: null }).state).toBe('received');
    expect(settledState({ ...ok, probeDone: false }).state).toBe('received');
  });
});

describe('pickup, release, reassign and download', () => {
  let footage: FootageDto;
  let bytes: Buffer;

  beforeAll(async () => {
    const clip = await makeClip(join(work, 'pick.mp4'), 'testsrc=size=640x360:rate=25', { seconds: 1, args: ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p'] });
    bytes = await readFile(clip);
    const id = await upload(team.host, clip, 'pick.mp4', { sha256: await sha256File(clip) });
    footage = await settled(team.host, id);
  }, 120_000);

  it('when an editor picks up a file, then others see who holds it and since when, and cannot pick it up', async () => {
    expect((await team.host.post(`/api/footage/${footage.id}/pickup`, { version: footage.version })).status).toBe(403); // hosts upload, editors pick up
    const r = await team.editor.post(`/api/footage/${footage.id}/pickup`, { version: footage.version }).expect(200);
    expect(r.body.holder).toEqual({ id: team.editor.userId, name: 'Test editor' });
    expect(Date.now() - Date.parse(r.body.heldSince)).toBeLessThan(60_000);
    const other = await newUser(ctx, 'Second Editor');
    await ctx.sequelize.query(`INSERT INTO memberships (channel_id, user_id, role) VALUES (:channelId, :userId, 'editor')`, { replacements: { channelId, userId: other.userId } });
    const taken = await other.post(`/api/footage/${footage.id}/pickup`, { version: r.body.version });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/^Test editor holds this file since/);
    // A stale version is refused too.
    expect((await team.editor.post(`/api/footage/${footage.id}/release`, { version: footage.version })).status).toBe(409);
    // Another editor may not release it; a producer reassigns it to them.
    expect((await other.post(`/api/footage/${footage.id}/release`, { version: r.body.version })).status).toBe(403);
    expect((await team.editor.post(`/api/footage/${footage.id}/reassign`, { version: r.body.version, userId: other.userId })).status).toBe(403);
    const hostTarget = await team.producer.post(`/api/footage/${footage.id}/reassign`, { version: r.body.version, userId: team.host.userId });
    expect(hostTarget.status).toBe(400);
    const moved = await team.producer.post(`/api/footage/${footage.id}/reassign`, { version: r.body.version, userId: other.userId }).expect(200);
    expect(moved.body.holder.id).toBe(other.userId);
    const released = await other.post(`/api/footage/${footage.id}/release`, { version: moved.body.version }).expect(200);
    expect(released.body.holder).toBeNull();
    expect(released.body.heldSince).toBeNull();
    const actions = await ctx.sequelize.query<{ action: string }>(`SELECT action FROM activities WHERE subject_id = :id AND action LIKE 'footage.%' ORDER BY id`, { replacements: { id: footage.id }, type: 'SELECT' as never });
    expect(actions.map((a) => a.action).slice(-3)).toEqual(['footage.picked_up', 'footage.reassigned', 'footage.released']);
    footage = released.body;
  });

  it('when a member downloads with a Range header, then 206 with exactly those bytes; outsiders get 404', async () => {
    const whole = await team.editor.get(`/api/footage/${footage.id}/download`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(whole.headers['accept-ranges']).toBe('bytes');
    expect(whole.headers['content-disposition']).toBe('attachment; filename=pick.mp4'); // RFC 6266: a token needs no quotes
    expect(Buffer.compare(whole.body as Buffer, bytes)).toBe(0);
    const part = await team.editor.get(`/api/footage/${footage.id}/download`).set('Range', 'bytes=100-1099').buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(part.status).toBe(206);
    expect(part.headers['content-range']).toBe(`bytes 100-1099/${bytes.length}`);
    expect(Buffer.compare(part.body as Buffer, bytes.subarray(100, 1100))).toBe(0);
    const tail = await team.editor.get(`/api/footage/${footage.id}/download`).set('Range', `bytes=${bytes.length}-`);
    expect(tail.status).toBe(416);
    const outsider = await newUser(ctx, 'Olu Outsider');
    expect((await outsider.get(`/api/footage/${footage.id}/download`)).status).toBe(404);
  });
});

describe('the PostgreSQL upload locker', () => {
  it('when two processes (two sessions) want the same upload, then the second waits, asks the holder to let go, and gets the lock after it is released', async () => {
    const a = new PgLocker(process.env.DATABASE_URL!, { acquireTimeoutMs: 5000 });
    const b = new PgLocker(process.env.DATABASE_URL!, { acquireTimeoutMs: 5000 });
    try {
      const id = 'f'.repeat(32);
      const lockA = a.newLock(id);
      let asked = 0;
      await lockA.lock(new AbortController().signal, () => {
        asked++;
        setTimeout(() => void lockA.unlock(), 100);
      });
      const started = Date.now();
      const lockB = b.newLock(id);
      await lockB.lock(new AbortController().signal, () => undefined);
      expect(asked).toBeGreaterThanOrEqual(1); // the holder was asked through NOTIFY
      expect(Date.now() - started).toBeGreaterThanOrEqual(90);
      // While B holds it, A cannot take it before the timeout unless B lets go.
      const c = a.newLock(id);
      const timeout = await c.lock(AbortSignal.timeout(300), () => undefined).then(() => 'locked', () => 'refused');
      expect(timeout).toBe('refused');
      await lockB.unlock();
      await c.lock(new AbortController().signal, () => undefined);
      await c.unlock();
    } finally {
      await a.close();
      await b.close();
    }
  });
});
