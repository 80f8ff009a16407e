// Footage of an episode: the rows uploads become, their checks (checksum, probe against the spec
// sheet, thumbnail), and who holds them. Every change records its activity in the same transaction.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { readdir, stat, unlink } from 'node:fs/promises';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import {
  compareProbeWithSpec,
  PROBE_COMPARED_KEYS,
  PROBE_KEY_LABELS,
  type Footage as FootageDto,
  type FootageKind,
  type FootageList,
  type FootageState,
  type ProbeSummary,
  type Role,
  type SpecMismatch,
  type SpecSkip,
  type SpecValues,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import type { Jobs } from '../../jobs/jobs.ts';
import { recordActivity } from '../../lib/activity.ts';
import { UPLOAD_ID_PATTERN } from '../../uploads/upload-store.ts';
import { FootageEvents } from './footage.events.ts';
import { ffprobe, summariseProbe, writeThumbnail } from './probe.ts';

/** Queue names of the footage jobs. */
export const FOOTAGE_JOBS = { checksum: 'footage-checksum', probe: 'footage-probe', expire: 'uploads-expire' } as const;

const STORAGE_KEY = /^[a-z]+\/[0-9a-f][0-9a-f-]{31,63}(\.[a-z0-9]{2,4})?$/;

/** Roles that may upload (every role of a channel). */
export const UPLOAD_ROLES: readonly Role[] = ['host', 'editor', 'producer', 'admin'];
/** Roles that may pick up footage. */
export const PICKUP_ROLES: readonly Role[] = ['editor', 'producer', 'admin'];
/** Roles that may release someone else's hold or hand footage to another person. */
export const ASSIGN_ROLES: readonly Role[] = ['producer', 'admin'];

interface FootageRow {
  id: string;
  upload_id: string | null;
  storage_key: string;
  channel_id: string;
  episode_id: string;
  step_id: string | null;
  step_label: string | null;
  kind: FootageKind;
  status: FootageState;
  original_name: string;
  format: string;
  size_bytes: string;
  received_bytes: string | null;
  upload_expires_at: Date | null;
  client_sha256: string | null;
  server_sha256: string | null;
  probe: (ProbeSummary & { spec?: { testName: string | null; skipped: SpecSkip[] } }) | null;
  probe_error: string | null;
  spec_mismatches: SpecMismatch[] | null;
  thumbnail_key: string | null;
  uploader_id: string | null;
  uploader_name: string | null;
  held_by_id: string | null;
  holder_name: string | null;
  held_since: Date | null;
  checked_at: Date | null;
  created_at: Date;
  version: number;
}

const SELECT_FOOTAGE = `
  SELECT f.*, up.name AS uploader_name, h.name AS holder_name,
         CASE WHEN s.id IS NULL THEN NULL ELSE t.name || ' · ' || coalesce(nullif(s.label, ''), 'step ' || (s.index + 1)) END AS step_label,
         u."offset" AS received_bytes, CASE WHEN u.completed_at IS NULL THEN u.expires_at END AS upload_expires_at
    FROM footage f
    LEFT JOIN users up ON up.id = f.uploader_id
    LEFT JOIN users h ON h.id = f.held_by_id
    LEFT JOIN test_steps s ON s.id = f.step_id
    LEFT JOIN tests t ON t.id = s.test_id
    LEFT JOIN uploads u ON u.id = f.upload_id`;

function toDto(r: FootageRow): FootageDto {
  const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);
  const { spec, ...probe } = r.probe ?? ({} as NonNullable<FootageRow['probe']>);
  const size = Number(r.size_bytes);
  return {
    id: r.id,
    episodeId: r.episode_id,
    stepId: r.step_id,
    stepLabel: r.step_label,
    kind: r.kind,
    status: r.status,
    originalName: r.original_name,
    format: r.format,
    sizeBytes: size,
    receivedBytes: r.status === 'receiving' ? Number(r.received_bytes ?? 0) : size,
    uploadExpiresAt: r.status === 'receiving' ? iso(r.upload_expires_at) : null,
    clientSha256: r.client_sha256,
    serverSha256: r.server_sha256,
    probe: r.probe ? (probe as ProbeSummary) : null,
    probeError: r.probe_error,
    specMismatches: r.spec_mismatches,
    specSkipped: spec?.skipped ?? [],
    specTestName: spec?.testName ?? null,
    hasThumbnail: !!r.thumbnail_key,
    uploader: r.uploader_id ? { id: r.uploader_id, name: r.uploader_name ?? 'Former member' } : null,
    holder: r.held_by_id ? { id: r.held_by_id, name: r.holder_name ?? 'Former member' } : null,
    heldSince: iso(r.held_since),
    checkedAt: iso(r.checked_at),
    createdAt: iso(r.created_at)!,
    version: r.version,
  };
}

