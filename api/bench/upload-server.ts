/**
 * Child process of upload.bench.ts: the real app (tus at /api/uploads) on 127.0.0.1 with its fake
 * sign-in provider, storing uploads under BENCH_STORAGE_DIR. No job workers run here, so the
 * checksum of the finished file does not mix into the memory figure. Sends { ready, port, oauthPort }.
 */
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { createDatabase } from '@midgray/db';
import { createApp } from '../src/app.ts';
import { loadEnv } from '../src/config/env.ts';
import { startFakeOAuth } from '../src/fakes/oauth-provider.ts';
import { createMailer } from '../src/mail/mailer.ts';

const storage = process.env.BENCH_STORAGE_DIR!;
const oauth = await startFakeOAuth(0, { clientId: 'bench-client', clientSecret: 'bench-secret' });
const env = loadEnv({
  ...process.env,
  NODE_ENV: 'test',
  PUBLIC_URL: 'http://127.0.0.1:4999',
  GITHUB_CLIENT_ID: 'bench-client',
  GITHUB_CLIENT_SECRET: 'bench-secret',
  FAKE_OAUTH_PORT: String(oauth.port),
  MAILBOX_DIR: join(storage, 'mail'),
  STORAGE_DIR: storage,
  UPLOAD_DISK_RESERVE_BYTES: '0',
  WEB_DIST: join(storage, 'no-web'),
  UPLOAD_MAX_BYTES: String(4 * 1024 ** 3),
});
const sequelize = createDatabase(env.DATABASE_URL);
const { app } = createApp({ env, sequelize, mailer: createMailer(env) }, { signInPerMinute: 1_000_000 });
const server = app.listen(0, '127.0.0.1', () => {
  process.send!({ type: 'ready', port: (server.address() as AddressInfo).port, oauthPort: oauth.port });
});
process.on('disconnect', () => process.exit(0));
