/**
 * Collapses concurrent identical reads WITHOUT serving anything older than the request.
 *
 * Why: when twenty people open (or refetch) the same board at once, twenty copies of the same
 * statement compete for two cores. Plain request coalescing would hand a request the result of a
 * read that started before it arrived, so a person who has just moved a card and refetches could
 * get the board from before their move. Here a request that arrives while a read is in flight
 * waits for the NEXT read, which starts after it arrived; everyone who arrives meanwhile shares
 * that next read. So every answer is at least as fresh as its request, at most two reads per key
 * run at a time, and a lone request runs exactly one read (no timers, no TTL, nothing to invalidate).
 */
export class FreshCoalescer<T> {
  private readonly running = new Map<string, Promise<T>>();
  private readonly queued = new Map<string, Promise<T>>();

  /** Returns `load()`'s result for `key`, sharing reads with concurrent callers as described above. */
  get(key: string, load: () => Promise<T>): Promise<T> {
    const queued = this.queued.get(key);
    if (queued) return queued;
    const running = this.running.get(key);
    if (!running) return this.start(key, load);
    const next = running
      .catch(() => undefined)
      .then(() => {
        this.queued.delete(key);
        return this.start(key, load);
      });
    this.queued.set(key, next);
    return next;
  }

  private start(key: string, load: () => Promise<T>): Promise<T> {
    const read: Promise<T> = load().finally(() => {
      if (this.running.get(key) === read) this.running.delete(key);
    });
    this.running.set(key, read);
    return read;
  }
}
