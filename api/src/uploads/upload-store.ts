// Where tus uploads live: bytes in files named by upload id under the storage folder (the file's
// size is the upload's offset, so a restarted server continues from the last byte on disk), and
// metadata in PostgreSQL (`uploads`, plus the `footage` row it will become), written in one
// transaction: a crash cannot leave metadata half-written (the stock file configstore writes JSON
// files non-atomically). Upload ids are the server's own 32 hex characters and paths are only
// ever built from them, never from a client's input.
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, open, stat, unlink, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { FileStore } from '@tus/file-store';
import { ERRORS, Upload, type KvStore } from '@tus/utils';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { lockUntilCommit } from '@midgray/db';
import { FILE_FORMAT_LABELS, FOOTAGE_KIND_LABELS, FORMAT_EXTENSIONS, formatForFileName, KIND_FORMATS, type FileFormat, type FootageKind } from '@midgray/shared';
import { SNIFF_BYTES, sniffFormat } from './sniff.ts';

/** The server's upload id format: 128 random bits as lower-case hex. */
export const UPLOAD_ID_PATTERN = /^[0-9a-f]{32}$/;

/** A refusal the tus server sends as-is (status and a sentence for the person). */
export class UploadRefusal extends Error {
  constructor(
    readonly status_code: number,
    readonly body: string,
  ) {
    super(body);
  }
}

/** What the guard established about a new upload before tus creates it. */
export interface UploadCreation {
  ownerId: string;
  channelId: string;
  episodeId: string;
  stepId: string | null;
  kind: FootageKind;
  originalName: string;
  /** Format the file name's extension claims; the first bytes must agree. */
  claimedFormat: FileFormat;
  clientSha256: string | null;
}

export interface UploadLimits {
  expiryMs: number;
  maxOpenPerUser: number;
  maxOpenBytesPerUser: number;
  /** Free space the footage store keeps after every upload under way has arrived. */
  diskReserveBytes: number;
  /** Free bytes of the footage store's file system now (null when it cannot be read). */
  freeBytes: () => Promise<number | null>;
}

const formatBytes = (n: number) => {
  const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
  let i = 0;
  while (n >= 1024 && i < units.length - 1) { n /= 1024; i++; }
  return `${i === 0 ? n : n.toFixed(n >= 100 ? 0 : 1)} ${units[i]}`;
};
export { formatBytes };

/**
 * The tus configstore over PostgreSQL. `set` of a new upload inserts its `uploads` row and the
 * `footage` row (status receiving) in one transaction, after checking the owner's open-upload
 * limits under a per-owner advisory lock (so two concurrent creations cannot both squeeze in).
 */
export class UploadRecords implements KvStore<Upload> {
  private readonly creations = new WeakMap<Upload, UploadCreation>();

  constructor(
    private readonly sequelize: Sequelize,
    private readonly limits: UploadLimits,
  ) {}

  /** Ties the guard's findings to the Upload object tus is about to create. */
  bind(upload: Upload, creation: UploadCreation) {
    this.creations.set(upload, creation);
  }

  async get(id: string): Promise<Upload | undefined> {
    if (!UPLOAD_ID_PATTERN.test(id)) return undefined;
    const rows = await this.sequelize.query<{ length: string; offset: string; metadata: Record<string, string | null>; created_at: Date }>(
      'SELECT length, "offset", metadata, created_at FROM uploads WHERE id = :id',
      { replacements: { id }, type: QueryTypes.SELECT },
    );
    const r = rows[0];
    if (!r) return undefined;
    return new Upload({ id, size: Number(r.length), offset: Number(r.offset), metadata: r.metadata, creation_date: new Date(r.created_at).toISOString() });
  }

