import type { Sequelize } from 'sequelize';
import {
  ApprovalsQuerySchema,
  ApproveSlotInputSchema,
  CalendarFeedParamsSchema,
  CalendarQuerySchema,
  ChannelParamsSchema,
  DescriptionPartsSchema,
  DescriptionVersionParamsSchema,
  IdParamsSchema,
  MarkLiveInputSchema,
  ParseChaptersInputSchema,
  ProposeSlotInputSchema,
  RejectSlotInputSchema,
  RestoreDescriptionInputSchema,
  ROLE_PERMISSIONS,
  SaveDescriptionInputSchema,
  UpdateEmailPreferencesInputSchema,
} from '@midgray/shared';
import { registerGearDueBackJob, type JobRegistry } from '../../jobs/gear-due-back.ts';
import type { Mailer } from '../../mail/mailer.ts';
import { notifyFootageReady, type ReadyFootage } from '../../mail/notifications.ts';
import { Batcher } from '../../lib/batcher.ts';
import { ANY_ROLE, byRecord, currentUser, membershipOf, type ChannelScope } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import { CalendarService } from './calendar.service.ts';
import { DescriptionService } from './description.service.ts';
import { ProfileService } from './profile.service.ts';
import { SlotsService } from './slots.service.ts';

const EDIT_DESCRIPTION = ROLE_PERMISSIONS['description.edit'];
const PROPOSE = ROLE_PERMISSIONS['slot.propose'];
const DECIDE = ROLE_PERMISSIONS['slot.approve'];

const episode: ChannelScope = byRecord('episodes');
/** Slots have no channel column of their own: their episode's channel decides. */
const slotScope: ChannelScope = { param: 'id', sql: 'SELECT e.channel_id FROM publish_slots s JOIN episodes e ON e.id = s.episode_id WHERE s.id = :id' };

/** Footage kinds as the "ready for pickup" e-mail names them. */
const FOOTAGE_KIND_WORDS: Record<string, string> = { camera_original: 'camera original', graded_render: 'graded render', frame_grab: 'frame grab' };

/** The footage feature's "verified" events, as far as publishing listens to them. */
export interface FootageReadySource {
  onReady(listener: (event: { episodeId: string; kind: string; originalName: string }) => void | Promise<void>): unknown;
}

/**
 * Publishing: the Description tab, publish slots and their approval, the approval queue, the
 * calendar and its private feed, and the user's e-mail and feed settings. Also defines the gear
 * due-back reminder job on `jobs`, and e-mails editors when the footage feature reports verified footage.
 */
