// Requests and responses of the test-plan API (issue 4): tests of an episode, their steps,
// spec-sheet lines and lighting. The generator inputs themselves live in ./plans.ts.
import { z } from 'zod';
import { PLAN_F_NUMBER_MAX, PLAN_F_NUMBER_MIN, PLAN_FPS_MAX, PLAN_ISO_MAX, PLAN_ISO_MIN, PLAN_LIGHT_RANGE_STOPS_MAX, PLAN_ND_DENSITY_MAX } from './plans.ts';

/** The kinds of test a plan can hold. */
export const TEST_KINDS = ['iso_sweep', 'latitude_bracket', 'custom'] as const;
export const TestKindSchema = z.enum(TEST_KINDS, { error: 'Kind must be "iso_sweep", "latitude_bracket" or "custom"' });
export type TestKind = z.infer<typeof TestKindSchema>;

/** How each kind reads on screen. */
export const TEST_KIND_LABELS: Record<TestKind, string> = {
  iso_sweep: 'ISO sweep',
  latitude_bracket: 'Latitude bracket',
  custom: 'Custom',
};

export const TEST_NAME_MAX = 120;
export const STEP_LABEL_MAX = 80;
export const STEP_NOTES_MAX = 500;
export const CUSTOM_STEPS_MAX = 100;
export const OBSERVATION_MAX = 4000;
export const SPEC_VALUE_MAX = 500;
export const SPEC_LABEL_MAX = 120;
/** Longest planned recording per step, in seconds (one hour). */
export const SECONDS_PER_STEP_MAX = 3600;
export const LIGHTING_CIRCUITS_MAX = 24;
export const LIGHTING_FIXTURES_MAX = 80;

const VersionSchema = z.number({ error: 'Send the version you last read (a whole number)' }).int().min(1);

const num = (what: string, min: number, max: number, minInclusive = true) => {
  const msg = `${what} must be a number from ${min} to ${max}`;
  const base = z.number({ error: msg });
  return (minInclusive ? base.min(min, msg) : base.gt(min, msg)).max(max, msg);
};

/** A rectangle in fractions of the frame (0…1), where readouts are measured. */
export const ReadoutRegionSchema = z
  .strictObject({ x: num('x', 0, 1), y: num('y', 0, 1), w: num('Width', 0, 1, false), h: num('Height', 0, 1, false) })
  .refine((r) => r.x + r.w <= 1 + 1e-9 && r.y + r.h <= 1 + 1e-9, { message: 'The region must lie inside the frame (x + w and y + h at most 1)' });
export type ReadoutRegion = z.infer<typeof ReadoutRegionSchema>;

/** One free step of a custom test, as typed by a person; settings left empty are not planned. */
export const CustomStepInputSchema = z.object({
  label: z.string({ error: 'Each step needs a label' }).trim().min(1, 'Each step needs a label').max(STEP_LABEL_MAX),
  iso: num('ISO', PLAN_ISO_MIN, PLAN_ISO_MAX).optional(),
  fNumber: num('Aperture', PLAN_F_NUMBER_MIN, PLAN_F_NUMBER_MAX).optional(),
  shutterAngleDeg: num('Shutter angle', 0, 360, false).optional(),
  ndDensity: num('ND density', 0, PLAN_ND_DENSITY_MAX).optional(),
  lightChangeStops: num('Light change', -PLAN_LIGHT_RANGE_STOPS_MAX, PLAN_LIGHT_RANGE_STOPS_MAX).optional(),
  notes: z.string().max(STEP_NOTES_MAX).default(''),
});
export type CustomStepInput = z.infer<typeof CustomStepInputSchema>;

/** Input of a custom test: its frame rate and the free list of steps. */
export const CustomTestInputSchema = z.object({
  fps: num('Frame rate', 0, PLAN_FPS_MAX, false),
  steps: z
    .array(CustomStepInputSchema)
    .min(1, 'Add at least one step')
    .max(CUSTOM_STEPS_MAX, `A custom test has at most ${CUSTOM_STEPS_MAX} steps`),
});
export type CustomTestInput = z.infer<typeof CustomTestInputSchema>;

/**
 * Settings a step plans (from the generator, or typed in for a custom test). Exposure fields are
 * null when a custom step leaves them open; the generator's extras (error, warning, grade
 * correction) ride along for display.
 */
