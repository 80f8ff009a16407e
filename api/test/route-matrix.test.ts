// Walks EVERY registered API route as: anonymous, each role, and a member of another channel,
// and checks the status. A route added without a row here fails the first test.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '@midgray/shared';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { MATRIX, type Caller, type MatrixFixture } from './route-matrix.table.ts';

let ctx: TestContext;
let fx: MatrixFixture;
let callers: Record<Exclude<Caller, 'anon'>, Client>;

beforeAll(async () => {
  ctx = await startTestApp();
  const { channelId, team } = await channelWithTeam(ctx);
  const outsider = await newUser(ctx, 'Olu Outsider');
  await outsider.post('/api/channels', { name: 'Elsewhere', timeZone: 'UTC' }).expect(201);
  const members = (await team.admin.get(`/api/channels/${channelId}/members`).expect(200)).body as { id: string; role: Role }[];
  const inv = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: `matrix-${randomUUID().slice(0, 6)}@crew.test`, role: 'editor' }).expect(201);
  fx = { ctx, channelId, hostMemberId: members.find((m) => m.role === 'host')!.id, invitationId: inv.body.invitation.id, team };
  for (const setup of Object.values(MATRIX).map((r) => r.setup).filter(Boolean)) await setup!(fx);
  callers = { ...team, outsider };
});
afterAll(() => ctx?.close());

describe('the route matrix', () => {
  it('has a row for every registered route and no row for a route that does not exist', () => {
    const registered = ctx.routes.map((r) => `${r.method} ${r.path}`).sort();
    const rows = Object.keys(MATRIX).sort();
    expect(registered.filter((r) => !rows.includes(r)), 'routes without a matrix row').toEqual([]);
    expect(rows.filter((r) => !registered.includes(r)), 'matrix rows without a route').toEqual([]);
  });

  const callerNames: Caller[] = ['anon', 'outsider', 'host', 'editor', 'producer', 'admin'];
  const lastIfLogout = (k: string) => (k.endsWith('/auth/logout') ? 1 : 0);
  for (const [key, row] of Object.entries(MATRIX).sort(([a], [b]) => lastIfLogout(a) - lastIfLogout(b))) {
    for (const caller of callerNames) {
      const expected = row.expect[caller];
      it(`${key} as ${caller} → ${expected}`, async () => {
        const [method, template] = key.split(' ');
        const path = template.replace(/:(\w+)/g, (_, name: string) => row.params?.(fx)[name] ?? fx.channelId);
        const body = row.body?.(fx);
        let res;
        if (row.send) {
          // A route registered as ALL (tus): send the row's method and headers, with the CSRF token when signed in.
          const { default: request } = await import('supertest');
          const agent: any = caller === 'anon' ? request(ctx.app) : callers[caller].agent;
          const t = agent[row.send.method.toLowerCase()](path).set(row.send.headers?.(fx) ?? {});
          if (caller !== 'anon') t.set('X-CSRF-Token', callers[caller].csrf);
          res = await t;
        } else if (caller === 'anon') {
          const { default: request } = await import('supertest');
          const t = (request(ctx.app) as any)[method.toLowerCase()](path);
          res = body === undefined ? await t : await t.send(body);
        } else {
          const c = callers[caller];
          const fn = { GET: c.get, POST: c.post, PATCH: c.patch, PUT: c.put, DELETE: c.delete }[method as 'POST']!;
          res = await fn(path, body as never);
        }
        expect(res.status, `${key} as ${caller}: ${JSON.stringify(res.body).slice(0, 200)}`).toBe(expected);
        // A HEAD answer has no body to read.
        if (res.status >= 400 && res.headers['content-type']?.includes('json') && row.send?.method !== 'HEAD') expect(res.body.error?.code).toBeTypeOf('string');
      });
    }
  }
});
