import { z } from 'zod';

const bool = z.enum(['0', '1', 'true', 'false']).transform((v) => v === '1' || v === 'true');

/** Everything the API reads from the environment, checked once at start. */
export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4100),
  HOST: z.string().default('127.0.0.1'),
  /** Public origin the browser uses, e.g. http://127.0.0.1:4100 (links in e-mails, OAuth callback). */
  PUBLIC_URL: z.url().default('http://127.0.0.1:4100'),
  DATABASE_URL: z.string().min(1, 'DATABASE_URL is required (npm start sets it)'),
  SESSION_SECRET: z.string().min(16).default('development-only-session-secret-change-me'),
  /** Start the local fakes (OAuth provider, SMTP) inside this process. Never in production. */
  FAKES: bool.default(true),
  FAKE_OAUTH_PORT: z.coerce.number().int().min(0).max(65535).default(4101),
  FAKE_SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2526),
  GITHUB_CLIENT_ID: z.string().default('midgray-local'),
  GITHUB_CLIENT_SECRET: z.string().default('midgray-local-secret'),
  /** OAuth endpoints; default to the local fake provider. */
  OAUTH_AUTHORIZATION_URL: z.url().optional(),
  OAUTH_TOKEN_URL: z.url().optional(),
  OAUTH_USER_PROFILE_URL: z.url().optional(),
  OAUTH_USER_EMAIL_URL: z.url().optional(),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_SECURE: bool.default(false),
  MAIL_FROM: z.string().default('Midgray <no-reply@midgray.localhost>'),
  /** Folder the local SMTP fake writes captured messages to. */
  MAILBOX_DIR: z.string().default('.data/mailbox'),
  /** Folder for uploaded footage (outside the web root). */
  STORAGE_DIR: z.string().default('.data/storage'),
  WEB_DIST: z.string().default('web/dist'),
  /** Largest footage file accepted, in bytes (default 256 GiB). */
  UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(256 * 1024 ** 3),
  /** Hours after its start an unfinished upload expires and its bytes are removed. */
  UPLOAD_EXPIRY_HOURS: z.coerce.number().positive().default(72),
  /** Unfinished uploads one person may have open at once, and their total declared bytes. */
  UPLOAD_MAX_OPEN_PER_USER: z.coerce.number().int().positive().default(50),
  UPLOAD_MAX_OPEN_BYTES_PER_USER: z.coerce.number().int().positive().default(4 * 1024 ** 4),
  /** Free space the footage folder keeps after every upload under way has arrived; uploads that would eat into it get 507. */
  UPLOAD_DISK_RESERVE_BYTES: z.coerce.number().int().min(0).default(2 * 1024 ** 3),
  /** Footage of one episode verified within this many seconds goes to the editors in one "footage ready" mail (0: one mail per file). */
  FOOTAGE_READY_BATCH_SECONDS: z.coerce.number().min(0).max(3600).default(60),
  /** How often expired uploads are swept (cron, every 15 minutes by default). */
  UPLOAD_CLEANUP_CRON: z.string().default('*/15 * * * *'),
  /** Upload locks: 'postgres' (advisory locks, safe with several API processes) or 'memory' (one process only). */
  UPLOAD_LOCKER: z.enum(['postgres', 'memory']).default('postgres'),
  /** PostgreSQL schema of the job queue (pg-boss). Tests give each app its own, so one test's workers never take another's jobs. */
  JOBS_SCHEMA: z.string().regex(/^[a-z][a-z0-9_]{0,49}$/, 'JOBS_SCHEMA must be a lower-case SQL name (letters, digits, _)').default('pgboss'),
  TRUST_PROXY: bool.default(false),
});
export type Env = z.infer<typeof EnvSchema>;

/** Parses `source` (default process.env) and fills derived OAuth URLs; exits with a readable list on error. */
export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = EnvSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Configuration error:\n${lines.join('\n')}`);
  }
  const env = parsed.data;
  if (env.NODE_ENV === 'production' && env.FAKES) throw new Error('FAKES must be off in production');
  if (env.NODE_ENV === 'production' && env.SESSION_SECRET.startsWith('development-only')) {
    throw new Error('Set SESSION_SECRET in production');
  }
  if (env.NODE_ENV === 'production') {
    // In production (no local stand-ins) the real provider and mail server must be named: defaults
    // would point sign-in and mail at 127.0.0.1 ports nothing listens on.
    const named = ['OAUTH_AUTHORIZATION_URL', 'OAUTH_TOKEN_URL', 'OAUTH_USER_PROFILE_URL', 'OAUTH_USER_EMAIL_URL', 'GITHUB_CLIENT_ID', 'GITHUB_CLIENT_SECRET', 'SMTP_HOST', 'SMTP_PORT'];
    const missing = named.filter((k) => !source[k]);
    if (missing.length) throw new Error(`Configuration error: in production set ${missing.join(', ')} (the sign-in provider's endpoints and client, and the mail server)`);
  }
  const fake = `http://127.0.0.1:${env.FAKE_OAUTH_PORT}`;
  env.OAUTH_AUTHORIZATION_URL ??= `${fake}/login/oauth/authorize`;
  env.OAUTH_TOKEN_URL ??= `${fake}/login/oauth/access_token`;
  env.OAUTH_USER_PROFILE_URL ??= `${fake}/user`;
  env.OAUTH_USER_EMAIL_URL ??= `${fake}/user/emails`;
  env.SMTP_PORT ??= env.FAKE_SMTP_PORT;
  return env;
}
