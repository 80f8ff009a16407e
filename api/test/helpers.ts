// Test harness: the real app in-process against the test PostgreSQL, with its own fake sign-in
// provider and SMTP on free loopback ports. Every test makes its own users and channels.
import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { SMTPServer } from 'smtp-server';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent.js';
import { Channel, createDatabase, Membership } from '@midgray/db';
import type { Role } from '@midgray/shared';
import { createApp, type AppOptions } from '../src/app.ts';
import { loadEnv } from '../src/config/env.ts';
import { startFakeOAuth } from '../src/fakes/oauth-provider.ts';
import { listCapturedMail, startFakeSmtp } from '../src/fakes/smtp.ts';
import { createMailer } from '../src/mail/mailer.ts';

export interface TestContext {
  app: ReturnType<typeof createApp>['app'];
  routes: ReturnType<typeof createApp>['routes'];
  /** The app's job queue, services and worker start (footage checks run only after startWorkers()). */
  built: ReturnType<typeof createApp>;
  sequelize: ReturnType<typeof createDatabase>;
  oauthUrl: string;
  mailboxDir: string;
  /** The app's mailer (to this context's SMTP fake), for functions other features call directly. */
  mailer: ReturnType<typeof createMailer>;
  /** Messages captured by this context's SMTP fake, newest first. */
  mails: () => ReturnType<typeof listCapturedMail>;
  close: () => Promise<void>;
}

/** Starts fakes and builds the app; call `close()` in afterAll. */
export async function startTestApp(opts: AppOptions & { env?: Record<string, string> } = {}): Promise<TestContext> {
  const mailboxDir = await mkdtemp(join(tmpdir(), 'midgray-mail-'));
  const oauth = await startFakeOAuth(0, { clientId: 'test-client', clientSecret: 'test-secret' });
  const smtp = await startFakeSmtp(0, mailboxDir);
  const oauthUrl = `http://127.0.0.1:${oauth.port}`;
  const env = loadEnv({
    ...process.env,
    NODE_ENV: 'test',
    PUBLIC_URL: 'http://127.0.0.1:4999',
    GITHUB_CLIENT_ID: 'test-client',
    GITHUB_CLIENT_SECRET: 'test-secret',
    FAKE_OAUTH_PORT: String(oauth.port),
    FAKE_SMTP_PORT: String(smtp.port),
    // Named explicitly, as production needs them (the fakes' own addresses).
    OAUTH_AUTHORIZATION_URL: `${oauthUrl}/login/oauth/authorize`,
    OAUTH_TOKEN_URL: `${oauthUrl}/login/oauth/access_token`,
    OAUTH_USER_PROFILE_URL: `${oauthUrl}/user`,
    OAUTH_USER_EMAIL_URL: `${oauthUrl}/user/emails`,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtp.port),
    MAILBOX_DIR: mailboxDir,
    // Tests do not depend on the machine's free space; the reserve itself is tested with a given free space.
    UPLOAD_DISK_RESERVE_BYTES: '0',
    // Mail each verified file at once, so tests need not wait out the batching window (tested on its own).
    FOOTAGE_READY_BATCH_SECONDS: '0',
    STORAGE_DIR: join(mailboxDir, 'storage'),
    WEB_DIST: join(mailboxDir, 'no-web'),
    ...opts.env,
  });
  const sequelize = createDatabase(env.DATABASE_URL);
  const mailer = createMailer(env);
  const built = createApp({ env, sequelize, mailer }, { signInPerMinute: 10_000, invitesPerHour: 10_000, ...opts });
  return {
    app: built.app,
    routes: built.routes,
    built,
    sequelize,
    oauthUrl,
    mailboxDir,
    mailer,
    mails: () => listCapturedMail(mailboxDir),
    close: async () => {
      await built.close();
      mailer.close();
      await sequelize.close();
      await new Promise<void>((r) => (oauth.server as Server).close(() => r()));
      await new Promise<void>((r) => (smtp.server as SMTPServer).close(() => r()));
      await rm(mailboxDir, { recursive: true, force: true });
    },
  };
}

/** A signed-in browser-like client: cookie jar plus the CSRF header on every write. */
export interface Client {
  agent: TestAgent;
  userId: string;
  email: string;
  name: string;
  csrf: string;
  get: (path: string) => request.Test;
  post: (path: string, body?: unknown) => request.Test;
  patch: (path: string, body?: unknown) => request.Test;
  put: (path: string, body?: unknown) => request.Test;
  delete: (path: string, body?: unknown) => request.Test;
}

/** Registers an account at the fake provider (unique e-mail unless given). */
export async function fakeAccount(ctx: TestContext, p: { name?: string; email?: string } = {}) {
  const email = p.email ?? `person-${randomUUID().slice(0, 8)}@crew.test`;
  const res = await fetch(`${ctx.oauthUrl}/_fake/accounts`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: p.name ?? 'Test Person', email }) });
  return (await res.json()) as { id: string; email: string; name: string; login: string };
}

/** Runs the whole OAuth authorization-code flow for `accountId` and returns a signed-in client. */
export async function signIn(ctx: TestContext, account: { id: string; email: string; name: string }): Promise<Client> {
  const agent = request.agent(ctx.app);
  const start = await agent.get('/api/auth/github').expect(302);
  const authorize = new URL(start.headers.location);
  const form = new URLSearchParams({ account: account.id, redirect_uri: authorize.searchParams.get('redirect_uri')!, state: authorize.searchParams.get('state') ?? '' });
  const decided = await fetch(`${ctx.oauthUrl}/login/oauth/authorize`, { method: 'POST', body: form, redirect: 'manual' });
  const callback = new URL(decided.headers.get('location')!);
  const done = await agent.get(callback.pathname + callback.search);
  if (done.status !== 302 || done.headers.location !== '/') throw new Error(`sign-in failed: ${done.status} ${done.headers.location}`);
  const me = await agent.get('/api/auth/me').expect(200);
  const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
  const withCsrf = (t: request.Test, body?: unknown) => {
    t.set('X-CSRF-Token', csrf);
    return body === undefined ? t : t.send(body as object);
  };
  return {
    agent,
    userId: me.body.user.id,
    email: account.email,
    name: account.name,
    csrf,
    get: (p) => agent.get(p),
    post: (p, b) => withCsrf(agent.post(p), b),
    patch: (p, b) => withCsrf(agent.patch(p), b),
    put: (p, b) => withCsrf(agent.put(p), b),
    delete: (p, b) => withCsrf(agent.delete(p), b),
  };
}

/** Signs in a brand-new person. */
export async function newUser(ctx: TestContext, name = 'Test Person') {
  return signIn(ctx, await fakeAccount(ctx, { name }));
}

/** A channel with one signed-in client per role (admin created it). */
export async function channelWithTeam(ctx: TestContext, name = `Bench ${randomUUID().slice(0, 6)}`) {
  const admin = await newUser(ctx, 'Alex Admin');
  const created = await admin.post('/api/channels', { name, timeZone: 'Europe/Berlin' }).expect(201);
  const channelId = created.body.id as string;
  const team: Record<Role, Client> = { admin } as Record<Role, Client>;
  for (const role of ['host', 'editor', 'producer'] as const) {
    const c = await newUser(ctx, `Test ${role}`);
    await Membership.create({ channelId, userId: c.userId, role });
    team[role] = c;
  }
  return { channelId, team, channel: (await Channel.findByPk(channelId))! };
}
