import { ChannelParamsSchema, CreateGearInputSchema, GearListQuerySchema, IdParamsSchema, ROLE_PERMISSIONS, UpdateGearInputSchema } from '@midgray/shared';
import { ANY_ROLE, byRecord, currentUser, membershipOf } from '../../middleware/auth.ts';
import type { ApiRoutes } from '../../routing.ts';
import type { GearService } from './gear.service.ts';

/** Producers and admins manage gear (PRODUCT.md "Who uses it"); every member reads it. */
const GEAR_MANAGERS = ROLE_PERMISSIONS['gear.manage'];
const gearScope = { scope: byRecord('gear'), what: 'Gear', params: IdParamsSchema } as const;

/** The channel's gear list. */
export function registerGearRoutes(routes: ApiRoutes, deps: { gear: GearService }) {
  const { gear } = deps;
  routes.get('/channels/:channelId/gear', { access: ANY_ROLE, params: ChannelParamsSchema, query: GearListQuerySchema }, async (_req, res) => {
    res.json(await gear.list(membershipOf(res).channelId, res.locals.input.query.archived));
  });
  routes.post('/channels/:channelId/gear', { access: GEAR_MANAGERS, params: ChannelParamsSchema, body: CreateGearInputSchema }, async (req, res) => {
    res.status(201).json(await gear.create(membershipOf(res).channelId, currentUser(req).id, res.locals.input.body));
  });
  routes.patch('/gear/:id', { access: GEAR_MANAGERS, ...gearScope, body: UpdateGearInputSchema }, async (req, res) => {
    res.json(await gear.update(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.id, res.locals.input.body));
  });
  routes.delete('/gear/:id', { access: GEAR_MANAGERS, ...gearScope }, async (req, res) => {
    await gear.remove(membershipOf(res).channelId, currentUser(req).id, res.locals.input.params.id);
    res.status(204).end();
  });
}
