// `npm run db:restore FILE`: restores a backup (database.dump, or its folder) into an EMPTY
// database (DATABASE_URL, else the development cluster's), then checks the uploaded files
// against the manifest beside the dump and reports any missing or changed file.
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { connArgs, storageManifest } from './backup.mjs';
import { ensurePostgres, findPgBin, REPO_ROOT } from './postgres.mjs';

export async function restore({ url, file, storageDir }) {
  const dumpFile = existsSync(file) && statSync(file).isDirectory() ? join(file, 'database.dump') : file;
  if (!existsSync(dumpFile)) throw new Error(`No backup at ${dumpFile}: pass the database.dump file or its folder`);
  const { args, password, database } = connArgs(url);
  const env = { ...process.env, PGPASSWORD: password };
  const tables = execFileSync(join(findPgBin(), 'psql'), [...args, '-tAc', "SELECT count(*) FROM pg_tables WHERE schemaname NOT IN ('pg_catalog','information_schema')"], { env, cwd: '/' }).toString().trim();
  if (tables !== '0') throw new Error(`Database ${database} is not empty (${tables} tables): restore only into an empty database, e.g. createdb a new one and point DATABASE_URL at it`);
  execFileSync(join(findPgBin(), 'pg_restore'), ['--no-owner', '--no-privileges', '--exit-on-error', ...args, dumpFile], { env, stdio: ['ignore', 'inherit', 'inherit'], cwd: '/' });
  const manifestFile = join(dirname(dumpFile), 'manifest.json');
  const problems = [];
  if (existsSync(manifestFile)) {
    const manifest = JSON.parse(readFileSync(manifestFile, 'utf8'));
    const present = new Map((await storageManifest(storageDir)).map((f) => [f.path, f]));
    for (const f of manifest.files) {
      const p = present.get(f.path);
      if (!p) problems.push(`missing file ${f.path}`);
      else if (p.sha256 !== f.sha256) problems.push(`changed file ${f.path}`);
    }
  } else problems.push('no manifest.json beside the dump: uploaded files were not checked');
  return { problems };
}

if (process.argv[1] && resolve(process.argv[1]) === resolve(new URL(import.meta.url).pathname)) {
  const file = process.argv[2];
  if (!file) {
    console.error('Usage: npm run db:restore <backup folder or database.dump>');
    process.exit(2);
  }
  try {
    const url = process.env.DATABASE_URL ?? ensurePostgres({ name: 'pg', port: 54329, database: 'midgray' }).url;
    const { problems } = await restore({ url, file: resolve(file), storageDir: resolve(REPO_ROOT, process.env.STORAGE_DIR ?? '.data/storage') });
    console.log('[restore] database restored');
    for (const p of problems) console.warn(`[restore] ${p}`);
  } catch (err) {
    console.error(`[restore] ${err.message}`);
    process.exit(1);
  }
}
