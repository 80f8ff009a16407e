// Readouts (issue 6): noise and recovery measurements of a test's frames, what the API accepts to
// run them, and what it returns (per step: latest done readout and history; per test: verdicts).
import { z } from 'zod';
import { ChannelSettingsSchema } from './channels.ts';
import { UuidSchema } from './common.ts';
import { ReadoutRegionSchema, type ReadoutRegion, type TestKind } from './test-plans.ts';

/** What a readout measures: noise on a region (ISO sweep) or recovery against the 0-stop frame (latitude bracket). */
export const READOUT_KINDS = ['noise', 'recovery'] as const;
export const ReadoutKindSchema = z.enum(READOUT_KINDS, { error: 'Kind must be "noise" or "recovery"' });
export type ReadoutKind = z.infer<typeof ReadoutKindSchema>;
export const READOUT_KIND_LABELS: Record<ReadoutKind, string> = { noise: 'Noise readout', recovery: 'Recovery readout' };

/** Where a readout is: waiting for a worker, being measured, measured, or refused by the measurement. */
export const READOUT_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type ReadoutState = (typeof READOUT_STATES)[number];
export const READOUT_STATE_LABELS: Record<ReadoutState, string> = { queued: 'Queued', running: 'Measuring', done: 'Done', failed: 'Failed' };

/** Encoding of a frame's code values: sRGB (stills) or the BT.709 OETF (frames taken from video). */
export const TRANSFERS = ['srgb', 'bt709'] as const;
export const TransferSchema = z.enum(TRANSFERS, { error: 'Transfer must be "srgb" or "bt709"' });
export type TransferName = z.infer<typeof TransferSchema>;

/** Largest per-patch grid (columns and rows each). */
export const READOUT_GRID_MAX = 24;
/** Latest time into a video a frame may be taken from, in seconds (24 h). */
export const FRAME_TIME_MAX_SECONDS = 86_400;

/** A per-patch grid over the region; `patch` picks the cell (row-major index) the headline figures come from. */
export const ReadoutGridSchema = z
  .strictObject({
    cols: z.number({ error: 'Columns must be a whole number from 1 to 24' }).int('Columns must be a whole number from 1 to 24').min(1, 'Columns must be a whole number from 1 to 24').max(READOUT_GRID_MAX, 'Columns must be a whole number from 1 to 24'),
    rows: z.number({ error: 'Rows must be a whole number from 1 to 24' }).int('Rows must be a whole number from 1 to 24').min(1, 'Rows must be a whole number from 1 to 24').max(READOUT_GRID_MAX, 'Rows must be a whole number from 1 to 24'),
    /** Null: the most neutral patch nearest L* 50 (a mid grey on a chart). */
    patch: z.number().int().min(0).nullable().default(null),
  })
  .refine((g) => g.patch === null || g.patch < g.cols * g.rows, { message: 'The chosen patch is outside the grid', path: ['patch'] });
export type ReadoutGrid = z.infer<typeof ReadoutGridSchema>;

/** POST /api/tests/:id/readouts and /api/steps/:id/readouts. Every field is optional. */
export const RunReadoutsInputSchema = z.strictObject({
  /** Only these steps of the test (test route only); default every step with a frame. */
  stepIds: z.array(UuidSchema).min(1, 'Pick at least one step').max(200).optional(),
  /** Default: noise for ISO sweeps and custom tests, recovery for latitude brackets. */
  kind: ReadoutKindSchema.optional(),
  /** Region in fractions of the frame; default the test's saved region, else the centre tenth. */
  region: ReadoutRegionSchema.nullable().optional(),
  grid: ReadoutGridSchema.nullable().optional(),
  /** Default: sRGB for stills, BT.709 for frames taken from video. */
  transfer: TransferSchema.optional(),
  /** Seconds into a video to take the frame from; default the middle. Ignored for stills. */
  frameTimeSeconds: z.number({ error: 'Frame time must be a number of seconds' }).min(0, 'Frame time cannot be negative').max(FRAME_TIME_MAX_SECONDS).nullable().optional(),
  /** Recovery: sample every n-th pixel across and down; default about half a million samples. */
  stride: z.number().int().min(1, 'Stride must be at least 1').max(64, 'Stride must be at most 64').optional(),
  /** Step route only: measure this footage instead of the step's newest suitable file. */
  footageId: UuidSchema.optional(),
});
export type RunReadoutsInput = z.infer<typeof RunReadoutsInputSchema>;