  async set(id: string, upload: Upload): Promise<void> {
    const creation = this.creations.get(upload);
    if (!creation) {
      // Only creation writes metadata here (deferred lengths are not offered).
      await this.sequelize.query('UPDATE uploads SET metadata = :metadata, updated_at = now() WHERE id = :id', {
        replacements: { id, metadata: JSON.stringify(upload.metadata ?? {}) },
      });
      return;
    }
    const length = upload.size ?? 0;
    await this.sequelize.transaction(async (transaction) => {
      await lockUntilCommit(transaction, 'midgray.uploads', creation.ownerId);
      const [open] = await this.sequelize.query<{ n: string; bytes: string }>(
        `SELECT count(*) AS n, coalesce(sum(length), 0) AS bytes FROM uploads
          WHERE owner_id = :owner AND completed_at IS NULL AND expires_at > now()`,
        { replacements: { owner: creation.ownerId }, type: QueryTypes.SELECT, transaction },
      );
      if (Number(open.n) + 1 > this.limits.maxOpenPerUser) {
        throw new UploadRefusal(429, `You already have ${open.n} unfinished uploads (the limit is ${this.limits.maxOpenPerUser}): finish or cancel some first.`);
      }
      if (Number(open.bytes) + length > this.limits.maxOpenBytesPerUser) {
        throw new UploadRefusal(429, `Your unfinished uploads already hold ${formatBytes(Number(open.bytes))}; with this file they would pass your limit of ${formatBytes(this.limits.maxOpenBytesPerUser)}. Finish or cancel some first.`);
      }
      // The disk: every upload under way (anyone's) still needs its missing bytes; this one needs all of its own.
      const free = await this.limits.freeBytes();
      if (free !== null) {
        const [pending] = await this.sequelize.query<{ bytes: string }>(
          `SELECT coalesce(sum(length - "offset"), 0) AS bytes FROM uploads WHERE completed_at IS NULL AND expires_at > now()`,
          { type: QueryTypes.SELECT, transaction },
        );
        const left = free - Number(pending.bytes) - length;
        if (left < this.limits.diskReserveBytes) {
          throw new UploadRefusal(
            507,
            `The footage store has ${formatBytes(free)} free; with the uploads under way (${formatBytes(Number(pending.bytes))} still to come) this file would leave less than the ${formatBytes(this.limits.diskReserveBytes)} it keeps free. Ask an admin to make room, or wait for uploads to finish.`,
          );
        }
      }
      const [[footage]] = (await this.sequelize.query(
        `INSERT INTO footage (channel_id, episode_id, step_id, upload_id, kind, status, uploader_id, original_name, format, size_bytes, storage_key, client_sha256)
         VALUES (:channelId, :episodeId, :stepId, :id, :kind, 'receiving', :ownerId, :name, :format, :length, :key, :sha)
         RETURNING id`,
        {
          replacements: { ...creation, id, name: creation.originalName, format: creation.claimedFormat, length, key: storageKeyOf(id), sha: creation.clientSha256 },
          transaction,
        },
      )) as unknown as [{ id: string }[]];
      await this.sequelize.query(
        `INSERT INTO uploads (id, owner_id, channel_id, episode_id, step_id, kind, original_name, length, metadata, client_sha256, expires_at, footage_id)
         VALUES (:id, :ownerId, :channelId, :episodeId, :stepId, :kind, :name, :length, :metadata, :sha, now() + make_interval(secs => :expirySeconds), :footageId)`,
        {
          replacements: {
            ...creation,
            id,
            name: creation.originalName,
            length,
            metadata: JSON.stringify(upload.metadata ?? {}),
            sha: creation.clientSha256,
            expirySeconds: this.limits.expiryMs / 1000,
            footageId: footage.id,
          },
          transaction,
        },
      );
    });
    // tus reads creation_date from the store; keep it equal to the row's.
    const stored = await this.get(id);
    upload.creation_date = stored?.creation_date;
  }

