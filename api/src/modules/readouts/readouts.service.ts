// Readouts: the use cases behind the Readouts tab and the compare page. Running readouts adds
// rows (queued) and one job each; a re-run is always a new row. Reads assemble per step the
// latest done readout and the history, and per test the ceiling ISO or latitude window computed
// with the channel's thresholds as they are now (the thresholds in force at request time stay in
// each row's params).
import { readFile, stat } from 'node:fs/promises';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
  ROLE_PERMISSIONS,
  curvePoint,
  mixedReadoutSettings,
  readoutKindForTest,
  TEST_KIND_LABELS,
  type ComparableTestDto,
  type CompareDto,
  type EpisodeReadoutsDto,
  type FrameSourceDto,
  type NoiseResults,
  type ReadoutDto,
  type ReadoutKind,
  type ReadoutParams,
  type ReadoutRegion,
  type ReadoutThresholds,
  type ReadoutVerdict,
  type RecoveryResults,
  type Role,
  type RunReadoutsInput,
  type RunReadoutsResultDto,
  type StepReadoutsDto,
  type TestReadoutsDto,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { guardFormula, toCsv, type CsvCell } from '../../lib/csv.ts';
import { recordActivity } from '../../lib/activity.ts';
import { isVideoFormat, loadFrame } from './frame-source.ts';
import { ceilingIso, latitudeWindow } from './measure/index.ts';
import { framePreview, softwareVersion } from './readout-figures.ts';
import { markFailed, READOUT_QUEUE, type ReadoutJobData } from './readout-job.ts';
import {
  loadAllChannelTests,
  loadChannelTests,
  loadEpisodeTests,
  loadReadouts,
  loadReadoutsById,
  loadStepFootage,
  loadSteps,
  loadTest,
  thresholdsOf,
  toReadoutDto,
  type FootageRow,
  type ReadoutRow,
  type StepRow,
  type TestRow,
} from './readouts.repository.ts';
import { storagePath, writeStored } from './storage.ts';

/** Roles that run readouts and set the measuring region (shared ROLE_PERMISSIONS 'readout.run'). */
export const READOUT_RUNNERS: readonly Role[] = ROLE_PERMISSIONS['readout.run'];

/** What the service needs of the job queue. */
export interface ReadoutQueue {
  send(name: string, data: object): Promise<string | null>;
}

/** Who is acting, in which channel. */
export interface Actor {
  channelId: string;
  userId: string;
}

/** Readouts kept in a step's history in responses (newest first). */
const HISTORY_LIMIT = 50;
/** Offsets closer than this are the 0-stop step. */
const ZERO_OFFSET = 1e-6;

/**
 * File kinds a readout may measure, best first. Noise: a frame grab as delivered, else the camera
 * original (ungraded noise), else a graded render. Recovery needs a graded frame (the correction
 * applied): a grab or a graded render, never a camera original.
 */
export const SOURCE_PREFERENCE: Record<ReadoutKind, readonly FootageRow['kind'][]> = {
  noise: ['frame_grab', 'camera_original', 'graded_render'],
  recovery: ['frame_grab', 'graded_render'],
};

/** The file a step is measured on: the newest file of the most preferred kind; `prefer` wins among allowed kinds. */
export function pickFrameSource(files: readonly FootageRow[], kind: ReadoutKind, prefer?: FootageRow['kind']): FootageRow | null {
  const order = prefer && SOURCE_PREFERENCE[kind].includes(prefer) ? [prefer, ...SOURCE_PREFERENCE[kind].filter((k) => k !== prefer)] : SOURCE_PREFERENCE[kind];
  for (const k of order) {
    const newest = files.filter((f) => f.kind === k).sort((a, b) => +new Date(b.createdAt) - +new Date(a.createdAt))[0];
    if (newest) return newest;
  }
  return null;
}

const isZero = (offset: number | null) => offset !== null && Math.abs(offset) < ZERO_OFFSET;

function toFrameSource(f: FootageRow | null): FrameSourceDto | null {
  return f ? { footageId: f.id, kind: f.kind, originalName: f.originalName, isVideo: isVideoFormat(f.format), durationSeconds: f.durationSeconds } : null;
}