export interface PlannedSettings {
  fps: number | null;
  iso: number | null;
  fNumber: number | null;
  shutterAngleDeg: number | null;
  shutterSeconds: number | null;
  ndDensity: number | null;
  lightChangeStops: number | null;
  /** Exposure error left at this step, in stops (generated steps). */
  exposureErrorStops?: number;
  /** Warning when the step cannot be held inside the kit's limits. */
  warning?: string | null;
  /** Latitude bracket: the offset as written ("−1⅓") and the grade's correction. */
  offsetLabel?: string;
  gradeCorrectionStops?: number;
  gradeCorrectionLabel?: string;
  notes?: string;
}

/** Settings as shot on set; the shutter is an angle at the test's frame rate. */
export const ActualSettingsSchema = z.strictObject({
  iso: num('ISO', PLAN_ISO_MIN, PLAN_ISO_MAX),
  fNumber: num('Aperture', PLAN_F_NUMBER_MIN, PLAN_F_NUMBER_MAX),
  shutterAngleDeg: num('Shutter angle', 0, 360, false),
  ndDensity: num('ND density', 0, PLAN_ND_DENSITY_MAX),
  lightChangeStops: num('Light change', -PLAN_LIGHT_RANGE_STOPS_MAX, PLAN_LIGHT_RANGE_STOPS_MAX).default(0),
});
export type ActualSettings = z.infer<typeof ActualSettingsSchema>;

/** A 1–5 rating of how a step came out. */
export const RatingSchema = z.number({ error: 'Rating must be a whole number from 1 to 5' }).int('Rating must be a whole number from 1 to 5').min(1, 'Rating must be a whole number from 1 to 5').max(5, 'Rating must be a whole number from 1 to 5');

// ---- responses ----

export interface TestStepDto {
  id: string;
  index: number;
  label: string;
  iso: number | null;
  offsetStops: number | null;
  planned: PlannedSettings;
  actual: ActualSettings | null;
  shotAt: string | null;
  shotBy: { id: string; name: string } | null;
  observation: string;
  rating: number | null;
  plannedSeconds: number;
  version: number;
}

export interface SpecSheetLineDto {
  id: string;
  key: string;
  label: string;
  value: string;
  checked: boolean;
  inDescription: boolean;
  required: boolean;
  position: number;
  custom: boolean;
  version: number;
}

export interface LightingCircuitDto {
  id: string;
  label: string;
  volts: number;
  breakerAmps: number;
}

export interface LightingFixtureDto {
  id: string;
  name: string;
  watts: number;
  quantity: number;
  circuitId: string | null;
}

export interface TestDto {
  id: string;
  episodeId: string;
  kind: TestKind;
  name: string;
  position: number;
  inputs: Record<string, unknown>;
  readoutRegion: ReadoutRegion | null;
  secondsPerStep: number;
  version: number;
  createdAt: string;
  updatedAt: string;
  steps: TestStepDto[];
  specLines: SpecSheetLineDto[];
  lighting: { circuits: LightingCircuitDto[]; fixtures: LightingFixtureDto[] };
}

/** GET /api/episodes/:id/tests: the episode's plan as the caller may see it. */
export interface EpisodePlanDto {
  episode: { id: string; channelId: string; title: string; stage: string };
  /** True when the caller's role may edit plans, spec sheets and observations. */
  canEdit: boolean;
  tests: TestDto[];
}

// ---- requests ----

export const CreateTestInputSchema = z.strictObject({
  kind: TestKindSchema,
  name: z.string({ error: 'Give the test a name' }).trim().min(1, 'Give the test a name').max(TEST_NAME_MAX),
  /** The generator input; checked by the generator itself (422 with its message). */
  inputs: z.record(z.string(), z.unknown(), { error: 'Inputs must be an object' }),
  secondsPerStep: num('Seconds per step', 0, SECONDS_PER_STEP_MAX, false).default(10),
});
export type CreateTestInput = z.infer<typeof CreateTestInputSchema>;

