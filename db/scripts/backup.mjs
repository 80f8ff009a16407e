// `npm run db:backup [DIR]`: a pg_dump archive of the database plus a manifest of the uploaded
// files (path, size, SHA-256), written to DIR (default .data/backups/midgray-<time>/).
// Uses DATABASE_URL when set, else starts the development cluster.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, existsSync, mkdirSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { DATA_ROOT, ensurePostgres, findPgBin, REPO_ROOT } from './postgres.mjs';

/** Returns { path, bytes, sha256 } for every file under `dir` (streamed, never loaded whole). */
export async function storageManifest(dir) {
  const files = [];
  const walk = (d) => {
    if (!existsSync(d)) return;
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.isFile()) files.push(p);
    }
  };
  walk(dir);
  const out = [];
  for (const f of files.sort()) {
    const hash = createHash('sha256');
    await new Promise((ok, fail) => createReadStream(f).on('data', (c) => hash.update(c)).on('end', ok).on('error', fail));
    out.push({ path: relative(dir, f), bytes: statSync(f).size, sha256: hash.digest('hex') });
  }
  return out;
}

/** Parses a postgres:// URL into pg_dump/pg_restore arguments and the password. */
export function connArgs(url) {
  const u = new URL(url);
  return {
    args: ['-h', u.hostname, '-p', u.port || '5432', '-U', decodeURIComponent(u.username), '-d', decodeURIComponent(u.pathname.slice(1))],
    password: decodeURIComponent(u.password),
    database: decodeURIComponent(u.pathname.slice(1)),
  };
}

export async function backup({ url, outDir, storageDir }) {
  mkdirSync(outDir, { recursive: true });
  const { args, password, database } = connArgs(url);
  const dumpFile = join(outDir, 'database.dump');
  execFileSync(join(findPgBin(), 'pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', '-f', dumpFile, ...args], { env: { ...process.env, PGPASSWORD: password }, stdio: ['ignore', 'inherit', 'inherit'], cwd: '/' });
  const files = await storageManifest(storageDir);
  const manifest = {
    createdAt: new Date().toISOString(),
    database,
    dump: 'database.dump',
    dumpBytes: statSync(dumpFile).size,
    storageDir: resolve(storageDir),
    files,
    totalFileBytes: files.reduce((s, f) => s + f.bytes, 0),
  };
  writeFileSync(join(outDir, 'manifest.json'), JSON.stringify(manifest, null, 2));
  return { dumpFile, manifest };
}

if (process.argv[1] && resolve(process.argv[1]) === resolve(new URL(import.meta.url).pathname)) {
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\..*/, '').replace('T', '-');
  const outDir = resolve(process.argv[2] ?? join(DATA_ROOT, 'backups', `midgray-${stamp}`));
  const url = process.env.DATABASE_URL ?? ensurePostgres({ name: 'pg', port: 54329, database: 'midgray' }).url;
  const storageDir = resolve(REPO_ROOT, process.env.STORAGE_DIR ?? '.data/storage');
  const { dumpFile, manifest } = await backup({ url, outDir, storageDir });
  console.log(`[backup] ${dumpFile} (${manifest.dumpBytes} bytes) and manifest.json with ${manifest.files.length} file(s), ${manifest.totalFileBytes} bytes`);
  console.log(`[backup] copy ${manifest.storageDir} alongside it; restore with: npm run db:restore ${dumpFile}`);
}
