// Data volume and transfer time. Units follow IEC 80000-13: SI prefixes are powers of 1000
// (1 GB = 10^9 bytes), binary prefixes powers of 1024 (1 GiB = 2^30 bytes); 1 byte = 8 bits.
// Camera bitrates and link speeds are quoted in SI megabits per second.
import { InvalidInputError } from '../errors.ts';
import { requireNonNegative, requirePositive } from './guards.ts';

const BITRATE_MUST_BE = 'Bitrate must be a positive number of megabits per second';
const LINK_MUST_BE = 'Link speed must be a positive number of megabits per second';

/** Returns the bytes (SI, whole bytes rounded up) recorded at a bitrate in megabits per second over a duration in seconds. */
export function bytesForBitrate(megabitsPerSecond: number, seconds: number): number {
  requirePositive(megabitsPerSecond, 'megabitsPerSecond', BITRATE_MUST_BE);
  requireNonNegative(seconds, 'seconds', 'Duration must be a number of seconds at or above 0');
  // Round up to whole bytes; the small allowance keeps float noise (750000000.0000001) from adding one.
  return Math.max(0, Math.ceil((megabitsPerSecond * 1e6 * seconds) / 8 - 1e-6));
}

/** Returns the seconds needed to move `bytes` over a link of the given megabits per second. */
export function uploadSeconds(bytes: number, megabitsPerSecond: number): number {
  requireNonNegative(bytes, 'bytes', 'Size must be a number of bytes at or above 0');
  requirePositive(megabitsPerSecond, 'megabitsPerSecond', LINK_MUST_BE);
  return (bytes * 8) / (megabitsPerSecond * 1e6);
}

/** Returns the seconds of recording that fit in `cardBytes` at a bitrate in megabits per second. */
export function cardRecordingSeconds(cardBytes: number, megabitsPerSecond: number): number {
  requireNonNegative(cardBytes, 'cardBytes', 'Card size must be a number of bytes at or above 0');
  requirePositive(megabitsPerSecond, 'megabitsPerSecond', BITRATE_MUST_BE);
  return (cardBytes * 8) / (megabitsPerSecond * 1e6);
}

const SI_UNITS = ['B', 'kB', 'MB', 'GB', 'TB', 'PB'];
const BINARY_UNITS = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB'];

function scaled(bytes: number, base: number, units: string[]): string {
  let value = bytes;
  let unit = 0;
  while (value >= base && unit < units.length - 1) {
    value /= base;
    unit++;
  }
  if (unit === 0) return `${Math.round(value)} B`;
  // Three significant figures, as a person reads a size: 12.5 GB, 715 MiB, 1.02 TB.
  const digits = value >= 100 ? 0 : value >= 10 ? 1 : 2;
  const text = value.toFixed(digits);
  // 999.7 MB rounds to "1000 MB"; say "1.00 GB" instead.
  if (Number(text) >= base && unit < units.length - 1) return `${(Number(text) / base).toFixed(2)} ${units[unit + 1]}`;
  return `${text} ${units[unit]}`;
}

/** Returns a size in bytes in SI and binary units: 12.5e9 → "12.5 GB (11.6 GiB)". */
export function formatBytesBoth(bytes: number): string {
  requireNonNegative(bytes, 'bytes', 'Size must be a number of bytes at or above 0');
  return `${scaled(bytes, 1000, SI_UNITS)} (${scaled(bytes, 1024, BINARY_UNITS)})`;
}

/** Storage estimate of one test: bytes, label and upload time. */
export interface StorageEstimate {
  /** Seconds of footage: secondsPerStep × steps. */
  seconds: number;
  /** Bytes (SI). */
  bytes: number;
  /** "12.5 GB (11.6 GiB)". */
  label: string;
  /** Seconds to upload at the link speed. */
  uploadSeconds: number;
}

/** Returns the storage and upload time of a test: bitrate (Mb/s) × seconds per step × steps, uploaded at a link speed (Mb/s). */
export function storageEstimate(input: {
  megabitsPerSecond: number;
  secondsPerStep: number;
  steps: number;
  linkMegabitsPerSecond: number;
}): StorageEstimate {
  requirePositive(input.secondsPerStep, 'secondsPerStep', 'Seconds per step must be a positive number');
  const steps = requireNonNegative(input.steps, 'steps', 'Steps must be a whole number at or above 0');
  if (!Number.isInteger(steps)) {
    throw new InvalidInputError(`Steps must be a whole number at or above 0 (got ${steps}).`, 'steps');
  }
  const seconds = input.secondsPerStep * steps;
  const bytes = bytesForBitrate(input.megabitsPerSecond, seconds);
  return {
    seconds,
    bytes,
    label: formatBytesBoth(bytes),
    uploadSeconds: uploadSeconds(bytes, input.linkMegabitsPerSecond),
  };
}
