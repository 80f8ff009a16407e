// `npm run bench`: runs every api/bench/*.bench.ts in turn against a private bench database in the
// test cluster (`node db/scripts/postgres.mjs start test midgray_bench`), printing each one's figures.
// Exits non-zero when a bench fails or misses what it checks.
import { execFileSync, spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { bin, ensureNpmPackages, REPO_ROOT } from './bootstrap.mjs';

ensureNpmPackages();
const url = execFileSync(process.execPath, [join(REPO_ROOT, 'db', 'scripts', 'postgres.mjs'), 'start', 'test', 'midgray_bench'], { cwd: REPO_ROOT })
  .toString()
  .trim()
  .split('\n')
  .pop();
const benches = readdirSync(join(REPO_ROOT, 'api', 'bench'))
  .filter((f) => f.endsWith('.bench.ts'))
  .sort();
let failed = 0;
for (const file of benches) {
  console.log(`\n=== ${file} ===`);
  const r = spawnSync(bin('tsx'), [join('api', 'bench', file)], { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, DATABASE_URL: url } });
  if (r.status !== 0) {
    failed++;
    console.log(`[bench] ${file} failed (exit ${r.status ?? r.signal})`);
  }
}
console.log(`\n[bench] ${benches.length - failed} of ${benches.length} benches finished`);
process.exit(failed ? 1 : 0);