/** Decides a received file's state from its checks. Pure; exported for tests. */
export function settledState(f: { clientSha256: string | null; serverSha256: string | null; probeDone: boolean; probeError: string | null; mismatches: unknown[] | null }): { state: FootageState; reasons: string[] } {
  const reasons: string[] = [];
  if (f.clientSha256 && f.serverSha256 && f.clientSha256 !== f.serverSha256) reasons.push('the SHA-256 computed by the server differs from the one the browser sent: the file changed on the way');
  if (f.probeError) reasons.push(f.probeError);
  if (f.mismatches?.length) reasons.push(f.mismatches.length === 1 ? '1 value differs from the spec sheet' : `${f.mismatches.length} values differ from the spec sheet`);
  if (reasons.length) return { state: 'flagged', reasons };
  if (f.clientSha256 && f.serverSha256 && f.probeDone) return { state: 'verified', reasons };
  return { state: 'received', reasons };
}

export interface FootageServiceDeps {
  sequelize: Sequelize;
  jobs: Jobs;
  storageDir: string;
  maxFileBytes: number;
  /** Removes an unfinished upload's bytes and rows (the upload store's remove). */
  removeUpload: (id: string) => Promise<void>;
}

/** Footage rules: finishing uploads, checks, the list, pickup and release. */
export class FootageService {
  readonly events = new FootageEvents();
  private readonly sequelize: Sequelize;

  constructor(private readonly deps: FootageServiceDeps) {
    this.sequelize = deps.sequelize;
  }

  /**
   * Absolute path of a storage key. Keys are made by the server (uploads/<id>, thumbnails/<id>.jpg,
   * demo/<sha>.png): a folder word and a hex or uuid name, so no key can leave the storage folder.
   */
  pathOf(key: string): string {
    if (!STORAGE_KEY.test(key)) throw new AppError('not_found', 'File not found');
    return join(this.deps.storageDir, key);
  }

  private async row(id: string, transaction?: Transaction): Promise<FootageRow | undefined> {
    const rows = await this.sequelize.query<FootageRow>(`${SELECT_FOOTAGE} WHERE f.id = :id`, { replacements: { id }, type: QueryTypes.SELECT, transaction });
    return rows[0];
  }

  /** Returns one footage row or 404. */
  async get(id: string): Promise<FootageDto> {
    const r = await this.row(id);
    if (!r) throw new AppError('not_found', 'Footage not found');
    return toDto(r);
  }

  /** The episode's footage (newest first), the test steps files can be tied to, and the size limit. */
  async list(episodeId: string): Promise<FootageList> {
    const rows = await this.sequelize.query<FootageRow>(`${SELECT_FOOTAGE} WHERE f.episode_id = :episodeId ORDER BY f.created_at DESC`, {
      replacements: { episodeId },
      type: QueryTypes.SELECT,
    });
    return { footage: rows.map(toDto), steps: await this.steps(episodeId), maxFileBytes: this.deps.maxFileBytes };
  }

