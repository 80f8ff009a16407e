// Hostile input for every write route of the route matrix (OWASP ASVS 5.0, input validation):
// wrong types, huge strings, unicode, prototype-pollution keys, SQL and HTML fragments, in
// bodies, path parameters and query strings. Never a 5xx; a 4xx never changes a row.
// Runs in a database of its own so other test files' writes do not disturb the fingerprint.
import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, migrateUp } from '@midgray/db';
import type { Role } from '@midgray/shared';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { MATRIX, type MatrixFixture } from './route-matrix.table.ts';

/** Hostile inputs tried per write route (bodies; plus a third as many params and queries). */
export const RUNS_PER_ROUTE = Number(process.env.FUZZ_RUNS ?? 60);

const base = process.env.DATABASE_URL!;
const dbName = `midgray_fuzz_${randomUUID().slice(0, 8)}`;
const urlFor = (db: string) => Object.assign(new URL(base), { pathname: `/${db}` }).toString();
const admin = createDatabase(urlFor('postgres'));

let ctx: TestContext;
let fx: MatrixFixture;
let caller: Client;
const tried: Record<string, number> = {};

const NASTY = [
  "' OR 1=1 --",
  "'; DROP TABLE episodes; --",
  '<script>alert(1)</script>',
  '<img src=x onerror=alert(1)>',
  '../../../../etc/passwd',
  '..%2f..%2fetc%2fpasswd',
  '\u0000',
  '%00',
  '__proto__',
  'constructor',
  'prototype',
  '\u202e\u0647\u0644\u0627',
  '𝕄𝕚𝕕𝕘𝕣𝕒𝕪 🎬',
  '9'.repeat(400),
  '-1',
  'NaN',
  '1e309',
  '2026-02-30T25:61:00Z',
  'Mars/Tharsis',
  'javascript:alert(1)',
];
const FIELDS = ['name', 'title', 'email', 'role', 'version', 'stage', 'toStage', 'toIndex', 'reason', 'kind', 'make', 'model', 'serial', 'source', 'embargoAt', 'embargoZone', 'dueBackOn', 'receivedOn', 'notes', 'value', 'label', 'startsAt', 'zone', 'comment', 'url', 'settings', 'inputs', 'steps', 'chapters', 'summary', 'publicUrl', 'timeZone', 'gearIds', 'hostId', 'editorId', '__proto__', 'constructor'];

const hostileValue: fc.Arbitrary<unknown> = fc.letrec((tie) => ({
  v: fc.oneof(
    { depthSize: 'small' },
    fc.constantFrom(...NASTY),
    fc.string({ maxLength: 40 }),
    fc.string({ unit: 'grapheme', maxLength: 20 }),
    fc.integer(),
    fc.double(),
    fc.boolean(),
    fc.constant(null),
    fc.constant('x'.repeat(20_000)),
    fc.array(tie('v'), { maxLength: 3 }),
    fc.dictionary(fc.constantFrom(...FIELDS), tie('v'), { maxKeys: 3 }),
  ),
})).v;

/** A raw JSON body: objects with known and hostile keys, primitives, arrays, prototype pollution. */
const hostileBody: fc.Arbitrary<string> = fc.oneof(
  fc.dictionary(fc.constantFrom(...FIELDS), hostileValue, { maxKeys: 6 }).map((o) => JSON.stringify(o)),
  hostileValue.map((v) => JSON.stringify(v) ?? 'null'),
  fc.constant('{"__proto__": {"role": "admin", "isAdmin": true}}'),
  fc.constant('{"constructor": {"prototype": {"polluted": true}}}'),
  fc.constant('[]'),
  fc.constant('"just a string"'),
);

const hostileSegment = fc.oneof(fc.constantFrom(...NASTY), fc.string({ minLength: 1, maxLength: 30 }), fc.uuid());

