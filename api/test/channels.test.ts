import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Activity, Channel, Invitation, Membership } from '@midgray/db';
import { channelWithTeam, fakeAccount, newUser, signIn, startTestApp, type TestContext } from './helpers.ts';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx?.close());

describe('channels', () => {
  it('when a user creates a channel, then they are its admin and the creation is in the activity log', async () => {
    const c = await newUser(ctx);
    const res = await c.post('/api/channels', { name: 'Bench North', timeZone: 'America/Chicago' }).expect(201);
    expect(res.body).toMatchObject({ name: 'Bench North', timeZone: 'America/Chicago', role: 'admin' });
    expect(await Activity.count({ where: { channelId: res.body.id, action: 'channel.created' } })).toBe(1);
  });

  it('when an admin saves settings with a stale version, then 409 and nothing changes', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await team.admin.patch(`/api/channels/${channelId}`, { version: 1, settings: { snrThresholdDb: 24 } }).expect(200);
    const stale = await team.admin.patch(`/api/channels/${channelId}`, { version: 1, name: 'Lost update' }).expect(409);
    expect(stale.body.error.code).toBe('stale_version');
    const ch = await Channel.findByPk(channelId);
    expect(ch!.name).not.toBe('Lost update');
    expect((ch!.settings as { snrThresholdDb: number }).snrThresholdDb).toBe(24);
  });

  it('rejects an unknown time zone with a message a person can act on', async () => {
    const c = await newUser(ctx);
    const res = await c.post('/api/channels', { name: 'Zoneless', timeZone: 'Mars/Tharsis' }).expect(400);
    expect(res.body.error.message).toMatch(/IANA/);
  });
});

describe('invitations', () => {
  it('when an admin invites an address, then the mail arrives and the invitee joins with the role on first sign-in', async () => {
    const { channelId, team } = await channelWithTeam(ctx, 'Invite Bench');
    const stamp = Date.now();
    const res = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: `New.Editor.${stamp}@Crew.test`, role: 'editor' }).expect(201);
    expect(res.body.mailSent).toBe(true);
    expect(res.body.invitation.email).toBe(`new.editor.${stamp}@crew.test`);

    const mail = (await ctx.mails()).find((m) => m.to.includes(`new.editor.${stamp}@crew.test`));
    expect(mail?.subject).toBe('Invitation to Invite Bench on Midgray');
    expect(mail?.text).toContain('as editor');
    expect(mail?.html).toContain('<a href=');

    const invitee = await signIn(ctx, await fakeAccount(ctx, { name: 'New Editor', email: `new.editor.${stamp}@crew.test` }));
    const me = await invitee.get('/api/auth/me').expect(200);
    expect(me.body.channels).toEqual([expect.objectContaining({ id: channelId, role: 'editor' })]);
    expect((await Invitation.findByPk(res.body.invitation.id))!.acceptedAt).not.toBeNull();
    // accepted invitations leave the open list
    expect((await team.admin.get(`/api/channels/${channelId}/invitations`).expect(200)).body).toEqual([]);
  });

  it('refuses a second open invitation for the same address, and inviting a member', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await team.admin.post(`/api/channels/${channelId}/invitations`, { email: 'twice@crew.test', role: 'host' }).expect(201);
    const again = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: 'twice@crew.test', role: 'editor' }).expect(409);
    expect(again.body.error.message).toMatch(/open invitation/);
    const member = await team.admin.post(`/api/channels/${channelId}/invitations`, { email: team.host.email, role: 'editor' }).expect(409);
    expect(member.body.error.message).toMatch(/already a member/);
  });

  it('a revoked invitation does not let the invitee in', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const email = `revoked.${Date.now()}@crew.test`;
    const res = await team.admin.post(`/api/channels/${channelId}/invitations`, { email, role: 'host' }).expect(201);
    await team.admin.delete(`/api/channels/${channelId}/invitations/${res.body.invitation.id}`).expect(204);
    const c = await signIn(ctx, await fakeAccount(ctx, { email }));
    expect((await c.get('/api/auth/me')).body.channels).toEqual([]);
  });
});

