import type { Request, Response } from 'express';
import { ChannelParamsSchema, CompareQuerySchema, IdParamsSchema, RunReadoutsInputSchema, SaveReadoutRegionInputSchema, StepFrameQuerySchema } from '@midgray/shared';
import { ANY_ROLE, byRecord, currentUser, membershipOf, type ChannelScope } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import { READOUT_RUNNERS, type ReadoutsService } from './readouts.service.ts';

// Routes keyed by a test or step find their channel through the episode; readouts carry theirs.
const byTest: ChannelScope = { param: 'id', sql: 'SELECT e.channel_id FROM tests t JOIN episodes e ON e.id = t.episode_id WHERE t.id = :id' };
const byStep: ChannelScope = {
  param: 'id',
  sql: 'SELECT e.channel_id FROM test_steps s JOIN tests t ON t.id = s.test_id JOIN episodes e ON e.id = t.episode_id WHERE s.id = :id',
};

const actorOf = (req: Request, res: Response) => ({ channelId: membershipOf(res).channelId, userId: currentUser(req).id });

/** Readouts: the tab's data, running readouts, the measuring region, images, CSV, comparison. */
export function registerReadoutRoutes(routes: ApiRoutes, deps: { readouts: ReadoutsService }) {
  const { readouts } = deps;
  const episode = { scope: byRecord('episodes'), what: 'Episode', params: IdParamsSchema } as const;
  const test = { scope: byTest, what: 'Test', params: IdParamsSchema } as const;
  const step = { scope: byStep, what: 'Step', params: IdParamsSchema } as const;
  const readout = { scope: byRecord('readouts'), what: 'Readout', params: IdParamsSchema } as const;

  routes.get('/episodes/:id/readouts', { access: ANY_ROLE, ...episode }, async (_req, res) => {
    const m = membershipOf(res);
    res.json(await readouts.episodeReadouts(res.locals.input.params.id, m.channelId, m.role));
  });
  routes.get('/tests/:id/readouts', { access: ANY_ROLE, ...test }, async (_req, res) => {
    res.json(await readouts.testReadouts(res.locals.input.params.id, membershipOf(res).role));
  });
  routes.get('/tests/:id/readouts.csv', { access: ANY_ROLE, ...test }, async (_req, res) => {
    const { fileName, text } = await readouts.csv(res.locals.input.params.id, membershipOf(res).role);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(text);
  });
  routes.post('/tests/:id/readouts', { access: READOUT_RUNNERS, ...test, body: RunReadoutsInputSchema }, async (req, res) => {
    res.status(202).json(await readouts.run({ testId: res.locals.input.params.id }, actorOf(req, res), res.locals.input.body));
  });
  routes.post('/steps/:id/readouts', { access: READOUT_RUNNERS, ...step, body: RunReadoutsInputSchema }, async (req, res) => {
    res.status(202).json(await readouts.run({ stepId: res.locals.input.params.id }, actorOf(req, res), res.locals.input.body));
  });
  routes.put('/tests/:id/readout-region', { access: READOUT_RUNNERS, ...test, body: SaveReadoutRegionInputSchema }, async (req, res) => {
    res.json(await readouts.saveRegion(res.locals.input.params.id, actorOf(req, res), res.locals.input.body.region));
  });
  routes.get('/steps/:id/frame.jpg', { access: ANY_ROLE, ...step, query: StepFrameQuerySchema }, async (_req, res) => {
    const jpeg = await readouts.stepFramePreview(res.locals.input.params.id, res.locals.input.query);
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.send(jpeg);
  });

  // A readout's images never change (a re-run is a new readout), so browsers may keep them.
  const image = (which: 'difference-map' | 'frame' | 'reference', type: string) => async (_req: Request, res: Response) => {
    const path = await readouts.imagePath(res.locals.input.params.id, which);
    res.sendFile(path, { dotfiles: 'allow', headers: { 'Content-Type': type, 'Cache-Control': 'private, max-age=86400, immutable' } });
  };
  routes.get('/readouts/:id/difference-map.png', { access: ANY_ROLE, ...readout }, image('difference-map', 'image/png'));
  routes.get('/readouts/:id/frame.jpg', { access: ANY_ROLE, ...readout }, image('frame', 'image/jpeg'));
  routes.get('/readouts/:id/reference-frame.jpg', { access: ANY_ROLE, ...readout }, image('reference', 'image/jpeg'));

  routes.get('/channels/:channelId/readouts/tests', { access: ANY_ROLE, params: ChannelParamsSchema }, async (_req, res) => {
    res.json(await readouts.comparableTests(membershipOf(res).channelId));
  });
  routes.get('/channels/:channelId/readouts/compare', { access: ANY_ROLE, params: ChannelParamsSchema, query: CompareQuerySchema }, async (_req, res) => {
    res.json(await readouts.compare(membershipOf(res).channelId, res.locals.input.query.tests));
  });
}