/** PUT /api/tests/:id/readout-region: the rectangle every step of the test is measured on (null = centre tenth). */
export const SaveReadoutRegionInputSchema = z.strictObject({ region: ReadoutRegionSchema.nullable() });
export type SaveReadoutRegionInput = z.infer<typeof SaveReadoutRegionInputSchema>;

/** GET /api/steps/:id/frame.jpg?footageId=&t= : which file and when. */
export const StepFrameQuerySchema = z.strictObject({
  footageId: UuidSchema.optional(),
  t: z.coerce.number({ error: 'Frame time must be a number of seconds' }).min(0).max(FRAME_TIME_MAX_SECONDS).optional(),
});

/** GET /api/channels/:channelId/readouts/compare?tests=a,b,c */
export const CompareQuerySchema = z.strictObject({
  tests: z
    .string({ error: 'Name the tests to compare: ?tests=id1,id2' })
    .transform((s) => [...new Set(s.split(',').map((t) => t.trim()).filter(Boolean))])
    .pipe(z.array(UuidSchema).min(2, 'Pick at least two tests to compare').max(8, 'Compare at most eight tests at once')),
});

// ---- stored parameters and results ----

/** Parameters a readout ran with, stored beside its results so a re-run is comparable. */
export interface ReadoutParams {
  /** Region as requested, fractions of the frame; null = the centre tenth. */
  region: ReadoutRegion | null;
  grid: ReadoutGrid | null;
  transfer: TransferName;
  /** 'chosen' when the request named it, 'auto' when it followed the file type. */
  transferFrom: 'chosen' | 'auto';
  /** Recovery: encoding of the reference frame's codes (follows its own file type when `auto`). */
  referenceTransfer: TransferName | null;
  /** Seconds into the video: as requested while queued (null = the middle), as used once measured; null for stills. */
  frameTimeSeconds: number | null;
  /** Recovery: seconds into the reference video, once measured. */
  referenceFrameTimeSeconds: number | null;
  /** Recovery: the stride requested (null = default); the one used is in the results. */
  stride: number | null;
  /** The channel's thresholds when the readout was requested. */
  snrThresholdDb: number;
  deltaEThreshold: number;
  /** Recovery: the 0-stop step the frame was compared with. */
  referenceStepId: string | null;
}

/**
 * Parameters of a readout of a frame grab with nothing chosen: the centre tenth, sRGB by its file
 * type, no grid, no reference, and the thresholds a channel starts with; `change` overrides any.
 * Demo data and tests start from these (the API builds a request's own from its input).
 */
export function stillReadoutParams(change: Partial<ReadoutParams> = {}): ReadoutParams {
  const { snrThresholdDb, deltaEThreshold } = ChannelSettingsSchema.parse({});
  return { region: null, grid: null, transfer: 'srgb', transferFrom: 'auto', referenceTransfer: null, frameTimeSeconds: null, referenceFrameTimeSeconds: null, stride: null, snrThresholdDb, deltaEThreshold, referenceStepId: null, ...change };
}

