// The search behind both plan generators: which nominal settings the kit allows move the light
// at the sensor by a target number of stops? Kits are small, so every combination of ND, aperture
// and shutter is tried (a dimmer, when allowed, takes the remainder) and ranked by
//   1. the exposure error left (differences under NEGLIGIBLE_STOPS count as none), then
//   2. how far each control moved, lowest-priority control first,
// so the first control in `priority` absorbs as much as it can and the next ones only take
// what is left. Errors are computed from the exact values the markings stand for (f/5.6 is
// 2^2.5 = 5.657; ND 0.3 is 0.997 stops), never from the labels.
import type { ExposureControl, KitLimits } from '../schemas/plans.ts';
import { formatMagnitude, stopWord } from './format.ts';
import { ndStops, shutterAngleToSeconds } from './math.ts';
import { exactFNumber, nominalApertureSeries } from './series.ts';

/** A step counts as held when its exposure error is within this many stops. */
export const HOLD_TOLERANCE_STOPS = 1 / 6;
/** Differences smaller than this (in stops) are treated as none when ranking settings. */
const NEGLIGIBLE_STOPS = 0.05;

/** The camera and light settings of one step. */
export interface PlanSettings {
  /** ND optical density on the camera. */
  ndDensity: number;
  /** Marked f-number (f/5.6 → 5.6). */
  fNumber: number;
  /** Exact f-number the marking stands for (f/5.6 → 5.657). */
  fNumberExact: number;
  /** Shutter angle in degrees. */
  shutterAngleDeg: number;
  /** Exposure time in seconds at the plan's frame rate. */
  shutterSeconds: number;
  /** Change of the light level on the scene in stops (positive = more light). */
  lightChangeStops: number;
}

/** The base exposure of a plan with the shutter given both ways. */
export interface ResolvedBase extends Omit<PlanSettings, 'lightChangeStops'> {
  iso: number;
  fps: number;
}

interface Option {
  value: number;
  /** Change of light at the sensor versus the base, in stops (positive = more light). */
  stops: number;
}

/** Finds the settings for a target change of light at the sensor, in stops (positive = more light). */
export interface Solver {
  solve(targetStops: number): { settings: PlanSettings; errorStops: number; warning: string | null };
}

const uniqueSorted = (values: number[]) => [...new Set(values)].sort((a, b) => a - b);

/** Returns a solver for one plan: option lists are built once, `solve(targetStops)` finds each step's settings. */
export function makeSolver(base: ResolvedBase, kit: KitLimits, priority: ExposureControl[]): Solver {
  const uses = (control: ExposureControl) => priority.includes(control);
  const baseNdStops = ndStops(base.ndDensity);

  const nd: Option[] = (uses('nd') ? uniqueSorted([...kit.ndDensities, base.ndDensity]) : [base.ndDensity]).map(
    (density) => ({ value: density, stops: baseNdStops - ndStops(density) }),
  );
  const aperture: Option[] = (
    uses('aperture')
      ? uniqueSorted([...nominalApertureSeries(kit.minFNumber, kit.maxFNumber, 'third'), base.fNumber])
      : [base.fNumber]
  ).map((fNumber) => ({ value: fNumber, stops: 2 * Math.log2(base.fNumberExact / exactFNumber(fNumber)) }));
  const shutter: Option[] = (
    uses('shutter') ? uniqueSorted([...kit.shutterAngles, base.shutterAngleDeg]) : [base.shutterAngleDeg]
  ).map((angle) => ({ value: angle, stops: Math.log2(angle / base.shutterAngleDeg) }));
  const lightOn = uses('light') && kit.lightsDimmable;
  const lightDown = lightOn ? kit.lightDownStops : 0;
  const lightUp = lightOn ? kit.lightUpStops : 0;

  const extreme = (pick: (a: number, b: number) => number, list: Option[]) =>
    list.reduce((acc, o) => pick(acc, o.stops), list[0]!.stops);
  const leastLight = extreme(Math.min, nd) + extreme(Math.min, aperture) + extreme(Math.min, shutter) - lightDown;
  const mostLight = extreme(Math.max, nd) + extreme(Math.max, aperture) + extreme(Math.max, shutter) + lightUp;

  // Cost slots: [error, then moves from the lowest-priority control to the highest].
  const slotOf: Record<ExposureControl, number> = { nd: -1, aperture: -1, shutter: -1, light: -1 };
  priority.forEach((control, i) => (slotOf[control] = priority.length - i));
  const size = priority.length + 1;

  return {
    solve(targetStops) {
      const best = new Float64Array(size).fill(Infinity);
      const cost = new Float64Array(size);
      let choice = { nd: nd[0]!, aperture: aperture[0]!, shutter: shutter[0]!, light: 0, error: Infinity };
      for (const n of nd) {
        for (const a of aperture) {
          for (const s of shutter) {
            const discrete = n.stops + a.stops + s.stops;
            const rest = targetStops - discrete;
            const light =
              lightOn && Math.abs(rest) > NEGLIGIBLE_STOPS
                ? Math.round(Math.min(Math.max(rest, -lightDown), lightUp) * 100) / 100
                : 0;
            const error = discrete + light - targetStops;
            cost[0] = Math.abs(error) <= NEGLIGIBLE_STOPS ? 0 : Math.abs(error);
            if (slotOf.nd > 0) cost[slotOf.nd] = Math.abs(n.stops);
            if (slotOf.aperture > 0) cost[slotOf.aperture] = Math.abs(a.stops);
            if (slotOf.shutter > 0) cost[slotOf.shutter] = Math.abs(s.stops);
            if (slotOf.light > 0) cost[slotOf.light] = Math.abs(light);
            if (lexicographicallyLess(cost, best)) {
              best.set(cost);
              choice = { nd: n, aperture: a, shutter: s, light, error };
            }
          }
        }
      }
      const settings: PlanSettings = {
        ndDensity: choice.nd.value,
        fNumber: choice.aperture.value,
        fNumberExact: exactFNumber(choice.aperture.value),
        shutterAngleDeg: choice.shutter.value,
        shutterSeconds: shutterAngleToSeconds(choice.shutter.value, base.fps),
        lightChangeStops: choice.light + 0,
      };
      return { settings, errorStops: round(choice.error, 4), warning: warningFor(choice.error, targetStops) };
    },
  };

  function warningFor(errorStops: number, targetStops: number): string | null {
    if (Math.abs(errorStops) <= HOLD_TOLERANCE_STOPS + 1e-9) return null;
    const amount = `${formatMagnitude(errorStops)} ${stopWord(Number(formatMagnitude(errorStops)))}`;
    if (errorStops > 0) {
      return targetStops < leastLight
        ? `Needs ${amount} less light than the kit can take away: add ND or dim the lights.`
        : `Lands ${amount} too bright: the kit's ND, aperture and shutter steps are too coarse here; add a finer ND or dim the lights.`;
    }
    return targetStops > mostLight
      ? `Needs ${amount} more light than the kit can add: add light or use a faster lens.`
      : `Lands ${amount} too dark: the kit's ND, aperture and shutter steps are too coarse here; add a finer ND or add light.`;
  }
}

function lexicographicallyLess(a: Float64Array, b: Float64Array): boolean {
  for (let i = 0; i < a.length; i++) {
    if (a[i]! < b[i]! - 1e-6) return true;
    if (a[i]! > b[i]! + 1e-6) return false;
  }
  return false;
}

/** Returns `value` rounded to `digits` decimals, never −0. */
export const round = (value: number, digits: number) => Number(value.toFixed(digits)) + 0;
