/**
 * Gathers items per key for a while and hands each key's batch over once: the first item of a key
 * starts its window, items arriving within it join, and when it ends the batch goes out. With a
 * window of 0 every item goes out at once. `flush()` sends what waits (on shutdown). Kept in this
 * process: a crash loses at most one window's batches, which is acceptable for notifications.
 */
export class Batcher<T> {
  private readonly waiting = new Map<string, { items: T[]; timer: ReturnType<typeof setTimeout> }>();

  constructor(
    private readonly windowMs: number,
    private readonly deliver: (key: string, items: T[]) => Promise<unknown>,
    private readonly onError: (err: unknown) => void = (err) => console.error('[batcher]', err),
  ) {}

  /** Adds an item to its key's batch; resolves when it is queued (or, with a 0 window, delivered). */
  async add(key: string, item: T): Promise<void> {
    if (this.windowMs <= 0) {
      await this.send(key, [item]);
      return;
    }
    const open = this.waiting.get(key);
    if (open) {
      open.items.push(item);
      return;
    }
    const timer = setTimeout(() => void this.release(key), this.windowMs);
    timer.unref?.();
    this.waiting.set(key, { items: [item], timer });
  }

  /** Sends every waiting batch now. */
  async flush(): Promise<void> {
    await Promise.all([...this.waiting.keys()].map((key) => this.release(key)));
  }

  private async release(key: string) {
    const batch = this.waiting.get(key);
    if (!batch) return;
    clearTimeout(batch.timer);
    this.waiting.delete(key);
    await this.send(key, batch.items);
  }

  private async send(key: string, items: T[]) {
    try {
      await this.deliver(key, items);
    } catch (err) {
      this.onError(err);
    }
  }
}