/** Ceiling ISO or latitude window of the steps from their latest readouts, with `thresholds`. */
export function verdictOf(kind: ReadoutKind, steps: ReadonlyArray<{ step: StepRow; latest: ReadoutDto | null }>, thresholds: ReadoutThresholds): ReadoutVerdict {
  const measured = steps.filter((s) => s.latest?.results?.kind === kind);
  let ceiling: number | null = null;
  let window: ReadoutVerdict['latitudeWindow'] = null;
  if (kind === 'noise') {
    ceiling = ceilingIso(
      measured.filter((s) => s.step.iso !== null && s.step.iso > 0).map((s) => ({ iso: s.step.iso!, snrDb: (s.latest!.results as NoiseResults).snrDb })),
      thresholds.snrThresholdDb,
    );
  } else {
    window = latitudeWindow(
      measured.filter((s) => s.step.offsetStops !== null).map((s) => ({ offsetStops: s.step.offsetStops!, meanDeltaE: (s.latest!.results as RecoveryResults).meanDeltaE })),
      thresholds.deltaEThreshold,
    );
  }
  const mixedSettings = mixedReadoutSettings(measured.map((s) => s.latest!.params));
  return { kind, thresholds, ceilingIso: ceiling, latitudeWindow: window, stepsMeasured: measured.length, stepsTotal: steps.length, mixedSettings };
}

