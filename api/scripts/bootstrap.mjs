// Shared set-up for `npm start` and `npm test`: npm packages, Debian packages, PostgreSQL.
// Plain Node without dependencies, because it runs before node_modules exists on a fresh clone.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { ensureDebianPackage, REPO_ROOT } from '../../db/scripts/postgres.mjs';

export { ensurePostgres, stopPostgres, REPO_ROOT } from '../../db/scripts/postgres.mjs';

const hasCommand = (cmd) => spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;

/** Runs `npm ci` when node_modules is missing or older than package-lock.json. */
export function ensureNpmPackages() {
  const marker = join(REPO_ROOT, 'node_modules', '.package-lock.json');
  const lock = join(REPO_ROOT, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  console.log('[setup] installing npm packages (npm ci) …');
  run('npm', ['ci', '--no-audit', '--no-fund'], {});
}

/** Installs ffmpeg (probe, frames, thumbnails) from Debian's packages when missing. */
export function ensureFfmpeg() {
  ensureDebianPackage('ffmpeg', () => hasCommand('ffprobe') && hasCommand('ffmpeg'));
}

/** Installs Debian's chromium for the browser tests when missing (never a downloaded browser). */
export function ensureChromium() {
  ensureDebianPackage('chromium', () => existsSync('/usr/bin/chromium'));
}

/** Runs a command in the repo with inherited output; throws on a non-zero exit. */
export function run(cmd, args, env, opts = {}) {
  const r = spawnSync(cmd, args, { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, ...env }, ...opts });
  if (r.status !== 0) {
    const err = new Error(`${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`);
    err.exitCode = r.status ?? 1;
    throw err;
  }
}

/** Local binaries from node_modules/.bin. */
export const bin = (name) => join(REPO_ROOT, 'node_modules', '.bin', name);

/** Builds the web app when web/dist is missing or older than any web source file. */
export function ensureWebBuild(force = false) {
  const index = join(REPO_ROOT, 'web', 'dist', 'index.html');
  if (!force && existsSync(index) && statSync(index).mtimeMs >= newestMtime([join(REPO_ROOT, 'web', 'src'), join(REPO_ROOT, 'shared', 'src'), join(REPO_ROOT, 'web', 'index.html'), join(REPO_ROOT, 'web', 'vite.config.ts')])) return;
  console.log('[setup] building the web app …');
  run(bin('vite'), ['build', '--logLevel', 'warn'], {}, { cwd: join(REPO_ROOT, 'web') });
}

function newestMtime(paths) {
  let newest = 0;
  const walk = (p) => {
    if (!existsSync(p)) return;
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const e of spawnSync('ls', ['-A', p]).stdout.toString().split('\n').filter(Boolean)) walk(join(p, e));
    } else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}
