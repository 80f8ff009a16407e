// What other features hear about footage. The "footage ready for pickup" e-mail (publishing and
// notifications) subscribes with `onReady`; it is called after a file was checked and verified.

/** A file that passed its checks: checksums equal, probe matched the spec sheet. */
export interface FootageReadyEvent {
  footageId: string;
  channelId: string;
  episodeId: string;
  kind: string;
  originalName: string;
  uploaderId: string | null;
}

export type FootageReadyListener = (event: FootageReadyEvent) => void | Promise<void>;

/** Listeners of one app instance; a failing listener is logged and never undoes the verification. */
export class FootageEvents {
  private readonly ready = new Set<FootageReadyListener>();

  /** Subscribes to verified footage; returns an unsubscribe function. */
  onReady(listener: FootageReadyListener): () => void {
    this.ready.add(listener);
    return () => this.ready.delete(listener);
  }

  /** Calls every listener (after the verifying transaction committed). */
  async emitReady(event: FootageReadyEvent): Promise<void> {
    for (const l of this.ready) {
      try {
        await l(event);
      } catch (err) {
        console.error('[footage] a ready listener failed', err);
      }
    }
  }
}
