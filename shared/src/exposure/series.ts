// Nominal (marked) series of ISO, f-number and shutter speed. The marked numbers are rounded
// labels of exact powers of two; the rounding is conventional, not arithmetic (ISO 12 is
// 12.5 exact, f/11 is 11.31, 1/125 s is 1/128), so each series is a table, not a formula.
// Every entry keeps its position in thirds of a stop, so stop arithmetic uses exact values.
import { requireOrdered, requirePositive, requireStep, type StopStep } from './guards.ts';

/**
 * Marked ISO speeds in third stops from ISO 3 to ISO 409600 (arithmetic scale of ISO 5800 /
 * ISO 12232). Full stops are the entries a whole number of stops from ISO 100. Above 6400 the
 * doubling run 12800, 25600, 51200 … is how digital cameras mark their speeds.
 */
const ISO_MARKED: readonly number[] = [
  3, 4, 5, 6, 8, 10, 12, 16, 20, 25, 32, 40, 50, 64, 80,
  100, 125, 160, 200, 250, 320, 400, 500, 640, 800, 1000, 1250, 1600, 2000, 2500, 3200, 4000,
  5000, 6400, 8000, 10000, 12800, 16000, 20000, 25600, 32000, 40000, 51200, 64000, 80000,
  102400, 128000, 160000, 204800, 256000, 320000, 409600,
];
/** Index of ISO 100 in ISO_MARKED (each index step is a third of a stop). */
const ISO_100_INDEX = 15;

/**
 * Marked f-numbers in third stops from f/0.7 to f/64: powers of √2 for full stops (f/1, 1.4, 2,
 * 2.8, 4, 5.6, 8, 11, 16, 22, 32, 45, 64) with the conventional third-stop markings between.
 */
const F_NUMBER_MARKED: readonly number[] = [
  0.7, 0.8, 0.9,
  1, 1.1, 1.2, 1.4, 1.6, 1.8, 2, 2.2, 2.5, 2.8, 3.2, 3.5, 4, 4.5, 5, 5.6, 6.3, 7.1,
  8, 9, 10, 11, 13, 14, 16, 18, 20, 22, 25, 29, 32, 36, 40, 45, 51, 57, 64,
];
/** Index of f/1 in F_NUMBER_MARKED. */
const F1_INDEX = 3;

/** Marked shutter speeds in third stops from 30 s to 1/8000 s, as they are written. */
const SHUTTER_MARKED: readonly string[] = [
  '30', '25', '20', '15', '13', '10', '8', '6', '5', '4', '3.2', '2.5', '2', '1.6', '1.3',
  '1', '0.8', '0.6', '1/2', '0.4', '0.3', '1/4', '1/5', '1/6', '1/8', '1/10', '1/13', '1/15',
  '1/20', '1/25', '1/30', '1/40', '1/50', '1/60', '1/80', '1/100', '1/125', '1/160', '1/200',
  '1/250', '1/320', '1/400', '1/500', '1/640', '1/800', '1/1000', '1/1250', '1/1600', '1/2000',
  '1/2500', '1/3200', '1/4000', '1/5000', '1/6400', '1/8000',
];
/** Index of 1 s in SHUTTER_MARKED. */
const ONE_SECOND_INDEX = 15;

/** One marked shutter speed. */
export interface NominalShutterSpeed {
  /** The marked time in seconds (1/125 → 0.008). */
  seconds: number;
  /** The exact time the marking stands for, in seconds: 2^(−thirds/3) (1/125 → 1/128). */
  exactSeconds: number;
  /** The marking as written: "1/125", "0.8 s", "30 s". */
  label: string;
  /** Position in thirds of a stop from 1 s (positive = shorter). */
  thirdsFromOneSecond: number;
}

const SHUTTER_SERIES: readonly NominalShutterSpeed[] = SHUTTER_MARKED.map((text, index) => {
  const thirds = index - ONE_SECOND_INDEX;
  const seconds = text.startsWith('1/') ? 1 / Number(text.slice(2)) : Number(text);
  return {
    seconds,
    exactSeconds: 2 ** (-thirds / 3),
    label: text.includes('/') ? text : `${text} s`,
    thirdsFromOneSecond: thirds,
  };
});

// Marked values sit on float-exact decimals, but bounds typed by people may not (0.008 vs 1/125).
const within = (value: number, min: number, max: number) =>
  value >= min * (1 - 1e-9) && value <= max * (1 + 1e-9);

function checkRange(min: number, max: number, step: unknown, what: string, example: string): StopStep {
  requirePositive(min, 'min', `The lowest ${what} must be a positive number such as ${example}`);
  requirePositive(max, 'max', `The highest ${what} must be a positive number such as ${example}`);
  requireOrdered(min, max, 'min', `${what[0]!.toUpperCase()}${what.slice(1)} range`);
  return requireStep(step);
}

/** Returns the marked ISO speeds between min and max inclusive, ascending; 'full' keeps whole stops from ISO 100. */
export function nominalIsoSeries(min: number, max: number, step: StopStep): number[] {
  const s = checkRange(min, max, step, 'ISO', '100');
  return ISO_MARKED.filter(
    (iso, i) => within(iso, min, max) && (s === 'third' || (i - ISO_100_INDEX) % 3 === 0),
  );
}

/** Returns the marked f-numbers between min and max inclusive, widest first; 'full' keeps whole stops from f/1. */
export function nominalApertureSeries(min: number, max: number, step: StopStep): number[] {
  const s = checkRange(min, max, step, 'f-number', '2.8');
  return F_NUMBER_MARKED.filter(
    (n, i) => within(n, min, max) && (s === 'third' || (i - F1_INDEX) % 3 === 0),
  );
}

/** Returns the marked shutter speeds (seconds and label) between minSeconds and maxSeconds, shortest first; 'full' keeps whole stops from 1 s. */
export function nominalShutterSeries(
  minSeconds: number,
  maxSeconds: number,
  step: StopStep,
): NominalShutterSpeed[] {
  const s = checkRange(minSeconds, maxSeconds, step, 'shutter time in seconds', '1/125 = 0.008');
  return SHUTTER_SERIES.filter(
    (speed) =>
      within(speed.seconds, minSeconds, maxSeconds) &&
      (s === 'third' || speed.thirdsFromOneSecond % 3 === 0),
  )
    .slice()
    .reverse()
    .map((speed) => ({ ...speed }));
}

/** Returns the position of a marked ISO speed in thirds of a stop from ISO 100, or null when the value is not marked. */
export function isoThirdsFrom100(iso: number): number | null {
  const i = ISO_MARKED.indexOf(iso);
  return i < 0 ? null : i - ISO_100_INDEX;
}

/** Returns the marked ISO speed a whole number of thirds from ISO 100, or null beyond the table. */
export function isoAtThirdsFrom100(thirds: number): number | null {
  return ISO_MARKED[thirds + ISO_100_INDEX] ?? null;
}

/** Returns the exact f-number a marking stands for (f/5.6 → 2^2.5 = 5.657); unmarked values come back unchanged. */
export function exactFNumber(fNumber: number): number {
  requirePositive(fNumber, 'fNumber', 'Aperture must be a positive f-number such as 5.6');
  const i = F_NUMBER_MARKED.indexOf(fNumber);
  return i < 0 ? fNumber : 2 ** ((i - F1_INDEX) / 6);
}
