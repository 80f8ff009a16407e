/**
 * Child process of board.bench.ts: the real app on 127.0.0.1 (a free port) with its fake sign-in
 * provider, counting every SQL statement sent to PostgreSQL — through Sequelize and through the
 * session store's own pool alike — so the bench can report statements per request.
 * Talks to its parent over IPC: sends { ready, port, oauthPort }, answers { type: 'counts' }.
 */
import { mkdtempSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { createDatabase } from '@midgray/db';
import { createApp } from '../src/app.ts';
import { FreshCoalescer } from '../src/lib/fresh-coalescer.ts';
import { loadEnv } from '../src/config/env.ts';
import { startFakeOAuth } from '../src/fakes/oauth-provider.ts';
import { createMailer } from '../src/mail/mailer.ts';

let statements = 0;
let sequelizeStatements = 0;
const query = pg.Client.prototype.query;
pg.Client.prototype.query = function countedQuery(this: pg.Client, ...args: unknown[]) {
  statements++;
  return (query as (...a: unknown[]) => unknown).apply(this, args);
} as typeof query;

// BENCH_NO_COALESCING=1: every board request runs its own statement (the figure without collapsing).
if (process.env.BENCH_NO_COALESCING === '1') {
  FreshCoalescer.prototype.get = function uncoalesced<T>(_key: string, load: () => Promise<T>) {
    return load();
  };
}

const oauth = await startFakeOAuth(0, { clientId: 'bench-client', clientSecret: 'bench-secret' });
const scratch = mkdtempSync(join(tmpdir(), 'midgray-bench-'));
const env = loadEnv({
  ...process.env,
  NODE_ENV: 'test',
  PUBLIC_URL: 'http://127.0.0.1:4999',
  GITHUB_CLIENT_ID: 'bench-client',
  GITHUB_CLIENT_SECRET: 'bench-secret',
  FAKE_OAUTH_PORT: String(oauth.port),
  MAILBOX_DIR: join(scratch, 'mail'),
  STORAGE_DIR: join(scratch, 'storage'),
  WEB_DIST: join(scratch, 'no-web'),
});
const sequelize = createDatabase(env.DATABASE_URL, { logging: () => void sequelizeStatements++ });
const { app } = createApp({ env, sequelize, mailer: createMailer(env) }, { signInPerMinute: 1_000_000 });
const server = app.listen(0, '127.0.0.1', () => {
  process.send!({ type: 'ready', port: (server.address() as AddressInfo).port, oauthPort: oauth.port });
});
process.on('message', (m: { type: string }) => {
  if (m.type === 'counts') process.send!({ type: 'counts', statements, sequelizeStatements });
});
process.on('disconnect', () => process.exit(0));
process.on('SIGTERM', () => process.exit(0));