  /** Steps of the episode's tests, in plan order, labelled "Test · step". */
  async steps(episodeId: string) {
    const rows = await this.sequelize.query<{ id: string; label: string; index: number; test_name: string }>(
      `SELECT s.id, s.label, s.index, t.name AS test_name FROM test_steps s JOIN tests t ON t.id = s.test_id
        WHERE t.episode_id = :episodeId ORDER BY t.position, t.created_at, s.index`,
      { replacements: { episodeId }, type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({ id: r.id, label: r.label || `Step ${r.index + 1}`, testName: r.test_name }));
  }

  /** True when the step belongs to one of the episode's tests. */
  async stepInEpisode(stepId: string, episodeId: string): Promise<boolean> {
    const rows = await this.sequelize.query(`SELECT 1 FROM test_steps s JOIN tests t ON t.id = s.test_id WHERE s.id = :stepId AND t.episode_id = :episodeId`, {
      replacements: { stepId, episodeId },
      type: QueryTypes.SELECT,
    });
    return rows.length > 0;
  }

  /**
   * Marks an upload whose bytes are all on disk as received: the footage row, the upload row,
   * its activity and the check jobs, in one transaction. Idempotent (a resumed client or a
   * restarted server may report the same upload finished twice).
   */
  async finishUpload(uploadId: string): Promise<void> {
    if (!UPLOAD_ID_PATTERN.test(uploadId)) return;
    await this.deps.jobs.start();
    const finished = await this.sequelize.transaction(async (transaction) => {
      const [u] = await this.sequelize.query<{ owner_id: string; channel_id: string; episode_id: string; length: string; completed_at: Date | null; footage_id: string | null; format: string | null; kind: string; original_name: string }>(
        'SELECT owner_id, channel_id, episode_id, length, completed_at, footage_id, format, kind, original_name FROM uploads WHERE id = :uploadId FOR UPDATE',
        { replacements: { uploadId }, type: QueryTypes.SELECT, transaction },
      );
      if (!u || u.completed_at || !u.footage_id) return null;
      await this.sequelize.query('UPDATE uploads SET completed_at = now(), "offset" = length, updated_at = now() WHERE id = :uploadId', { replacements: { uploadId }, transaction });
      await this.sequelize.query(
        `UPDATE footage SET status = 'received', size_bytes = :length, format = coalesce(:format, format), version = version + 1, updated_at = now() WHERE id = :id`,
        { replacements: { id: u.footage_id, length: u.length, format: u.format }, transaction },
      );
      await recordActivity(
        {
          channelId: u.channel_id,
          actorId: u.owner_id,
          subjectType: 'footage',
          subjectId: u.footage_id,
          episodeId: u.episode_id,
          action: 'footage.received',
          toValue: 'received',
          details: { kind: u.kind, name: u.original_name, sizeBytes: Number(u.length) },
        },
        transaction,
      );
      // The jobs go in with the footage: a crash cannot leave a received file nobody checks.
      // pg-boss writes through this transaction's own connection (its `db` option).
      const connection = (transaction as unknown as { connection: { query: (text: string, values: unknown[]) => Promise<{ rows: unknown[] }> } }).connection;
      const db = { executeSql: (text: string, values: unknown[]) => connection.query(text, values) };
      await this.deps.jobs.send(FOOTAGE_JOBS.checksum, { footageId: u.footage_id }, { db });
      await this.deps.jobs.send(FOOTAGE_JOBS.probe, { footageId: u.footage_id }, { db });
      return u.footage_id;
    });
    if (finished) this.deps.jobs.wake(FOOTAGE_JOBS.checksum, FOOTAGE_JOBS.probe);
  }

  /** Job: streams the stored file through SHA-256 and records the digest. */
  async computeChecksum(footageId: string): Promise<void> {
    const f = await this.row(footageId);
    if (!f || f.status === 'receiving') return;
    const hash = createHash('sha256');
    await pipeline(createReadStream(this.pathOf(f.storage_key), { highWaterMark: 1024 * 1024 }), hash);
    const digest = hash.digest('hex');
    await this.sequelize.query('UPDATE footage SET server_sha256 = :digest, updated_at = now() WHERE id = :id', { replacements: { id: footageId, digest } });
    await this.settle(footageId);
  }

  /** The spec-sheet values of the test a file belongs to: its step's test, or the episode's only test. */
  private async specFor(f: FootageRow): Promise<{ testName: string; values: SpecValues } | null> {
    const tests = await this.sequelize.query<{ id: string; name: string }>(
      f.step_id
        ? 'SELECT t.id, t.name FROM tests t JOIN test_steps s ON s.test_id = t.id WHERE s.id = :stepId'
        : 'SELECT id, name FROM tests WHERE episode_id = :episodeId',
      { replacements: { stepId: f.step_id, episodeId: f.episode_id }, type: QueryTypes.SELECT },
    );
    if (tests.length !== 1) return null;
    const lines = await this.sequelize.query<{ key: string; value: string }>(`SELECT key, value FROM spec_sheet_lines WHERE test_id = :testId AND key IN (:keys)`, {
      replacements: { testId: tests[0].id, keys: [...PROBE_COMPARED_KEYS] },
      type: QueryTypes.SELECT,
    });
    return { testName: tests[0].name, values: Object.fromEntries(lines.map((l) => [l.key, l.value])) };
  }

  /** Job: probes the file, compares it with the spec sheet, makes the thumbnail. */
  async probe(footageId: string): Promise<void> {
    const f = await this.row(footageId);
    if (!f || f.status === 'receiving') return;
    const path = this.pathOf(f.storage_key);
    let summary: ProbeSummary | null = null;
    let probeError: string | null = null;
    try {
      summary = summariseProbe(await ffprobe(path));
      if (!summary.codec) probeError = 'ffprobe found no picture in the file';
    } catch (err) {
      probeError = (err as Error).message;
    }
    let mismatches: SpecMismatch[] | null = null;
    let spec: { testName: string | null; skipped: SpecSkip[] } = { testName: null, skipped: [] };
    if (summary && !probeError) {
      const sheet = await this.specFor(f);
      if (sheet) {
        const cmp = compareProbeWithSpec(summary, sheet.values, f.kind);
        mismatches = cmp.mismatches;
        spec = { testName: sheet.testName, skipped: cmp.skipped };
      } else {
        spec.skipped = PROBE_COMPARED_KEYS.map((key) => ({ key, label: PROBE_KEY_LABELS[key], reason: f.step_id ? 'The step has no test' : 'Choose the test step this file belongs to: the episode has no single test to compare with' }));
      }
    }
    let thumbnailKey: string | null = null;
    if (summary && !probeError) {
      try {
        thumbnailKey = `thumbnails/${footageId}.jpg`;
        await writeThumbnail(path, this.pathOf(thumbnailKey), summary.durationSeconds);
      } catch (err) {
        thumbnailKey = null;
        console.warn(`[footage] no thumbnail for ${footageId}: ${(err as Error).message}`);
      }
    }
    await this.sequelize.query(
      `UPDATE footage SET probe = :probe, probe_error = :probeError, spec_mismatches = :mismatches, thumbnail_key = :thumbnailKey, updated_at = now() WHERE id = :id`,
      {
        replacements: {
          id: footageId,
          probe: summary ? JSON.stringify({ ...summary, spec }) : null,
          probeError,
          mismatches: mismatches ? JSON.stringify(mismatches) : null,
          thumbnailKey,
        },
      },
    );
    await this.settle(footageId);
  }

  /** Moves a received file to verified or flagged once its checks are in; announces verified files. */
  async settle(footageId: string): Promise<void> {
    const result = await this.sequelize.transaction(async (transaction) => {
      const [f] = await this.sequelize.query<FootageRow>('SELECT * FROM footage WHERE id = :id FOR UPDATE', { replacements: { id: footageId }, type: QueryTypes.SELECT, transaction });
      if (!f || f.status === 'receiving') return null;
      const { state, reasons } = settledState({
        clientSha256: f.client_sha256,
        serverSha256: f.server_sha256,
        probeDone: f.probe !== null || f.probe_error !== null,
        probeError: f.probe_error,
        mismatches: f.spec_mismatches,
      });
      if (state === f.status) return null;
      await this.sequelize.query(
        `UPDATE footage SET status = :state, checked_at = CASE WHEN :state IN ('verified','flagged') THEN now() ELSE checked_at END, version = version + 1, updated_at = now() WHERE id = :id`,
        { replacements: { id: footageId, state }, transaction },
      );
      await recordActivity(
        {
          channelId: f.channel_id,
          actorId: null,
          subjectType: 'footage',
          subjectId: footageId,
          episodeId: f.episode_id,
          action: `footage.${state}`,
          fromValue: f.status,
          toValue: state,
          reason: reasons.join('; ') || null,
          details: { mismatches: f.spec_mismatches ?? [] },
        },
        transaction,
      );
      return { state, f };
    });
    if (result?.state === 'verified') {
      const f = result.f;
      await this.events.emitReady({ footageId, channelId: f.channel_id, episodeId: f.episode_id, kind: f.kind, originalName: f.original_name, uploaderId: f.uploader_id });
    }
  }

  /** Records the browser's SHA-256 of an upload (sent when its worker finishes); only the uploader may. */
  async setClientChecksum(uploadId: string, userId: string, sha256: string): Promise<FootageDto> {
    const footageId = await this.sequelize.transaction(async (transaction) => {
      const [u] = await this.sequelize.query<{ owner_id: string; client_sha256: string | null; footage_id: string | null }>(
        'SELECT owner_id, client_sha256, footage_id FROM uploads WHERE id = :uploadId FOR UPDATE',
        { replacements: { uploadId }, type: QueryTypes.SELECT, transaction },
      );
      if (!u || !u.footage_id) throw new AppError('not_found', 'Upload not found');
      if (u.owner_id !== userId) throw new AppError('forbidden', 'Only the person who uploaded this file can send its checksum');
      if (u.client_sha256 && u.client_sha256 !== sha256) {
        throw new AppError('conflict', 'A different checksum was already recorded for this upload: upload the file again if it changed');
      }
      await this.sequelize.query('UPDATE uploads SET client_sha256 = :sha256, updated_at = now() WHERE id = :uploadId', { replacements: { uploadId, sha256 }, transaction });
      await this.sequelize.query('UPDATE footage SET client_sha256 = :sha256, updated_at = now() WHERE id = :id', { replacements: { id: u.footage_id, sha256 }, transaction });
      return u.footage_id;
    });
    await this.settle(footageId);
    return this.get(footageId);
  }

  private async lockForChange(id: string, version: number, transaction: Transaction): Promise<FootageRow> {
    const [f] = await this.sequelize.query<FootageRow>('SELECT * FROM footage WHERE id = :id FOR UPDATE', { replacements: { id }, type: QueryTypes.SELECT, transaction });
    if (!f) throw new AppError('not_found', 'Footage not found');
    if (f.status === 'receiving') throw new AppError('conflict', 'This file is still uploading: pick it up once it has arrived');
    if (f.version !== version) throw new AppError('stale_version', 'Someone changed this footage meanwhile: reload and try again', { currentVersion: f.version });
    return f;
  }

  private async nameOf(userId: string, transaction: Transaction) {
    const [u] = await this.sequelize.query<{ name: string }>('SELECT name FROM users WHERE id = :userId', { replacements: { userId }, type: QueryTypes.SELECT, transaction });
    return u?.name ?? 'someone';
  }

  /** An editor (or producer/admin) claims a file to work on it. */
  async pickUp(id: string, actor: { userId: string; role: Role }, version: number): Promise<FootageDto> {
    if (!PICKUP_ROLES.includes(actor.role)) throw new AppError('forbidden', `Your role (${actor.role}) cannot pick up footage; editors, producers and admins can`);
    await this.sequelize.transaction(async (transaction) => {
      const f = await this.lockForChange(id, version, transaction);
      if (f.held_by_id === actor.userId) return;
      if (f.held_by_id) {
        throw new AppError('conflict', `${await this.nameOf(f.held_by_id, transaction)} holds this file since ${new Date(f.held_since!).toISOString()}: ask them to release it, or ask a producer to reassign it`);
      }
      await this.sequelize.query('UPDATE footage SET held_by_id = :userId, held_since = now(), version = version + 1, updated_at = now() WHERE id = :id', { replacements: { id, userId: actor.userId }, transaction });
      await recordActivity({ channelId: f.channel_id, actorId: actor.userId, subjectType: 'footage', subjectId: id, episodeId: f.episode_id, action: 'footage.picked_up', toValue: actor.userId }, transaction);
    });
    return this.get(id);
  }

  /** The holder (or a producer/admin) lets go of a file. */
  async release(id: string, actor: { userId: string; role: Role }, version: number): Promise<FootageDto> {
    await this.sequelize.transaction(async (transaction) => {
      const f = await this.lockForChange(id, version, transaction);
      if (!f.held_by_id) throw new AppError('conflict', 'Nobody holds this file');
      if (f.held_by_id !== actor.userId && !ASSIGN_ROLES.includes(actor.role)) {
        throw new AppError('forbidden', 'Only the person who holds this file, a producer or an admin can release it');
      }
      await this.sequelize.query('UPDATE footage SET held_by_id = NULL, held_since = NULL, version = version + 1, updated_at = now() WHERE id = :id', { replacements: { id }, transaction });
      await recordActivity({ channelId: f.channel_id, actorId: actor.userId, subjectType: 'footage', subjectId: id, episodeId: f.episode_id, action: 'footage.released', fromValue: f.held_by_id }, transaction);
    });
    return this.get(id);
  }

  /** A producer or admin hands a file to another member who may pick up footage. */
  async reassign(id: string, actor: { userId: string; role: Role }, input: { userId: string; version: number }): Promise<FootageDto> {
    if (!ASSIGN_ROLES.includes(actor.role)) throw new AppError('forbidden', `Your role (${actor.role}) cannot reassign footage; producers and admins can`);
    await this.sequelize.transaction(async (transaction) => {
      const f = await this.lockForChange(id, input.version, transaction);
      const [m] = await this.sequelize.query<{ role: Role }>('SELECT role FROM memberships WHERE channel_id = :channelId AND user_id = :userId', {
        replacements: { channelId: f.channel_id, userId: input.userId },
        type: QueryTypes.SELECT,
        transaction,
      });
      if (!m) throw new AppError('validation_failed', 'That person is not a member of this channel', { fieldErrors: { userId: ['Not a member of this channel'] } });
      if (!PICKUP_ROLES.includes(m.role)) {
        throw new AppError('validation_failed', `A ${m.role} cannot hold footage; choose an editor, producer or admin`, { fieldErrors: { userId: ['Cannot hold footage'] } });
      }
      if (f.held_by_id === input.userId) return;
      await this.sequelize.query('UPDATE footage SET held_by_id = :userId, held_since = now(), version = version + 1, updated_at = now() WHERE id = :id', { replacements: { id, userId: input.userId }, transaction });
      await recordActivity(
        { channelId: f.channel_id, actorId: actor.userId, subjectType: 'footage', subjectId: id, episodeId: f.episode_id, action: 'footage.reassigned', fromValue: f.held_by_id, toValue: input.userId },
        transaction,
      );
    });
    return this.get(id);
  }

  /** Where a received file's bytes are, for downloads: the storage root and the key under it. */
  async fileFor(id: string): Promise<{ root: string; key: string; name: string; size: number }> {
    const f = await this.row(id);
    if (!f) throw new AppError('not_found', 'Footage not found');
    if (f.status === 'receiving') throw new AppError('conflict', 'This file is still uploading: download it once it has arrived');
    const key = f.storage_key;
    this.pathOf(key);
    return { root: this.deps.storageDir, key, name: f.original_name, size: Number(f.size_bytes) };
  }

  /** Where a file's thumbnail is (storage root and key), or 404. */
  async thumbnailFor(id: string): Promise<{ root: string; key: string }> {
    const f = await this.row(id);
    if (!f?.thumbnail_key) throw new AppError('not_found', 'This file has no thumbnail (yet)');
    this.pathOf(f.thumbnail_key);
    return { root: this.deps.storageDir, key: f.thumbnail_key };
  }

  /**
   * Sweeps uploads: finishes those whose bytes all arrived (a server stopped before recording it),
   * removes expired unfinished ones (bytes and rows, with an activity line), and deletes stray files
   * in the upload folder that no row knows, once they are older than the expiry. Returns counts.
   */
  async sweepUploads(expiryMs: number, bytesOnDisk: (id: string) => Promise<number | null>): Promise<{ finished: number; expired: number; strays: number }> {
    const out = { finished: 0, expired: 0, strays: 0 };
    const open = await this.sequelize.query<{ id: string; length: string; expired: boolean; channel_id: string; episode_id: string; owner_id: string; original_name: string }>(
      'SELECT id, length, expires_at < now() AS expired, channel_id, episode_id, owner_id, original_name FROM uploads WHERE completed_at IS NULL',
      { type: QueryTypes.SELECT },
    );
    for (const u of open) {
      const onDisk = await bytesOnDisk(u.id);
      if (onDisk !== null && onDisk === Number(u.length) && !u.expired) {
        await this.finishUpload(u.id);
        out.finished++;
      } else if (u.expired) {
        await this.deps.removeUpload(u.id);
        await this.sequelize.transaction((transaction) =>
          recordActivity(
            { channelId: u.channel_id, actorId: null, subjectType: 'upload', subjectId: u.id, episodeId: u.episode_id, action: 'upload.expired', details: { name: u.original_name, receivedBytes: onDisk ?? 0, lengthBytes: Number(u.length) } },
            transaction,
          ),
        );
        out.expired++;
      }
    }
    const dir = join(this.deps.storageDir, 'uploads');
    const names = await readdir(dir).catch(() => [] as string[]);
    const known = new Set((await this.sequelize.query<{ id: string }>('SELECT id FROM uploads', { type: QueryTypes.SELECT })).map((r) => r.id));
    for (const name of names) {
      if (!UPLOAD_ID_PATTERN.test(name) || known.has(name)) continue;
      const st = await stat(join(dir, name)).catch(() => null);
      if (st && Date.now() - st.mtimeMs > expiryMs) {
        await unlink(join(dir, name)).catch(() => undefined);
        out.strays++;
      }
    }
    return out;
  }
}
