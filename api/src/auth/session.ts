import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import type { Env } from '../config/env.ts';

export const SESSION_COOKIE = 'midgray.sid';
const FOURTEEN_DAYS_MS = 14 * 24 * 60 * 60 * 1000;
/** A session's stored expiry is written again at most this often (its cookie still slides on every response). */
export const SESSION_TOUCH_AFTER_MS = 60_000;
const TOUCHED_KEPT = 10_000;

/**
 * The PostgreSQL session store, with touches throttled: express-session asks the store to "touch"
 * a session (push its expiry) on every request, which is one UPDATE per request. A 14-day sliding
 * expiry loses nothing when the stored value lags by up to `touchAfterMs`, so a session touched
 * by this process within that time is not written again (the `touchAfter` idea of other session
 * stores). Saves, reads and destroys are untouched.
 */
export function createSessionStore(pool: pg.Pool, touchAfterMs = SESSION_TOUCH_AFTER_MS, now: () => number = Date.now) {
  const PgStore = connectPgSimple(session);
  class ThrottledTouchStore extends PgStore {
    private readonly touched = new Map<string, number>();

    private remember(sid: string) {
      const t = now();
      if (this.touched.size >= TOUCHED_KEPT) {
        for (const [k, at] of this.touched) if (t - at >= touchAfterMs) this.touched.delete(k);
        if (this.touched.size >= TOUCHED_KEPT) this.touched.clear();
      }
      this.touched.set(sid, t);
    }

    override touch(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
      const last = this.touched.get(sid);
      if (last !== undefined && now() - last < touchAfterMs) {
        cb?.();
        return;
      }
      this.remember(sid);
      super.touch(sid, sess, cb);
    }

    override set(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
      this.remember(sid);
      super.set(sid, sess, cb);
    }

    override destroy(sid: string, cb?: (err?: unknown) => void): void {
      this.touched.delete(sid);
      super.destroy(sid, cb);
    }
  }
  return new ThrottledTouchStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
}

/** Returns express-session middleware storing sessions in PostgreSQL (table `session`, made by a migration). */
export function createSessionMiddleware(env: Env, pool: pg.Pool) {
  return session({
    name: SESSION_COOKIE,
    secret: env.SESSION_SECRET,
    store: createSessionStore(pool),
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
