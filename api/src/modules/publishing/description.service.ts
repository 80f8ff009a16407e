// The episode description: load with its composed text, save with a version check (409 when
// stale), keep every saved version, restore one, parse pasted chapters, and compose a preview with
// the same shared function the browser uses.
import type { Sequelize, Transaction } from 'sequelize';
import { Description, DescriptionVersion, User } from '@midgray/db';
import {
  canRole,
  composeDescription,
  descriptionInputFrom,
  disclosureRequired,
  parseChapters,
  resolveDisclosure,
  type ComposedDescription,
  type DescriptionParts,
  type DescriptionVersion as DescriptionVersionDto,
  type EpisodeDescription,
  type ParsedChapters,
  type Role,
  type SaveDescriptionInput,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';
import { descriptionContext, episodeHead, partsOf, type EpisodeHead } from './publishing.repository.ts';

const PART_NAMES = ['summary', 'chapters', 'gearLinks', 'disclosure'] as const;
type PartName = (typeof PART_NAMES)[number];

/** Which parts differ between two versions (JSON comparison of each part). */
function changedParts(before: DescriptionParts, after: DescriptionParts): PartName[] {
  return PART_NAMES.filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]));
}

/** Trims what a person would not mean to keep, so stored text equals what the composer prints. */
function normaliseParts(p: DescriptionParts): DescriptionParts {
  return {
    summary: p.summary,
    chapters: p.chapters.map((c) => ({ label: c.label.trim(), startSeconds: c.startSeconds })),
    gearLinks: p.gearLinks.map((l) => ({ url: l.url.trim(), label: l.label.trim(), commission: l.commission })),
    disclosure: p.disclosure,
  };
}

async function head(episodeId: string, transaction?: Transaction, lock = false): Promise<EpisodeHead> {
  const h = await episodeHead(episodeId, transaction, lock);
  if (!h) throw new AppError('not_found', 'Episode not found');
  return h;
}

/** Descriptions of episodes: read, save, versions, restore, chapters, preview. */
export class DescriptionService {
  constructor(private readonly sequelize: Sequelize) {}

  /** The episode's description with its composed text, warnings and disclosure state. */
  async get(episodeId: string, role: Role, transaction?: Transaction): Promise<EpisodeDescription> {
    const h = await head(episodeId, transaction);
    // One after the other: queries of one transaction share a connection.
    const row = await Description.findByPk(episodeId, { transaction });
    const context = await descriptionContext(h, transaction);
    const parts = partsOf(row);
    const input = descriptionInputFrom(context, parts);
    const need = disclosureRequired(input);
    const updatedBy = row?.updatedById ? await User.findByPk(row.updatedById, { transaction }) : null;
    return {
      episodeId,
      version: row?.version ?? 0,
      parts,
      context,
      composed: composeDescription(input),
      disclosure: { required: need.required, reasons: need.reasons, present: resolveDisclosure(input) !== '' },
      updatedAt: row ? row.updatedAt.toISOString() : null,
      updatedBy: updatedBy ? { id: updatedBy.id, name: updatedBy.name } : null,
      canEdit: canRole(role, 'description.edit'),
    };
  }

  /** Saves the parts when `version` is current (0 = first save); keeps a version and an activity line. */
  async save(episodeId: string, actorId: string, role: Role, input: SaveDescriptionInput): Promise<EpisodeDescription> {
    const { version, ...raw } = input;
    const parts = normaliseParts(raw);
    return this.sequelize.transaction(async (transaction) => {
      const h = await head(episodeId, transaction, true);
      const row = await Description.findByPk(episodeId, { transaction, lock: transaction.LOCK.UPDATE });
      const current = row?.version ?? 0;
      if (version !== current) {
        throw new AppError('stale_version', 'Someone saved this description meanwhile: your changes were not saved. Reload to see theirs, then apply yours again.', { currentVersion: current });
      }
      const before = partsOf(row);
      const changed = row ? changedParts(before, parts) : PART_NAMES.filter((k) => JSON.stringify(parts[k]) !== JSON.stringify(partsOf(null)[k]));
      if (row && changed.length === 0) return this.get(episodeId, role, transaction);
      await this.write(h, row, parts, actorId, changed, null, transaction);
      return this.get(episodeId, role, transaction);
    });
  }

