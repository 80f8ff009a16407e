// The ISO sweep and latitude bracket generators (issue 4). Both ask one question per step:
// which nominal settings the kit allows move the light at the sensor by a target number of
// stops? The answer is searched exhaustively (kits are small) and ranked by
//   1. the exposure error left (differences under NEGLIGIBLE_STOPS count as none), then
//   2. how far each control moved, lowest-priority control first,
// so the first control in `priority` absorbs as much as it can and the next ones only take
// what is left. Errors are computed from the exact values the markings stand for (f/5.6 is
// 2^2.5 = 5.657; ND 0.3 is 0.997 stops), never from the labels.
import type { z } from 'zod';
import { InvalidInputError } from '../errors.ts';
import {
  IsoSweepInputSchema,
  LatitudeBracketInputSchema,
  type BaseExposure,
  type ExposureControl,
  type KitLimits,
} from '../schemas/plans.ts';
import { formatMagnitude, formatStops, stopWord } from './format.ts';
import type { StopStep } from './guards.ts';
import { apertureStops, ndStops, secondsToShutterAngle, shutterAngleToSeconds, stopsBetween } from './math.ts';
import { exactFNumber, isoThirdsFrom100, nominalApertureSeries, nominalIsoSeries } from './series.ts';

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

/** One step of an ISO sweep. */
export interface IsoSweepStep extends PlanSettings {
  index: number;
  iso: number;
  /** Stops of ISO above the base (negative below); marked values are whole thirds. */
  isoStopsFromBase: number;
  /** Image exposure left versus the base exposure, in stops (positive = brighter). */
  exposureErrorStops: number;
  /** True when the error is within 1/6 stop. */
  held: boolean;
  /** What the step needs when it is not held, else null. */
  warning: string | null;
}

/** An ISO sweep: one step per marked ISO value, ascending. */
export interface IsoSweepPlan {
  kind: 'iso_sweep';
  base: ResolvedBase;
  step: StopStep;
  priority: ExposureControl[];
  steps: IsoSweepStep[];
}

/** One step of a latitude bracket. */
export interface LatitudeBracketStep extends PlanSettings {
  index: number;
  /** Requested exposure offset in stops (positive = over-exposed, more light). */
  offsetStops: number;
  /** The offset as written: "−1⅓", "0", "+3". */
  offsetLabel: string;
  /** Offset the chosen settings really give, in stops. */
  achievedOffsetStops: number;
  /** achievedOffsetStops − offsetStops. */
  exposureErrorStops: number;
  held: boolean;
  warning: string | null;
  /** Correction the grade applies to bring the step back to the reference: −offset, in stops. */
  gradeCorrectionStops: number;
  /** The correction as written: "+3 stops in the grade", "none (reference)". */
  gradeCorrectionLabel: string;
}

/** A latitude bracket: one step per offset from −N to +N, ascending. */
export interface LatitudeBracketPlan {
  kind: 'latitude_bracket';
  base: ResolvedBase;
  step: StopStep;
  priority: ExposureControl[];
  steps: LatitudeBracketStep[];
}

/** Returns the parsed input, or throws InvalidInputError carrying the first problem and its field path. */
function parseOrThrow<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input);
  if (!result.success) {
    const issue = result.error.issues[0]!;
    throw new InvalidInputError(issue.message, issue.path.join('.') || undefined);
  }
  return result.data;
}

function resolveBase(iso: number, base: BaseExposure): ResolvedBase {
  const shutterAngleDeg =
    base.shutter.kind === 'angle' ? base.shutter.angleDeg : secondsToShutterAngle(base.shutter.seconds, base.fps);
  const shutterSeconds =
    base.shutter.kind === 'seconds' ? base.shutter.seconds : shutterAngleToSeconds(base.shutter.angleDeg, base.fps);
  return {
    iso,
    fps: base.fps,
    ndDensity: base.ndDensity,
    fNumber: base.fNumber,
    fNumberExact: exactFNumber(base.fNumber),
    shutterAngleDeg,
    shutterSeconds,
  };
}

interface Option {
  value: number;
  /** Change of light at the sensor versus the base, in stops (positive = more light). */
  stops: number;
}

interface Solver {
  solve(targetStops: number): { settings: PlanSettings; errorStops: number; warning: string | null };
}

const uniqueSorted = (values: number[]) => [...new Set(values)].sort((a, b) => a - b);

