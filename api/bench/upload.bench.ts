/**
 * Upload benchmark (footage "Figures"): a 2 GiB file sent with tus-js-client through the app's tus
 * endpoint on loopback, against writing the same bytes straight to the same disk (a stream copy
 * into the same folder) in the same run: copy, upload, copy, upload, copy; the fastest of each
 * counts, so a busy moment on a shared machine does not decide the ratio. Reports both throughputs, their ratio (target ≥ 0.6), and
 * the server's peak resident memory growth during the upload, sampled from /proc/<pid>/status
 * every 20 ms (target < 100 MB: the server streams, never buffers a file).
 * Run: `npx tsx api/bench/upload.bench.ts [GiB]` with DATABASE_URL set (npm run bench does it).
 */
import { fork } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream, readFileSync } from 'node:fs';
import { mkdir, open, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import * as tus from 'tus-js-client';
import { Channel, createDatabase, Episode, Membership, migrateUp } from '@midgray/db';

const GiB = 1024 ** 3;
const MB = 1_000_000;
const SIZE = Math.round(Number(process.argv[2] ?? 2) * GiB);
const RATIO_TARGET = 0.6;
const RSS_TARGET_BYTES = 100 * MB;
const REPO = join(import.meta.dirname, '..', '..');
// On the repository's disk (git-ignored), where the app's storage lives in development.
const dir = join(REPO, '.data', `bench-upload-${process.pid}`);
const storage = join(dir, 'storage');

const url = process.env.DATABASE_URL;
if (!url) throw new Error('Set DATABASE_URL (npm run bench starts a bench database)');
const db = createDatabase(url);
await migrateUp(db);

await mkdir(storage, { recursive: true });
const source = join(dir, 'source.mov');
{
  // 2 GiB that starts like a MOV file (the upload server checks the first bytes), then noise.
  const block = randomBytes(16 * 1024 * 1024);
  Buffer.from([0, 0, 0, 0x14, 0x66, 0x74, 0x79, 0x70, 0x71, 0x74, 0x20, 0x20, 0, 0, 2, 0, 0x71, 0x74, 0x20, 0x20]).copy(block, 0);
  const fh = await open(source, 'w');
  for (let at = 0; at < SIZE; at += block.length) await fh.write(block, 0, Math.min(block.length, SIZE - at));
  // Flush it, so writing it back does not slow the first measurement.
  await fh.datasync();
  await fh.close();
}
const sourceSha = await sha256(source);

const child = fork(join(REPO, 'api', 'bench', 'upload-server.ts'), [], {
  cwd: REPO,
  execArgv: ['--import', 'tsx'],
  env: { ...process.env, BENCH_STORAGE_DIR: storage },
  stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
});
const ready = await new Promise<{ port: number; oauthPort: number }>((resolve, reject) => {
  child.once('message', (m) => resolve(m as { port: number; oauthPort: number }));
  child.once('exit', (code) => reject(new Error(`bench server exited (${code})`)));
});
const base = `http://127.0.0.1:${ready.port}`;

try {
  const { cookie, csrf, userId } = await signIn(base, `http://127.0.0.1:${ready.oauthPort}`);
  const channel = await Channel.create({ name: 'Bench uploads', timeZone: 'UTC', settings: {} });
  await Membership.create({ channelId: channel.id, userId, role: 'host' });
  const episode = await Episode.create({ channelId: channel.id, title: 'Bench upload episode', stage: 'shoot', position: 0 });

  // Warm both paths once with a small file, then measure.
  await directWrite(source, join(dir, 'warm.bin'), 64 * 1024 * 1024);
  await rm(join(dir, 'warm.bin'));

  // The yardstick runs before and after the upload; the faster run counts (the stricter ratio).
  const directBefore = await time(() => directWrite(source, join(dir, 'direct.bin'), SIZE));
  await rm(join(dir, 'direct.bin'));

  const rssBefore = rssOf(child.pid!);
  let peak = rssBefore;
  const sampler = setInterval(() => (peak = Math.max(peak, rssOf(child.pid!))), 20);
  let uploadUrl = '';
  const tusOnce = () =>
    time(
    () =>
      new Promise<void>((resolve, reject) => {
        const u = new tus.Upload(createReadStream(source), {
          endpoint: `${base}/api/uploads`,
          headers: { Cookie: cookie, 'X-CSRF-Token': csrf },
          metadata: { episodeId: episode.id, kind: 'camera_original', filename: 'bench.mov' },
          retryDelays: null,
          onSuccess: () => {
            uploadUrl = u.url!;
            resolve();
          },
          onError: reject,
        });
        u.start();
      }),
    );
  // Two uploads, the yardstick between them; on a shared machine the faster of each pair counts.
  const uploadFirst = await tusOnce();
  const directBetween = await time(() => directWrite(source, join(dir, 'direct.bin'), SIZE));
  await rm(join(dir, 'direct.bin'));
  const uploadSecond = await tusOnce();
  const upload = Math.min(uploadFirst, uploadSecond);
  clearInterval(sampler);
  peak = Math.max(peak, rssOf(child.pid!));
  const directAfter = await time(() => directWrite(source, join(dir, 'direct.bin'), SIZE));
  await rm(join(dir, 'direct.bin'));
  const direct = Math.min(directBefore, directBetween, directAfter);
  const stored = join(storage, 'uploads', uploadUrl.split('/').pop()!);
  const storedSha = await sha256(stored);

  const mbps = (ms: number) => (SIZE / MB / (ms / 1000)).toFixed(0);
  const ratio = direct / upload;
  const growth = peak - rssBefore;
  console.log(`Upload benchmark: ${(SIZE / GiB).toFixed(2)} GiB, node ${process.version}, tus-js-client → @tus/server on loopback`);
  console.log(`  straight to disk (stream copy, same folder): ${(direct / 1000).toFixed(2)} s, ${mbps(direct)} MB/s (fastest of ${[directBefore, directBetween, directAfter].map((t) => (t / 1000).toFixed(2)).join(', ')} s)`);
  console.log(`  through the app's tus endpoint:              ${(upload / 1000).toFixed(2)} s, ${mbps(upload)} MB/s (faster of ${(uploadFirst / 1000).toFixed(2)}, ${(uploadSecond / 1000).toFixed(2)} s)`);
  console.log(`  ratio tus / direct: ${ratio.toFixed(2)} (target ≥ ${RATIO_TARGET})`);
  console.log(`  server RSS: ${(rssBefore / MB).toFixed(0)} MB before, ${(peak / MB).toFixed(0)} MB peak, growth ${(growth / MB).toFixed(1)} MB (target < ${RSS_TARGET_BYTES / MB} MB)`);
  console.log(`  stored file SHA-256 ${storedSha === sourceSha ? 'equals' : 'DIFFERS FROM'} the source's`);
  const ok = ratio >= RATIO_TARGET && growth < RSS_TARGET_BYTES && storedSha === sourceSha;
  if (!ok) process.exitCode = 1;
} finally {
  child.kill('SIGTERM');
  await db.close();
  await rm(dir, { recursive: true, force: true });
}

/** Resident set size of a process in bytes, from /proc/<pid>/status (VmRSS, in kB). */
function rssOf(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) * 1024 : 0;
}

