// SMPTE ST 12-1 timecode ↔ frame count, and chapter times (m:ss / h:mm:ss; the parsing rules
// live with the description composer, these wrappers throw InvalidInputError instead).
// Drop-frame counting exists only for the NTSC-family rates 30000/1001 (29.97) and 60000/1001
// (59.94): it skips frame numbers 00 and 01 (00–03 at 59.94) at the start of every minute
// except minutes 00, 10, 20, 30, 40 and 50, so the count keeps pace with the clock. No
// pictures are dropped, only labels. Drop-frame timecode is written with ';' before the frames.
import { chapterTimeToSeconds, secondsToChapterTime } from './description.ts';
import { InvalidInputError } from './errors.ts';
import { gotText, requirePositive } from './exposure/guards.ts';

const HOURS_PER_DAY = 24;

interface Counting {
  /** Frame labels per second (30 for 29.97). */
  base: number;
  /** Frame labels skipped per minute in drop-frame (0 for non-drop). */
  drop: number;
}

const FPS_MUST_BE = 'Frame rate must be a positive number of frames per second';

function counting(fps: number, dropFrame: boolean): Counting {
  requirePositive(fps, 'fps', FPS_MUST_BE);
  const base = Math.round(fps);
  if (!dropFrame) return { base, drop: 0 };
  // Accept 29.97 or 59.94 typed with two decimals as well as the exact ratios.
  if (Math.abs(fps - 30000 / 1001) < 0.005) return { base: 30, drop: 2 };
  if (Math.abs(fps - 60000 / 1001) < 0.005) return { base: 60, drop: 4 };
  throw new InvalidInputError(
    `Drop-frame timecode exists only at 29.97 (30000/1001) and 59.94 (60000/1001) fps (got ${fps}); use non-drop timecode.`,
    'fps',
  );
}

const pad = (n: number) => String(n).padStart(2, '0');

/** Returns the SMPTE timecode "HH:MM:SS:FF" (non-drop) or "HH:MM:SS;FF" (drop-frame) of a zero-based frame count. */
export function framesToTimecode(frames: number, fps: number, options: { dropFrame?: boolean } = {}): string {
  const { base, drop } = counting(fps, options.dropFrame ?? false);
  if (typeof frames !== 'number' || !Number.isInteger(frames) || frames < 0) {
    throw new InvalidInputError(`Frame count must be a whole number at or above 0 ${gotText(frames)}.`, 'frames');
  }
  const perMinute = base * 60 - drop;
  const perTenMinutes = base * 600 - 9 * drop;
  const perDay = perTenMinutes * 6 * HOURS_PER_DAY;
  if (frames >= perDay) {
    throw new InvalidInputError(
      `Frame ${frames} is past 24 hours of timecode at this rate (last frame ${perDay - 1}); timecode restarts at midnight.`,
      'frames',
    );
  }
  let label = frames;
  if (drop > 0) {
    // Add back the labels skipped so far: 9 dropped minutes per full ten-minute block, then
    // one per started minute after the first (undropped) minute of the current block.
    const blocks = Math.floor(frames / perTenMinutes);
    const rest = frames % perTenMinutes;
    label += 9 * drop * blocks + (rest < drop ? 0 : drop * Math.floor((rest - drop) / perMinute));
  }
  const ff = label % base;
  const totalSeconds = Math.floor(label / base);
  const ss = totalSeconds % 60;
  const mm = Math.floor(totalSeconds / 60) % 60;
  const hh = Math.floor(totalSeconds / 3600);
  return `${pad(hh)}:${pad(mm)}:${pad(ss)}${drop > 0 ? ';' : ':'}${pad(ff)}`;
}

const TIMECODE = /^(\d{2})[:;](\d{2})[:;](\d{2})([:;])(\d{2,3})$/;

/** Returns the zero-based frame count of a SMPTE timecode; ';' before the frames means drop-frame. */
export function timecodeToFrames(tc: string, fps: number): number {
  const match = typeof tc === 'string' ? TIMECODE.exec(tc.trim()) : null;
  if (!match) {
    throw new InvalidInputError(
      `Timecode must look like HH:MM:SS:FF, or HH:MM:SS;FF for drop-frame ${gotText(tc)}.`,
      'tc',
    );
  }
  const [hh, mm, ss, ff] = [match[1], match[2], match[3], match[5]].map(Number) as [number, number, number, number];
  const dropFrame = match[4] === ';';
  const { base, drop } = counting(fps, dropFrame);
  if (hh >= HOURS_PER_DAY || mm >= 60 || ss >= 60 || ff >= base) {
    throw new InvalidInputError(
      `Timecode ${tc} is out of range: hours 00–23, minutes and seconds 00–59, frames 00–${pad(base - 1)} at this rate.`,
      'tc',
    );
  }
  if (drop > 0 && ss === 0 && ff < drop && mm % 10 !== 0) {
    throw new InvalidInputError(
      `Timecode ${tc} does not exist in drop-frame counting: frames 00–${pad(drop - 1)} are skipped at the start of every minute except each tenth; the next label is ${pad(hh)}:${pad(mm)}:00;${pad(drop)}.`,
      'tc',
    );
  }
  const totalMinutes = 60 * hh + mm;
  return base * (3600 * hh + 60 * mm + ss) + ff - drop * (totalMinutes - Math.floor(totalMinutes / 10));
}

/** Returns the seconds of a chapter time written "m:ss" or "h:mm:ss" ("4:05" → 245, "1:02:03" → 3723). */
export function parseChapterTime(text: string): number {
  const parsed = typeof text === 'string' ? chapterTimeToSeconds(text) : { error: `Chapter time must look like 4:05 or 1:02:03 ${gotText(text)}` };
  if ('error' in parsed) throw new InvalidInputError(`${parsed.error}.`, 'time');
  return parsed.seconds;
}

/** Returns a chapter time label from seconds (whole seconds, rounded down): "m:ss" under an hour, else "h:mm:ss". */
export function formatChapterTime(seconds: number): string {
  if (typeof seconds !== 'number' || !Number.isFinite(seconds) || seconds < 0) {
    throw new InvalidInputError(`Chapter time must be a number of seconds at or above 0 ${gotText(seconds)}.`, 'seconds');
  }
  return secondsToChapterTime(seconds);
}
