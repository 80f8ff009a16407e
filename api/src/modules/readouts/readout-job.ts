// The readout job (pg-boss queue `readout`): one job per readout row. The worker claims the row
// (queued → running), reads the frame(s) from storage, measures, writes the images and stores the
// figures (running → done) — or the reason it could not (→ failed). A job that pg-boss retries
// after a crash finds the row still `running` and measures again; a finished row is left alone.
import { QueryTypes, type Sequelize } from 'sequelize';
import { InvalidInputError, type ReadoutParams, type ReadoutResults } from '@midgray/shared';
import { ffmpegVersionLine, isVideoFormat, loadFrame, type LoadedFrame } from './frame-source.ts';
import { framePreview, noiseFigures, recoveryFigures, softwareVersion } from './readout-figures.ts';
import { loadFootage, type FootageRow } from './readouts.repository.ts';
import { readoutImageKey, storagePath, writeStored } from './storage.ts';

/** Queue name of the readout job. */
export const READOUT_QUEUE = 'readout';
/** Queue of the sweep that closes readouts whose job was lost. */
export const READOUT_SWEEP_QUEUE = 'readout-sweep';
/** Every 15 minutes. */
export const READOUT_SWEEP_CRON = '*/15 * * * *';
/**
 * A readout still queued or running this long after it was requested lost its job (the process
 * died between commit and send, or every retry expired: 3 attempts × 30 min plus delays).
 */
export const READOUT_STALE_HOURS = 2;

/** Data of one job. */
export interface ReadoutJobData {
  readoutId: string;
}

export interface ReadoutJobDeps {
  sequelize: Sequelize;
  /** Absolute storage folder (footage and readout images). */
  storageDir: string;
}

/** What the job module needs of the job queue (api/src/jobs/jobs.ts `Jobs`). */
export interface ReadoutJobRegistry {
  define<T extends object>(name: string, handler: (data: T) => Promise<void>, opts?: { queue?: object; work?: object }): void;
  schedule(name: string, cron: string, data?: object): void;
}

/** A reason a readout cannot be measured, shown to people as it is. */
class ReadoutFailure extends Error {}

interface ClaimedRow {
  id: string;
  kind: 'noise' | 'recovery';
  footageId: string | null;
  referenceFootageId: string | null;
  params: ReadoutParams;
}

async function readFrame(deps: ReadoutJobDeps, footage: FootageRow | null, seconds: number | null, what: string): Promise<LoadedFrame> {
  if (!footage) throw new ReadoutFailure(`The ${what} file was deleted after the readout was requested: run it again`);
  let path: string;
  try {
    path = storagePath(deps.storageDir, footage.storageKey);
  } catch {
    throw new ReadoutFailure(`The ${what} file is not in the storage folder`);
  }
  try {
    return await loadFrame(path, footage.format, seconds, footage.durationSeconds);
  } catch (err) {
    if (err instanceof InvalidInputError) throw new ReadoutFailure(`${footage.originalName}: ${err.message}`);
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') throw new ReadoutFailure(`The bytes of ${footage.originalName} are missing from storage`);
    throw err;
  }
}

