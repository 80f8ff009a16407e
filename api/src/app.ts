import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { csrfSync } from 'csrf-sync';
import express, { type Express, type RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import helmet from 'helmet';
import pg from 'pg';
import type { Sequelize } from 'sequelize';
import { registerAuthRoutes } from './auth/auth.router.ts';
import { createPassport } from './auth/passport.ts';
import { createSessionMiddleware } from './auth/session.ts';
import type { Env } from './config/env.ts';
import { AppError } from './errors.ts';
import type { Mailer } from './mail/mailer.ts';
import { apiNotFound, errorHandler } from './middleware/error-handler.ts';
import { ChannelsService } from './modules/channels/channels.service.ts';
import { registerChannelRoutes } from './modules/channels/channels.router.ts';
import { registerEpisodeRoutes } from './modules/episodes/episodes.router.ts';
import { EpisodesService } from './modules/episodes/episodes.service.ts';
import { registerGearRoutes } from './modules/gear/gear.router.ts';
import { GearService } from './modules/gear/gear.service.ts';
import { registerMailboxRoutes } from './modules/dev/mailbox.router.ts';
import { registerHealthRoutes } from './modules/health/health.router.ts';
import { registerPlanRoutes } from './modules/plans/plans.router.ts';
import { registerPublishingRoutes } from './modules/publishing/publishing.router.ts';
import { approvalRequestOnEntry } from './modules/publishing/slots.service.ts';
import { PlansService } from './modules/plans/plans.service.ts';
import { ApiRoutes, type RouteInfo } from './routing.ts';
import { Jobs } from './jobs/jobs.ts';
import { defineFootageJobs } from './modules/footage/footage.jobs.ts';
import { registerFootageRoutes } from './modules/footage/footage.router.ts';
import { FootageService, UPLOAD_ROLES } from './modules/footage/footage.service.ts';
import { createUploadServer, UPLOADS_PATH } from './uploads/tus.ts';
import { registerReadoutJob } from './modules/readouts/readout-job.ts';
import { registerReadoutRoutes } from './modules/readouts/readouts.router.ts';
import { ReadoutsService } from './modules/readouts/readouts.service.ts';

export const API_VERSION = '0.1.0';
/** Largest JSON body any route accepts. */
export const JSON_BODY_LIMIT = '256kb';

/** What the app needs from the outside; server.ts and tests build it. */
export interface AppContext {
  env: Env;
  sequelize: Sequelize;
  mailer: Mailer;
  /** The job queue; createApp makes (and closes) its own when not given. */
  jobs?: Jobs;
}

export interface AppOptions {
  /** Requests per minute per address on sign-in routes (default 30). */
  signInPerMinute?: number;
  /** Invitations per hour per address (default 60). */
  invitesPerHour?: number;
}

/** What createApp returns: the app, its routes, the job queue and services other features hook into. */
export interface BuiltApp {
  app: Express;
  routes: RouteInfo[];
  jobs: Jobs;
  /** Starts this process's job workers and schedules (server.ts; tests that need them). */
  startWorkers: () => Promise<void>;
  footage: FootageService;
  close: () => Promise<void>;
}

/** Builds the Express app (no listen). Returns the app, its route list, its jobs and a close() for its pools. */
export function createApp(ctx: AppContext, opts: AppOptions = {}): BuiltApp {
  const { env, sequelize, mailer } = ctx;
  const jobs = ctx.jobs ?? new Jobs(env.DATABASE_URL, { schema: env.JOBS_SCHEMA });
  const app = express();
  app.disable('x-powered-by');
  if (env.TRUST_PROXY) app.set('trust proxy', 1);

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'default-src': ["'self'"],
          // 'wasm-unsafe-eval' only allows compiling WebAssembly (the footage checksum worker's SHA-256), not eval.
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'worker-src': ["'self'", 'blob:'],
          'frame-ancestors': ["'none'"],
          'form-action': ["'self'"],
          'upgrade-insecure-requests': env.NODE_ENV === 'production' ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  const pool = new pg.Pool({ connectionString: env.DATABASE_URL, max: 5 });
  app.use(createSessionMiddleware(env, pool));
  const passport = createPassport(env, sequelize);
  app.use(passport.initialize());
  app.use(passport.session());

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
    errorConfig: { statusCode: 403, message: 'invalid csrf token', code: 'EBADCSRFTOKEN' },
  });
  const csrfProtection: RequestHandler = (req, res, next) => csrfSynchronisedProtection(req, res, next);

  const limiter = (limit: number, windowMs: number, what: string): RequestHandler =>
    rateLimit({
      windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req, _res, next) => next(new AppError('rate_limited', `Too many ${what} from this address: wait a minute and try again`)),
    });

  // Uploads (tus) mount here, before any body parser: they stream the raw request body.
  // The path equals the public URL; Express 5 needs the named wildcard. CSRF is checked inside.
  const uploads = createUploadServer({ env, sequelize, footage: () => footage, csrfProtection });
  const footage = new FootageService({ sequelize, jobs, storageDir: uploads.store.root, maxFileBytes: env.UPLOAD_MAX_BYTES, removeUpload: (id) => uploads.store.remove(id) });
  defineFootageJobs(jobs, { footage, expiryMs: uploads.expiryMs, bytesOnDisk: (id) => uploads.store.bytesOnDisk(id), cleanupCron: env.UPLOAD_CLEANUP_CRON });
  app.all(`${UPLOADS_PATH}{/*splat}`, ...uploads.handlers);

  app.use('/api', express.json({ limit: JSON_BODY_LIMIT, strict: true, type: ['application/json', 'application/*+json'] }));
  app.use('/api', csrfProtection);
  app.use('/api', (req, _res, next) => {
    // Writes must be JSON: a cross-site form post (urlencoded, multipart, text/plain) is refused outright.
    if (['POST', 'PATCH', 'PUT', 'DELETE'].includes(req.method) && req.headers['content-length'] && req.headers['content-length'] !== '0' && !req.is(['application/json', 'application/*+json'])) {
      return next(new AppError('unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json)'));
    }
    next();
  });

  const routes = new ApiRoutes(sequelize);
  registerHealthRoutes(routes, { sequelize, version: API_VERSION });
  registerAuthRoutes(routes, { passport, sequelize, generateCsrfToken: (req) => generateToken(req), signInLimiter: limiter(opts.signInPerMinute ?? 30, 60_000, 'sign-in attempts') });
  registerChannelRoutes(routes, {
    channels: new ChannelsService(sequelize, mailer, env.PUBLIC_URL),
    inviteLimiter: limiter(opts.invitesPerHour ?? 60, 3_600_000, 'invitations'),
  });
  const mail = { sequelize, mailer, publicUrl: env.PUBLIC_URL };
  // Episodes know nothing of publishing: the "approval requested" mail hears board moves through this listener.
  registerEpisodeRoutes(routes, { episodes: new EpisodesService(sequelize, { afterMove: approvalRequestOnEntry(mail) }) });
  registerGearRoutes(routes, { gear: new GearService(sequelize) });
  registerPlanRoutes(routes, { plans: new PlansService(sequelize) });
  const publishing = registerPublishingRoutes(routes, { ...mail, jobs, footageEvents: footage.events, footageReadyBatchMs: env.FOOTAGE_READY_BATCH_SECONDS * 1000 });
  if (env.FAKES) registerMailboxRoutes(routes, { mailboxDir: resolve(env.MAILBOX_DIR) });
  registerFootageRoutes(routes, { footage });
  registerReadoutJob(jobs, { sequelize, storageDir: uploads.store.root });
  registerReadoutRoutes(routes, { readouts: new ReadoutsService(sequelize, jobs, uploads.store.root) });
  // The tus endpoint is mounted above (before the body parsers); record it for the route matrix.
  routes.list.push({ method: 'ALL', path: UPLOADS_PATH, access: UPLOAD_ROLES }, { method: 'ALL', path: `${UPLOADS_PATH}/:uploadId`, access: UPLOAD_ROLES });

  app.use('/api', routes.router);
  app.use('/api', apiNotFound);

  // The built web app, with the SPA's index.html for every other GET.
  const dist = resolve(env.WEB_DIST);
  if (existsSync(join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h', immutable: false }));
    app.get('/{*splat}', (_req, res) => res.sendFile(join(dist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
  }
  app.use(errorHandler);

  return {
    app,
    routes: routes.list,
    jobs,
    startWorkers: () => jobs.startWorkers(),
    footage,
    close: async () => {
      await publishing.flush();
      if (!ctx.jobs) await jobs.stop();
      await uploads.close();
      await pool.end();
    },
  };
}