/** A rectangle in pixels. */
export interface PixelRegion {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Figures of one patch or region (noise readout). Luma is linear light 0…1; CIELAB D65. */
export interface PatchFigures {
  region: PixelRegion;
  pixelCount: number;
  meanLinearLuma: number;
  sigmaLinearLuma: number;
  /** 20·log10(mean/σ); null when σ = 0. */
  snrDb: number | null;
  meanL: number;
  /** Mean colour cast: +a* magenta, −a* green, +b* yellow, −b* blue. */
  meanA: number;
  meanB: number;
  chromaSigmaA: number;
  chromaSigmaB: number;
  /** √(σa*² + σb*²): RMS distance of a pixel's (a*, b*) from the region's mean colour. */
  chromaNoise: number;
}

/** What a noise readout stores. */
export interface NoiseResults extends PatchFigures {
  kind: 'noise';
  width: number;
  height: number;
  bitDepth: 8 | 16;
  transfer: TransferName;
  clippedFraction: number;
  crushedFraction: number;
  /** Where the headline figures come from: the region itself or one patch of the grid. */
  headline: 'region' | 'patch';
  patchIndex: number | null;
  grid: { cols: number; rows: number; patches: Array<PatchFigures & { col: number; row: number }> } | null;
}

/** What a recovery readout stores. */
export interface RecoveryResults {
  kind: 'recovery';
  width: number;
  height: number;
  bitDepth: 8 | 16;
  transfer: TransferName;
  stride: number;
  sampleCount: number;
  meanDeltaE: number;
  p95DeltaE: number;
  maxDeltaE: number;
  clippedFraction: number;
  crushedFraction: number;
  referenceClippedFraction: number;
  referenceCrushedFraction: number;
  region: PixelRegion;
  referenceSigmaLinearLuma: number;
  recoveredSigmaLinearLuma: number;
  noiseRatio: number | null;
  noiseStops: number | null;
  mapWidth: number;
  mapHeight: number;
}

export type ReadoutResults = NoiseResults | RecoveryResults;

// ---- responses ----

export interface ReadoutDto {
  id: string;
  stepId: string;
  kind: ReadoutKind;
  status: ReadoutState;
  footageId: string | null;
  /** Original name of the measured file (null once the file is deleted). */
  footageName: string | null;
  referenceFootageId: string | null;
  params: ReadoutParams;
  softwareVersion: string;
  results: ReadoutResults | null;
  hasDifferenceMap: boolean;
  hasFrame: boolean;
  hasReferenceFrame: boolean;
  error: string | null;
  requestedBy: { id: string; name: string } | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

/** The file a step would be measured on. */
export interface FrameSourceDto {
  footageId: string;
  kind: 'camera_original' | 'graded_render' | 'frame_grab';
  originalName: string;
  isVideo: boolean;
  durationSeconds: number | null;
}

export interface StepReadoutsDto {
  id: string;
  index: number;
  label: string;
  iso: number | null;
  offsetStops: number | null;
  /** The host's own verdict: 1–5 rating and notes from the shoot. */
  rating: number | null;
  observation: string;
  frameSource: FrameSourceDto | null;
  /** Newest done readout of the test's readout kind. */
  latest: ReadoutDto | null;
  /** Newest readout still queued or measuring, if any. */
  pending: ReadoutDto | null;
  /** Every readout of the step, newest first (at most 50). */
  history: ReadoutDto[];
}

export interface ReadoutThresholds {
  snrThresholdDb: number;
  deltaEThreshold: number;
}

/** The verdict figures of a test, computed with the channel's current thresholds. */
export interface ReadoutVerdict {
  kind: ReadoutKind;
  thresholds: ReadoutThresholds;
  /** ISO sweeps: highest ISO at or above the SNR threshold; null when none is (or nothing measured). */
  ceilingIso: number | null;
  /** Latitude brackets: the contiguous offsets around 0 within the ΔE00 threshold. */
  latitudeWindow: { minStops: number; maxStops: number; offsets: number[] } | null;
  /** Steps with a done readout of `kind`, of all steps. */
  stepsMeasured: number;
  stepsTotal: number;
  /** Settings in which the measured steps' latest readouts differ (empty when all were measured alike). */
  mixedSettings: MixedReadoutSetting[];
}

/** Readout settings that must agree across a test's steps for their figures to be compared. */
export const COMPARED_READOUT_SETTINGS = ['region', 'grid', 'transfer', 'referenceTransfer', 'stride'] as const;
export type MixedReadoutSetting = (typeof COMPARED_READOUT_SETTINGS)[number];
const SETTING_WORDS: Record<MixedReadoutSetting, string> = { region: 'region', grid: 'patch grid', transfer: 'transfer curve', referenceTransfer: 'reference transfer curve', stride: 'sampling stride' };

/** Which compared settings differ among these readouts' parameters. */
export function mixedReadoutSettings(params: readonly ReadoutParams[]): MixedReadoutSetting[] {
  return COMPARED_READOUT_SETTINGS.filter((k) => new Set(params.map((p) => JSON.stringify(p[k] ?? null))).size > 1);
}

/** The warning shown beside a verdict whose steps were measured differently, with its fix; null when none. */
export function mixedSettingsNote(mixed: readonly MixedReadoutSetting[]): string | null {
  if (mixed.length === 0) return null;
  return `The steps were measured with different ${mixed.map((k) => SETTING_WORDS[k]).join(', ')}: run the readouts again on the whole test so every step is measured the same way.`;
}

export interface TestReadoutsDto {
  test: { id: string; episodeId: string; episodeTitle: string; name: string; kind: TestKind; readoutRegion: ReadoutRegion | null };
  /** The readout kind this test's steps get by default. */
  readoutKind: ReadoutKind;
  thresholds: ReadoutThresholds;
  verdict: ReadoutVerdict;
  /** True when the caller's role may run readouts and save the region. */
  canRun: boolean;
  steps: StepReadoutsDto[];
}

/** GET /api/episodes/:id/readouts */
export interface EpisodeReadoutsDto {
  episode: { id: string; title: string };
  canRun: boolean;
  thresholds: ReadoutThresholds;
  tests: TestReadoutsDto[];
}

/** POST …/readouts: the rows queued, and the steps left out with the reason. */
export interface RunReadoutsResultDto {
  queued: ReadoutDto[];
  skipped: Array<{ stepId: string; label: string; reason: string }>;
}

/** One point of a test's curve (latest done readout of a step). */
export interface CurvePoint {
  stepId: string;
  label: string;
  iso: number | null;
  offsetStops: number | null;
  snrDb: number | null;
  chromaNoise: number | null;
  meanDeltaE: number | null;
  p95DeltaE: number | null;
  noiseStops: number | null;
  clippedFraction: number | null;
  crushedFraction: number | null;
}

/** A test picked for comparison: its curve and verdict. */
export interface CompareSeriesDto {
  test: { id: string; name: string; kind: TestKind; episodeId: string; episodeTitle: string };
  verdict: ReadoutVerdict;
  points: CurvePoint[];
}

/** GET /api/channels/:channelId/readouts/compare */
export interface CompareDto {
  readoutKind: ReadoutKind;
  thresholds: ReadoutThresholds;
  series: CompareSeriesDto[];
}

/** GET /api/channels/:channelId/readouts/tests: tests that can be compared. */
export interface ComparableTestDto {
  id: string;
  name: string;
  kind: TestKind;
  readoutKind: ReadoutKind;
  episodeId: string;
  episodeTitle: string;
  stepsMeasured: number;
  stepsTotal: number;
}

/** The readout kind a test's steps get: recovery for latitude brackets, noise otherwise. */
export function readoutKindForTest(kind: TestKind): ReadoutKind {
  return kind === 'latitude_bracket' ? 'recovery' : 'noise';
}

/** A curve point from a step and its latest done readout (null figures when none). */
export function curvePoint(step: { id: string; label: string; iso: number | null; offsetStops: number | null }, readout: Pick<ReadoutDto, 'results'> | null): CurvePoint {
  const r = readout?.results ?? null;
  return {
    stepId: step.id,
    label: step.label,
    iso: step.iso,
    offsetStops: step.offsetStops,
    snrDb: r?.kind === 'noise' ? r.snrDb : null,
    chromaNoise: r?.kind === 'noise' ? r.chromaNoise : null,
    meanDeltaE: r?.kind === 'recovery' ? r.meanDeltaE : null,
    p95DeltaE: r?.kind === 'recovery' ? r.p95DeltaE : null,
    noiseStops: r?.kind === 'recovery' ? r.noiseStops : null,
    clippedFraction: r ? r.clippedFraction : null,
    crushedFraction: r ? r.crushedFraction : null,
  };
}
