import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation } from '@midgray/db';
import { channelWithTeam, startTestApp, type TestContext } from './helpers.ts';

// OWASP ASVS 5.0 (sessions, headers) and the tests issue 8 names: headers, cookie flags in
// production, rate limits, closed CORS.
describe('security headers and limits', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await startTestApp({ signInPerMinute: 3 });
  });
  afterAll(() => ctx?.close());

  it('sends a Content-Security-Policy that allows only our own origin for scripts (no inline scripts)', async () => {
    const res = await request(ctx.app).get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toContain("default-src 'self'");
    const scriptSrc = /script-src ([^;]*)/.exec(csp)![1].split(' ');
    // Only our origin; 'wasm-unsafe-eval' lets the checksum worker compile WebAssembly and
    // allows no JavaScript eval or inline script (CSP Level 3).
    expect(scriptSrc.filter((s) => s !== "'wasm-unsafe-eval'")).toEqual(["'self'"]);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('keeps CORS closed: a cross-origin request gets no Access-Control-Allow-Origin', async () => {
    const res = await request(ctx.app).get('/api/health').set('Origin', 'https://elsewhere.example');
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    const pre = await request(ctx.app).options('/api/channels').set('Origin', 'https://elsewhere.example').set('Access-Control-Request-Method', 'POST');
    expect(pre.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('rate-limits sign-in attempts per address with 429 and the error shape', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) statuses.push((await request(ctx.app).get('/api/auth/github')).status);
    expect(statuses.slice(0, 3)).toEqual([302, 302, 302]);
    expect(statuses[4]).toBe(429);
    const res = await request(ctx.app).get('/api/auth/github');
    expect(res.body.error.code).toBe('rate_limited');
  });
});

describe('cookies in production mode', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await startTestApp({ env: { NODE_ENV: 'production', FAKES: 'false', TRUST_PROXY: 'true', SESSION_SECRET: 'a-long-production-like-secret-for-tests' } });
  });
  afterAll(() => ctx?.close());

  it('marks the session cookie Secure, HttpOnly and SameSite=Lax behind an HTTPS proxy', async () => {
    const res = await request(ctx.app).get('/api/auth/github').set('X-Forwarded-Proto', 'https');
    const cookie = [res.headers['set-cookie']].flat().find((c: string) => c?.startsWith('midgray.sid='));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/; Secure/i);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('never sends the session cookie over plain HTTP', async () => {
    const res = await request(ctx.app).get('/api/auth/github');
    const cookie = [res.headers['set-cookie'] ?? []].flat().find((c: string) => c?.startsWith('midgray.sid='));
    expect(cookie).toBeUndefined();
  });

  it('does not serve the development mailbox in production', async () => {
    await request(ctx.app).get('/api/dev/mailbox').expect(404);
  });
});

describe('invitation rate limit', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await startTestApp({ invitesPerHour: 2 });
  });
  afterAll(() => ctx?.close());

  it('refuses the third invitation within the hour with 429, and writes no invitation for it', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const invite = (n: number) => team.admin.post(`/api/channels/${channelId}/invitations`, { email: `guest-${n}@crew.test`, role: 'editor' });
    expect((await invite(1)).status).toBe(201);
    expect((await invite(2)).status).toBe(201);
    const third = await invite(3);
    expect(third.status).toBe(429);
    expect(third.body.error).toMatchObject({ code: 'rate_limited' });
    expect(third.body.error.message).toMatch(/wait/);
    expect(await Invitation.count({ where: { channelId } })).toBe(2);
  });
});
