import {
  ArchiveEpisodeInputSchema,
  BoardQuerySchema,
  ChannelParamsSchema,
  CreateEpisodeInputSchema,
  IdParamsSchema,
  MoveEpisodeInputSchema,
  ROLE_PERMISSIONS,
  UpdateEpisodeInputSchema,
} from '@midgray/shared';
import { ANY_ROLE, byRecord, currentUser, membershipOf } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import type { Actor, EpisodesService } from './episodes.service.ts';

/** Host, producer, admin: who creates, edits and archives episodes (PRODUCT.md "Who uses it"). */
const EPISODE_WRITERS = ROLE_PERMISSIONS['episode.create'];
const episodeScope = { scope: byRecord('episodes'), what: 'Episode', params: IdParamsSchema } as const;

/** The board, episodes, stage moves and the archive. */
export function registerEpisodeRoutes(routes: ApiRoutes, deps: { episodes: EpisodesService }) {
  const { episodes } = deps;
  const actor = (req: Parameters<typeof currentUser>[0], res: Parameters<typeof membershipOf>[0]): Actor => {
    const m = membershipOf(res);
    return { userId: currentUser(req).id, channelId: m.channelId, role: m.role };
  };

  // The board's JSON is built by PostgreSQL and passed through as bytes (see boardJson). Express
  // adds an ETag, so a browser revalidating with If-None-Match gets 304 when nothing changed.
  routes.get('/channels/:channelId/board', { access: ANY_ROLE, params: ChannelParamsSchema, query: BoardQuerySchema }, async (req, res) => {
    const board = await episodes.boardJson(membershipOf(res).channelId, res.locals.input.query, currentUser(req).id);
    res.set('Cache-Control', 'private, no-cache').type('application/json').send(board);
  });
  routes.post('/channels/:channelId/episodes', { access: EPISODE_WRITERS, params: ChannelParamsSchema, body: CreateEpisodeInputSchema }, async (req, res) => {
    res.status(201).json(await episodes.create(actor(req, res), res.locals.input.body));
  });
  routes.get('/channels/:channelId/episodes/archived', { access: ANY_ROLE, params: ChannelParamsSchema }, async (_req, res) => {
    res.json(await episodes.archived(membershipOf(res).channelId));
  });

  routes.get('/episodes/:id', { access: ANY_ROLE, ...episodeScope }, async (_req, res) => {
    res.json(await episodes.detail(res.locals.input.params.id));
  });
  routes.patch('/episodes/:id', { access: EPISODE_WRITERS, ...episodeScope, body: UpdateEpisodeInputSchema }, async (req, res) => {
    res.json(await episodes.update(actor(req, res), res.locals.input.params.id, res.locals.input.body));
  });
  // Every member may ask; the stage rules (checkStageMove) decide who may make which move.
  routes.post('/episodes/:id/move', { access: ANY_ROLE, ...episodeScope, body: MoveEpisodeInputSchema }, async (req, res) => {
    res.json(await episodes.move(actor(req, res), res.locals.input.params.id, res.locals.input.body));
  });
  routes.post('/episodes/:id/archive', { access: EPISODE_WRITERS, ...episodeScope, body: ArchiveEpisodeInputSchema }, async (req, res) => {
    res.json(await episodes.archive(actor(req, res), res.locals.input.params.id, res.locals.input.body.version));
  });
  routes.post('/episodes/:id/unarchive', { access: EPISODE_WRITERS, ...episodeScope, body: ArchiveEpisodeInputSchema }, async (req, res) => {
    res.json(await episodes.unarchive(actor(req, res), res.locals.input.params.id, res.locals.input.body.version));
  });
}
