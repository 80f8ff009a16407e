/**
 * Board benchmark (issue 3, "Tests and figures"): GET /api/channels/:id/board on loopback with
 * autocannon at 20 connections, for a channel of 10 and of 1,000 episodes (each with gear, a test
 * with its 19 spec-sheet lines, footage and publish slots, all invented), as the board page asks
 * for it (the first 20 cards of each column with every column's counts), and once with a title
 * search and the person filter (the filters run in the same statement). Prints requests/s, p50,
 * p95 and p99 latency, SQL statements per request, and the ratio to two floors measured in the same
 * run: GET /api/health (no session, one `SELECT 1`) and GET /api/channels/:id (signed in, one
 * membership lookup). Target: p95 < 50 ms at 1,000 episodes, and the same statement count at 10
 * and 1,000. The app runs in a child process (board-server.ts) so the load generator does not
 * share its event loop.
 *
 * Run: `npm run bench` (all benches), or DATABASE_URL=… npx tsx api/bench/board.bench.ts [seconds]
 */
import { fork, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { QueryTypes } from 'sequelize';
import { createDatabase, migrateUp } from '@midgray/db';

const SECONDS = Math.max(3, Number(process.argv[2] ?? 10));
const CONNECTIONS = 20;
const TARGET_P95_MS = 50;
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set: run `npm run bench`, which starts the bench database');
  process.exit(2);
}

const here = dirname(fileURLToPath(import.meta.url));
const db = createDatabase(url);
await migrateUp(db);

// ---------------------------------------------------------------------------------------------------
// The app in a child process

interface Server {
  base: string;
  oauth: string;
  counts: () => Promise<{ statements: number; sequelizeStatements: number }>;
  child: ChildProcess;
}

