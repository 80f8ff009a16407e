// The ISO sweep and latitude bracket generators (issue 4). Each step asks the solver for the
// settings that move the light at the sensor by its target: −k stops for k stops more ISO (hold
// the exposure), +offset for a bracket step (over-exposure = more light).
import type { z } from 'zod';
import { InvalidInputError } from '../errors.ts';
import { IsoSweepInputSchema, LatitudeBracketInputSchema, type BaseExposure, type ExposureControl } from '../schemas/plans.ts';
import { formatStops, stopWord } from './format.ts';
import type { StopStep } from './guards.ts';
import { apertureStops, ndStops, secondsToShutterAngle, shutterAngleToSeconds, stopsBetween } from './math.ts';
import { exactFNumber, isoThirdsFrom100, nominalIsoSeries } from './series.ts';
import { makeSolver, round, type PlanSettings, type ResolvedBase } from './solver.ts';

export { HOLD_TOLERANCE_STOPS, type PlanSettings, type ResolvedBase } from './solver.ts';

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
  // An angle derived from seconds (1/50 s at 24 fps) is rounded so it matches the same angle typed
  // in the kit list (172.8°) instead of sitting beside it as 172.79999999999998°.
  const shutterAngleDeg =
    base.shutter.kind === 'angle'
      ? base.shutter.angleDeg
      : round(secondsToShutterAngle(base.shutter.seconds, base.fps), 9);
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
