// `npm test`: the same set-up as `npm start` against separate test databases, then every test:
// unit and API integration tests (vitest) and browser tests (Playwright in Debian's chromium).
// Exits non-zero on any failure and ends with one summary line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { bin, ensureChromium, ensureFfmpeg, ensureNpmPackages, ensurePostgres, ensureWebBuild, REPO_ROOT, run, stopPostgres } from './bootstrap.mjs';

const CLUSTER = 'pg-test';
const PG_PORT = Number(process.env.PG_TEST_PORT ?? 54339);
const reports = join(REPO_ROOT, '.data', 'test-reports');
const only = process.argv.slice(2); // e.g. `npm test -- unit` or `npm test -- e2e`
const want = (k) => only.length === 0 || only.includes(k);

let pg;
let exitCode = 0;
const totals = { passed: 0, failed: 0, skipped: 0 };

try {
  ensureNpmPackages();
  ensureFfmpeg();
  if (want('e2e')) ensureChromium();
  pg = ensurePostgres({ name: CLUSTER, port: PG_PORT, database: 'midgray_test', fast: true, freshDatabase: true });
  const e2eDb = ensurePostgres({ name: CLUSTER, port: PG_PORT, database: 'midgray_e2e', fast: true, freshDatabase: true });
  rmSync(reports, { recursive: true, force: true });
  mkdirSync(reports, { recursive: true });
  const baseEnv = { NODE_ENV: 'test', DATABASE_URL: pg.url, E2E_DATABASE_URL: e2eDb.url, PG_ADMIN_URL: pg.adminUrl };

  run(bin('tsx'), ['db/src/cli/migrate.ts'], baseEnv);

  if (want('unit')) {
    const r = spawnSync(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${join(reports, 'vitest.json')}`], { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, ...baseEnv } });
    if (r.status !== 0) exitCode = 1;
    const file = join(reports, 'vitest.json');
    if (existsSync(file)) {
      const j = JSON.parse(readFileSync(file, 'utf8'));
      totals.passed += j.numPassedTests ?? 0;
      totals.failed += (j.numFailedTests ?? 0) + (j.numFailedTestSuites && !j.numFailedTests ? j.numFailedTestSuites : 0);
      totals.skipped += (j.numPendingTests ?? 0) + (j.numTodoTests ?? 0);
    } else exitCode = 1;
  }

  if (want('e2e')) {
    ensureWebBuild();
    run(bin('tsx'), ['db/src/cli/migrate.ts'], { ...baseEnv, DATABASE_URL: e2eDb.url });
    const r = spawnSync(bin('playwright'), ['test'], { cwd: REPO_ROOT, stdio: 'inherit', env: { ...process.env, ...baseEnv, PLAYWRIGHT_JSON_OUTPUT_NAME: join(reports, 'playwright.json') } });
    if (r.status !== 0) exitCode = 1;
    const file = join(reports, 'playwright.json');
    if (existsSync(file)) {
      const s = JSON.parse(readFileSync(file, 'utf8')).stats ?? {};
      totals.passed += (s.expected ?? 0) + (s.flaky ?? 0);
      totals.failed += s.unexpected ?? 0;
      totals.skipped += s.skipped ?? 0;
    } else exitCode = 1;
  }
} catch (err) {
  console.error(`[test] ${err.message}`);
  exitCode = err.exitCode ?? 1;
} finally {
  if (pg?.startedHere) stopPostgres(CLUSTER);
}
if (totals.failed > 0) exitCode = 1;
console.log(`\n${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`);
process.exit(exitCode);
