// The resumable upload endpoint (tus 1.0: core, creation, expiration, termination) inside the
// Express app at /api/uploads — mounted before any body parser, with the tus `path` equal to the
// public URL and relative Location headers, so it works behind a proxy. Express middleware runs
// first and decides who may do what: sign-in, CSRF on writes, membership of the episode's channel
// on creation, and on every HEAD/PATCH/DELETE the upload's owner and channel (an upload URL is
// not a secret). Refusals happen before tus sees the request, so nothing is stored.
import { randomBytes } from 'node:crypto';
import { mkdir, statfs } from 'node:fs/promises';
import { resolve } from 'node:path';
import { MemoryLocker, Server, type ServerOptions } from '@tus/server';
import { ERRORS, EVENTS, Metadata, type Locker } from '@tus/utils';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { extensionsForKind, FOOTAGE_KIND_LABELS, fileExtension, fileNameProblem, formatForFileName, KIND_FORMATS, sanitizeFileName, UploadMetadataSchema, type Role } from '@midgray/shared';
import type { Env } from '../config/env.ts';
import { AppError } from '../errors.ts';
import type { FootageService } from '../modules/footage/footage.service.ts';
import { UPLOAD_ROLES } from '../modules/footage/footage.service.ts';
import { PgLocker } from './pg-locker.ts';
import { FootageUploadStore, formatBytes, UPLOAD_ID_PATTERN, UploadRecords, UploadRefusal, type UploadCreation } from './upload-store.ts';

