// What a saved test is made of, computed the same way in the browser (live preview) and in the
// API (saved rows): the steps its generator input gives, the bitrate a spec-sheet line names,
// and how far the settings as shot are from the plan.
import type { z } from 'zod';
import { InvalidInputError } from './errors.ts';
import { formatAngle, formatDensity, formatFNumber, formatStops } from './exposure/format.ts';
import { exposureDifferenceStops, isoSweepPlan, latitudeBracketPlan } from './exposure/plans.ts';
import { shutterAngleToSeconds } from './exposure/math.ts';
import { CustomTestInputSchema, type ActualSettings, type PlannedSettings, type TestKind } from './schemas/test-plans.ts';
import type { IsoSweepInputSchema, LatitudeBracketInputSchema } from './schemas/plans.ts';
import { specSheetLinesForPlan, type SpecSheetLineDraft } from './spec-sheet.ts';

/** A step ready to save: position, label, the ISO or offset it stands for, and its planned settings. */
export interface StepDraft {
  index: number;
  label: string;
  iso: number | null;
  offsetStops: number | null;
  planned: PlannedSettings;
}

function parseCustom(inputs: unknown) {
  const result = CustomTestInputSchema.safeParse(inputs);
  if (!result.success) {
    const issue = result.error.issues[0]!;
    const where = issue.path[0] === 'steps' && typeof issue.path[1] === 'number' ? `Step ${issue.path[1] + 1}: ` : '';
    throw new InvalidInputError(`${where}${issue.message}`, issue.path.join('.') || undefined);
  }
  return result.data;
}

/** Returns the steps of a test from its generator input; throws InvalidInputError (→ 422) when the input is refused. */
export function planSteps(kind: TestKind, inputs: unknown): StepDraft[] {
  if (kind === 'iso_sweep') {
    const plan = isoSweepPlan(inputs as z.input<typeof IsoSweepInputSchema>);
    return plan.steps.map((s) => ({
      index: s.index,
      label: `ISO ${s.iso}`,
      iso: s.iso,
      offsetStops: null,
      planned: {
        fps: plan.base.fps,
        iso: s.iso,
        fNumber: s.fNumber,
        shutterAngleDeg: s.shutterAngleDeg,
        shutterSeconds: s.shutterSeconds,
        ndDensity: s.ndDensity,
        lightChangeStops: s.lightChangeStops,
        exposureErrorStops: s.exposureErrorStops,
        warning: s.warning,
      },
    }));
  }
  if (kind === 'latitude_bracket') {
    const plan = latitudeBracketPlan(inputs as z.input<typeof LatitudeBracketInputSchema>);
    return plan.steps.map((s) => ({
      index: s.index,
      label: s.offsetStops === 0 ? '0 (reference)' : `${s.offsetLabel} stops`,
      iso: plan.base.iso,
      offsetStops: s.offsetStops,
      planned: {
        fps: plan.base.fps,
        iso: plan.base.iso,
        fNumber: s.fNumber,
        shutterAngleDeg: s.shutterAngleDeg,
        shutterSeconds: s.shutterSeconds,
        ndDensity: s.ndDensity,
        lightChangeStops: s.lightChangeStops,
        exposureErrorStops: s.exposureErrorStops,
        warning: s.warning,
        offsetLabel: s.offsetLabel,
        gradeCorrectionStops: s.gradeCorrectionStops,
        gradeCorrectionLabel: s.gradeCorrectionLabel,
      },
    }));
  }
  const custom = parseCustom(inputs);
  return custom.steps.map((s, index) => ({
    index,
    label: s.label,
    iso: s.iso ?? null,
    offsetStops: null,
    planned: {
      fps: custom.fps,
      iso: s.iso ?? null,
      fNumber: s.fNumber ?? null,
      shutterAngleDeg: s.shutterAngleDeg ?? null,
      shutterSeconds: s.shutterAngleDeg === undefined ? null : shutterAngleToSeconds(s.shutterAngleDeg, custom.fps),
      ndDensity: s.ndDensity ?? null,
      lightChangeStops: s.lightChangeStops ?? null,
      notes: s.notes,
    },
  }));
}

/** Returns the standard spec-sheet lines of a test, pre-filled from its plan (custom tests: frame rate only). */
export function specSheetDraftsFor(kind: TestKind, inputs: unknown): SpecSheetLineDraft[] {
  if (kind === 'iso_sweep') return specSheetLinesForPlan('iso_sweep', inputs as z.input<typeof IsoSweepInputSchema>);
  if (kind === 'latitude_bracket') return specSheetLinesForPlan('latitude_bracket', inputs as z.input<typeof LatitudeBracketInputSchema>);
  const custom = parseCustom(inputs);
  const fps = `${Number(custom.fps.toFixed(3))} fps`;
  return specSheetLinesForPlan('custom').map((line) => (line.key === 'frame_rate' ? { ...line, value: fps } : line));
}

