// Reads behind the Readouts tab and the compare page: tests with their episode and channel
// settings, steps, the footage that can be measured, and readout rows as shared DTOs.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { ChannelSettingsSchema, type ReadoutDto, type ReadoutParams, type ReadoutRegion, type ReadoutResults, type ReadoutThresholds, type TestKind } from '@midgray/shared';

export interface TestRow {
  id: string;
  episodeId: string;
  episodeTitle: string;
  channelId: string;
  name: string;
  kind: TestKind;
  position: number;
  readoutRegion: ReadoutRegion | null;
  thresholds: ReadoutThresholds;
}

export interface StepRow {
  id: string;
  testId: string;
  index: number;
  label: string;
  iso: number | null;
  offsetStops: number | null;
  rating: number | null;
  observation: string;
}

export interface FootageRow {
  id: string;
  stepId: string;
  kind: 'camera_original' | 'graded_render' | 'frame_grab';
  status: string;
  format: string;
  originalName: string;
  storageKey: string;
  durationSeconds: number | null;
  createdAt: Date;
}

export interface ReadoutRow {
  id: string;
  channelId: string;
  testId: string;
  stepId: string;
  footageId: string | null;
  referenceFootageId: string | null;
  kind: 'noise' | 'recovery';
  status: 'queued' | 'running' | 'done' | 'failed';
  params: ReadoutParams;
  softwareVersion: string;
  results: ReadoutResults | null;
  differenceMapKey: string | null;
  frameKey: string | null;
  referenceFrameKey: string | null;
  error: string | null;
  requestedBy: string | null;
  requesterName: string | null;
  footageName: string | null;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
}

/** The channel's thresholds, defaults filled in for settings saved before they existed. */
export function thresholdsOf(settings: unknown): ReadoutThresholds {
  const parsed = ChannelSettingsSchema.safeParse(settings ?? {});
  const s = parsed.success ? parsed.data : ChannelSettingsSchema.parse({});
  return { snrThresholdDb: s.snrThresholdDb, deltaEThreshold: s.deltaEThreshold };
}

const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

const TEST_SELECT = `
  SELECT t.id, t.episode_id AS "episodeId", e.title AS "episodeTitle", e.channel_id AS "channelId", t.name, t.kind,
         t.position, t.readout_region AS "readoutRegion", c.settings
    FROM tests t JOIN episodes e ON e.id = t.episode_id JOIN channels c ON c.id = e.channel_id`;

type RawTest = Omit<TestRow, 'thresholds'> & { settings: unknown };
const toTest = ({ settings, ...t }: RawTest): TestRow => ({ ...t, thresholds: thresholdsOf(settings) });

/** One test with its episode and the channel's thresholds; null when missing. */
export async function loadTest(sequelize: Sequelize, testId: string, transaction?: Transaction): Promise<TestRow | null> {
  const rows = await sequelize.query<RawTest>(`${TEST_SELECT} WHERE t.id = :testId`, { replacements: { testId }, type: QueryTypes.SELECT, transaction });
  return rows[0] ? toTest(rows[0]) : null;
}

/** The tests of an episode in plan order. */
export async function loadEpisodeTests(sequelize: Sequelize, episodeId: string): Promise<TestRow[]> {
  const rows = await sequelize.query<RawTest>(`${TEST_SELECT} WHERE t.episode_id = :episodeId ORDER BY t.position, t.created_at, t.id`, {
    replacements: { episodeId },
    type: QueryTypes.SELECT,
  });
  return rows.map(toTest);
}

/** Tests of a channel by id (only those in the channel come back), in the order asked. */
export async function loadChannelTests(sequelize: Sequelize, channelId: string, testIds: string[]): Promise<TestRow[]> {
  if (!testIds.length) return [];
  const rows = await sequelize.query<RawTest>(`${TEST_SELECT} WHERE e.channel_id = :channelId AND t.id IN (:testIds)`, {
    replacements: { channelId, testIds },
    type: QueryTypes.SELECT,
  });
  const byId = new Map(rows.map((r) => [r.id, toTest(r)]));
  return testIds.map((id) => byId.get(id)).filter((t): t is TestRow => !!t);
}

/** Every test of the channel's episodes that are not archived, newest episode first. */
export async function loadAllChannelTests(sequelize: Sequelize, channelId: string): Promise<TestRow[]> {
  const rows = await sequelize.query<RawTest>(
    `${TEST_SELECT} WHERE e.channel_id = :channelId AND e.archived_at IS NULL ORDER BY e.created_at DESC, e.id, t.position, t.id`,
    { replacements: { channelId }, type: QueryTypes.SELECT },
  );
  return rows.map(toTest);
}

