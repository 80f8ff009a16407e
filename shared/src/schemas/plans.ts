// Inputs of the two test-plan generators (issue 4): the ISO sweep and the latitude bracket.
// Forms validate with these schemas; the generators parse with them too, so a refused input
// reads the same in the browser, in the API's 422 and in a thrown InvalidInputError.
import { z } from 'zod';
import { gotText } from '../exposure/guards.ts';
import { isoAtThirdsFrom100, isoThirdsFrom100 } from '../exposure/series.ts';

/** Lowest ISO a plan accepts (the marked series starts at ISO 3). */
export const PLAN_ISO_MIN = 3;
/** Highest ISO a plan accepts (the marked series ends at ISO 409600). */
export const PLAN_ISO_MAX = 409_600;
/** Widest f-number a plan accepts. */
export const PLAN_F_NUMBER_MIN = 0.7;
/** Narrowest f-number a plan accepts. */
export const PLAN_F_NUMBER_MAX = 64;
/** Highest frame rate a plan accepts, in fps. */
export const PLAN_FPS_MAX = 1000;
/** Highest ND optical density a plan accepts (6.0 is about 20 stops). */
export const PLAN_ND_DENSITY_MAX = 6;
/** Most entries in a kit's ND list or shutter-angle list. */
export const PLAN_KIT_LIST_MAX = 16;
/** Most stops a dimmer or added light may move the light level, each way. */
export const PLAN_LIGHT_RANGE_STOPS_MAX = 10;
/** Largest bracket offset N in stops (offsets run −N … +N). */
export const BRACKET_MAX_OFFSET_STOPS = 6;

/** The controls a plan may move to hold or shift exposure. */
export const EXPOSURE_CONTROLS = ['nd', 'aperture', 'shutter', 'light'] as const;
/** Default order in which controls absorb a change: ND first, then aperture, shutter, light level. */
export const DEFAULT_CONTROL_PRIORITY: readonly ExposureControl[] = ['nd', 'aperture', 'shutter', 'light'];

const says = (mustBe: string) => (issue: { input?: unknown }) => `${mustBe} ${gotText(issue.input)}.`;

/**
 * A number field whose every failure reads "<mustBe> (got …)." — except a value above `max`,
 * which reads "<what> must be at most <max> (got …)." so the person sees the limit they hit.
 */
function boundedNumber(mustBe: string, min: number, max: number, minInclusive: boolean, tooBig?: string) {
  const error = says(mustBe);
  const base = z.number({ error });
  return (minInclusive ? base.min(min, { error }) : base.gt(min, { error })).max(max, {
    error: tooBig ? says(tooBig) : error,
  });
}

const IsoValueSchema = (what: string) =>
  boundedNumber(`${what} must be a number from ${PLAN_ISO_MIN} to ${PLAN_ISO_MAX}`, PLAN_ISO_MIN, PLAN_ISO_MAX, true);
const FNumberSchema = (what: string) =>
  boundedNumber(
    `${what} must be an f-number from ${PLAN_F_NUMBER_MIN} to ${PLAN_F_NUMBER_MAX}, such as 5.6`,
    PLAN_F_NUMBER_MIN,
    PLAN_F_NUMBER_MAX,
    true,
  );
const ShutterAngleSchema = (what: string) =>
  boundedNumber(`${what} must be a number of degrees above 0 and at most 360`, 0, 360, false);
const DensitySchema = (what: string) =>
  boundedNumber(
    `${what} must be an optical density from 0 to ${PLAN_ND_DENSITY_MAX}, such as 0.3, 0.6 or 0.9`,
    0,
    PLAN_ND_DENSITY_MAX,
    true,
  );

/** A ladder spacing: whole stops or thirds of a stop. */
export const StopStepSchema = z.enum(['full', 'third'], { error: says('Step must be "full" or "third"') });

/** One control a plan may move. */
export const ExposureControlSchema = z.enum(EXPOSURE_CONTROLS, {
  error: says('Each priority entry must be one of "nd", "aperture", "shutter", "light"'),
});
/** A control a plan may move. */
export type ExposureControl = (typeof EXPOSURE_CONTROLS)[number];

/** Shutter given as a rotary angle in degrees or as an exposure time in seconds. */
export const ShutterSettingSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('angle'), angleDeg: ShutterAngleSchema('Shutter angle') }),
    z.object({
      kind: z.literal('seconds'),
      seconds: boundedNumber('Shutter time must be a positive number of seconds, at most 60', 0, 60, false),
    }),
  ],
  { error: says('Shutter must be given as { kind: "angle", angleDeg } or { kind: "seconds", seconds }') },
);
export type ShutterSetting = z.infer<typeof ShutterSettingSchema>;

/** The exposure a plan starts from: aperture, shutter, frame rate and ND on the camera. */
export const BaseExposureSchema = z.object({
  fNumber: FNumberSchema('Base aperture'),
  shutter: ShutterSettingSchema,
  fps: boundedNumber(
    'Frame rate must be a positive number of frames per second',
    0,
    PLAN_FPS_MAX,
    false,
    `Frame rate must be at most ${PLAN_FPS_MAX} frames per second`,
  ),
  ndDensity: DensitySchema('Base ND density').default(0),
});
export type BaseExposure = z.infer<typeof BaseExposureSchema>;

const lightRange = (what: string) =>
  boundedNumber(`${what} must be a number of stops from 0 to ${PLAN_LIGHT_RANGE_STOPS_MAX}`, 0, PLAN_LIGHT_RANGE_STOPS_MAX, true);

