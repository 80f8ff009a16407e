// Starts Midgray: the local fakes (in development), then the API and web app on one port.
import { resolve } from 'node:path';
import { createDatabase } from '@midgray/db';
import { createApp } from './app.ts';
import { loadEnv } from './config/env.ts';
import { startFakeOAuth } from './fakes/oauth-provider.ts';
import { startFakeSmtp } from './fakes/smtp.ts';
import { createMailer } from './mail/mailer.ts';

const env = loadEnv();
const closers: (() => unknown)[] = [];

if (env.FAKES) {
  const oauth = await startFakeOAuth(env.FAKE_OAUTH_PORT, { clientId: env.GITHUB_CLIENT_ID, clientSecret: env.GITHUB_CLIENT_SECRET });
  const smtp = await startFakeSmtp(env.FAKE_SMTP_PORT, resolve(env.MAILBOX_DIR));
  closers.push(() => oauth.server.close(), () => smtp.server.close(() => undefined));
  console.log(`[fakes] sign-in provider on http://127.0.0.1:${oauth.port}, SMTP on 127.0.0.1:${smtp.port}`);
}

const sequelize = createDatabase(env.DATABASE_URL);
const mailer = createMailer(env);
const { app, close, startWorkers } = createApp({ env, sequelize, mailer });
// Job workers (footage checksum and probe, upload sweep) run in this process too; more worker
// processes can run the same code elsewhere, since the queue lives in PostgreSQL.
await startWorkers();
const server = app.listen(env.PORT, env.HOST, () => {
  console.log(`[api] listening on http://${env.HOST}:${env.PORT}`);
});

let stopping = false;
async function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[api] ${signal}: closing`);
  server.close();
  server.closeAllConnections?.();
  // The app first (it sends mail still waiting in a batch), then the fakes and the mailer it used.
  await close();
  for (const c of closers) await c();
  mailer.close();
  await sequelize.close();
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