/** Steps of the tests, in step order. */
export async function loadSteps(sequelize: Sequelize, testIds: string[], transaction?: Transaction): Promise<StepRow[]> {
  if (!testIds.length) return [];
  const rows = await sequelize.query<StepRow>(
    `SELECT id, test_id AS "testId", index, label, iso, offset_stops AS "offsetStops", rating, observation
       FROM test_steps WHERE test_id IN (:testIds) ORDER BY test_id, index`,
    { replacements: { testIds }, type: QueryTypes.SELECT, transaction },
  );
  return rows.map((r) => ({ ...r, iso: num(r.iso), offsetStops: num(r.offsetStops), rating: num(r.rating) }));
}

/** Footage tied to the steps whose bytes have all arrived (any state but `receiving`), newest first. */
export async function loadStepFootage(sequelize: Sequelize, stepIds: string[], transaction?: Transaction): Promise<FootageRow[]> {
  if (!stepIds.length) return [];
  const rows = await sequelize.query<FootageRow & { probe: { durationSeconds?: number | null } | null }>(
    `SELECT id, step_id AS "stepId", kind, status, format, original_name AS "originalName", storage_key AS "storageKey", probe, created_at AS "createdAt"
       FROM footage WHERE step_id IN (:stepIds) AND status <> 'receiving' ORDER BY created_at DESC, id`,
    { replacements: { stepIds }, type: QueryTypes.SELECT, transaction },
  );
  return rows.map(({ probe, ...r }) => ({ ...r, durationSeconds: typeof probe?.durationSeconds === 'number' ? probe.durationSeconds : null }));
}

/** One footage row by id (for the job), or null. */
export async function loadFootage(sequelize: Sequelize, footageId: string): Promise<FootageRow | null> {
  const rows = await sequelize.query<FootageRow & { probe: { durationSeconds?: number | null } | null }>(
    `SELECT id, step_id AS "stepId", kind, status, format, original_name AS "originalName", storage_key AS "storageKey", probe, created_at AS "createdAt"
       FROM footage WHERE id = :footageId`,
    { replacements: { footageId }, type: QueryTypes.SELECT },
  );
  const r = rows[0];
  if (!r) return null;
  const { probe, ...rest } = r;
  return { ...rest, durationSeconds: typeof probe?.durationSeconds === 'number' ? probe.durationSeconds : null };
}

const READOUT_SELECT = `
  SELECT r.id, r.channel_id AS "channelId", r.test_id AS "testId", r.step_id AS "stepId", r.footage_id AS "footageId",
         r.reference_footage_id AS "referenceFootageId", r.kind, r.status, r.params, r.software_version AS "softwareVersion",
         r.results, r.difference_map_key AS "differenceMapKey", r.frame_key AS "frameKey", r.reference_frame_key AS "referenceFrameKey",
         r.error, r.requested_by AS "requestedBy", u.name AS "requesterName", f.original_name AS "footageName",
         r.created_at AS "createdAt", r.started_at AS "startedAt", r.finished_at AS "finishedAt"
    FROM readouts r LEFT JOIN users u ON u.id = r.requested_by LEFT JOIN footage f ON f.id = r.footage_id`;

/** Readouts of the tests, newest first (created_at, then id for equal instants). */
export async function loadReadouts(sequelize: Sequelize, testIds: string[]): Promise<ReadoutRow[]> {
  if (!testIds.length) return [];
  return sequelize.query<ReadoutRow>(`${READOUT_SELECT} WHERE r.test_id IN (:testIds) ORDER BY r.created_at DESC, r.id DESC`, {
    replacements: { testIds },
    type: QueryTypes.SELECT,
  });
}

/** Readouts by id, in no particular order. */
export async function loadReadoutsById(sequelize: Sequelize, ids: string[], transaction?: Transaction): Promise<ReadoutRow[]> {
  if (!ids.length) return [];
  return sequelize.query<ReadoutRow>(`${READOUT_SELECT} WHERE r.id IN (:ids)`, { replacements: { ids }, type: QueryTypes.SELECT, transaction });
}

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());

/** A readout row as the API returns it. */
export function toReadoutDto(r: ReadoutRow): ReadoutDto {
  return {
    id: r.id,
    stepId: r.stepId,
    kind: r.kind,
    status: r.status,
    footageId: r.footageId,
    footageName: r.footageName,
    referenceFootageId: r.referenceFootageId,
    params: r.params,
    softwareVersion: r.softwareVersion,
    results: r.results,
    hasDifferenceMap: !!r.differenceMapKey,
    hasFrame: !!r.frameKey,
    hasReferenceFrame: !!r.referenceFrameKey,
    error: r.error,
    requestedBy: r.requestedBy ? { id: r.requestedBy, name: r.requesterName ?? 'Former member' } : null,
    createdAt: iso(r.createdAt)!,
    startedAt: iso(r.startedAt),
    finishedAt: iso(r.finishedAt),
  };
}