export function registerPublishingRoutes(
  routes: ApiRoutes,
  deps: { sequelize: Sequelize; mailer: Mailer; publicUrl: string; jobs?: JobRegistry; footageEvents?: FootageReadySource; footageReadyBatchMs?: number },
): { flush: () => Promise<void> } {
  const mail = { sequelize: deps.sequelize, mailer: deps.mailer, publicUrl: deps.publicUrl };
  if (deps.jobs) registerGearDueBackJob(deps.jobs, mail);
  // Files of one episode verified within a minute of each other go to the editors in one mail, not one mail each.
  const ready = new Batcher<ReadyFootage>(deps.footageReadyBatchMs ?? 60_000, (episodeId, footage) => notifyFootageReady(mail, { episodeId, footage }));
  deps.footageEvents?.onReady(async (e) => {
    await ready.add(e.episodeId, { name: e.originalName, kind: FOOTAGE_KIND_WORDS[e.kind] ?? e.kind.replace(/_/g, ' ') });
  });
  const descriptions = new DescriptionService(deps.sequelize);
  const slots = new SlotsService(deps.sequelize, mail);
  const calendar = new CalendarService(deps.sequelize, deps.publicUrl);
  const profile = new ProfileService();
  const id = (res: { locals: Record<string, any> }) => res.locals.input.params.id as string;

  // --- Description ---------------------------------------------------------------------------
  routes.get('/episodes/:id/description', { access: ANY_ROLE, scope: episode, what: 'Episode', params: IdParamsSchema }, async (_req, res) => {
    res.json(await descriptions.get(id(res), membershipOf(res).role));
  });
  routes.put('/episodes/:id/description', { access: EDIT_DESCRIPTION, scope: episode, what: 'Episode', params: IdParamsSchema, body: SaveDescriptionInputSchema }, async (req, res) => {
    res.json(await descriptions.save(id(res), currentUser(req).id, membershipOf(res).role, res.locals.input.body));
  });
  routes.get('/episodes/:id/description/versions', { access: ANY_ROLE, scope: episode, what: 'Episode', params: IdParamsSchema }, async (_req, res) => {
    res.json(await descriptions.versions(id(res)));
  });
  routes.post(
    '/episodes/:id/description/versions/:versionId/restore',
    { access: EDIT_DESCRIPTION, scope: episode, what: 'Episode', params: DescriptionVersionParamsSchema, body: RestoreDescriptionInputSchema },
    async (req, res) => {
      const { versionId } = res.locals.input.params;
      res.json(await descriptions.restore(id(res), versionId, currentUser(req).id, membershipOf(res).role, res.locals.input.body.version));
    },
  );
  routes.post('/episodes/:id/description/chapters/parse', { access: ANY_ROLE, scope: episode, what: 'Episode', params: IdParamsSchema, body: ParseChaptersInputSchema }, async (_req, res) => {
    res.json(descriptions.parseChapters(res.locals.input.body.text));
  });
  routes.post('/episodes/:id/description/preview', { access: ANY_ROLE, scope: episode, what: 'Episode', params: IdParamsSchema, body: DescriptionPartsSchema }, async (_req, res) => {
    res.json(await descriptions.preview(id(res), res.locals.input.body));
  });

  // --- Publish slots -------------------------------------------------------------------------
  routes.get('/episodes/:id/schedule', { access: ANY_ROLE, scope: episode, what: 'Episode', params: IdParamsSchema }, async (_req, res) => {
    res.json(await slots.schedule(id(res), membershipOf(res).role));
  });
  routes.post('/episodes/:id/slots', { access: PROPOSE, scope: episode, what: 'Episode', params: IdParamsSchema, body: ProposeSlotInputSchema }, async (req, res) => {
    res.status(201).json(await slots.propose(id(res), currentUser(req).id, membershipOf(res).role, res.locals.input.body));
  });
  routes.post('/slots/:id/approve', { access: DECIDE, scope: slotScope, what: 'Publish slot', params: IdParamsSchema, body: ApproveSlotInputSchema }, async (req, res) => {
    res.json(await slots.approve(id(res), currentUser(req).id, membershipOf(res).role, res.locals.input.body));
  });
  routes.post('/slots/:id/reject', { access: DECIDE, scope: slotScope, what: 'Publish slot', params: IdParamsSchema, body: RejectSlotInputSchema }, async (req, res) => {
    res.json(await slots.reject(id(res), currentUser(req).id, membershipOf(res).role, res.locals.input.body));
  });
  routes.post('/episodes/:id/live', { access: DECIDE, scope: episode, what: 'Episode', params: IdParamsSchema, body: MarkLiveInputSchema }, async (req, res) => {
    res.json(await slots.markLive(id(res), currentUser(req).id, membershipOf(res).role, res.locals.input.body));
  });
  routes.get('/channels/:channelId/approvals', { access: DECIDE, params: ChannelParamsSchema, query: ApprovalsQuerySchema }, async (_req, res) => {
    const m = membershipOf(res);
    res.json(await slots.queue(m.channelId, m.role, res.locals.input.query.zone));
  });

  // --- Calendar ------------------------------------------------------------------------------
  routes.get('/channels/:channelId/calendar', { access: ANY_ROLE, params: ChannelParamsSchema, query: CalendarQuerySchema }, async (_req, res) => {
    const { from, to } = res.locals.input.query;
    res.json(await calendar.events([membershipOf(res).channelId], from, to));
  });
  // Public: the secret in the URL is the credential (calendar apps cannot sign in). Unknown → 404.
  routes.get('/calendar/:token.ics', { access: 'public', params: CalendarFeedParamsSchema }, async (_req, res) => {
    const user = await calendar.userForFeedToken(res.locals.input.params.token);
    if (!user) {
      res.status(404).json({ error: { code: 'not_found', message: 'No calendar feed at this address (it may have been reset): copy the new address from your profile' } });
      return;
    }
    res.setHeader('Cache-Control', 'private, no-store');
    res.setHeader('X-Robots-Tag', 'noindex');
    res.type('text/calendar; charset=utf-8').send(await calendar.feed(user));
  });

  // --- The user's own settings ---------------------------------------------------------------
  routes.get('/me/profile', { access: 'user' }, async (req, res) => {
    res.json(await profile.get(currentUser(req).id));
  });
  routes.put('/me/email-preferences', { access: 'user', body: UpdateEmailPreferencesInputSchema }, async (req, res) => {
    res.json(await profile.setOptOuts(currentUser(req).id, res.locals.input.body.optOuts));
  });
  routes.post('/me/calendar-feed', { access: 'user' }, async (req, res) => {
    res.status(201).json(await calendar.resetFeed(currentUser(req).id));
  });
  routes.delete('/me/calendar-feed', { access: 'user' }, async (req, res) => {
    await calendar.disableFeed(currentUser(req).id);
    res.status(204).end();
  });
  return { flush: () => ready.flush() };
}
