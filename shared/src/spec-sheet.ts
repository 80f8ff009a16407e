// The spec sheet of a test: the standard capture lines in a stable order, which are required
// before the plan → shoot move by default, and the values a generated plan already knows.
import type { z } from 'zod';
import { formatAngle, formatDensity, formatFNumber, formatFps, formatSeconds, formatStops } from './exposure/format.ts';
import { isoSweepPlan, latitudeBracketPlan, type PlanSettings, type ResolvedBase } from './exposure/plans.ts';
import type { IsoSweepInputSchema, LatitudeBracketInputSchema } from './schemas/plans.ts';

/** Keys of the standard spec-sheet lines, in display order. */
export const SPEC_SHEET_LINE_KEYS = [
  'body',
  'lens',
  'resolution',
  'frame_rate',
  'shutter',
  'aperture',
  'nd',
  'iso',
  'white_balance',
  'gamma_profile',
  'colour_space',
  'codec',
  'bit_depth',
  'chroma_subsampling',
  'bitrate',
  'monitoring_lut',
  'lighting',
  'scene_chart',
  'media',
] as const;
/** Key of a standard spec-sheet line. */
export type SpecSheetLineKey = (typeof SPEC_SHEET_LINE_KEYS)[number];

/** A standard line: its label, whether it is required and shown in the description by default, and a hint. */
export interface SpecSheetLineDefinition {
  key: SpecSheetLineKey;
  label: string;
  /** Position in the sheet, from 0. */
  position: number;
  /** Required lines must be filled before the episode moves from plan to shoot. */
  requiredByDefault: boolean;
  /** Whether the composer puts the line in the episode description unless someone unticks it. */
  inDescriptionByDefault: boolean;
  /** Placeholder text for the value field. */
  hint: string;
}

type Row = [SpecSheetLineKey, string, boolean, boolean, string];
// key, label, required, in description, hint
const ROWS: Row[] = [
  ['body', 'Body', true, true, 'Camera body under test, with firmware version'],
  ['lens', 'Lens', true, true, 'Lens and focal length'],
  ['resolution', 'Resolution', true, true, 'e.g. 3840×2160 (UHD) or 4096×2160 (DCI 4K)'],
  ['frame_rate', 'Frame rate', true, true, 'e.g. 23.976 fps'],
  ['shutter', 'Shutter', true, false, 'Angle or time, e.g. 180° (1/48 s)'],
  ['aperture', 'Aperture', true, false, 'e.g. f/4'],
  ['nd', 'ND', true, false, 'Optical density, e.g. 0.6'],
  ['iso', 'ISO', true, true, 'e.g. 800, or the sweep range'],
  ['white_balance', 'White balance', true, false, 'Kelvin and tint, e.g. 5600 K'],
  ['gamma_profile', 'Gamma / log profile', true, true, 'Transfer curve the camera records'],
  ['colour_space', 'Colour space', true, true, 'Gamut the camera records'],
  ['codec', 'Codec', true, true, 'Recording codec and wrapper'],
  ['bit_depth', 'Bit depth', true, true, 'e.g. 10-bit'],
  ['chroma_subsampling', 'Chroma subsampling', true, true, 'e.g. 4:2:2'],
  ['bitrate', 'Bitrate', true, false, 'Megabits per second, e.g. 400 Mb/s'],
  ['monitoring_lut', 'Monitoring LUT', false, false, 'LUT on the monitor (not baked in)'],
  ['lighting', 'Lighting', true, false, 'Fixtures, their watts and circuits, dimmer levels'],
  ['scene_chart', 'Scene / chart', true, true, 'Chart or scene, and its illumination'],
  ['media', 'Media', false, false, 'Card or drive recorded to'],
];

/** The standard spec-sheet lines in their stable order. */
export const SPEC_SHEET_LINES: readonly SpecSheetLineDefinition[] = ROWS.map(
  ([key, label, requiredByDefault, inDescriptionByDefault, hint], position) => ({
    key,
    label,
    position,
    requiredByDefault,
    inDescriptionByDefault,
    hint,
  }),
);

/** A spec-sheet line ready to save: value (empty when unknown), flags and position. */
export interface SpecSheetLineDraft {
  key: SpecSheetLineKey;
  label: string;
  position: number;
  value: string;
  required: boolean;
  checked: boolean;
  inDescription: boolean;
}

function blankLines(): SpecSheetLineDraft[] {
  return SPEC_SHEET_LINES.map((line) => ({
    key: line.key,
    label: line.label,
    position: line.position,
    value: '',
    required: line.requiredByDefault,
    checked: false,
    inDescription: line.inDescriptionByDefault,
  }));
}

function summarise(values: number[], baseValue: number, format: (v: number) => string, baseText?: string): string {
  const unique = [...new Set(values)].sort((a, b) => a - b);
  if (unique.length === 1) return baseText && unique[0] === baseValue ? baseText : format(unique[0]!);
  return `${format(unique[0]!)}–${format(unique.at(-1)!)}, varies by step (base ${baseText ?? format(baseValue)})`;
}

function exposureLines(base: ResolvedBase, steps: PlanSettings[]): Partial<Record<SpecSheetLineKey, string>> {
  const baseShutter = `${formatAngle(base.shutterAngleDeg)} (${formatSeconds(base.shutterSeconds)})`;
  const lights = steps.map((s) => s.lightChangeStops);
  const dimmed = lights.some((l) => l !== 0);
  return {
    frame_rate: formatFps(base.fps),
    shutter: summarise(steps.map((s) => s.shutterAngleDeg), base.shutterAngleDeg, formatAngle, baseShutter),
    aperture: summarise(steps.map((s) => s.fNumber), base.fNumber, formatFNumber),
    nd: summarise(steps.map((s) => s.ndDensity), base.ndDensity, formatDensity),
    ...(dimmed
      ? {
          lighting: `Light level varies by step: ${formatStops(Math.min(0, ...lights))} to ${formatStops(Math.max(0, ...lights))} stops from the base level`,
        }
      : {}),
  };
}

/** Returns the standard spec-sheet lines of a test, pre-filled with what its plan knows (frame rate, shutter, aperture, ND, ISO). */
export function specSheetLinesForPlan(kind: 'iso_sweep', input: z.input<typeof IsoSweepInputSchema>): SpecSheetLineDraft[];
export function specSheetLinesForPlan(
  kind: 'latitude_bracket',
  input: z.input<typeof LatitudeBracketInputSchema>,
): SpecSheetLineDraft[];
export function specSheetLinesForPlan(kind: 'custom', input?: unknown): SpecSheetLineDraft[];
export function specSheetLinesForPlan(kind: 'iso_sweep' | 'latitude_bracket' | 'custom', input?: unknown): SpecSheetLineDraft[] {
  const lines = blankLines();
  let known: Partial<Record<SpecSheetLineKey, string>> = {};
  if (kind === 'iso_sweep') {
    const plan = isoSweepPlan(input as z.input<typeof IsoSweepInputSchema>);
    const first = plan.steps[0]!.iso;
    const last = plan.steps.at(-1)!.iso;
    known = {
      ...exposureLines(plan.base, plan.steps),
      iso: first === last ? String(first) : `${first}–${last}, ${plan.step === 'full' ? 'full' : 'third'} stops`,
    };
  } else if (kind === 'latitude_bracket') {
    const plan = latitudeBracketPlan(input as z.input<typeof LatitudeBracketInputSchema>);
    known = { ...exposureLines(plan.base, plan.steps), iso: String(plan.base.iso) };
  }
  return lines.map((line) => ({ ...line, value: known[line.key] ?? line.value }));
}