/** What the kit on set can do: the lens's aperture range, ND densities on hand, shutter angles allowed, dimmable lights. */
export const KitLimitsSchema = z
  .object({
    minFNumber: FNumberSchema('Widest lens aperture'),
    maxFNumber: FNumberSchema('Narrowest lens aperture'),
    ndDensities: z
      .array(DensitySchema('Each ND density'))
      .max(PLAN_KIT_LIST_MAX, { error: `List at most ${PLAN_KIT_LIST_MAX} ND densities.` })
      .default([]),
    shutterAngles: z
      .array(ShutterAngleSchema('Each allowed shutter angle'))
      .max(PLAN_KIT_LIST_MAX, { error: `List at most ${PLAN_KIT_LIST_MAX} shutter angles.` })
      .default([]),
    lightsDimmable: z.boolean({ error: says('Lights dimmable must be true or false') }).default(false),
    lightDownStops: lightRange('Light range down').default(0),
    lightUpStops: lightRange('Light range up').default(0),
  })
  .superRefine((kit, ctx) => {
    if (kit.minFNumber > kit.maxFNumber) {
      ctx.addIssue({
        code: 'custom',
        path: ['minFNumber'],
        message: `The lens range is reversed: widest f/${kit.minFNumber} must be a smaller number than narrowest f/${kit.maxFNumber}.`,
      });
    }
  });
export type KitLimits = z.infer<typeof KitLimitsSchema>;

/** The order in which controls absorb an exposure change; controls left out stay at the base setting. */
export const ControlPrioritySchema = z
  .array(ExposureControlSchema)
  .min(1, { error: 'List at least one control the plan may move (nd, aperture, shutter, light).' })
  .max(EXPOSURE_CONTROLS.length)
  .refine((list) => new Set(list).size === list.length, {
    error: 'Name each control at most once in the priority list.',
  })
  .default([...DEFAULT_CONTROL_PRIORITY]);

function checkBaseAgainstKit(base: BaseExposure, kit: KitLimits, ctx: z.RefinementCtx): void {
  if (base.fNumber < kit.minFNumber || base.fNumber > kit.maxFNumber) {
    ctx.addIssue({
      code: 'custom',
      path: ['base', 'fNumber'],
      message: `Base aperture f/${base.fNumber} is outside the lens range f/${kit.minFNumber}–f/${kit.maxFNumber}.`,
    });
  }
  if (base.shutter.kind === 'seconds' && base.shutter.seconds * base.fps > 1 + 1e-9) {
    ctx.addIssue({
      code: 'custom',
      path: ['base', 'shutter', 'seconds'],
      message: `A ${base.shutter.seconds} s shutter is longer than one frame at ${Number(base.fps.toFixed(3))} fps; use at most 1/${Number(base.fps.toFixed(3))} s (360°).`,
    });
  }
}

/** Input of the ISO sweep generator: the ISO ladder, the base exposure, the kit and the control priority. */
export const IsoSweepInputSchema = z
  .object({
    baseIso: IsoValueSchema('Base ISO'),
    minIso: IsoValueSchema('Lowest ISO'),
    maxIso: IsoValueSchema('Highest ISO'),
    step: StopStepSchema,
    base: BaseExposureSchema,
    kit: KitLimitsSchema,
    priority: ControlPrioritySchema,
  })
  .superRefine((input, ctx) => {
    if (input.minIso > input.maxIso) {
      ctx.addIssue({
        code: 'custom',
        path: ['minIso'],
        message: `The ISO range is reversed: lowest ISO ${input.minIso} is above highest ISO ${input.maxIso}; swap them.`,
      });
      return;
    }
    const baseThirds = isoThirdsFrom100(input.baseIso);
    if (baseThirds === null) {
      const below = isoAtThirdsFrom100(Math.floor(3 * Math.log2(input.baseIso / 100)));
      const above = isoAtThirdsFrom100(Math.ceil(3 * Math.log2(input.baseIso / 100)));
      ctx.addIssue({
        code: 'custom',
        path: ['baseIso'],
        message: `Base ISO ${input.baseIso} is not a marked ISO speed; use ${[below, above].filter((v) => v !== null).join(' or ')}.`,
      });
    }
    checkBaseAgainstKit(input.base, input.kit, ctx);
  });
/** Parsed ISO sweep input (defaults applied). */
export type IsoSweepInput = z.infer<typeof IsoSweepInputSchema>;

/** Input of the latitude bracket generator: base ISO, the correct exposure, offsets −N…+N, the kit and the priority. */
export const LatitudeBracketInputSchema = z
  .object({
    baseIso: IsoValueSchema('Base ISO'),
    base: BaseExposureSchema,
    maxOffsetStops: z
      .number({ error: says(`Bracket range must be a whole number of stops from 1 to ${BRACKET_MAX_OFFSET_STOPS}`) })
      .int({ error: says(`Bracket range must be a whole number of stops from 1 to ${BRACKET_MAX_OFFSET_STOPS}`) })
      .min(1, { error: says(`Bracket range must be a whole number of stops from 1 to ${BRACKET_MAX_OFFSET_STOPS}`) })
      .max(BRACKET_MAX_OFFSET_STOPS, {
        error: says(`Bracket range must be a whole number of stops from 1 to ${BRACKET_MAX_OFFSET_STOPS}`),
      }),
    step: StopStepSchema,
    kit: KitLimitsSchema,
    priority: ControlPrioritySchema,
  })
  .superRefine((input, ctx) => checkBaseAgainstKit(input.base, input.kit, ctx));
/** Parsed latitude bracket input (defaults applied). */
export type LatitudeBracketInput = z.infer<typeof LatitudeBracketInputSchema>;