/** Starts the app (board-server.ts) in a child process; `env` adds to its environment. */
async function startServer(env: Record<string, string> = {}): Promise<Server> {
  const child = fork(join(here, 'board-server.ts'), [], {
    execArgv: ['--import', 'tsx', ...(process.env.BENCH_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`] : [])],
    env: { ...process.env, DATABASE_URL: url, ...env },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  const [ready] = (await once(child, 'message')) as [{ port: number; oauthPort: number }];
  return {
    base: `http://127.0.0.1:${ready.port}`,
    oauth: `http://127.0.0.1:${ready.oauthPort}`,
    child,
    counts: async () => {
      child.send({ type: 'counts' });
      const [m] = (await once(child, 'message')) as [{ statements: number; sequelizeStatements: number }];
      return m;
    },
  };
}

const servers: Server[] = [];
const app = await startServer();
servers.push(app);
const base = app.base;
const oauth = app.oauth;

// ---------------------------------------------------------------------------------------------------
// Sign in as a user would (authorization-code flow against the fake provider)

let cookie = '';
function keepCookie(res: Response) {
  const set = res.headers.getSetCookie?.() ?? [];
  for (const c of set) if (c.startsWith('midgray.sid=')) cookie = c.split(';')[0];
}

async function signIn(): Promise<{ userId: string; csrf: string }> {
  const account = await (await fetch(`${oauth}/_fake/accounts`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Bench Producer', email: `bench-${Date.now()}@crew.test` }) })).json();
  const start = await fetch(`${base}/api/auth/github`, { redirect: 'manual' });
  keepCookie(start);
  const authorize = new URL(start.headers.get('location')!);
  const form = new URLSearchParams({ account: account.id, redirect_uri: authorize.searchParams.get('redirect_uri')!, state: authorize.searchParams.get('state') ?? '' });
  const decided = await fetch(`${oauth}/login/oauth/authorize`, { method: 'POST', body: form, redirect: 'manual' });
  const callback = new URL(decided.headers.get('location')!);
  const done = await fetch(`${base}${callback.pathname}${callback.search}`, { headers: { cookie }, redirect: 'manual' });
  keepCookie(done);
  const me = await (await fetch(`${base}/api/auth/me`, { headers: { cookie } })).json();
  const csrf = (await (await fetch(`${base}/api/auth/csrf`, { headers: { cookie } })).json()).token as string;
  return { userId: me.user.id, csrf };
}

// ---------------------------------------------------------------------------------------------------
// Seed: a channel with `count` episodes spread over the six stages

const hostOf = new Map<string, string>();

async function seededChannel(count: number, csrf: string): Promise<string> {
  const res = await fetch(`${base}/api/channels`, { method: 'POST', headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': csrf }, body: JSON.stringify({ name: `Bench ${count}`, timeZone: 'Europe/Berlin' }) });
  if (res.status !== 201) throw new Error(`channel not created: ${res.status} ${await res.text()}`);
  const channelId = (await res.json()).id as string;
  const q = (sql: string, replacements: Record<string, unknown> = {}) => db.query(sql, { replacements: { c: channelId, n: count, ...replacements } });
  await q(`WITH u AS (INSERT INTO users (provider, provider_id, login, name)
                      SELECT 'bench', gen_random_uuid()::text, 'bench-' || r || '-' || gen_random_uuid(), initcap(r) || ' Benchperson'
                        FROM unnest(ARRAY['host','editor','producer']) AS r RETURNING id, split_part(login, '-', 2) AS role)
           INSERT INTO memberships (channel_id, user_id, role) SELECT :c, id, role FROM u`);
  await q(`INSERT INTO gear (channel_id, kind, make, model, serial, source, sponsored, received_on, due_back_on, embargo_at, embargo_zone)
           SELECT :c, (ARRAY['body','lens','light','recorder'])[1 + i % 4], (ARRAY['Korvala','Brightwell','Lumetra','Datavault'])[1 + i % 4],
                  'Bench ' || i, 'SN-' || i, (ARRAY['loaner','rental','owned','purchased'])[1 + i % 4], i % 7 = 0,
                  current_date - 10, CASE WHEN i % 3 = 0 THEN current_date + (i % 20) END,
                  CASE WHEN i % 5 = 0 THEN now() + (i || ' hours')::interval END, CASE WHEN i % 5 = 0 THEN 'Europe/Berlin' END
             FROM generate_series(1, 40) AS i`);
  await q(`WITH people AS (SELECT array_agg(user_id ORDER BY role) AS ids FROM memberships WHERE channel_id = :c),
                made AS (
                  INSERT INTO episodes (channel_id, title, stage, position, host_id, editor_id, shoot_date, target_publish_week)
                  SELECT :c, 'Bench episode ' || i || ': noise and latitude of body ' || (i % 40), (ARRAY['plan','shoot','grade','approval','scheduled','live'])[1 + i % 6],
                         i / 6, people.ids[1 + i % 4], people.ids[1 + (i + 1) % 4], current_date + (i % 30) - 10, date_trunc('week', current_date + (i % 60))::date
                    FROM generate_series(0, :n - 1) AS i, people
                  RETURNING id, stage, (regexp_match(title, '[0-9]+'))[1]::int AS i)
           , g AS (SELECT array_agg(id ORDER BY model) AS ids FROM gear WHERE channel_id = :c)
           , eg AS (INSERT INTO episode_gear (episode_id, gear_id)
                    SELECT DISTINCT made.id, g.ids[1 + (made.i * k) % 40] FROM made, g, generate_series(1, 3) AS k)
           , t AS (INSERT INTO tests (episode_id, kind, name) SELECT id, 'iso_sweep', 'ISO sweep' FROM made RETURNING id, episode_id)
           , l AS (INSERT INTO spec_sheet_lines (test_id, key, label, value, checked, required, position)
                   SELECT t.id, 'line_' || p, 'Line ' || p, CASE WHEN p % 6 = 0 THEN '' ELSE 'value' END, p % 4 <> 0, p < 17, p
                     FROM t, generate_series(0, 18) AS p)
           , f AS (INSERT INTO footage (channel_id, episode_id, kind, status, original_name, format, size_bytes, storage_key)
                   SELECT :c, made.id, 'camera_original', 'verified', 'A00' || k || '.mov', 'mov', 1000000, 'bench/' || made.id || '/' || k
                     FROM made, generate_series(1, 3) AS k WHERE made.stage NOT IN ('plan', 'shoot'))
           INSERT INTO publish_slots (episode_id, starts_at, zone, status, decided_at)
           SELECT id, now() + ((i % 20) || ' days')::interval, 'America/New_York',
                  CASE WHEN stage = 'approval' THEN 'proposed' ELSE 'approved' END, CASE WHEN stage = 'approval' THEN NULL ELSE now() END
             FROM made WHERE stage IN ('approval', 'scheduled', 'live')`);
  const [{ host }] = await db.query<{ host: string }>(`SELECT user_id AS host FROM memberships WHERE channel_id = :c AND role = 'host'`, { replacements: { c: channelId }, type: QueryTypes.SELECT });
  hostOf.set(channelId, host);
  const [{ n }] = await db.query<{ n: number }>(`SELECT count(*)::int AS n FROM episodes WHERE channel_id = :c`, { replacements: { c: channelId }, type: QueryTypes.SELECT });
  if (n !== count) throw new Error(`seeded ${n} episodes, wanted ${count}`);
  return channelId;
}

// ---------------------------------------------------------------------------------------------------
// Measure

interface Figures {
  name: string;
  path: string;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  non2xx: number;
  bytes: number;
  oneRequest: { statements: number; sequelize: number };
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length) - 1; // nearest-rank definition
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))];
}

/** Waits until the app has finished every request still queued (its statement count stops moving). */
async function settle(server: Server) {
  let last = await server.counts();
  for (let quiet = 0; quiet < 3; ) {
    await new Promise((r) => setTimeout(r, 300));
    const now = await server.counts();
    quiet = now.statements === last.statements ? quiet + 1 : 0;
    last = now;
  }
}

/**
 * Statements of one request sent alone to an idle app: the fewest of three tries (a session-store
 * write of an earlier request can still land inside a try on a busy machine; the ORM count must agree).
 */
async function statementsOfOneRequest(server: Server, path: string, headers: Record<string, string>) {
  const seen: { statements: number; sequelize: number; bytes: number }[] = [];
  for (let i = 0; i < 3; i++) {
    await settle(server);
    const c0 = await server.counts();
    const res = await fetch(`${server.base}${path}`, { headers });
    if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`);
    const bytes = (await res.arrayBuffer()).byteLength;
    const c1 = await server.counts();
    seen.push({ statements: c1.statements - c0.statements, sequelize: c1.sequelizeStatements - c0.sequelizeStatements, bytes });
  }
  if (new Set(seen.map((s) => s.sequelize)).size !== 1) throw new Error(`${path}: ORM statement counts vary between identical requests: ${JSON.stringify(seen)}`);
  return seen.reduce((a, b) => (b.statements < a.statements ? b : a));
}

async function measure(name: string, path: string, signedIn: boolean, server: Server = app): Promise<Figures> {
  const headers: Record<string, string> = signedIn ? { cookie } : {};
  // Warm-up (JIT, pools, the optional-table probe), then one request alone, then the measured run.
  await autocannon({ url: `${server.base}${path}`, connections: CONNECTIONS, duration: 2, headers });
  const one = await statementsOfOneRequest(server, path, headers);
  const latencies: number[] = [];
  const instance = autocannon({ url: `${server.base}${path}`, connections: CONNECTIONS, duration: SECONDS, headers });
  instance.on('response', (_client: unknown, _status: number, _bytes: number, responseTime: number) => latencies.push(responseTime));
  const result = await instance;
  await settle(server);
  latencies.sort((a, b) => a - b);
  return {
    name,
    path,
    rps: result.requests.average,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    non2xx: result.non2xx + result.errors,
    bytes: one.bytes,
    oneRequest: { statements: one.statements, sequelize: one.sequelize },
  };
}

const fmt = (n: number, digits = 1) => n.toFixed(digits);

try {
  const { csrf } = await signIn();
  const small = await seededChannel(10, csrf);
  const large = await seededChannel(1000, csrf);
  console.log(`Board benchmark: autocannon, ${CONNECTIONS} connections, ${SECONDS} s per endpoint (after 2 s warm-up), app in a child process on loopback`);
  console.log(`node ${process.version}; invented data: 10 and 1,000 episodes, each with gear, a 19-line spec sheet, footage and slots`);
  const rows = [
    await measure('floor: health (no session)', '/api/health', false),
    await measure('floor: channel (signed in)', `/api/channels/${small}`, true),
    await measure('board, 10 episodes', `/api/channels/${small}/board`, true),
    await measure('board, 1,000 episodes', `/api/channels/${large}/board`, true),
    await measure('board, 1,000, search+person', `/api/channels/${large}/board?q=latitude+body+1&personId=${hostOf.get(large)}`, true),
  ];
  // The same two board reads on a second app process whose board reads are not collapsed.
  const plain = await startServer({ BENCH_NO_COALESCING: '1' });
  servers.push(plain);
  rows.push(await measure('board, 10, not collapsed', `/api/channels/${small}/board`, true, plain));
  rows.push(await measure('board, 1,000, not collapsed', `/api/channels/${large}/board`, true, plain));
  const [health, channel] = rows;
  console.log('');
  console.log(
    ['endpoint'.padEnd(30), 'req/s'.padStart(8), 'p50 ms'.padStart(7), 'p95 ms'.padStart(7), 'p99 ms'.padStart(7), 'bytes'.padStart(8), 'SQL/req'.padStart(8), 'of which ORM'.padStart(13), 'p95 ÷ health'.padStart(13), 'p95 ÷ channel'.padStart(14), 'non-2xx'.padStart(8)].join(' '),
  );
  for (const r of rows) {
    console.log(
      [
        r.name.padEnd(30),
        fmt(r.rps, 0).padStart(8),
        fmt(r.p50).padStart(7),
        fmt(r.p95).padStart(7),
        fmt(r.p99).padStart(7),
        String(r.bytes).padStart(8),
        String(r.oneRequest.statements).padStart(8),
        String(r.oneRequest.sequelize).padStart(13),
        `${fmt(r.p95 / health.p95, 2)}×`.padStart(13),
        `${fmt(r.p95 / channel.p95, 2)}×`.padStart(14),
        String(r.non2xx).padStart(8),
      ].join(' '),
    );
  }
  const [, , b10, b1000] = rows;
  console.log('The board sends the first 20 cards of each column (at most 120) and every column\'s counts; "Show more" asks for more.');
  console.log('');
  console.log('SQL/req: statements of one request sent alone to the idle app (fewest of 3 tries), session store included;');
  console.log('"of which ORM": those sent through Sequelize (sign-in lookup, membership, the board statement).');
  console.log('"not collapsed": concurrent reads of one board each run their own statement (FreshCoalescer off).');
  console.log(`requests/s ratio board(1,000) ÷ health: ${fmt(b1000.rps / health.rps, 3)}; board(1,000) ÷ channel: ${fmt(b1000.rps / channel.rps, 3)}`);
  const sameCount = b10.oneRequest.statements === b1000.oneRequest.statements && b10.oneRequest.sequelize === b1000.oneRequest.sequelize;
  console.log(`statements per board request at 10 and 1,000 episodes: ${b10.oneRequest.statements} and ${b1000.oneRequest.statements} → ${sameCount ? 'the same' : 'DIFFERENT'}`);
  console.log(`p95 at 1,000 episodes: ${fmt(b1000.p95)} ms → ${b1000.p95 < TARGET_P95_MS ? 'meets' : 'MISSES'} the ${TARGET_P95_MS} ms target`);
  if (rows.some((r) => r.non2xx > 0)) throw new Error('some requests failed');
  if (!sameCount) process.exitCode = 1;
} finally {
  for (const s of servers) s.child.kill();
  await db.close();
}