/** Builds the option lists once per plan; `solve` then finds the settings for each step. */
function makeSolver(base: ResolvedBase, kit: KitLimits, priority: ExposureControl[]): Solver {
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

const round = (value: number, digits: number) => Number(value.toFixed(digits)) + 0;

/** Settings as shot (or planned) on one step, for comparing the two. */
export interface ShotSettings {
  iso: number;
  fNumber: number;
  shutterSeconds: number;
  ndDensity: number;
  /** Light level change versus the plan's base, in stops; default 0. */
  lightChangeStops?: number;
}

/** Returns how much brighter (positive) or darker the image of `actual` is than `planned`, in stops. */
export function exposureDifferenceStops(planned: ShotSettings, actual: ShotSettings): number {
  const plannedIso = isoThirdsFrom100(planned.iso);
  const actualIso = isoThirdsFrom100(actual.iso);
  // Marked ISO speeds are whole thirds apart; unmarked ones fall back to their ratio.
  const isoStops =
    plannedIso !== null && actualIso !== null ? (actualIso - plannedIso) / 3 : stopsBetween(planned.iso, actual.iso);
  return (
    isoStops +
    apertureStops(exactFNumber(actual.fNumber), exactFNumber(planned.fNumber)) +
    stopsBetween(planned.shutterSeconds, actual.shutterSeconds) -
    (ndStops(actual.ndDensity) - ndStops(planned.ndDensity)) +
    ((actual.lightChangeStops ?? 0) - (planned.lightChangeStops ?? 0))
  );
}

/** Returns an ISO sweep plan: one step per marked ISO in the range, with the settings that hold the base exposure. */
export function isoSweepPlan(input: z.input<typeof IsoSweepInputSchema>): IsoSweepPlan {
  const parsed = parseOrThrow(IsoSweepInputSchema, input);
  const base = resolveBase(parsed.baseIso, parsed.base);
  const baseThirds = isoThirdsFrom100(parsed.baseIso)!;
  const ladder = nominalIsoSeries(parsed.minIso, parsed.maxIso, 'third').filter(
    (iso) => parsed.step === 'third' || (isoThirdsFrom100(iso)! - baseThirds) % 3 === 0,
  );
  if (ladder.length === 0) {
    throw new InvalidInputError(
      `No marked ISO speed ${parsed.step === 'full' ? `a whole number of stops from base ISO ${parsed.baseIso} ` : ''}lies between ISO ${parsed.minIso} and ISO ${parsed.maxIso}; widen the range.`,
      'minIso',
    );
  }
  const solver = makeSolver(base, parsed.kit, parsed.priority);
  const steps = ladder.map((iso, index): IsoSweepStep => {
    const isoStopsFromBase = (isoThirdsFrom100(iso)! - baseThirds) / 3;
    // k stops more ISO needs k stops less light at the sensor.
    const { settings, errorStops, warning } = solver.solve(-isoStopsFromBase);
    return {
      index,
      iso,
      isoStopsFromBase,
      ...settings,
      exposureErrorStops: errorStops,
      held: warning === null,
      warning,
    };
  });
  return { kind: 'iso_sweep', base, step: parsed.step, priority: parsed.priority, steps };
}

/** Returns a latitude bracket plan at base ISO: one step per offset −N…+N with the settings that give it and the grade correction. */
export function latitudeBracketPlan(input: z.input<typeof LatitudeBracketInputSchema>): LatitudeBracketPlan {
  const parsed = parseOrThrow(LatitudeBracketInputSchema, input);
  const base = resolveBase(parsed.baseIso, parsed.base);
  const solver = makeSolver(base, parsed.kit, parsed.priority);
  const stride = parsed.step === 'full' ? 3 : 1;
  const steps: LatitudeBracketStep[] = [];
  for (let thirds = -3 * parsed.maxOffsetStops; thirds <= 3 * parsed.maxOffsetStops; thirds += stride) {
    const offsetStops = thirds / 3;
    const { settings, errorStops, warning } = solver.solve(offsetStops);
    const correction = -offsetStops + 0;
    steps.push({
      index: steps.length,
      offsetStops,
      offsetLabel: formatStops(offsetStops),
      ...settings,
      achievedOffsetStops: round(offsetStops + errorStops, 4),
      exposureErrorStops: errorStops,
      held: warning === null,
      warning,
      gradeCorrectionStops: correction,
      gradeCorrectionLabel:
        thirds === 0 ? 'none (reference)' : `${formatStops(correction)} ${stopWord(correction)} in the grade`,
    });
  }
  return { kind: 'latitude_bracket', base, step: parsed.step, priority: parsed.priority, steps };
}