describe('members and roles', () => {
  it('when an admin changes a role, then the member can do what the new role allows at once', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const members = (await team.admin.get(`/api/channels/${channelId}/members`)).body as { id: string; userId: string }[];
    const host = members.find((m) => m.userId === team.host.userId)!;
    await team.host.get(`/api/channels/${channelId}/invitations`).expect(403);
    await team.admin.patch(`/api/channels/${channelId}/members/${host.id}`, { role: 'admin' }).expect(200);
    await team.host.get(`/api/channels/${channelId}/invitations`).expect(200);
    expect(await Activity.count({ where: { channelId, action: 'member.role_changed' } })).toBe(1);
  });

  it('when an admin removes a member, then the member loses access on the next request', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    await team.editor.get(`/api/channels/${channelId}`).expect(200);
    const members = (await team.admin.get(`/api/channels/${channelId}/members`)).body as { id: string; userId: string }[];
    const editor = members.find((m) => m.userId === team.editor.userId)!;
    await team.admin.delete(`/api/channels/${channelId}/members/${editor.id}`).expect(204);
    await team.editor.get(`/api/channels/${channelId}`).expect(404);
  });

  it('the last admin can be neither removed nor demoted', async () => {
    const { channelId, team } = await channelWithTeam(ctx);
    const members = (await team.admin.get(`/api/channels/${channelId}/members`)).body as { id: string; userId: string }[];
    const admin = members.find((m) => m.userId === team.admin.userId)!;
    const del = await team.admin.delete(`/api/channels/${channelId}/members/${admin.id}`).expect(409);
    expect(del.body.error.message).toMatch(/last admin/);
    await team.admin.patch(`/api/channels/${channelId}/members/${admin.id}`, { role: 'host' }).expect(409);
    expect(await Membership.count({ where: { channelId, role: 'admin' } })).toBe(1);
  });

  it('two admins demoting each other at once: one wins, the other is told it is no longer admin, never a deadlock', async () => {
    // Repeated, since a lock-order deadlock (PostgreSQL 40P01 → 500) shows only in some interleavings.
    for (let round = 0; round < 8; round++) {
      const { channelId, team } = await channelWithTeam(ctx);
      const members = (await team.admin.get(`/api/channels/${channelId}/members`)).body as { id: string; userId: string }[];
      const producer = members.find((m) => m.userId === team.producer.userId)!;
      const admin = members.find((m) => m.userId === team.admin.userId)!;
      await team.admin.patch(`/api/channels/${channelId}/members/${producer.id}`, { role: 'admin' }).expect(200);
      const [a, b] = await Promise.all([
        team.admin.patch(`/api/channels/${channelId}/members/${producer.id}`, { role: 'host' }),
        round % 2 ? team.producer.delete(`/api/channels/${channelId}/members/${admin.id}`) : team.producer.patch(`/api/channels/${channelId}/members/${admin.id}`, { role: 'host' }),
      ]);
      // Member changes of a channel run one after the other: the second finds its caller no longer admin.
      const loser = [a, b].find((r) => r.status >= 300)!;
      expect([a.status, b.status].filter((s) => s < 300), `round ${round}: ${a.status} ${b.status}`).toHaveLength(1);
      expect(loser.status).toBe(403);
      expect(loser.body.error.message).toMatch(/needs admin/);
      expect(await Membership.count({ where: { channelId, role: 'admin' } })).toBe(1);
    }
  });
});

describe('bad input', () => {
  it('malformed JSON → 400 with the error shape', async () => {
    const c = await newUser(ctx);
    const res = await c.agent.post('/api/channels').set('X-CSRF-Token', c.csrf).set('Content-Type', 'application/json').send('{"name": "x",');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'bad_request' });
  });

  it('unknown fields → 400 naming the field; nothing written', async () => {
    const c = await newUser(ctx);
    const res = await c.post('/api/channels', { name: 'Extra', isAdmin: true }).expect(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(JSON.stringify(res.body.error.details)).toContain('isAdmin');
    expect((await c.get('/api/auth/me')).body.channels).toEqual([]);
  });

  it('wrong types → 400', async () => {
    const c = await newUser(ctx);
    const res = await c.post('/api/channels', { name: 42 }).expect(400);
    expect(res.body.error.details.fieldErrors['body.name']).toBeTruthy();
  });

  it('oversized bodies → 413; nothing written', async () => {
    const c = await newUser(ctx);
    const res = await c.post('/api/channels', { name: 'x'.repeat(400_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect((await c.get('/api/auth/me')).body.channels).toEqual([]);
  });

  it('a malformed id in the path → 400, not a database error', async () => {
    const c = await newUser(ctx);
    const res = await c.get('/api/channels/not-a-uuid/members').expect(400);
    expect(res.body.error.code).toBe('validation_failed');
  });

  it('an unknown API path → 404 with the error shape', async () => {
    const res = await (await newUser(ctx)).get('/api/nothing-here').expect(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
