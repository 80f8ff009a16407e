// The arithmetic behind each upload's speed and time left, kept free of Uppy and React so it can
// be tested: an exponential moving average of bytes over time, the time left it implies, how both
// read on screen (SI prefixes, powers of 1000: IEC 80000-13 and the SI Brochure, 9th ed., Table 7),
// and when a progress step is worth announcing to a screen reader.

/** Smoothing time constant in seconds: steady enough to read, quick enough to follow a change (common practice for transfer meters, 2–5 s). */
export const RATE_TIME_CONSTANT_SECONDS = 3;

/** Seconds without a progress event after which the speed shown decays as if nothing arrived (a stall). */
export const STALL_AFTER_SECONDS = 1.5;

/** One file's speed estimate: the smoothed rate and the last sample it was computed from. */
export interface RateEstimate {
  /** Smoothed bytes per second; null until two samples have been seen. */
  bytesPerSecond: number | null;
  /** Bytes sent at the last sample. */
  bytes: number;
  /** When the last sample was taken, in milliseconds (any monotonic clock). */
  atMs: number;
}

/** Returns a fresh estimate that starts counting from `bytes` at `atMs` (no speed yet). */
export function startRate(bytes: number, atMs: number): RateEstimate {
  return { bytesPerSecond: null, bytes, atMs };
}

/** Returns the weight of a new sample `seconds` long: 1 − e^(−Δt/τ), so irregular intervals weigh by their length. */
function sampleWeight(seconds: number): number {
  return 1 - Math.exp(-seconds / RATE_TIME_CONSTANT_SECONDS);
}

/**
 * Returns the estimate after a progress sample of `bytes` sent by `atMs`. A sample that goes back
 * (a resumed upload restarting from the server's offset) or back in time restarts the clock and keeps the speed.
 */
export function sampleRate(estimate: RateEstimate, bytes: number, atMs: number): RateEstimate {
  const seconds = (atMs - estimate.atMs) / 1000;
  if (bytes < estimate.bytes || seconds < 0) return { bytesPerSecond: estimate.bytesPerSecond, bytes, atMs };
  if (seconds === 0) return { ...estimate, bytes }; // same instant: wait for time to pass
  const instant = (bytes - estimate.bytes) / seconds;
  const previous = estimate.bytesPerSecond;
  const bytesPerSecond = previous == null ? instant : previous + sampleWeight(seconds) * (instant - previous);
  return { bytesPerSecond, bytes, atMs };
}

/** Returns the speed to show at `nowMs` in bytes per second: the estimate, lowered as if zero bytes arrived when no sample came for a while. */
export function rateAt(estimate: RateEstimate, nowMs: number): number | null {
  const silentSeconds = (nowMs - estimate.atMs) / 1000;
  if (estimate.bytesPerSecond == null || silentSeconds <= STALL_AFTER_SECONDS) return estimate.bytesPerSecond;
  // The silence past the allowance counts as a sample of zero bytes, so the speed falls smoothly from where it was.
  return estimate.bytesPerSecond * (1 - sampleWeight(silentSeconds - STALL_AFTER_SECONDS));
}

/** Returns the estimate with its clock restarted at `atMs` (after a pause, so the paused time is not counted as slow). */
export function restartClock(estimate: RateEstimate, atMs: number): RateEstimate {
  return { ...estimate, atMs };
}

/** Returns the seconds left to send `bytesLeft` at `bytesPerSecond`; null when the speed is unknown or zero (never Infinity). */
export function secondsLeft(bytesLeft: number, bytesPerSecond: number | null): number | null {
  if (bytesPerSecond == null || !Number.isFinite(bytesPerSecond) || bytesPerSecond <= 0) return null;
  return Math.max(0, bytesLeft) / bytesPerSecond;
}

const SI_RATE_UNITS = ['B/s', 'kB/s', 'MB/s', 'GB/s', 'TB/s'];

/** Returns a speed in SI units: "38.2 MB/s", "312 kB/s", "900 B/s"; "—" when unknown or zero. */
export function formatSpeed(bytesPerSecond: number | null): string {
  if (bytesPerSecond == null || !Number.isFinite(bytesPerSecond) || bytesPerSecond <= 0) return '—';
  let n = bytesPerSecond;
  let i = 0;
  // Step up before rounding would print "1000": bytes round to whole numbers, larger units to tenths.
  while (n >= (i === 0 ? 999.5 : 999.95) && i < SI_RATE_UNITS.length - 1) {
    n /= 1000;
    i++;
  }
  if (i === 0) return `${Math.round(n)} B/s`;
  return `${n.toFixed(n >= 99.95 ? 0 : 1)} ${SI_RATE_UNITS[i]}`;
}

/**
 * Returns the time left as words, rounded more coarsely as it grows so it does not flicker:
 * "about 7 s left", "about 45 s left" (5 s steps), "about 2 min 10 s left" (10 s steps), "about 1 h 5 min left"; "—" when unknown.
 */
export function formatTimeLeft(seconds: number | null): string {
  if (seconds == null || !Number.isFinite(seconds) || seconds < 0) return '—';
  if (seconds < 10) return `about ${Math.max(1, Math.ceil(seconds))} s left`;
  if (seconds < 60) {
    const s = Math.round(seconds / 5) * 5;
    return s >= 60 ? 'about 1 min left' : `about ${s} s left`;
  }
  if (seconds < 3600) {
    const total = Math.round(seconds / 10) * 10;
    if (total >= 3600) return 'about 1 h left';
    const m = Math.floor(total / 60);
    const s = total % 60;
    return s ? `about ${m} min ${s} s left` : `about ${m} min left`;
  }
  const total = Math.round(seconds / 60);
  const h = Math.floor(total / 60);
  const m = total % 60;
  return m ? `about ${h} h ${m} min left` : `about ${h} h left`;
}

/** Returns the highest quarter (25, 50 or 75 %) passed between two fractions sent, or null when none was; 100 % is announced as "uploaded" instead. */
export function quarterPassed(previousFraction: number, fraction: number): 25 | 50 | 75 | null {
  for (const q of [75, 50, 25] as const) if (previousFraction < q / 100 && fraction >= q / 100) return q;
  return null;
}

/** Returns what a screen reader hears at a quarter: "A007.mp4: 50 % sent, about 40 s left" (time left only when known). */
export function quarterAnnouncement(name: string, quarter: 25 | 50 | 75, secondsToGo: number | null): string {
  return secondsToGo == null ? `${name}: ${quarter} % sent` : `${name}: ${quarter} % sent, ${formatTimeLeft(secondsToGo)}`;
}