export const UpdateTestInputSchema = z.strictObject({
  version: VersionSchema,
  name: z.string().trim().min(1, 'Give the test a name').max(TEST_NAME_MAX).optional(),
  inputs: z.record(z.string(), z.unknown(), { error: 'Inputs must be an object' }).optional(),
  secondsPerStep: num('Seconds per step', 0, SECONDS_PER_STEP_MAX, false).optional(),
  readoutRegion: ReadoutRegionSchema.nullable().optional(),
  position: z.number().int().min(0).max(1000).optional(),
});
export type UpdateTestInput = z.infer<typeof UpdateTestInputSchema>;

export const VersionInputSchema = z.strictObject({ version: VersionSchema });
export type VersionInput = z.infer<typeof VersionInputSchema>;
/** `?version=N` on deletes. */
export const VersionQuerySchema = z.strictObject({ version: z.coerce.number({ error: 'Send ?version= with the version you last read' }).int().min(1) });

export const LightingInputSchema = z
  .strictObject({
    version: VersionSchema,
    circuits: z
      .array(
        z.strictObject({
          key: z.string().min(1).max(64),
          label: z.string().trim().min(1, 'Each circuit needs a label').max(80),
          volts: num('Voltage', 0, 1000, false),
          breakerAmps: num('Breaker rating', 0, 1000, false),
        }),
      )
      .max(LIGHTING_CIRCUITS_MAX),
    fixtures: z
      .array(
        z.strictObject({
          name: z.string().trim().min(1, 'Each fixture needs a name').max(80),
          watts: num('Power', 0, 100_000, false),
          quantity: z.number().int().min(1).max(100).default(1),
          circuitKey: z.string().min(1).max(64).nullable(),
        }),
      )
      .max(LIGHTING_FIXTURES_MAX),
  })
  .superRefine((input, ctx) => {
    const keys = new Set<string>();
    input.circuits.forEach((c, i) => {
      if (keys.has(c.key)) ctx.addIssue({ code: 'custom', path: ['circuits', i, 'key'], message: `Two circuits share the key "${c.key}"` });
      keys.add(c.key);
    });
    input.fixtures.forEach((f, i) => {
      if (f.circuitKey !== null && !keys.has(f.circuitKey)) {
        ctx.addIssue({ code: 'custom', path: ['fixtures', i, 'circuitKey'], message: `"${f.name}" is on a circuit that is not in the list` });
      }
    });
  });
export type LightingInput = z.infer<typeof LightingInputSchema>;

export const CreateSpecLineInputSchema = z.strictObject({
  label: z.string({ error: 'Give the line a label' }).trim().min(1, 'Give the line a label').max(SPEC_LABEL_MAX),
  value: z.string().max(SPEC_VALUE_MAX).default(''),
  checked: z.boolean().default(false),
  inDescription: z.boolean().default(false),
  required: z.boolean().default(false),
});
export type CreateSpecLineInput = z.infer<typeof CreateSpecLineInputSchema>;

export const UpdateSpecLineInputSchema = z.strictObject({
  version: VersionSchema,
  label: z.string().trim().min(1, 'Give the line a label').max(SPEC_LABEL_MAX).optional(),
  value: z.string().max(SPEC_VALUE_MAX, `Keep the value under ${SPEC_VALUE_MAX} characters`).optional(),
  checked: z.boolean().optional(),
  inDescription: z.boolean().optional(),
  required: z.boolean().optional(),
});
export type UpdateSpecLineInput = z.infer<typeof UpdateSpecLineInputSchema>;

export const MarkStepShotInputSchema = z.strictObject({
  version: VersionSchema,
  actual: ActualSettingsSchema,
  observation: z.string().max(OBSERVATION_MAX, `Keep the observation under ${OBSERVATION_MAX} characters`).default(''),
  rating: RatingSchema.nullable().default(null),
});
export type MarkStepShotInput = z.infer<typeof MarkStepShotInputSchema>;

export const UpdateStepInputSchema = z.strictObject({
  version: VersionSchema,
  observation: z.string().max(OBSERVATION_MAX, `Keep the observation under ${OBSERVATION_MAX} characters`).optional(),
  rating: RatingSchema.nullable().optional(),
  plannedSeconds: num('Planned seconds', 0, SECONDS_PER_STEP_MAX, false).optional(),
});
export type UpdateStepInput = z.infer<typeof UpdateStepInputSchema>;