  /** Removes an unfinished upload's rows (its footage row too, which never became footage). */
  async delete(id: string): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      await this.sequelize.query(`DELETE FROM footage WHERE upload_id = :id AND status = 'receiving'`, { replacements: { id }, transaction });
      await this.sequelize.query('DELETE FROM uploads WHERE id = :id', { replacements: { id }, transaction });
    });
  }

  /** Ids of unfinished uploads. */
  async list(): Promise<string[]> {
    const rows = await this.sequelize.query<{ id: string }>('SELECT id FROM uploads WHERE completed_at IS NULL', { type: QueryTypes.SELECT });
    return rows.map((r) => r.id);
  }

  /** Records how far an upload got (the file on disk stays the truth). */
  async setOffset(id: string, offset: number, transaction?: Transaction) {
    // Bytes only ever append, so a late progress report never moves the offset back.
    await this.sequelize.query('UPDATE uploads SET "offset" = GREATEST("offset", :offset), updated_at = now() WHERE id = :id AND completed_at IS NULL', { replacements: { id, offset }, transaction });
  }

  async formatOf(id: string): Promise<{ format: string | null; kind: FootageKind; originalName: string; length: number } | undefined> {
    const rows = await this.sequelize.query<{ format: string | null; kind: FootageKind; original_name: string; length: string }>(
      'SELECT format, kind, original_name, length FROM uploads WHERE id = :id',
      { replacements: { id }, type: QueryTypes.SELECT },
    );
    const r = rows[0];
    return r && { format: r.format, kind: r.kind, originalName: r.original_name, length: Number(r.length) };
  }

  async setFormat(id: string, format: FileFormat) {
    await this.sequelize.transaction(async (transaction) => {
      await this.sequelize.query('UPDATE uploads SET format = :format, updated_at = now() WHERE id = :id', { replacements: { id, format }, transaction });
      await this.sequelize.query('UPDATE footage SET format = :format, updated_at = now() WHERE upload_id = :id', { replacements: { id, format }, transaction });
    });
  }
}

/** Storage key (relative to the storage folder) of an upload's bytes. */
export const storageKeyOf = (id: string) => `uploads/${id}`;

/** Returns why `format` (found in the bytes) is refused for a file named `name` of `kind`, or null. */
export function formatProblem(format: FileFormat | null, kind: FootageKind, claimed: FileFormat | null): string | null {
  const kindName = FOOTAGE_KIND_LABELS[kind].toLowerCase();
  if (!format) return `The file's first bytes are not a video container or still image Midgray accepts as a ${kindName} (it checks MP4/MOV, Matroska, MXF, AVI, PNG, JPEG, TIFF and DPX). Check that you picked the right file.`;
  if (claimed && claimed !== format) {
    return `The file's name says ${FILE_FORMAT_LABELS[claimed]} but its contents are ${FILE_FORMAT_LABELS[format]}: rename it to ${FORMAT_EXTENSIONS[format][0]} or pick the right file.`;
  }
  if (!KIND_FORMATS[kind].includes(format)) return `This file is ${FILE_FORMAT_LABELS[format]}, which is not accepted as a ${kindName}.`;
  return null;
}

/**
 * @tus/file-store with the PostgreSQL configstore, a content check on the first bytes, and the
 * offset recorded after each write. Creation inserts the rows before the (empty) file exists.
 */
export class FootageUploadStore extends FileStore {
  readonly records: UploadRecords;
  readonly root: string;

  constructor(opts: { storageDir: string; records: UploadRecords; expiryMs: number }) {
    super({ directory: join(opts.storageDir, 'uploads'), configstore: opts.records, expirationPeriodInMilliseconds: opts.expiryMs });
    this.records = opts.records;
    this.root = opts.storageDir;
    // Lengths are always declared up front: limits and quotas need them.
    this.extensions = ['creation', 'creation-with-upload', 'termination', 'expiration'];
  }

  /** Absolute path of an upload's bytes (ids are checked against the server's own format). */
  pathOf(id: string): string {
    if (!UPLOAD_ID_PATTERN.test(id)) throw ERRORS.FILE_NOT_FOUND;
    return join(this.directory, id);
  }

  override async create(upload: Upload): Promise<Upload> {
    const path = this.pathOf(upload.id);
    await this.records.set(upload.id, upload);
    await mkdir(this.directory, { recursive: true });
    await writeFile(path, '', { flag: 'wx' });
    upload.storage = { type: 'file', path };
    return upload;
  }