/** Measures one readout row; returns what became of it ('skipped' when it was not queued or running). */
export async function runReadout(deps: ReadoutJobDeps, readoutId: string): Promise<'done' | 'failed' | 'skipped'> {
  const { sequelize } = deps;
  const claimed = await sequelize.query<ClaimedRow>(
    `UPDATE readouts SET status = 'running', started_at = now()
      WHERE id = :readoutId AND status IN ('queued', 'running')
      RETURNING id, kind, footage_id AS "footageId", reference_footage_id AS "referenceFootageId", params`,
    { replacements: { readoutId }, type: QueryTypes.SELECT },
  );
  const row = claimed[0];
  if (!row) return 'skipped';
  try {
    const footage = row.footageId ? await loadFootage(sequelize, row.footageId) : null;
    const frame = await readFrame(deps, footage, row.params.frameTimeSeconds, 'measured');
    const usedFfmpeg = footage ? isVideoFormat(footage.format) || footage.format === 'dpx' : false;
    const params: ReadoutParams = { ...row.params, frameTimeSeconds: frame.seconds };
    let results: ReadoutResults;
    const keys: { frame: string; reference: string | null; map: string | null } = { frame: readoutImageKey(row.id, 'frame.jpg'), reference: null, map: null };
    let ffmpegUsed = usedFfmpeg;
    if (row.kind === 'noise') {
      results = noiseFigures(frame.frame, { region: params.region, grid: params.grid, transfer: params.transfer });
    } else {
      const refFootage = row.referenceFootageId ? await loadFootage(sequelize, row.referenceFootageId) : null;
      // The 0-stop step measured against itself reads its file once.
      const reference =
        refFootage && footage && refFootage.id === footage.id && (params.frameTimeSeconds === frame.seconds || !frame.isVideo)
          ? frame
          : await readFrame(deps, refFootage, row.params.frameTimeSeconds, 'reference');
      ffmpegUsed ||= refFootage ? isVideoFormat(refFootage.format) || refFootage.format === 'dpx' : false;
      const referenceTransfer = params.referenceTransfer ?? params.transfer;
      params.referenceFrameTimeSeconds = reference.seconds;
      const figures = await recoveryFigures(frame.frame, reference.frame, { region: params.region, transfer: params.transfer, referenceTransfer, stride: params.stride });
      results = figures.results;
      keys.map = await writeStored(deps.storageDir, readoutImageKey(row.id, 'difference-map.png'), figures.differenceMap);
      keys.reference = await writeStored(deps.storageDir, readoutImageKey(row.id, 'reference.jpg'), await framePreview(reference.frame));
    }
    await writeStored(deps.storageDir, keys.frame, await framePreview(frame.frame));
    const version = softwareVersion(ffmpegUsed ? await ffmpegVersionLine() : null);
    await sequelize.query(
      `UPDATE readouts SET status = 'done', results = CAST(:results AS jsonb), params = CAST(:params AS jsonb), software_version = :version,
              frame_key = :frameKey, reference_frame_key = :referenceKey, difference_map_key = :mapKey, error = NULL, finished_at = now()
        WHERE id = :id AND status = 'running'`,
      {
        replacements: { id: row.id, results: JSON.stringify(results), params: JSON.stringify(params), version, frameKey: keys.frame, referenceKey: keys.reference, mapKey: keys.map },
      },
    );
    return 'done';
  } catch (err) {
    let message: string;
    if (err instanceof ReadoutFailure) message = err.message;
    else if (err instanceof InvalidInputError) message = err.message.charAt(0).toUpperCase() + err.message.slice(1);
    else {
      console.error(`[readouts] readout ${row.id} failed`, err);
      message = 'The measurement failed unexpectedly; the error was logged on the server';
    }
    await markFailed(sequelize, row.id, message, ['running']);
    return 'failed';
  }
}

/** Marks a readout failed with `message` if it is still in one of `from`. */
export async function markFailed(sequelize: Sequelize, readoutId: string, message: string, from: Array<'queued' | 'running'>) {
  await sequelize.query(`UPDATE readouts SET status = 'failed', error = :message, finished_at = now() WHERE id = :readoutId AND status IN (:from)`, {
    replacements: { readoutId, message: message.slice(0, 2000), from },
  });
}

/**
 * Marks readouts queued or running for longer than READOUT_STALE_HOURS as failed, so the tab
 * stops waiting for them and offers a new run. Returns how many were closed.
 */
export async function sweepStaleReadouts(sequelize: Sequelize, now = new Date()): Promise<number> {
  const closed = await sequelize.query<{ id: string }>(
    `UPDATE readouts SET status = 'failed', finished_at = now(),
            error = 'The measurement did not finish (its job was lost): run it again'
      WHERE status IN ('queued', 'running') AND created_at < CAST(:now AS timestamptz) - make_interval(hours => :hours)
      RETURNING id`,
    { replacements: { now: now.toISOString(), hours: READOUT_STALE_HOURS }, type: QueryTypes.SELECT },
  );
  return closed.length;
}

/** Defines the readout queue and its handler on `jobs` (workers start with the server's startWorkers()). */
export function registerReadoutJob(jobs: ReadoutJobRegistry, deps: ReadoutJobDeps) {
  jobs.define<ReadoutJobData>(
    READOUT_QUEUE,
    async (data) => {
      await runReadout(deps, data.readoutId);
    },
    {
      // Failures are stored on the row; pg-boss retries only when a worker died mid-job (expiry).
      queue: { retryLimit: 2, retryDelay: 10, expireInSeconds: 1800 },
      // A 4K recovery readout holds two 50 MB frames: measure one at a time per process.
      work: { batchSize: 1, pollingIntervalSeconds: 1 },
    },
  );
  jobs.define(READOUT_SWEEP_QUEUE, async () => {
    const closed = await sweepStaleReadouts(deps.sequelize);
    if (closed) console.log(`[readouts] closed ${closed} readouts whose job was lost`);
  });
  jobs.schedule(READOUT_SWEEP_QUEUE, READOUT_SWEEP_CRON);
}
