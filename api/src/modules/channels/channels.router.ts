import type { RequestHandler } from 'express';
import { ChannelParamsSchema, CreateChannelInputSchema, CreateInvitationInputSchema, InvitationParamsSchema, MemberParamsSchema, UpdateChannelInputSchema, UpdateMemberInputSchema } from '@midgray/shared';
import { ANY_ROLE, currentUser, membershipOf } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import type { ChannelsService } from './channels.service.ts';

const ADMIN = ['admin'] as const;

/** Channels, members and invitations. */
export function registerChannelRoutes(routes: ApiRoutes, deps: { channels: ChannelsService; inviteLimiter: RequestHandler }) {
  const { channels } = deps;

  routes.post('/channels', { access: 'user', body: CreateChannelInputSchema }, async (req, res) => {
    res.status(201).json(await channels.create(currentUser(req).id, res.locals.input.body));
  });
  routes.get('/channels/:channelId', { access: ANY_ROLE, params: ChannelParamsSchema }, async (_req, res) => {
    const m = membershipOf(res);
    res.json(await channels.get(m.channelId, m.role));
  });
  routes.patch('/channels/:channelId', { access: ADMIN, params: ChannelParamsSchema, body: UpdateChannelInputSchema }, async (req, res) => {
    res.json(await channels.update(membershipOf(res).channelId, currentUser(req).id, res.locals.input.body));
  });

  routes.get('/channels/:channelId/members', { access: ANY_ROLE, params: ChannelParamsSchema }, async (_req, res) => {
    res.json(await channels.listMembers(membershipOf(res).channelId));
  });
  routes.patch('/channels/:channelId/members/:memberId', { access: ADMIN, params: MemberParamsSchema, body: UpdateMemberInputSchema }, async (req, res) => {
    res.json(await channels.changeRole(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.memberId, res.locals.input.body.role));
  });
  routes.delete('/channels/:channelId/members/:memberId', { access: ADMIN, params: MemberParamsSchema }, async (req, res) => {
    await channels.removeMember(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.memberId);
    res.status(204).end();
  });

  routes.get('/channels/:channelId/invitations', { access: ADMIN, params: ChannelParamsSchema }, async (_req, res) => {
    res.json(await channels.listInvitations(membershipOf(res).channelId));
  });
  routes.post('/channels/:channelId/invitations', { access: ADMIN, params: ChannelParamsSchema, body: CreateInvitationInputSchema, before: [deps.inviteLimiter] }, async (req, res) => {
    const { email, role } = res.locals.input.body;
    res.status(201).json(await channels.invite(membershipOf(res).channelId, currentUser(req).id, email, role));
  });
  routes.delete('/channels/:channelId/invitations/:invitationId', { access: ADMIN, params: InvitationParamsSchema }, async (req, res) => {
    await channels.revokeInvitation(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.invitationId);
    res.status(204).end();
  });
}