/**
 * Returns the megabits per second a bitrate line names, or null when it names none.
 * Reads "400", "400 Mb/s", "400 Mbps", "1.2 Gb/s", "50 MB/s" (bytes: × 8), "800 kb/s"; SI prefixes (IEC 80000-13).
 */
export function parseBitrateMbps(text: string): number | null {
  const m = /^\s*(\d{1,3}(?:,\d{3})+|\d+(?:\.\d+)?|\.\d+)\s*([kKmMgG]?)(bit|bps|b|B)?(?:\s*(?:\/\s*s(?:ec)?|ps))?\b/.exec(text);
  if (!m) return null;
  const value = Number(m[1]!.replace(/,/g, ''));
  if (!(value > 0) || !Number.isFinite(value)) return null;
  const prefix = m[2]!.toLowerCase();
  const scale = prefix === 'k' ? 1e-3 : prefix === 'g' ? 1e3 : 1;
  // A capital B after a prefix means bytes ("50 MB/s"); without any unit, megabits are meant.
  const bytes = m[3] === 'B';
  return value * scale * (bytes ? 8 : 1);
}

/** How the settings as shot differ from the plan: total exposure difference in stops and one line per changed control. */
export interface StepDifference {
  /** Image exposure of actual versus planned, in stops (positive = brighter); null when the plan leaves a control open. */
  stops: number | null;
  /** "ISO 800 → 1000", "f/4 → f/5.6" …; empty when shot as planned. */
  changes: string[];
}

const close = (a: number, b: number) => Math.abs(a - b) < 1e-6;

/** Returns the difference between a step's planned settings and the settings it was shot with. */
export function stepDifference(planned: PlannedSettings, actual: ActualSettings): StepDifference {
  const changes: string[] = [];
  if (planned.iso !== null && !close(planned.iso, actual.iso)) changes.push(`ISO ${planned.iso} → ${actual.iso}`);
  if (planned.fNumber !== null && !close(planned.fNumber, actual.fNumber)) changes.push(`${formatFNumber(planned.fNumber)} → ${formatFNumber(actual.fNumber)}`);
  if (planned.shutterAngleDeg !== null && !close(planned.shutterAngleDeg, actual.shutterAngleDeg)) {
    changes.push(`shutter ${formatAngle(planned.shutterAngleDeg)} → ${formatAngle(actual.shutterAngleDeg)}`);
  }
  if (planned.ndDensity !== null && !close(planned.ndDensity, actual.ndDensity)) changes.push(`ND ${formatDensity(planned.ndDensity)} → ${formatDensity(actual.ndDensity)}`);
  const plannedLight = planned.lightChangeStops ?? 0;
  if (!close(plannedLight, actual.lightChangeStops)) changes.push(`light ${formatStops(plannedLight)} → ${formatStops(actual.lightChangeStops)} stops`);
  const open = planned.iso === null || planned.fNumber === null || planned.shutterAngleDeg === null || planned.ndDensity === null || planned.fps === null;
  if (open) return { stops: null, changes };
  const fps = planned.fps!;
  const stops = exposureDifferenceStops(
    { iso: planned.iso!, fNumber: planned.fNumber!, shutterSeconds: shutterAngleToSeconds(planned.shutterAngleDeg!, fps), ndDensity: planned.ndDensity!, lightChangeStops: plannedLight },
    { iso: actual.iso, fNumber: actual.fNumber, shutterSeconds: shutterAngleToSeconds(actual.shutterAngleDeg, fps), ndDensity: actual.ndDensity, lightChangeStops: actual.lightChangeStops },
  );
  return { stops: Math.abs(stops) < 1e-9 ? 0 : stops, changes };
}

/** Returns the settings a step was planned with as a starting point for "as shot" (open controls fall back to the test's base). */
export function actualFromPlanned(planned: PlannedSettings, fallback: ActualSettings): ActualSettings {
  return {
    iso: planned.iso ?? fallback.iso,
    fNumber: planned.fNumber ?? fallback.fNumber,
    shutterAngleDeg: planned.shutterAngleDeg ?? fallback.shutterAngleDeg,
    ndDensity: planned.ndDensity ?? fallback.ndDensity,
    lightChangeStops: planned.lightChangeStops ?? 0,
  };
}