async function fingerprint(): Promise<string> {
  const tables = await ctx.sequelize.query<{ tablename: string }>(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'session' ORDER BY tablename`, { type: QueryTypes.SELECT });
  const parts = await Promise.all(
    tables.map(async ({ tablename }) => {
      const [r] = await ctx.sequelize.query<{ h: string | null; n: string }>(`SELECT md5(string_agg(md5(t::text), '' ORDER BY md5(t::text))) AS h, count(*) AS n FROM "${tablename}" t`, { type: QueryTypes.SELECT });
      return `${tablename}:${r.n}:${r.h}`;
    }),
  );
  return parts.join('|');
}

beforeAll(async () => {
  await admin.query(`CREATE DATABASE "${dbName}"`);
  const db = createDatabase(urlFor(dbName));
  await migrateUp(db);
  await db.close();
  ctx = await startTestApp({ env: { DATABASE_URL: urlFor(dbName) } });
  const { channelId, team } = await channelWithTeam(ctx);
  const members = (await team.admin.get(`/api/channels/${channelId}/members`).expect(200)).body as { id: string; role: Role }[];
  const inv = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: `fuzz-${randomUUID().slice(0, 6)}@crew.test`, role: 'editor' }).expect(201);
  fx = { ctx, channelId, hostMemberId: members.find((m) => m.role === 'host')!.id, invitationId: inv.body.invitation.id, team };
  for (const row of Object.values(MATRIX)) if (row.setup) await row.setup(fx);
  await newUser(ctx);
  caller = team.admin;
});
afterAll(async () => {
  await ctx?.close();
  await admin.query(`DROP DATABASE IF EXISTS "${dbName}" WITH (FORCE)`);
  await admin.close();
  console.log(`[fuzz] hostile inputs per route: ${JSON.stringify(tried)}`);
});

const writeRoutes = Object.keys(MATRIX).filter((k) => /^(POST|PATCH|PUT|DELETE) /.test(k) && !k.endsWith('/auth/logout'));

describe('hostile input on every write route', () => {
  for (const key of writeRoutes) {
    it(`${key}: never 5xx, and a 4xx changes nothing`, async () => {
      const [method, template] = key.split(' ');
      const row = MATRIX[key];
      const send = async (path: string, raw: string | undefined) => {
        const t = (caller.agent as any)[method.toLowerCase()](path).set('X-CSRF-Token', caller.csrf);
        return raw === undefined ? t : t.set('Content-Type', 'application/json').send(raw);
      };
      const realPath = () => template.replace(/:(\w+)/g, (_, n: string) => row.params?.(fx)[n] ?? fx.channelId);
      const check = async (path: string, raw: string | undefined) => {
        const before = await fingerprint();
        const res = await send(path, raw);
        tried[key] = (tried[key] ?? 0) + 1;
        expect(res.status, `${method} ${path} ${raw?.slice(0, 120)} → ${JSON.stringify(res.body).slice(0, 200)}`).toBeLessThan(500);
        if (res.status >= 400) {
          expect(res.body?.error?.code, 'error shape').toBeTypeOf('string');
          expect(await fingerprint(), `${method} ${path} answered ${res.status} but changed rows`).toBe(before);
        }
      };
      await fc.assert(fc.asyncProperty(hostileBody, (raw) => check(realPath(), raw)), { numRuns: RUNS_PER_ROUTE });
      await fc.assert(
        fc.asyncProperty(hostileSegment, hostileBody, (seg, raw) => check(template.replace(/:(\w+)/g, () => encodeURIComponent(seg)), raw)),
        { numRuns: Math.ceil(RUNS_PER_ROUTE / 3) },
      );
      await fc.assert(
        fc.asyncProperty(fc.dictionary(fc.constantFrom(...FIELDS, 'limit', 'offset', 'q'), fc.constantFrom(...NASTY), { maxKeys: 3 }), hostileBody, (q, raw) =>
          check(`${realPath()}?${new URLSearchParams(q as Record<string, string>).toString()}`, raw),
        ),
        { numRuns: Math.ceil(RUNS_PER_ROUTE / 3) },
      );
    });
  }
});
