import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import type { Env } from '../config/env.ts';

export const SESSION_COOKIE = 'midgray.sid';
const FOURTEEN_DAYS_MS = 14 * 24 * 60 * 60 * 1000;

/** Returns express-session middleware storing sessions in PostgreSQL (table `session`, made by a migration). */
export function createSessionMiddleware(env: Env, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  return session({
    name: SESSION_COOKIE,
    secret: env.SESSION_SECRET,
    store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: env.TRUST_PROXY,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: env.NODE_ENV === 'production',
      maxAge: FOURTEEN_DAYS_MS,
    },
  });
}
