// The session store writes a session's expiry again at most once a minute (touch throttling),
// against the real PostgreSQL `session` table.
import pg from 'pg';
import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import type session from 'express-session';
import { createSessionStore, SESSION_TOUCH_AFTER_MS } from '../src/auth/session.ts';

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
afterAll(() => pool.end());

const call = (fn: (cb: (err?: unknown) => void) => void) => new Promise<void>((resolve, reject) => fn((err) => (err ? reject(err) : resolve())));
// Expiries are stored in whole seconds, so every instant here is one.
const sessionAt = (expires: number) => ({ cookie: { expires: new Date(expires), originalMaxAge: 1000, httpOnly: true, path: '/' } }) as unknown as session.SessionData;
async function storedExpiry(sid: string): Promise<number | null> {
  const r = await pool.query<{ expire: Date }>('SELECT expire FROM session WHERE sid = $1', [sid]);
  return r.rows[0] ? r.rows[0].expire.getTime() : null;
}

describe('session touches', () => {
  it('a touch within a minute of the last write is not written; a later one is', async () => {
    let clock = Date.UTC(2026, 4, 1);
    const store = createSessionStore(pool, SESSION_TOUCH_AFTER_MS, () => clock);
    const sid = `test-${randomUUID()}`;
    const day = 24 * 3600 * 1000;
    await call((cb) => store.set(sid, sessionAt(clock + 14 * day), cb));
    const first = await storedExpiry(sid);
    expect(first).toBe(clock + 14 * day);

    clock += SESSION_TOUCH_AFTER_MS - 1;
    await call((cb) => store.touch(sid, sessionAt(clock + 14 * day), cb));
    expect(await storedExpiry(sid)).toBe(first);

    clock += 1;
    await call((cb) => store.touch(sid, sessionAt(clock + 14 * day), cb));
    expect(await storedExpiry(sid)).toBe(clock + 14 * day);

    // A store that has not seen the session (another process, a restart) writes the first touch.
    const fresh = createSessionStore(pool, SESSION_TOUCH_AFTER_MS, () => clock + 5000);
    await call((cb) => fresh.touch(sid, sessionAt(clock + 5000 + 14 * day), cb));
    expect(await storedExpiry(sid)).toBe(clock + 5000 + 14 * day);

    await call((cb) => store.destroy(sid, cb));
    expect(await storedExpiry(sid)).toBeNull();
  });
});
