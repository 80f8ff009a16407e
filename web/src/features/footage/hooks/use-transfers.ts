// Follows each file Uppy sends: its smoothed speed and time left (arithmetic in upload-rate.ts),
// whether it is sending, paused, done or stopped, and a short sentence for a polite live region at
// each quarter, pause, resume and finish, so a screen reader hears the upload without a flood.
import type { Body, Meta, Uppy, UppyFile } from '@uppy/core';
import { useEffect, useState } from 'react';
import { quarterAnnouncement, quarterPassed, rateAt, restartClock, sampleRate, secondsLeft, startRate, type RateEstimate } from '../upload-rate.ts';

/** Where one file's upload stands. */
export type TransferState = 'sending' | 'paused' | 'done' | 'stopped';

/** One started upload as the list shows it. */
export interface Transfer {
  id: string;
  name: string;
  state: TransferState;
  /** Bytes the server has been sent so far. */
  bytesSent: number;
  bytesTotal: number;
  /** Smoothed bytes per second, lowered during a stall; null until measured. */
  bytesPerSecond: number | null;
  /** Seconds left at that speed; null when unknown, paused or finished. */
  secondsLeft: number | null;
}

/** How often the list redraws while something is sending, in milliseconds (speed and time left move in steps this long). */
const REDRAW_EVERY_MS = 500;

interface Tracked {
  estimate: RateEstimate;
  /** Fraction sent when the last progress event came, for the quarter announcements. */
  fraction: number;
}

/** Returns where a started file's upload stands, from Uppy's own file state. */
function stateOf<M extends Meta, B extends Body>(file: UppyFile<M, B>): TransferState {
  if (file.progress.uploadComplete) return 'done';
  if (file.error) return 'stopped';
  return file.isPaused ? 'paused' : 'sending';
}

/** Returns "A007.mp4 paused" for one file, "2 uploads paused" for several. */
function namesOr<M extends Meta, B extends Body>(files: UppyFile<M, B>[], what: string): string {
  return files.length === 1 ? `${files[0].name ?? 'The file'} ${what}` : `${files.length} uploads ${what}`;
}

