// One upload is never written by two requests at once. @tus/server's default MemoryLocker only
// knows the requests of its own process; behind a load balancer a resumed PATCH can land on
// another process while the old one still writes. This locker takes a PostgreSQL advisory lock
// per upload id (held by one shared session per process) after an in-process reservation, and
// asks the current holder, in this process or another (LISTEN/NOTIFY), to let go — the same
// "request release" contract as MemoryLocker, so a client that reconnects takes over its upload.
import { ERRORS, type Lock, type Locker, type RequestRelease } from '@tus/utils';
import pg from 'pg';

const CHANNEL = 'midgray_upload_lock_release';
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** The advisory-lock key of an upload id: its first 64 bits (ids are 128 random bits in hex). */
export function lockKey(id: string): string {
  if (!/^[0-9a-f]{32}$/.test(id)) throw ERRORS.FILE_NOT_FOUND;
  return BigInt.asIntN(64, BigInt(`0x${id.slice(0, 16)}`)).toString();
}

export interface PgLockerOptions {
  /** Give up waiting for a lock after this many ms (default 30 s, as MemoryLocker). */
  acquireTimeoutMs?: number;
}

/** A tus Locker backed by PostgreSQL advisory locks; close() ends its session. */
export class PgLocker implements Locker {
  readonly local = new Map<string, RequestRelease>();
  readonly timeoutMs: number;
  private client: pg.Client | null = null;
  private connecting: Promise<pg.Client> | null = null;
  private closed = false;

  constructor(
    private readonly connectionString: string,
    opts: PgLockerOptions = {},
  ) {
    this.timeoutMs = opts.acquireTimeoutMs ?? 30_000;
  }

  newLock(id: string): Lock {
    return new PgLock(id, this);
  }

  /** The process's lock session (connects and LISTENs on first use). */
  async session(): Promise<pg.Client> {
    if (this.client) return this.client;
    this.connecting ??= (async () => {
      const client = new pg.Client({ connectionString: this.connectionString, application_name: 'midgray-upload-locks' });
      await client.connect();
      await client.query(`LISTEN ${CHANNEL}`);
      client.on('notification', (n) => {
        const release = n.payload ? this.local.get(n.payload) : undefined;
        if (release) void release();
      });
      const lost = (err?: Error) => {
        // Locks held by a lost session are gone; new requests open a new one.
        if (!this.closed) console.error('[uploads] lock session lost', err?.message ?? '');
        this.client = null;
        this.connecting = null;
      };
      client.on('error', lost);
      client.on('end', () => lost());
      this.client = client;
      return client;
    })().catch((err) => {
      this.connecting = null;
      throw err;
    });
    return this.connecting;
  }

  /** Tries the advisory lock once; true when this process now holds it. */
  async tryLock(id: string): Promise<boolean> {
    const c = await this.session();
    const r = await c.query<{ ok: boolean }>('SELECT pg_try_advisory_lock($1::bigint) AS ok', [lockKey(id)]);
    return r.rows[0].ok;
  }

  async unlock(id: string): Promise<void> {
    const c = await this.session();
    await c.query('SELECT pg_advisory_unlock($1::bigint)', [lockKey(id)]);
  }

  /** Asks whichever process holds `id` to release it. */
  async askRelease(id: string): Promise<void> {
    const c = await this.session();
    await c.query('SELECT pg_notify($1, $2)', [CHANNEL, id]);
  }

  async close(): Promise<void> {
    this.closed = true;
    const c = this.client ?? (this.connecting ? await this.connecting.catch(() => null) : null);
    this.client = null;
    await c?.end().catch(() => undefined);
  }
}

class PgLock implements Lock {
  constructor(
    private readonly id: string,
    private readonly locker: PgLocker,
  ) {}

  async lock(signal: AbortSignal, requestRelease: RequestRelease): Promise<void> {
    const { locker, id } = this;
    const deadline = Date.now() + locker.timeoutMs;
    let lastRemoteAsk = 0;
    for (let attempt = 0; ; attempt++) {
      if (signal.aborted) throw ERRORS.ERR_LOCK_TIMEOUT;
      const holder = locker.local.get(id);
      if (holder) {
        // Held by another request of this process: ask it to finish (tus: the newer request wins).
        await holder();
      } else {
        locker.local.set(id, requestRelease);
        let ok = false;
        try {
          ok = await locker.tryLock(id);
        } catch (err) {
          locker.local.delete(id);
          throw err;
        }
        if (ok) return;
        locker.local.delete(id);
        if (Date.now() - lastRemoteAsk > 500) {
          lastRemoteAsk = Date.now();
          await locker.askRelease(id);
        }
      }
      if (Date.now() > deadline) throw ERRORS.ERR_LOCK_TIMEOUT;
      await sleep(Math.min(20 + attempt * 10, 200));
    }
  }

  async unlock(): Promise<void> {
    this.locker.local.delete(this.id);
    await this.locker.unlock(this.id);
  }
}
