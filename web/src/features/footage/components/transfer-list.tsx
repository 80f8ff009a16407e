// Beside the dashboard: each started upload with its own speed and time left (or paused, done,
// stopped), and a polite live region that says the same in a few sentences for screen readers.
import type { Transfer } from '../hooks/use-transfers.ts';
import { formatSpeed, formatTimeLeft } from '../upload-rate.ts';

/** Returns the whole percent sent, never 100 before the file is done. */
function percentSent(t: Transfer): number {
  if (t.state === 'done') return 100;
  return t.bytesTotal > 0 ? Math.min(99, Math.floor((100 * t.bytesSent) / t.bytesTotal)) : 0;
}

/** The per-file list of uploads and the live region that announces their quarters, pauses and ends. */
export function TransferList({ transfers, announcement }: { transfers: Transfer[]; announcement: string }) {
  return (
    <>
      <p className="sr-only" role="status" aria-live="polite" aria-atomic="true" aria-label="Upload announcements">
        {announcement}
      </p>
      {transfers.length > 0 && (
        <div className="mt-3">
          <h3 id="footage-transfers" className="text-sm font-semibold">
            Transfers
          </h3>
          <ul aria-labelledby="footage-transfers" className="mt-1 max-w-3xl divide-y divide-line rounded-md border border-line text-xs">
            {transfers.map((t) => (
              <li key={t.id} className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5 px-2 py-1.5">
                <span className="min-w-0 flex-[1_1_12rem] truncate font-medium text-ink" title={t.name}>
                  {t.name}
                </span>
                <span className="flex flex-wrap items-baseline gap-x-3 text-ink-soft tabular-nums">
                  {t.state !== 'done' && <span className="sm:w-10 sm:text-right">{percentSent(t)} %</span>}
                  {t.state === 'sending' && t.bytesPerSecond == null && <span>measuring speed…</span>}
                  {t.state === 'sending' && t.bytesPerSecond != null && (
                    <>
                      <span className="sm:min-w-[5.5rem] sm:text-right">
                        {formatSpeed(t.bytesPerSecond)}
                      </span>
                      <span className="sm:min-w-[10rem]">
                        {formatTimeLeft(t.secondsLeft)}
                      </span>
                    </>
                  )}
                  {t.state === 'paused' && <span>paused</span>}
                  {t.state === 'done' && <span className="text-ok">done</span>}
                  {t.state === 'stopped' && <span className="text-danger">stopped</span>}
                </span>
              </li>
            ))}
          </ul>
        </div>
      )}
    </>
  );
}
