import { ClientChecksumInputSchema, FootageVersionInputSchema, IdParamsSchema, ReassignFootageInputSchema, UploadParamsSchema } from '@midgray/shared';
import { ANY_ROLE, byRecord, currentUser, membershipOf } from '../../middleware/auth.ts';
import { AppError } from '../../errors.ts';
import type { ApiRoutes } from '../../routing.ts';
import type { FootageService } from './footage.service.ts';
import { ASSIGN_ROLES, PICKUP_ROLES } from './footage.service.ts';

const FOOTAGE = byRecord('footage');
const WHAT = 'Footage';

/** The episode's footage, pickup and release, downloads, thumbnails and the browser's checksum. */
export function registerFootageRoutes(routes: ApiRoutes, deps: { footage: FootageService }) {
  const { footage } = deps;
  const actor = (req: Parameters<typeof currentUser>[0], res: Parameters<typeof membershipOf>[0]) => ({ userId: currentUser(req).id, role: membershipOf(res).role });

  routes.get('/episodes/:id/footage', { access: ANY_ROLE, params: IdParamsSchema, scope: byRecord('episodes'), what: 'Episode' }, async (_req, res) => {
    res.json(await footage.list(res.locals.input.params.id));
  });
  routes.get('/footage/:id', { access: ANY_ROLE, params: IdParamsSchema, scope: FOOTAGE, what: WHAT }, async (_req, res) => {
    res.json(await footage.get(res.locals.input.params.id));
  });
  routes.post('/footage/:id/pickup', { access: PICKUP_ROLES, params: IdParamsSchema, scope: FOOTAGE, what: WHAT, body: FootageVersionInputSchema }, async (req, res) => {
    res.json(await footage.pickUp(res.locals.input.params.id, actor(req, res), res.locals.input.body.version));
  });
  routes.post('/footage/:id/release', { access: ANY_ROLE, params: IdParamsSchema, scope: FOOTAGE, what: WHAT, body: FootageVersionInputSchema }, async (req, res) => {
    res.json(await footage.release(res.locals.input.params.id, actor(req, res), res.locals.input.body.version));
  });
  routes.post('/footage/:id/reassign', { access: ASSIGN_ROLES, params: IdParamsSchema, scope: FOOTAGE, what: WHAT, body: ReassignFootageInputSchema }, async (req, res) => {
    res.json(await footage.reassign(res.locals.input.params.id, actor(req, res), res.locals.input.body));
  });
  // Byte ranges (RFC 9110 §14), If-Range and HEAD come from Express's file sender.
  routes.get('/footage/:id/download', { access: ANY_ROLE, params: IdParamsSchema, scope: FOOTAGE, what: WHAT }, async (_req, res, next) => {
    const file = await footage.fileFor(res.locals.input.params.id);
    res.attachment(file.name);
    // `root` keeps the dot-file check to the server-made key (the storage folder itself may sit under .data/).
    res.sendFile(file.key, { root: file.root, acceptRanges: true, lastModified: true, cacheControl: false, dotfiles: 'deny', headers: { 'Cache-Control': 'private, no-store', 'X-Content-Type-Options': 'nosniff' } }, (err) => {
      if (err && !res.headersSent) next((err as { code?: string }).code === 'ENOENT' ? new AppError('not_found', 'The file is missing from storage: ask an admin to check the storage folder') : err);
    });
  });
  routes.get('/footage/:id/thumbnail', { access: ANY_ROLE, params: IdParamsSchema, scope: FOOTAGE, what: WHAT }, async (_req, res, next) => {
    const thumb = await footage.thumbnailFor(res.locals.input.params.id);
    res.type('image/jpeg');
    res.sendFile(thumb.key, { root: thumb.root, dotfiles: 'deny', headers: { 'Cache-Control': 'private, max-age=3600' } }, (err) => {
      if (err && !res.headersSent) next(err);
    });
  });
  routes.put('/upload-checksums/:uploadId', { access: ANY_ROLE, params: UploadParamsSchema, scope: byRecord('uploads', 'uploadId'), what: 'Upload', body: ClientChecksumInputSchema }, async (req, res) => {
    res.json(await footage.setClientChecksum(res.locals.input.params.uploadId, currentUser(req).id, res.locals.input.body.sha256));
  });
}
