import type { RequestHandler } from 'express';
import type { Sequelize } from 'sequelize';
import { ChannelParamsSchema, CreateChannelInputSchema, CreateInvitationInputSchema, InvitationParamsSchema, MemberParamsSchema, UpdateChannelInputSchema, UpdateMemberInputSchema } from '@midgray/shared';
import { ANY_ROLE, currentUser, membershipOf, requireMember, requireUser } from '../../middleware/auth.ts';
import { validate } from '../../middleware/validate.ts';
import type { ApiRoutes } from '../../routing.ts';
import type { ChannelsService } from './channels.service.ts';

const ADMIN = ['admin'] as const;

/** Channels, members and invitations. */
export function registerChannelRoutes(routes: ApiRoutes, deps: { sequelize: Sequelize; channels: ChannelsService; inviteLimiter: RequestHandler }) {
  const { sequelize, channels } = deps;
  const member = (roles: readonly ('host' | 'editor' | 'producer' | 'admin')[]) => requireMember(sequelize, roles);

  routes.post('/channels', 'user', requireUser, validate({ body: CreateChannelInputSchema }), async (req, res) => {
    res.status(201).json(await channels.create(currentUser(req).id, res.locals.input.body));
  });
  routes.get('/channels/:channelId', ANY_ROLE, validate({ params: ChannelParamsSchema }), member(ANY_ROLE), async (_req, res) => {
    const m = membershipOf(res);
    res.json(await channels.get(m.channelId, m.role));
  });
  routes.patch('/channels/:channelId', ADMIN, validate({ params: ChannelParamsSchema, body: UpdateChannelInputSchema }), member(ADMIN), async (req, res) => {
    res.json(await channels.update(membershipOf(res).channelId, currentUser(req).id, res.locals.input.body));
  });

  routes.get('/channels/:channelId/members', ANY_ROLE, validate({ params: ChannelParamsSchema }), member(ANY_ROLE), async (_req, res) => {
    res.json(await channels.listMembers(membershipOf(res).channelId));
  });
  routes.patch('/channels/:channelId/members/:memberId', ADMIN, validate({ params: MemberParamsSchema, body: UpdateMemberInputSchema }), member(ADMIN), async (req, res) => {
    const { memberId } = res.locals.input.params;
    res.json(await channels.changeRole(membershipOf(res).channelId, currentUser(req).id, memberId, res.locals.input.body.role));
  });
  routes.delete('/channels/:channelId/members/:memberId', ADMIN, validate({ params: MemberParamsSchema }), member(ADMIN), async (req, res) => {
    await channels.removeMember(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.memberId);
    res.status(204).end();
  });

  routes.get('/channels/:channelId/invitations', ADMIN, validate({ params: ChannelParamsSchema }), member(ADMIN), async (_req, res) => {
    res.json(await channels.listInvitations(membershipOf(res).channelId));
  });
  routes.post('/channels/:channelId/invitations', ADMIN, deps.inviteLimiter, validate({ params: ChannelParamsSchema, body: CreateInvitationInputSchema }), member(ADMIN), async (req, res) => {
    const { email, role } = res.locals.input.body;
    res.status(201).json(await channels.invite(membershipOf(res).channelId, currentUser(req).id, email, role));
  });
  routes.delete('/channels/:channelId/invitations/:invitationId', ADMIN, validate({ params: InvitationParamsSchema }), member(ADMIN), async (req, res) => {
    await channels.revokeInvitation(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.invitationId);
    res.status(204).end();
  });
}