  private async write(h: EpisodeHead, row: Description | null, parts: DescriptionParts, actorId: string, changed: PartName[], restoredFrom: number | null, transaction: Transaction) {
    const next = (row?.version ?? 0) + 1;
    if (row) await row.update({ ...parts, version: next, updatedById: actorId }, { transaction });
    else await Description.create({ episodeId: h.id, ...parts, version: next, updatedById: actorId }, { transaction });
    await DescriptionVersion.create({ episodeId: h.id, version: next, snapshot: parts, changedParts: changed, restoredFrom, authorId: actorId }, { transaction });
    await recordActivity(
      {
        channelId: h.channelId,
        actorId,
        subjectType: 'description',
        subjectId: h.id,
        episodeId: h.id,
        action: restoredFrom === null ? 'description.saved' : 'description.restored',
        fromValue: row ? String(row.version) : null,
        toValue: String(next),
        details: { changed, ...(restoredFrom !== null ? { restoredFrom } : {}) },
      },
      transaction,
    );
  }

  /** Every saved version, newest first, with author, time, what changed and the snapshot. */
  async versions(episodeId: string): Promise<DescriptionVersionDto[]> {
    const h = await head(episodeId);
    const context = await descriptionContext(h);
    const rows = await DescriptionVersion.findAll({ where: { episodeId }, order: [['version', 'DESC']] });
    const authors = new Map(
      (await User.findAll({ where: { id: [...new Set(rows.map((r) => r.authorId).filter((id): id is string => !!id))] } })).map((u) => [u.id, u.name]),
    );
    return rows.map((r) => {
      const snapshot = { ...partsOf(null), ...r.snapshot };
      return {
        id: r.id,
        version: r.version,
        author: r.authorId ? { id: r.authorId, name: authors.get(r.authorId) ?? 'Unknown' } : null,
        createdAt: r.createdAt.toISOString(),
        changed: r.changedParts.filter((c): c is PartName => (PART_NAMES as readonly string[]).includes(c)),
        restoredFrom: r.restoredFrom,
        snapshot,
        characters: [...composeDescription(descriptionInputFrom(context, snapshot)).text].length,
      };
    });
  }

  /** Makes an old version current again, as a new version (history is never rewritten). */
  async restore(episodeId: string, versionId: string, actorId: string, role: Role, currentVersion: number): Promise<EpisodeDescription> {
    return this.sequelize.transaction(async (transaction) => {
      const h = await head(episodeId, transaction, true);
      const old = await DescriptionVersion.findOne({ where: { id: versionId, episodeId }, transaction });
      if (!old) throw new AppError('not_found', 'Version not found');
      const row = await Description.findByPk(episodeId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!row || row.version !== currentVersion) {
        throw new AppError('stale_version', 'Someone saved this description meanwhile: reload the versions and restore again.', { currentVersion: row?.version ?? 0 });
      }
      const parts = { ...partsOf(null), ...old.snapshot };
      const changed = changedParts(partsOf(row), parts);
      if (changed.length === 0) throw new AppError('conflict', `Version ${old.version} is the same as the current text: nothing to restore`);
      await this.write(h, row, parts, actorId, changed, old.version, transaction);
      return this.get(episodeId, role, transaction);
    });
  }

  /** Chapters from pasted lines, with an error per line that is not a chapter. */
  parseChapters(text: string): ParsedChapters {
    return parseChapters(text);
  }

  /** The composed text and warnings of unsaved parts, exactly as the browser's live preview composes them. */
  async preview(episodeId: string, parts: DescriptionParts): Promise<ComposedDescription> {
    const h = await head(episodeId);
    return composeDescription(descriptionInputFrom(await descriptionContext(h), normaliseParts(parts)));
  }
}