export class ReadoutsService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly queue: ReadoutQueue,
    private readonly storageDir: string,
  ) {}

  /** Assembles the readouts of `tests` (steps, sources, latest, history, verdicts). */
  private async assemble(tests: TestRow[], role: Role): Promise<TestReadoutsDto[]> {
    const testIds = tests.map((t) => t.id);
    const steps = await loadSteps(this.sequelize, testIds);
    const files = await loadStepFootage(this.sequelize, steps.map((s) => s.id));
    const readouts = (await loadReadouts(this.sequelize, testIds)).map(toReadoutDto);
    const canRun = READOUT_RUNNERS.includes(role);
    return tests.map((test) => {
      const kind = readoutKindForTest(test.kind);
      const testSteps = steps.filter((s) => s.testId === test.id);
      const stepDtos: StepReadoutsDto[] = testSteps.map((step) => {
        const mine = readouts.filter((r) => r.stepId === step.id);
        return {
          id: step.id,
          index: step.index,
          label: step.label,
          iso: step.iso,
          offsetStops: step.offsetStops,
          rating: step.rating,
          observation: step.observation,
          frameSource: toFrameSource(pickFrameSource(files.filter((f) => f.stepId === step.id), kind)),
          latest: mine.find((r) => r.kind === kind && r.status === 'done') ?? null,
          pending: mine.find((r) => r.status === 'queued' || r.status === 'running') ?? null,
          history: mine.slice(0, HISTORY_LIMIT),
        };
      });
      const verdict = verdictOf(kind, stepDtos.map((s, i) => ({ step: testSteps[i], latest: s.latest })), test.thresholds);
      return {
        test: { id: test.id, episodeId: test.episodeId, episodeTitle: test.episodeTitle, name: test.name, kind: test.kind, readoutRegion: test.readoutRegion },
        readoutKind: kind,
        thresholds: test.thresholds,
        verdict,
        canRun,
        steps: stepDtos,
      };
    });
  }

  /** The Readouts tab: every test of the episode with its readouts. */
  async episodeReadouts(episodeId: string, channelId: string, role: Role): Promise<EpisodeReadoutsDto> {
    const tests = await loadEpisodeTests(this.sequelize, episodeId);
    const [episode] = await this.sequelize.query<{ id: string; title: string; settings: unknown }>(
      'SELECT e.id, e.title, c.settings FROM episodes e JOIN channels c ON c.id = e.channel_id WHERE e.id = :episodeId AND e.channel_id = :channelId',
      { replacements: { episodeId, channelId }, type: QueryTypes.SELECT },
    );
    if (!episode) throw new AppError('not_found', 'Episode not found');
    return {
      episode: { id: episode.id, title: episode.title },
      canRun: READOUT_RUNNERS.includes(role),
      thresholds: thresholdsOf(episode.settings),
      tests: await this.assemble(tests, role),
    };
  }

  /** One test's readouts. */
  async testReadouts(testId: string, role: Role): Promise<TestReadoutsDto> {
    const test = await loadTest(this.sequelize, testId);
    if (!test) throw new AppError('not_found', 'Test not found');
    return (await this.assemble([test], role))[0];
  }

  /**
   * Queues readouts for the steps of a test (all with a frame, or `input.stepIds`) or for one
   * step. Steps without a frame are reported in `skipped`; if none is left, 422.
   */
  async run(target: { testId: string } | { stepId: string }, actor: Actor, input: RunReadoutsInput): Promise<RunReadoutsResultDto> {
    let testId: string;
    let onlySteps: string[] | null = input.stepIds ?? null;
    if ('stepId' in target) {
      if (input.stepIds) throw new AppError('invalid_input', 'stepIds apply to a whole test: leave them out when running one step');
      const [row] = await this.sequelize.query<{ testId: string }>('SELECT test_id AS "testId" FROM test_steps WHERE id = :id', { replacements: { id: target.stepId }, type: QueryTypes.SELECT });
      if (!row) throw new AppError('not_found', 'Step not found');
      testId = row.testId;
      onlySteps = [target.stepId];
    } else {
      testId = target.testId;
      if (input.footageId) throw new AppError('invalid_input', 'A file can only be chosen when running one step');
    }

    const created = await this.sequelize.transaction(async (transaction) => {
      // Lock the test so a concurrent region save or run sees a consistent plan.
      await this.sequelize.query('SELECT id FROM tests WHERE id = :testId FOR UPDATE', { replacements: { testId }, transaction });
      const test = await loadTest(this.sequelize, testId, transaction);
      if (!test) throw new AppError('not_found', 'Test not found');
      const kind = input.kind ?? readoutKindForTest(test.kind);
      if (kind === 'recovery' && test.kind !== 'latitude_bracket') {
        throw new AppError('invalid_input', `A recovery readout compares a latitude bracket's steps with its 0-stop step; "${test.name}" is ${TEST_KIND_LABELS[test.kind].toLowerCase()}: run a noise readout`);
      }
      const steps = await loadSteps(this.sequelize, [testId], transaction);
      if (!steps.length) throw new AppError('invalid_input', `"${test.name}" has no steps to measure`);
      if (onlySteps) {
        const unknown = onlySteps.filter((id) => !steps.some((s) => s.id === id));
        if (unknown.length) throw new AppError('invalid_input', `${unknown.length === 1 ? 'A step you picked is' : `${unknown.length} steps you picked are`} not part of "${test.name}"`, { unknown });
      }
      const targets = onlySteps ? steps.filter((s) => onlySteps!.includes(s.id)) : steps;
      const files = await loadStepFootage(this.sequelize, steps.map((s) => s.id), transaction);
      const filesOf = (stepId: string) => files.filter((f) => f.stepId === stepId);

      let referenceStep: StepRow | null = null;
      if (kind === 'recovery') {
        referenceStep = steps.find((s) => isZero(s.offsetStops)) ?? null;
        if (!referenceStep) throw new AppError('invalid_input', `"${test.name}" has no 0-stop step to compare the recovered frames with`);
        if (!pickFrameSource(filesOf(referenceStep.id), 'recovery')) {
          throw new AppError('invalid_input', `Upload a frame grab or graded render of the reference step (${referenceStep.label || '0 stops'}) first: every recovered frame is compared with it`);
        }
      }

      const skipped: RunReadoutsResultDto['skipped'] = [];
      const rows: Array<Record<string, unknown>> = [];
      for (const step of targets) {
        let source: FootageRow | null;
        if (input.footageId) {
          source = filesOf(step.id).find((f) => f.id === input.footageId) ?? null;
          if (!source) throw new AppError('invalid_input', 'That file is not attached to this step (or is still uploading)');
          if (!SOURCE_PREFERENCE[kind].includes(source.kind)) {
            throw new AppError('invalid_input', 'A recovery readout needs a graded frame: pick a frame grab or graded render, not a camera original');
          }
        } else source = pickFrameSource(filesOf(step.id), kind);
        if (!source) {
          skipped.push({ stepId: step.id, label: step.label, reason: kind === 'recovery' ? 'no frame grab or graded render yet' : 'no footage yet' });
          continue;
        }
        const reference = referenceStep ? pickFrameSource(filesOf(referenceStep.id), 'recovery', source.kind) : null;
        const still = !isVideoFormat(source.format);
        const params: ReadoutParams = {
          region: input.region !== undefined ? input.region : (test.readoutRegion as ReadoutRegion | null),
          grid: kind === 'noise' ? (input.grid ?? null) : null,
          transfer: input.transfer ?? (still && source.format !== 'dpx' ? 'srgb' : 'bt709'),
          transferFrom: input.transfer ? 'chosen' : 'auto',
          referenceTransfer: reference ? (input.transfer ?? (!isVideoFormat(reference.format) && reference.format !== 'dpx' ? 'srgb' : 'bt709')) : null,
          frameTimeSeconds: still ? null : (input.frameTimeSeconds ?? null),
          referenceFrameTimeSeconds: null,
          stride: kind === 'recovery' ? (input.stride ?? null) : null,
          snrThresholdDb: test.thresholds.snrThresholdDb,
          deltaEThreshold: test.thresholds.deltaEThreshold,
          referenceStepId: referenceStep?.id ?? null,
        };
        if (!still && params.frameTimeSeconds !== null && source.durationSeconds !== null && params.frameTimeSeconds >= source.durationSeconds) {
          throw new AppError('invalid_input', `${source.originalName} is ${source.durationSeconds.toFixed(2)} s long; pick a frame time before that`);
        }
        rows.push({
          channelId: test.channelId,
          testId,
          stepId: step.id,
          footageId: source.id,
          referenceFootageId: reference?.id ?? null,
          kind,
          params: JSON.stringify(params),
          version: softwareVersion(),
          requestedBy: actor.userId,
        });
      }
      if (!rows.length) {
        throw new AppError(
          'invalid_input',
          kind === 'recovery'
            ? 'No step has a frame grab or graded render to measure yet: upload them on the Footage tab, tied to their steps'
            : 'No step has footage to measure yet: upload frame grabs or camera originals on the Footage tab, tied to their steps',
          { skipped },
        );
      }
      const ids: string[] = [];
      for (const r of rows) {
        const [inserted] = await this.sequelize.query<{ id: string }>(
          `INSERT INTO readouts (channel_id, test_id, step_id, footage_id, reference_footage_id, kind, status, params, software_version, requested_by)
           VALUES (:channelId, :testId, :stepId, :footageId, :referenceFootageId, :kind, 'queued', CAST(:params AS jsonb), :version, :requestedBy)
           RETURNING id`,
          { replacements: r, type: QueryTypes.SELECT, transaction },
        );
        ids.push(inserted.id);
      }
      await recordActivity(
        {
          channelId: actor.channelId,
          actorId: actor.userId,
          subjectType: 'test',
          subjectId: testId,
          episodeId: test.episodeId,
          action: 'readouts.requested',
          details: { kind, readouts: ids.length, skipped: skipped.length, ...('stepId' in target ? { stepId: target.stepId } : {}) },
        },
        transaction,
      );
      return { ids, skipped };
    });

    // Jobs go out after the rows are committed, so a worker always finds its row.
    for (const id of created.ids) {
      try {
        await this.queue.send(READOUT_QUEUE, { readoutId: id } satisfies ReadoutJobData);
      } catch (err) {
        console.error('[readouts] could not queue readout', id, err);
        await markFailed(this.sequelize, id, 'The job queue did not accept the readout: run it again in a moment', ['queued']);
      }
    }
    const queued = (await loadReadoutsById(this.sequelize, created.ids)).map(toReadoutDto);
    queued.sort((a, b) => created.ids.indexOf(a.id) - created.ids.indexOf(b.id));
    return { queued, skipped: created.skipped };
  }

  /** Saves the region every step of the test is measured on (null: the centre tenth). */
  async saveRegion(testId: string, actor: Actor, region: ReadoutRegion | null): Promise<{ readoutRegion: ReadoutRegion | null }> {
    return this.sequelize.transaction(async (transaction) => {
      // The region is not part of the plan people edit, so the test's version stays as it is.
      const [updated] = await this.sequelize.query<{ episodeId: string }>(
        `UPDATE tests SET readout_region = CAST(:region AS jsonb), updated_at = now() WHERE id = :testId RETURNING episode_id AS "episodeId"`,
        { replacements: { testId, region: region === null ? null : JSON.stringify(region) }, type: QueryTypes.SELECT, transaction },
      );
      if (!updated) throw new AppError('not_found', 'Test not found');
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: testId, episodeId: updated.episodeId, action: 'test.readout_region', details: { region } },
        transaction,
      );
      return { readoutRegion: region };
    });
  }

  /** The readout table of a test as CSV: one line per step with its latest done readout. */
  async csv(testId: string, role: Role): Promise<{ fileName: string; text: string }> {
    const t = await this.testReadouts(testId, role);
    const { snrThresholdDb, deltaEThreshold } = t.thresholds;
    const text = (s: string | null | undefined) => (s ? guardFormula(s) : '');
    const round = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? null : Number(v.toFixed(digits)));
    const pct = (v: number | null | undefined) => round(v === null || v === undefined ? null : v * 100, 3);
    const common = (s: StepReadoutsDto): CsvCell[] => [
      text(s.latest?.footageName),
      s.latest?.params.frameTimeSeconds ?? null,
      s.latest?.params.transfer ?? '',
      s.latest?.softwareVersion ?? '',
      s.latest?.id ?? '',
      s.latest?.finishedAt ?? '',
      s.rating,
      text(s.observation),
    ];
    const tail = ['file', 'frame_time_s', 'transfer', 'software_version', 'readout_id', 'measured_at', 'host_rating', 'host_notes'];
    let rows: CsvCell[][];
    if (t.readoutKind === 'noise') {
      rows = [
        ['step', 'iso', 'offset_stops', 'snr_db', 'snr_threshold_db', 'meets_threshold', 'mean_linear_luma', 'sigma_linear_luma', 'chroma_sigma_a', 'chroma_sigma_b', 'chroma_noise', 'mean_a', 'mean_b', 'clipped_pct', 'crushed_pct', 'region_px', 'patch', ...tail],
        ...t.steps.map((s) => {
          const r = s.latest?.results?.kind === 'noise' ? s.latest.results : null;
          return [
            text(s.label),
            s.iso,
            s.offsetStops,
            round(r?.snrDb, 3),
            snrThresholdDb,
            r ? (r.snrDb !== null && r.snrDb >= snrThresholdDb ? 'yes' : 'no') : '',
            round(r?.meanLinearLuma, 6),
            round(r?.sigmaLinearLuma, 6),
            round(r?.chromaSigmaA, 4),
            round(r?.chromaSigmaB, 4),
            round(r?.chromaNoise, 4),
            round(r?.meanA, 4),
            round(r?.meanB, 4),
            pct(r?.clippedFraction),
            pct(r?.crushedFraction),
            r ? `${r.region.w}x${r.region.h}+${r.region.x}+${r.region.y}` : '',
            r?.patchIndex ?? null,
            ...common(s),
          ];
        }),
      ];
    } else {
      rows = [
        ['step', 'offset_stops', 'mean_de00', 'p95_de00', 'max_de00', 'de00_threshold', 'within_threshold', 'noise_ratio', 'noise_stops', 'clipped_pct', 'crushed_pct', 'stride', 'samples', ...tail],
        ...t.steps.map((s) => {
          const r = s.latest?.results?.kind === 'recovery' ? s.latest.results : null;
          return [
            text(s.label),
            s.offsetStops,
            round(r?.meanDeltaE, 4),
            round(r?.p95DeltaE, 4),
            round(r?.maxDeltaE, 4),
            deltaEThreshold,
            r ? (r.meanDeltaE <= deltaEThreshold ? 'yes' : 'no') : '',
            round(r?.noiseRatio, 4),
            round(r?.noiseStops, 4),
            pct(r?.clippedFraction),
            pct(r?.crushedFraction),
            r?.stride ?? null,
            r?.sampleCount ?? null,
            ...common(s),
          ];
        }),
      ];
    }
    const slug = t.test.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'test';
    return { fileName: `readouts-${slug}.csv`, text: toCsv(rows) };
  }

  /** Tests of the channel with readouts to compare, with how many steps are measured. */
  async comparableTests(channelId: string): Promise<ComparableTestDto[]> {
    const tests = await loadAllChannelTests(this.sequelize, channelId);
    const assembled = await this.assemble(tests, 'host');
    return assembled.map((t) => ({
      id: t.test.id,
      name: t.test.name,
      kind: t.test.kind,
      readoutKind: t.readoutKind,
      episodeId: t.test.episodeId,
      episodeTitle: t.test.episodeTitle,
      stepsMeasured: t.verdict.stepsMeasured,
      stepsTotal: t.verdict.stepsTotal,
    }));
  }

  /** Curves and verdicts of two or more tests of the same kind, with the channel's thresholds. */
  async compare(channelId: string, testIds: string[]): Promise<CompareDto> {
    const tests = await loadChannelTests(this.sequelize, channelId, testIds);
    if (tests.length !== testIds.length) throw new AppError('not_found', 'Test not found');
    const kinds = new Set(tests.map((t) => t.kind));
    if (kinds.size > 1) {
      throw new AppError('invalid_input', `Compare tests of the same kind: ${tests.map((t) => `"${t.name}" is ${TEST_KIND_LABELS[t.kind].toLowerCase()}`).join(', ')}`);
    }
    const assembled = await this.assemble(tests, 'host');
    return {
      readoutKind: assembled[0].readoutKind,
      thresholds: assembled[0].thresholds,
      series: assembled.map((t) => ({
        test: { id: t.test.id, name: t.test.name, kind: t.test.kind, episodeId: t.test.episodeId, episodeTitle: t.test.episodeTitle },
        verdict: t.verdict,
        points: t.steps.map((s) => curvePoint(s, s.latest)),
      })),
    };
  }

  /** Path of one of a readout's images, or 404 when it has none. */
  async imagePath(readoutId: string, which: 'difference-map' | 'frame' | 'reference'): Promise<string> {
    const [row] = await loadReadoutsById(this.sequelize, [readoutId]);
    const key = row ? ({ 'difference-map': row.differenceMapKey, frame: row.frameKey, reference: row.referenceFrameKey } as const)[which] : null;
    const what = which === 'difference-map' ? 'difference map' : which === 'frame' ? 'measured frame' : 'reference frame';
    if (!row || !key) throw new AppError('not_found', `This readout has no ${what}${row && row.status !== 'done' ? ' yet' : ''}`);
    const path = storagePath(this.storageDir, key);
    try {
      await stat(path);
    } catch {
      throw new AppError('not_found', `The ${what} image is missing from storage: run the readout again`);
    }
    return path;
  }

  /**
   * A JPEG of the frame a readout of the step would measure (for drawing the region before any
   * readout ran): the chosen file or the step's preferred one, at `seconds` or the middle.
   */
  async stepFramePreview(stepId: string, query: { footageId?: string; t?: number }): Promise<Buffer> {
    const [step] = await this.sequelize.query<{ testKind: RowKind }>(
      'SELECT t.kind AS "testKind" FROM test_steps s JOIN tests t ON t.id = s.test_id WHERE s.id = :stepId',
      { replacements: { stepId }, type: QueryTypes.SELECT },
    );
    if (!step) throw new AppError('not_found', 'Step not found');
    const files = await loadStepFootage(this.sequelize, [stepId]);
    const source = query.footageId ? (files.find((f) => f.id === query.footageId) ?? null) : pickFrameSource(files, readoutKindForTest(step.testKind));
    if (!source) throw new AppError('not_found', query.footageId ? 'That file is not attached to this step' : 'This step has no footage to show yet');
    const still = !isVideoFormat(source.format);
    const seconds = still ? null : (query.t ?? null);
    const cacheKey = `readouts/previews/${source.id}-${seconds === null ? 'default' : Math.round(seconds * 1000)}.jpg`;
    const cached = storagePath(this.storageDir, cacheKey);
    try {
      return await readFile(cached);
    } catch {
      // not cached yet
    }
    let frame;
    try {
      frame = await loadFrame(storagePath(this.storageDir, source.storageKey), source.format, seconds, source.durationSeconds);
    } catch (err) {
      if ((err as { code?: string }).code === 'invalid_input') throw new AppError('invalid_input', (err as Error).message);
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') throw new AppError('not_found', `The bytes of ${source.originalName} are missing from storage`);
      throw err;
    }
    const jpeg = await framePreview(frame.frame);
    await writeStored(this.storageDir, cacheKey, jpeg);
    return jpeg;
  }
}

type RowKind = TestRow['kind'];
export type { ReadoutRow };