/** Public path of the upload endpoint (the tus `path`; the Express mount matches it). */
export const UPLOADS_PATH = '/api/uploads';
const ID_URL = /^\/api\/uploads\/([^/?#]*)$/;

/**
 * express-session wraps res.end(chunk, encoding); @tus/server 2 (through srvx) ends with
 * res.end(callback), which that wrapper passes on as a chunk (ERR_INVALID_ARG_TYPE). This accepts
 * the callback form and calls the callback once the response finished or closed.
 */
export const acceptEndCallback: RequestHandler = (_req, res, next) => {
  const end = res.end;
  res.end = function patchedEnd(this: Response, chunk?: unknown, encoding?: unknown, cb?: unknown) {
    if (typeof chunk === 'function') [cb, chunk, encoding] = [chunk, undefined, undefined];
    else if (typeof encoding === 'function') [cb, encoding] = [encoding, undefined];
    if (typeof cb === 'function') {
      let called = false;
      const once = () => {
        if (!called) {
          called = true;
          (cb as () => void)();
        }
      };
      res.once('finish', once);
      res.once('close', once);
    }
    return (end as (c?: unknown, e?: unknown) => Response).call(this, chunk, encoding);
  } as typeof res.end;
  next();
};

/** What the guard found, for the tus hooks (on res.locals of the Express request). */
interface UploadLocals {
  creation?: UploadCreation;
}

export interface UploadServerDeps {
  env: Env;
  sequelize: Sequelize;
  footage: () => FootageService;
  /** The app's CSRF check (csrf-sync); tus writes must carry X-CSRF-Token too. */
  csrfProtection: RequestHandler;
}

/** Builds the tus server, its store and locker, and the Express handlers to mount at /api/uploads{/*splat}. */
export function createUploadServer(deps: UploadServerDeps) {
  const { env, sequelize } = deps;
  const expiryMs = env.UPLOAD_EXPIRY_HOURS * 3_600_000;
  const storageDir = resolve(env.STORAGE_DIR);
  const freeBytes = async () => {
    try {
      await mkdir(storageDir, { recursive: true });
      const fs = await statfs(storageDir);
      return fs.bavail * fs.bsize;
    } catch (err) {
      console.error(`[uploads] free space of ${storageDir} unknown: ${(err as Error).message}`);
      return null;
    }
  };
  const records = new UploadRecords(sequelize, {
    expiryMs,
    maxOpenPerUser: env.UPLOAD_MAX_OPEN_PER_USER,
    maxOpenBytesPerUser: env.UPLOAD_MAX_OPEN_BYTES_PER_USER,
    diskReserveBytes: env.UPLOAD_DISK_RESERVE_BYTES,
    freeBytes,
  });
  const store = new FootageUploadStore({ storageDir, records, expiryMs });
  // MemoryLocker only serialises the requests of one process; the PostgreSQL locker serves several.
  const locker: Locker & { close?: () => Promise<void> } = env.UPLOAD_LOCKER === 'postgres' ? new PgLocker(env.DATABASE_URL) : new MemoryLocker();
  const maxBytes = env.UPLOAD_MAX_BYTES;

  const localsOf = (req: { runtime?: { node?: { req?: unknown } } }): UploadLocals => {
    const nodeReq = req.runtime?.node?.req as Request | undefined;
    return (nodeReq?.res?.locals ?? {}) as UploadLocals;
  };

  const options: ServerOptions & { datastore: FootageUploadStore } = {
    path: UPLOADS_PATH,
    datastore: store,
    locker,
    relativeLocation: true,
    maxSize: maxBytes,
    disableTerminationForFinishedUploads: true,
    allowedOrigins: [new URL(env.PUBLIC_URL).origin],
    namingFunction: () => randomBytes(16).toString('hex'),
    // Second line of defence after the guard: only ids of the server's own form.
    getFileIdFromRequest: (_req, lastPath) => (lastPath && UPLOAD_ID_PATTERN.test(lastPath) ? lastPath : undefined),
    onUploadCreate: async (req, upload) => {
      const creation = localsOf(req as never).creation;
      if (!creation) throw new UploadRefusal(400, 'The upload was not checked before creation');
      records.bind(upload, creation);
      return { metadata: { ...upload.metadata, filename: creation.originalName } };
    },
    onUploadFinish: async (_req, upload) => {
      await deps.footage().finishUpload(upload.id);
      return {};
    },
    onResponseError: (_req, err) => {
      if (err instanceof UploadRefusal) return { status_code: err.status_code, body: err.body };
      const e = err as { status_code?: number; body?: string };
      if (e === ERRORS.INVALID_OFFSET) return { status_code: 409, body: 'The Upload-Offset does not match the bytes the server has: ask for the upload\'s offset (HEAD) and continue from there.' };
      if (e === ERRORS.ERR_MAX_SIZE_EXCEEDED || e === ERRORS.ERR_SIZE_EXCEEDED) return { status_code: 413, body: `The file is larger than its declared length or the ${formatBytes(maxBytes)} Midgray accepts.` };
      if (e === ERRORS.FILE_NO_LONGER_EXISTS) return { status_code: 410, body: 'This upload expired and its bytes were removed: start it again.' };
      if (e === ERRORS.ERR_LOCK_TIMEOUT) return { status_code: 423, body: 'Another request is still writing this upload: try again in a few seconds.' };
      if (!e?.status_code) console.error('[uploads] unexpected error', err);
      return undefined;
    },
  };
  const tus = new Server(options);
  // While a long PATCH streams in, record the offset about once a second (postReceiveInterval), so
  // the footage table shows everyone how far an upload got; the file on disk stays the truth.
  tus.on(EVENTS.POST_RECEIVE, (_stream: unknown, upload: { id: string; offset: number }) => {
    records.setOffset(upload.id, upload.offset).catch((err: Error) => console.warn('[uploads] offset not recorded:', err.message));
  });

  /** Sends a refusal as the API's JSON error (tus clients show the text; the web app reads the message). */
  const refuse = (next: NextFunction, code: ConstructorParameters<typeof AppError>[0], message: string) => next(new AppError(code, message));

  const roleIn = async (channelId: string, userId: string): Promise<Role | undefined> => {
    const rows = await sequelize.query<{ role: Role }>('SELECT role FROM memberships WHERE channel_id = :channelId AND user_id = :userId', {
      replacements: { channelId, userId },
      type: QueryTypes.SELECT,
    });
    return rows[0]?.role;
  };

  /** Checks a creation request (POST /api/uploads) and records what tus will need. */
  const checkCreation = async (req: Request, res: Response, next: NextFunction) => {
    const user = req.user!;
    if (req.headers['upload-defer-length'] !== undefined || req.headers['upload-length'] === undefined) {
      return refuse(next, 'bad_request', 'Send the file\'s size (Upload-Length): uploads of unknown length are not accepted');
    }
    let raw: Record<string, string | null>;
    try {
      raw = Metadata.parse(req.headers['upload-metadata'] as string | undefined);
    } catch {
      return refuse(next, 'bad_request', 'Upload-Metadata is not valid tus metadata (key and base64 value pairs)');
    }
    const parsed = UploadMetadataSchema.safeParse(Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, v ?? undefined])));
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      return refuse(next, 'validation_failed', `Upload metadata ${issue.path.join('.') || ''}: ${issue.message}`.replace(' : ', ': '));
    }
    const meta = parsed.data;
    const episodes = await sequelize.query<{ channel_id: string }>('SELECT channel_id FROM episodes WHERE id = :id', { replacements: { id: meta.episodeId }, type: QueryTypes.SELECT });
    const channelId = episodes[0]?.channel_id;
    const role = channelId ? await roleIn(channelId, user.id) : undefined;
    if (!channelId || !role) return refuse(next, 'not_found', 'Episode not found');
    if (!UPLOAD_ROLES.includes(role)) return refuse(next, 'forbidden', `Your role (${role}) cannot upload footage`);
    const length = Number(req.headers['upload-length']);
    if (!Number.isSafeInteger(length) || length < 0) return refuse(next, 'bad_request', 'Upload-Length must be a whole number of bytes');
    if (length === 0) return refuse(next, 'bad_request', 'The file is empty');
    if (length > maxBytes) return refuse(next, 'payload_too_large', `The file is ${formatBytes(length)}; the largest file Midgray accepts is ${formatBytes(maxBytes)}`);
    const problem = fileNameProblem(meta.filename);
    if (problem) return refuse(next, 'validation_failed', problem);
    const name = sanitizeFileName(meta.filename);
    const claimed = formatForFileName(name);
    if (!claimed || !KIND_FORMATS[meta.kind].includes(claimed)) {
      const ext = fileExtension(name) || 'a file without an extension';
      return refuse(next, 'unsupported_media_type', `${ext} is not accepted as a ${FOOTAGE_KIND_LABELS[meta.kind].toLowerCase()}: use ${extensionsForKind(meta.kind).join(', ')}`);
    }
    const stepId = meta.stepId || null;
    if (stepId && !(await deps.footage().stepInEpisode(stepId, meta.episodeId))) return refuse(next, 'validation_failed', 'That test step is not part of this episode');
    (res.locals as UploadLocals).creation = {
      ownerId: user.id,
      channelId,
      episodeId: meta.episodeId,
      stepId,
      kind: meta.kind,
      originalName: name,
      claimedFormat: claimed,
      clientSha256: meta.sha256 || null,
    };
    next();
  };

  /** Checks a request about one upload against its owner and channel. */
  const checkExisting = async (id: string, req: Request, _res: Response, next: NextFunction) => {
    const user = req.user!;
    const rows = await sequelize.query<{ owner_id: string; channel_id: string; length: string; completed_at: Date | null; owner_name: string }>(
      'SELECT u.owner_id, u.channel_id, u.length, u.completed_at, p.name AS owner_name FROM uploads u JOIN users p ON p.id = u.owner_id WHERE u.id = :id',
      { replacements: { id }, type: QueryTypes.SELECT },
    );
    const up = rows[0];
    const role = up ? await roleIn(up.channel_id, user.id) : undefined;
    // Uploads of channels the caller is not in answer like ones that do not exist.
    if (!up || !role) return refuse(next, 'not_found', 'Upload not found');
    if (!UPLOAD_ROLES.includes(role)) return refuse(next, 'forbidden', `Your role (${role}) cannot upload footage`);
    if (req.method === 'DELETE') {
      if (up.completed_at) return refuse(next, 'conflict', 'This upload is finished and is now footage; it cannot be cancelled');
      if (up.owner_id !== user.id && !['producer', 'admin'].includes(role)) return refuse(next, 'forbidden', `${up.owner_name} started this upload; only they, a producer or an admin can cancel it`);
      return next();
    }
    if (up.owner_id !== user.id) return refuse(next, 'forbidden', `${up.owner_name} started this upload; only they can continue it`);
    if (!up.completed_at && (req.method === 'HEAD' || req.method === 'PATCH')) {
      // All bytes on disk but not recorded as finished (the server stopped in between): finish now.
      if ((await store.bytesOnDisk(id)) === Number(up.length)) await deps.footage().finishUpload(id);
    }
    next();
  };

  const guard: RequestHandler = (req, res, next) => {
    const path = req.originalUrl.split('?')[0];
    if (req.method === 'OPTIONS') return next(); // protocol discovery; stores nothing
    const isCollection = path === UPLOADS_PATH || path === `${UPLOADS_PATH}/`;
    const m = ID_URL.exec(path);
    // Only ids of the server's own form: no encoded slashes, dots or other paths.
    if (!isCollection && !(m && UPLOAD_ID_PATTERN.test(m[1]))) return refuse(next, 'not_found', 'Upload not found');
    if (!req.user) return refuse(next, 'unauthenticated', 'Sign in to upload');
    const checks = async () => {
      if (isCollection) {
        if (req.method !== 'POST') return refuse(next, 'not_found', `No API route for ${req.method} ${path}`);
        return checkCreation(req, res, next);
      }
      if (!['HEAD', 'PATCH', 'DELETE'].includes(req.method)) return refuse(next, 'not_found', `No API route for ${req.method} ${path}`);
      return checkExisting(m![1], req, res, next);
    };
    const run = () => checks().catch(next);
    // Writes carry the session's CSRF token (X-CSRF-Token), as every other API write.
    if (['POST', 'PATCH', 'DELETE'].includes(req.method)) return deps.csrfProtection(req, res, (err?: unknown) => (err ? next(err) : void run()));
    void run();
  };

  const handle: RequestHandler = (req, res, next) => {
    tus.handle(req, res).catch(next);
  };

  return {
    /** Middleware chain for app.all('/api/uploads{/*splat}', …). */
    handlers: [acceptEndCallback, guard, handle] as RequestHandler[],
    store,
    records,
    tus,
    expiryMs,
    close: async () => {
      await locker.close?.();
    },
  };
}