async function time(fn: () => Promise<unknown>): Promise<number> {
  const t = performance.now();
  await fn();
  return performance.now() - t;
}

/** The yardstick: the same bytes read and written by a plain stream copy. */
async function directWrite(from: string, to: string, bytes: number) {
  await pipeline(createReadStream(from, { end: bytes - 1 }), createWriteStream(to));
  if ((await stat(to)).size !== bytes) throw new Error('short copy');
}

async function sha256(path: string) {
  const h = createHash('sha256');
  await pipeline(createReadStream(path), h);
  return h.digest('hex');
}

/** Signs in through the fake provider like a browser; returns the session cookie and CSRF token. */
async function signIn(app: string, oauth: string) {
  let cookie = '';
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie?.() ?? []) if (c.startsWith('midgray.sid=')) cookie = c.split(';')[0];
  };
  const account = await (await fetch(`${oauth}/_fake/accounts`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Bench Host', email: `bench-upload-${Date.now()}@crew.test` }) })).json();
  const start = await fetch(`${app}/api/auth/github`, { redirect: 'manual' });
  keep(start);
  const authorize = new URL(start.headers.get('location')!);
  const form = new URLSearchParams({ account: account.id, redirect_uri: authorize.searchParams.get('redirect_uri')!, state: authorize.searchParams.get('state') ?? '' });
  const decided = await fetch(`${oauth}/login/oauth/authorize`, { method: 'POST', body: form, redirect: 'manual' });
  const callback = new URL(decided.headers.get('location')!);
  keep(await fetch(`${app}${callback.pathname}${callback.search}`, { headers: { cookie }, redirect: 'manual' }));
  const me = await (await fetch(`${app}/api/auth/me`, { headers: { cookie } })).json();
  const csrf = (await (await fetch(`${app}/api/auth/csrf`, { headers: { cookie } })).json()).token as string;
  return { cookie, csrf, userId: me.user.id as string };
}