  override read(id: string) {
    return createReadStream(this.pathOf(id));
  }

  override async remove(id: string): Promise<void> {
    await unlink(this.pathOf(id)).catch((err: NodeJS.ErrnoException) => {
      if (err.code !== 'ENOENT') throw err;
    });
    await this.records.delete(id);
  }

  override async write(readable: Readable, id: string, offset: number): Promise<number> {
    const path = this.pathOf(id);
    // While the file is shorter than SNIFF_BYTES, look at the first bytes before any is written.
    let source: Readable = readable;
    if (offset < SNIFF_BYTES) {
      const head = await readPrefix(readable, SNIFF_BYTES - offset);
      await this.checkContent(id, offset, head, readable.readableEnded);
      if (readable.readableEnded) source = Readable.from(head.length ? [head] : []);
      else if (head.length) readable.unshift(head);
    }
    // 1 MiB buffers: fewer write calls for multi-GB bodies; bytesWritten counts what reached the file.
    const out = createWriteStream(path, { flags: 'r+', start: offset, highWaterMark: 1024 * 1024 });
    let received = 0;
    try {
      await pipeline(source, out);
      received = out.bytesWritten;
    } catch (err) {
      received = out.bytesWritten;
      // A dropped connection ends the source early; what arrived is on disk and counted.
      if (received === 0) throw ERRORS.FILE_WRITE_ERROR;
    }
    const newOffset = offset + received;
    await this.records.setOffset(id, newOffset);
    return newOffset;
  }

  /**
   * Decides the format from the bytes already on disk plus `head` (the start of this request's
   * body). A refusal removes the upload and fails the request; too few bytes to tell (and not the
   * whole file) lets them through, to be checked again on the next PATCH.
   */
  private async checkContent(id: string, offset: number, head: Buffer, requestEnded: boolean): Promise<void> {
    const info = await this.records.formatOf(id);
    if (!info) throw ERRORS.FILE_NOT_FOUND;
    if (info.format) return;
    let existing = Buffer.alloc(0);
    if (offset > 0) {
      const fh = await open(this.pathOf(id), 'r');
      try {
        existing = Buffer.alloc(offset);
        await fh.read(existing, 0, offset, 0);
      } finally {
        await fh.close();
      }
    }
    const prefix = Buffer.concat([existing, head]);
    const complete = prefix.length >= info.length;
    const r = sniffFormat(prefix.subarray(0, SNIFF_BYTES), complete);
    if (!r.format && r.needMore && requestEnded) return;
    const problem = formatProblem(r.format, info.kind, formatForFileName(info.originalName));
    if (problem) {
      await this.remove(id).catch(() => undefined);
      throw new UploadRefusal(415, problem);
    }
    await this.records.setFormat(id, r.format!);
  }

  /** Size in bytes of an upload's file on disk (its true offset), or null when missing. */
  async bytesOnDisk(id: string): Promise<number | null> {
    try {
      return (await stat(this.pathOf(id))).size;
    } catch {
      return null;
    }
  }
}

/** Reads at least `bytes` from a stream (fewer when it ends first) without consuming the rest. */
async function readPrefix(stream: Readable, bytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let n = 0;
  while (n < bytes) {
    const chunk = stream.read() as Buffer | null;
    if (chunk) {
      chunks.push(chunk);
      n += chunk.length;
      continue;
    }
    if (stream.readableEnded || stream.destroyed) break;
    const ended = await new Promise<boolean>((resolve, reject) => {
      const done = (v: boolean) => () => {
        stream.off('readable', onReadable);
        stream.off('end', onEnd);
        stream.off('error', onError);
        resolve(v);
      };
      const onReadable = done(false);
      const onEnd = done(true);
      const onError = (err: Error) => {
        stream.off('readable', onReadable);
        stream.off('end', onEnd);
        reject(err);
      };
      stream.once('readable', onReadable);
      stream.once('end', onEnd);
      stream.once('error', onError);
    });
    if (ended) break;
  }
  return Buffer.concat(chunks);
}
