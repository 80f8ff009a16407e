// `npm start` (and `npm run dev` with --dev): all the set-up, then Midgray on one port.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { bin, ensureFfmpeg, ensureNpmPackages, ensurePostgres, ensureWebBuild, REPO_ROOT, run, stopPostgres } from './bootstrap.mjs';

const dev = process.argv.includes('--dev');
const PORT = Number(process.env.PORT ?? 4100);
const VITE_PORT = Number(process.env.VITE_PORT ?? 5173);
const PUBLIC_URL = process.env.PUBLIC_URL ?? (dev ? `http://127.0.0.1:${VITE_PORT}` : `http://127.0.0.1:${PORT}`);
const CLUSTER = 'pg';

// Ctrl-C during set-up: the step running then gets it too and fails, and the catch below stops
// what was started. Without a listener Node would exit at once and leave PostgreSQL running.
let interrupted = false;
const onEarlySignal = () => {
  interrupted = true;
};
process.on('SIGINT', onEarlySignal);
process.on('SIGTERM', onEarlySignal);
const step = (fn) => {
  const out = fn();
  if (interrupted) throw Object.assign(new Error('interrupted during set-up'), { exitCode: 130 });
  return out;
};

let pg;
try {
  step(() => ensureNpmPackages());
  step(() => (pg = ensurePostgres({ name: CLUSTER, port: Number(process.env.PG_PORT ?? 54329), database: 'midgray' })));
  step(() => ensureFfmpeg());
  const env = { DATABASE_URL: process.env.DATABASE_URL ?? pg.url, NODE_ENV: 'development', PORT: String(PORT), PUBLIC_URL };
  step(() => run(bin('tsx'), ['db/src/cli/migrate.ts'], env));
  step(() => run(bin('tsx'), ['db/src/cli/seed.ts'], env));
  if (!dev) step(() => ensureWebBuild());
  process.off('SIGINT', onEarlySignal);
  process.off('SIGTERM', onEarlySignal);

  const children = [];
  const server = spawn(bin('tsx'), dev ? ['watch', '--clear-screen=false', 'api/src/server.ts'] : ['api/src/server.ts'], { cwd: REPO_ROOT, stdio: ['ignore', 'inherit', 'inherit'], env: { ...process.env, ...env } });
  children.push(server);
  if (dev) {
    children.push(spawn(bin('vite'), ['--port', String(VITE_PORT), '--strictPort'], { cwd: join(REPO_ROOT, 'web'), stdio: ['ignore', 'inherit', 'inherit'], env: { ...process.env, API_PORT: String(PORT) } }));
  }

  // Print the banner once the server answers, so the URL works when people read it.
  const healthUrl = `http://127.0.0.1:${PORT}/api/health`;
  const waitForHealth = async () => {
    for (let i = 0; i < 120; i++) {
      try {
        if ((await fetch(healthUrl)).ok) return true;
      } catch {
        /* not up yet */
      }
      await new Promise((r) => setTimeout(r, 500));
    }
    return false;
  };
  waitForHealth().then((up) => {
    if (!up) return;
    console.log(`
  Midgray is running at ${PUBLIC_URL}
  Sign in through the local sign-in provider with one of the demo accounts
  of the channel "Lumen Test Bench":
    Ilse Marrow    host      ilse@lumen-bench.test
    Dario Fenwick  editor    dario@lumen-bench.test
    Noor Halvard   producer  noor@lumen-bench.test
    Ada Quillon    admin     ada@lumen-bench.test
    Sami Okaro     (not a member yet: invite sami@freelance-cuts.test as admin)
  Captured e-mail: ${PUBLIC_URL}/mailbox
  Ctrl-C stops the app and its PostgreSQL.
`);
  });

  let stopping = false;
  const stop = (code) => {
    if (stopping) return;
    stopping = true;
    for (const c of children) c.kill('SIGTERM');
    setTimeout(() => {
      if (process.env.DATABASE_URL === undefined && pg.startedHere) stopPostgres(CLUSTER);
      process.exit(code);
    }, 1500);
  };
  process.on('SIGINT', () => stop(0));
  process.on('SIGTERM', () => stop(0));
  server.on('exit', (code) => {
    if (!stopping) {
      console.error(`[start] the server stopped (exit ${code})`);
      stop(code ?? 1);
    }
  });
} catch (err) {
  // A failed step, or Ctrl-C during set-up (the running step dies with it): stop what we started.
  console.error(`[start] ${err.message}`);
  if (process.env.DATABASE_URL === undefined && pg?.startedHere) stopPostgres(CLUSTER);
  process.exit(err.exitCode ?? 1);
}