/** Returns the started uploads of `uppy` with their speed and time left, and the latest sentence for a live region. */
export function useTransfers<M extends Meta, B extends Body>(uppy: Uppy<M, B> | null): { transfers: Transfer[]; announcement: string } {
  const [transfers, setTransfers] = useState<Transfer[]>([]);
  const [announcement, setAnnouncement] = useState('');

  useEffect(() => {
    if (!uppy) return;
    const tracked = new Map<string, Tracked>();
    let disposed = false;
    const started = () => uppy.getFiles().filter((f) => f.progress.uploadStarted != null);
    const inFlight = () => started().filter((f) => stateOf(f) === 'sending' || stateOf(f) === 'paused');

    const draw = () => {
      if (disposed) return;
      const now = performance.now();
      setTransfers(
        started().map((f) => {
          const state = stateOf(f);
          const bytesTotal = f.progress.bytesTotal ?? f.size ?? 0;
          const bytesSent = state === 'done' ? bytesTotal : f.progress.bytesUploaded || 0;
          const estimate = tracked.get(f.id)?.estimate;
          const bytesPerSecond = state === 'sending' && estimate ? rateAt(estimate, now) : null;
          return { id: f.id, name: f.name ?? 'file', state, bytesSent, bytesTotal, bytesPerSecond, secondsLeft: state === 'sending' ? secondsLeft(bytesTotal - bytesSent, bytesPerSecond) : null };
        }),
      );
    };
    // Uppy's own listeners (registered first) update the file state; draw after them.
    const drawSoon = () => setTimeout(draw, 0);
    const restart = (files: UppyFile<M, B>[]) => {
      const now = performance.now();
      for (const f of files) {
        const t = tracked.get(f.id);
        if (t) t.estimate = restartClock(t.estimate, now);
      }
    };

    const onProgress = (file: UppyFile<M, B> | undefined, progress: { bytesUploaded: number; bytesTotal: number | null }) => {
      if (!file) return;
      const now = performance.now();
      const total = progress.bytesTotal ?? file.size ?? 0;
      const fraction = total > 0 ? progress.bytesUploaded / total : 0;
      const t = tracked.get(file.id);
      if (!t) {
        tracked.set(file.id, { estimate: startRate(progress.bytesUploaded, now), fraction });
        // A continued upload (added again after a reload) starts past some quarters: say how far it is.
        const quarter = quarterPassed(0, fraction);
        if (quarter) setAnnouncement(quarterAnnouncement(file.name ?? 'file', quarter, null));
        drawSoon();
        return;
      }
      t.estimate = sampleRate(t.estimate, progress.bytesUploaded, now);
      // Keep the furthest point: a resumed upload that steps back to the server's offset does not announce a quarter twice.
      const quarter = quarterPassed(t.fraction, fraction);
      t.fraction = Math.max(t.fraction, fraction);
      if (quarter) setAnnouncement(quarterAnnouncement(file.name ?? 'file', quarter, secondsLeft(total - progress.bytesUploaded, rateAt(t.estimate, now))));
    };
    const onPause = (file: UppyFile<M, B> | undefined, isPaused: boolean) => {
      if (!file) return;
      if (!isPaused) restart([file]);
      setAnnouncement(namesOr([file], isPaused ? 'paused' : 'resumed'));
      drawSoon();
    };
    const onPauseAll = () => {
      const files = inFlight();
      if (files.length) setAnnouncement(namesOr(files, 'paused'));
      drawSoon();
    };
    const onResumeAll = () => {
      const files = inFlight();
      restart(files);
      if (files.length) setAnnouncement(namesOr(files, 'resumed'));
      drawSoon();
    };
    const onRetry = () => {
      restart(started());
      drawSoon();
    };
    const onSuccess = (file: UppyFile<M, B> | undefined) => {
      if (file) setAnnouncement(`${file.name ?? 'The file'} uploaded`);
      drawSoon();
    };
    const onError = (file: UppyFile<M, B> | undefined) => {
      if (file) setAnnouncement(`${file.name ?? 'The file'}: the upload stopped`);
      drawSoon();
    };
    const onRemoved = (file: UppyFile<M, B>) => {
      tracked.delete(file.id);
      drawSoon();
    };
    const onCancelAll = () => {
      tracked.clear();
      drawSoon();
    };

    uppy.on('upload-progress', onProgress);
    uppy.on('upload-pause', onPause);
    uppy.on('pause-all', onPauseAll);
    uppy.on('resume-all', onResumeAll);
    uppy.on('upload-retry', onRetry);
    uppy.on('retry-all', onRetry);
    uppy.on('upload-start', drawSoon);
    uppy.on('upload-success', onSuccess);
    uppy.on('upload-error', onError);
    uppy.on('file-removed', onRemoved);
    uppy.on('cancel-all', onCancelAll);
    // Redraw while something is sending, so the speed falls during a stall even without events.
    const timer = setInterval(() => {
      if (started().some((f) => stateOf(f) === 'sending')) draw();
    }, REDRAW_EVERY_MS);
    return () => {
      disposed = true;
      clearInterval(timer);
      uppy.off('upload-progress', onProgress);
      uppy.off('upload-pause', onPause);
      uppy.off('pause-all', onPauseAll);
      uppy.off('resume-all', onResumeAll);
      uppy.off('upload-retry', onRetry);
      uppy.off('retry-all', onRetry);
      uppy.off('upload-start', drawSoon);
      uppy.off('upload-success', onSuccess);
      uppy.off('upload-error', onError);
      uppy.off('file-removed', onRemoved);
      uppy.off('cancel-all', onCancelAll);
      setTransfers([]);
      setAnnouncement('');
    };
  }, [uppy]);

  return { transfers, announcement };
}
