import { CreateSpecLineInputSchema, CreateTestInputSchema, IdParamsSchema, LightingInputSchema, MarkStepShotInputSchema, UpdateSpecLineInputSchema, UpdateStepInputSchema, UpdateTestInputSchema, VersionInputSchema, VersionQuerySchema } from '@midgray/shared';
import type { Response } from 'express';
import { byRecord, currentUser, membershipOf, type ChannelScope } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import { PLAN_EDITORS, PLAN_READERS, type PlansService } from './plans.service.ts';
import { shotListCsv, shotListFileName } from './shot-list.ts';

// Routes keyed by a test, spec-sheet line or step find their channel through the episode.
const byTest: ChannelScope = { param: 'id', sql: 'SELECT e.channel_id FROM tests t JOIN episodes e ON e.id = t.episode_id WHERE t.id = :id' };
const bySpecLine: ChannelScope = {
  param: 'id',
  sql: 'SELECT e.channel_id FROM spec_sheet_lines l JOIN tests t ON t.id = l.test_id JOIN episodes e ON e.id = t.episode_id WHERE l.id = :id',
};
const byStep: ChannelScope = {
  param: 'id',
  sql: 'SELECT e.channel_id FROM test_steps s JOIN tests t ON t.id = s.test_id JOIN episodes e ON e.id = t.episode_id WHERE s.id = :id',
};

const actorOf = (req: Parameters<typeof currentUser>[0], res: Response) => ({ channelId: membershipOf(res).channelId, userId: currentUser(req).id });

/** Test plans of an episode: tests, steps, spec sheets, lighting, the shot list. */
export function registerPlanRoutes(routes: ApiRoutes, deps: { plans: PlansService }) {
  const { plans } = deps;
  const episode = { scope: byRecord('episodes'), what: 'Episode', params: IdParamsSchema } as const;
  const test = { scope: byTest, what: 'Test', params: IdParamsSchema } as const;
  const line = { scope: bySpecLine, what: 'Spec-sheet line', params: IdParamsSchema } as const;
  const step = { scope: byStep, what: 'Step', params: IdParamsSchema } as const;

  routes.get('/episodes/:id/tests', { access: PLAN_READERS, ...episode }, async (_req, res) => {
    res.json(await plans.listForEpisode(res.locals.input.params.id, membershipOf(res).role));
  });
  routes.post('/episodes/:id/tests', { access: PLAN_EDITORS, ...episode, body: CreateTestInputSchema }, async (req, res) => {
    res.status(201).json(await plans.create(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.get('/episodes/:id/shot-list.csv', { access: PLAN_READERS, ...episode }, async (_req, res) => {
    const { episode: ep, tests } = await plans.listForEpisode(res.locals.input.params.id, membershipOf(res).role);
    res
      .type('text/csv; charset=utf-8; header=present')
      .attachment(shotListFileName(ep.title))
      .set('Cache-Control', 'no-store')
      .send(shotListCsv(tests));
  });

  routes.get('/tests/:id', { access: PLAN_READERS, ...test }, async (_req, res) => {
    res.json(await plans.get(res.locals.input.params.id));
  });
  routes.patch('/tests/:id', { access: PLAN_EDITORS, ...test, body: UpdateTestInputSchema }, async (req, res) => {
    res.json(await plans.update(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.delete('/tests/:id', { access: PLAN_EDITORS, ...test, query: VersionQuerySchema }, async (req, res) => {
    await plans.remove(res.locals.input.params.id, actorOf(req, res), res.locals.input.query.version);
    res.status(204).end();
  });
  routes.post('/tests/:id/regenerate', { access: PLAN_EDITORS, ...test, body: VersionInputSchema }, async (req, res) => {
    res.json(await plans.regenerate(res.locals.input.params.id, actorOf(req, res), res.locals.input.body.version));
  });
  routes.put('/tests/:id/lighting', { access: PLAN_EDITORS, ...test, body: LightingInputSchema }, async (req, res) => {
    res.json(await plans.setLighting(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.post('/tests/:id/spec-lines', { access: PLAN_EDITORS, ...test, body: CreateSpecLineInputSchema }, async (req, res) => {
    res.status(201).json(await plans.addSpecLine(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });

  routes.patch('/spec-lines/:id', { access: PLAN_EDITORS, ...line, body: UpdateSpecLineInputSchema }, async (req, res) => {
    res.json(await plans.updateSpecLine(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.delete('/spec-lines/:id', { access: PLAN_EDITORS, ...line, query: VersionQuerySchema }, async (req, res) => {
    await plans.removeSpecLine(res.locals.input.params.id, actorOf(req, res), res.locals.input.query.version);
    res.status(204).end();
  });

  routes.patch('/steps/:id', { access: PLAN_EDITORS, ...step, body: UpdateStepInputSchema }, async (req, res) => {
    res.json(await plans.updateStep(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.post('/steps/:id/shot', { access: PLAN_EDITORS, ...step, body: MarkStepShotInputSchema }, async (req, res) => {
    res.json(await plans.markShot(res.locals.input.params.id, actorOf(req, res), res.locals.input.body));
  });
  routes.delete('/steps/:id/shot', { access: PLAN_EDITORS, ...step, query: VersionQuerySchema }, async (req, res) => {
    res.json(await plans.unmarkShot(res.locals.input.params.id, actorOf(req, res), res.locals.input.query.version));
  });
}

