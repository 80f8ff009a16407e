/**
 * Episodes on the board: create, edit, move between and within stages, archive and restore.
 * Every write runs in one transaction with its activity line; writes that change the order of a
 * board column take the channel's board lock first (episodes.repository.ts `lockBoard`), so two
 * people moving cards at once both land and every column stays numbered 0…n−1.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Episode, EpisodeGear, Gear } from '@midgray/db';
import {
  checkStageMove,
  gearName,
  STAGE_LABELS,
  type ArchivedEpisode,
  type BoardQuery,
  type CreateEpisodeInput,
  type EpisodeDetail,
  type MoveEpisodeInput,
  type MoveResult,
  type Role,
  type Stage,
  type UpdateEpisodeInput,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';
import { FreshCoalescer } from '../../lib/fresh-coalescer.ts';
import { gearOfEpisode } from '../gear/gear.service.ts';
import { archivedEpisodes, boardJson, columnIds, episodeActivity, episodeExtras, lockBoard, stageFacts, writeColumns } from './episodes.repository.ts';

/** Who is acting, in which channel, with which role (from the route's membership check). */
export interface Actor {
  userId: string;
  channelId: string;
  role: Role;
}

type CreateInput = { title: string; gearIds: string[]; hostId: string | null; editorId: string | null; targetPublishWeek: string | null; shootDate: string | null };
type UpdateInput = Omit<UpdateEpisodeInput, 'targetPublishWeek'> & { targetPublishWeek?: string | null; gearIds?: string[] };

/** A board move that changed an episode's stage, told to the after-move listener once it committed. */
export interface EpisodeMoved {
  episodeId: string;
  channelId: string;
  actorId: string;
  from: Stage;
  to: Stage;
}

/** Hears committed stage changes (other features hook in through app.ts); its failure never undoes the move. */
export type AfterMoveListener = (moved: EpisodeMoved) => void | Promise<void>;

const fieldError = (field: string, message: string) => new AppError('validation_failed', `Check ${field}: ${message}`, { fieldErrors: { [`body.${field}`]: [message] } });

export class EpisodesService {
  /** Concurrent reads of one channel's board share a statement, never an older one (see FreshCoalescer). */
  private readonly boardReads = new FreshCoalescer<Buffer | null>();

  constructor(
    private readonly sequelize: Sequelize,
    private readonly hooks: { afterMove?: AfterMoveListener } = {},
  ) {}

  /**
   * The board of a channel as UTF-8 JSON bytes (one SQL statement; see boardJson). Reads with the
   * same channel and query share a statement; "mine" also keys on the caller.
   */
  async boardJson(channelId: string, query: BoardQuery, userId: string): Promise<Buffer> {
    const key = JSON.stringify([channelId, query.q, query.gearId ?? '', query.personId ?? '', query.mine ? userId : '', query.limit, query.show]);
    const json = await this.boardReads.get(key, async () => {
      const text = await boardJson(this.sequelize, channelId, query, userId);
      return text === null ? null : Buffer.from(text, 'utf8');
    });
    if (!json) throw new AppError('not_found', 'Channel not found');
    return json;
  }

  /** Creates an episode at the end of the Plan column. */
  async create(actor: Actor, input: CreateEpisodeInput): Promise<EpisodeDetail> {
    const data = input as CreateInput;
    const id = await this.sequelize.transaction(async (transaction) => {
      await this.assertPeople(actor.channelId, { hostId: data.hostId, editorId: data.editorId }, transaction);
      await this.assertGear(actor.channelId, data.gearIds, [], transaction);
      await lockBoard(actor.channelId, transaction);
      const plan = (await columnIds(actor.channelId, ['plan'], transaction)).get('plan')!;
      const ep = await Episode.create(
        {
          channelId: actor.channelId,
          title: data.title,
          stage: 'plan',
          position: plan.length,
          hostId: data.hostId,
          editorId: data.editorId,
          targetPublishWeek: data.targetPublishWeek,
          shootDate: data.shootDate,
          createdById: actor.userId,
        },
        { transaction },
      );
      if (data.gearIds.length) await EpisodeGear.bulkCreate(data.gearIds.map((gearId) => ({ episodeId: ep.id, gearId })), { transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'episode', subjectId: ep.id, episodeId: ep.id, action: 'episode.created', toValue: 'plan', details: { title: ep.title } },
        transaction,
      );
      return ep.id;
    });
    return this.detail(id);
  }

  /** The episode page: header, gear, people, counts, live slots and the activity list. */
  async detail(episodeId: string): Promise<EpisodeDetail> {
    const rows = await this.sequelize.query<{
      id: string;
      channel_id: string;
      title: string;
      stage: Stage;
      position: number;
      version: number;
      host_id: string | null;
      host_name: string | null;
      editor_id: string | null;
      editor_name: string | null;
      target_publish_week: string | null;
      shoot_date: string | null;
      public_url: string | null;
      archived_at: Date | null;
      created_at: Date;
      updated_at: Date;
    }>(
      `SELECT e.*, h.name AS host_name, ed.name AS editor_name
         FROM episodes e LEFT JOIN users h ON h.id = e.host_id LEFT JOIN users ed ON ed.id = e.editor_id
        WHERE e.id = :episodeId`,
      { replacements: { episodeId }, type: QueryTypes.SELECT },
    );
    const e = rows[0];
    if (!e) throw new AppError('not_found', 'Episode not found');
    const [gear, extras, activity] = await Promise.all([
      gearOfEpisode(this.sequelize, episodeId),
      episodeExtras(this.sequelize, episodeId),
      episodeActivity(this.sequelize, episodeId),
    ]);
    return {
      id: e.id,
      channelId: e.channel_id,
      title: e.title,
      stage: e.stage,
      position: e.position,
      version: e.version,
      host: e.host_id ? { id: e.host_id, name: e.host_name ?? 'Former member' } : null,
      editor: e.editor_id ? { id: e.editor_id, name: e.editor_name ?? 'Former member' } : null,
      gear,
      targetPublishWeek: e.target_publish_week,
      shootDate: e.shoot_date,
      publicUrl: e.public_url,
      archivedAt: e.archived_at ? new Date(e.archived_at).toISOString() : null,
      createdAt: new Date(e.created_at).toISOString(),
      updatedAt: new Date(e.updated_at).toISOString(),
      ...extras,
      activity,
    };
  }

  /**
   * Edits title, gear, people and dates (and, for producers and admins, the public URL). Each
   * changed field gets its own activity line (assignments as `episode.assigned`).
   */
  async update(actor: Actor, episodeId: string, input: UpdateEpisodeInput): Promise<EpisodeDetail> {
    const data = input as UpdateInput;
    if (data.publicUrl !== undefined && !['producer', 'admin'].includes(actor.role)) {
      throw new AppError('forbidden', `Only a producer or admin records the public URL (your role here is ${actor.role})`);
    }
    await this.sequelize.transaction(async (transaction) => {
      const ep = await this.lockEpisode(actor.channelId, episodeId, data.version, transaction);
      if (ep.archivedAt) throw new AppError('conflict', `"${ep.title}" is archived: restore it before editing`);
      await this.assertPeople(actor.channelId, { hostId: data.hostId, editorId: data.editorId }, transaction);
      const currentGear = (await EpisodeGear.findAll({ where: { episodeId }, transaction })).map((g) => g.gearId);
      if (data.gearIds) await this.assertGear(actor.channelId, data.gearIds, currentGear, transaction);

      const log = (action: string, field: string, fromValue: string | null, toValue: string | null) =>
        recordActivity({ channelId: actor.channelId, actorId: actor.userId, subjectType: 'episode', subjectId: episodeId, episodeId, action, fromValue, toValue, details: { field } }, transaction);
      const names = await this.namesOf([ep.hostId, ep.editorId, data.hostId ?? null, data.editorId ?? null], transaction);

      const changes: Record<string, unknown> = {};
      const scalar: [keyof UpdateInput & keyof Episode, string][] = [
        ['title', 'title'],
        ['targetPublishWeek', 'target publish week'],
        ['shootDate', 'shoot date'],
        ['publicUrl', 'public URL'],
      ];
      for (const [key, label] of scalar) {
        const next = data[key] as string | null | undefined;
        if (next === undefined || next === ep[key]) continue;
        changes[key] = next;
        await log('episode.updated', label, (ep[key] as string | null) ?? null, next);
      }
      for (const key of ['hostId', 'editorId'] as const) {
        const next = data[key];
        if (next === undefined || next === ep[key]) continue;
        changes[key] = next;
        await log('episode.assigned', key === 'hostId' ? 'host' : 'editor', ep[key] ? (names.get(ep[key]!) ?? null) : null, next ? (names.get(next) ?? null) : null);
      }
      if (data.gearIds) {
        const added = data.gearIds.filter((id) => !currentGear.includes(id));
        const removed = currentGear.filter((id) => !data.gearIds!.includes(id));
        if (added.length || removed.length) {
          await EpisodeGear.destroy({ where: { episodeId, gearId: removed }, transaction });
          if (added.length) await EpisodeGear.bulkCreate(added.map((gearId) => ({ episodeId, gearId })), { transaction });
          const gearNames = await this.gearNames([...added, ...removed], transaction);
          await log('episode.updated', 'gear', removed.map((id) => gearNames.get(id)).join(', ') || null, added.map((id) => gearNames.get(id)).join(', ') || null);
        }
      }
      await ep.update({ ...changes, version: ep.version + 1 }, { transaction });
    });
    return this.detail(episodeId);
  }

  /**
   * Moves a card to `toStage` at `toIndex` (a reorder when the stage is the same). The version must
   * be the one the mover saw (else 409); the stage rules decide (else 422 listing what is missing).
   * A stage change is told to the after-move listener once committed; a refused move tells nothing.
   */
  async move(actor: Actor, episodeId: string, input: MoveEpisodeInput): Promise<MoveResult> {
    const { result, from } = await this.sequelize.transaction(async (transaction) => {
      await lockBoard(actor.channelId, transaction);
      const ep = await this.lockEpisode(actor.channelId, episodeId, input.version, transaction);
      if (ep.archivedAt) throw new AppError('conflict', `"${ep.title}" is archived: restore it before moving it`);
      const from = ep.stage;
      const to = input.toStage;
      const facts = { ...(await stageFacts(episodeId, transaction)), now: new Date().toISOString() };
      const check = checkStageMove({ from, to, role: actor.role, reason: input.reason, facts });
      if (!check.allowed) {
        throw new AppError('stage_rule_failed', `"${ep.title}" cannot move to ${STAGE_LABELS[to]}: ${check.missing.join('; ')}`, {
          missing: check.missing,
          needsReason: check.needsReason,
          from,
          to,
        });
      }
      const columns = await columnIds(actor.channelId, from === to ? [from] : [from, to], transaction);
      const source = columns.get(from)!.filter((id) => id !== episodeId);
      columns.set(from, source);
      const target = from === to ? source : columns.get(to)!.filter((id) => id !== episodeId);
      const index = Math.min(input.toIndex, target.length);
      target.splice(index, 0, episodeId);
      columns.set(to, target);
      await writeColumns(columns, transaction);
      const version = ep.version + 1;
      await ep.update({ stage: to, position: index, version }, { transaction });
      if (check.direction !== 'same') {
        await recordActivity(
          {
            channelId: actor.channelId,
            actorId: actor.userId,
            subjectType: 'episode',
            subjectId: episodeId,
            episodeId,
            action: 'episode.moved',
            fromValue: from,
            toValue: to,
            reason: check.direction === 'back' ? input.reason!.trim() : null,
            details: { direction: check.direction },
          },
          transaction,
        );
      }
      return { result: { id: episodeId, stage: to, position: index, version }, from };
    });
    if (result.stage !== from && this.hooks.afterMove) {
      try {
        await this.hooks.afterMove({ episodeId, channelId: actor.channelId, actorId: actor.userId, from, to: result.stage });
      } catch (err) {
        console.error(`[episodes] after-move listener failed for ${episodeId}:`, (err as Error).message);
      }
    }
    return result;
  }

  /** Archives an episode: it leaves the board (its column closes the gap) and shows on the archive page. */
  async archive(actor: Actor, episodeId: string, version: number): Promise<EpisodeDetail> {
    await this.sequelize.transaction(async (transaction) => {
      await lockBoard(actor.channelId, transaction);
      const ep = await this.lockEpisode(actor.channelId, episodeId, version, transaction);
      if (ep.archivedAt) throw new AppError('conflict', `"${ep.title}" is already archived`);
      await ep.update({ archivedAt: new Date(), version: ep.version + 1 }, { transaction });
      await writeColumns(await columnIds(actor.channelId, [ep.stage], transaction), transaction);
      await recordActivity({ channelId: actor.channelId, actorId: actor.userId, subjectType: 'episode', subjectId: episodeId, episodeId, action: 'episode.archived', fromValue: ep.stage }, transaction);
    });
    return this.detail(episodeId);
  }

  /** Restores an archived episode to the end of the column of the stage it was in. */
  async unarchive(actor: Actor, episodeId: string, version: number): Promise<EpisodeDetail> {
    await this.sequelize.transaction(async (transaction) => {
      await lockBoard(actor.channelId, transaction);
      const ep = await this.lockEpisode(actor.channelId, episodeId, version, transaction);
      if (!ep.archivedAt) throw new AppError('conflict', `"${ep.title}" is not archived`);
      const column = (await columnIds(actor.channelId, [ep.stage], transaction)).get(ep.stage)!;
      await ep.update({ archivedAt: null, position: column.length, version: ep.version + 1 }, { transaction });
      await recordActivity({ channelId: actor.channelId, actorId: actor.userId, subjectType: 'episode', subjectId: episodeId, episodeId, action: 'episode.unarchived', toValue: ep.stage }, transaction);
    });
    return this.detail(episodeId);
  }

  /** The archive page's list. */
  archived(channelId: string): Promise<ArchivedEpisode[]> {
    return archivedEpisodes(this.sequelize, channelId);
  }

  // -------------------------------------------------------------------------------------------------

  /** Locks the episode row; 404 outside the channel, 409 when `version` is stale. */
  private async lockEpisode(channelId: string, episodeId: string, version: number, transaction: Transaction): Promise<Episode> {
    const ep = await Episode.findOne({ where: { id: episodeId, channelId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!ep) throw new AppError('not_found', 'Episode not found');
    if (ep.version !== version) {
      throw new AppError('stale_version', `Someone changed "${ep.title}" meanwhile (it is now in ${STAGE_LABELS[ep.stage]}): the board has been reloaded, try again`, {
        currentVersion: ep.version,
        stage: ep.stage,
        position: ep.position,
      });
    }
    return ep;
  }

  /** Host and editor must be members of the channel. */
  private async assertPeople(channelId: string, people: { hostId?: string | null; editorId?: string | null }, transaction: Transaction) {
    const ids = [people.hostId, people.editorId].filter((x): x is string => !!x);
    if (!ids.length) return;
    const rows = await this.sequelize.query<{ user_id: string }>(`SELECT user_id FROM memberships WHERE channel_id = :channelId AND user_id IN (:ids)`, {
      replacements: { channelId, ids },
      type: QueryTypes.SELECT,
      transaction,
    });
    const members = new Set(rows.map((r) => r.user_id));
    if (people.hostId && !members.has(people.hostId)) throw fieldError('hostId', 'The host must be a member of this channel');
    if (people.editorId && !members.has(people.editorId)) throw fieldError('editorId', 'The editor must be a member of this channel');
  }

  /** Gear must belong to the channel; newly added gear must not be archived. */
  private async assertGear(channelId: string, gearIds: string[], alreadyLinked: string[], transaction: Transaction) {
    if (!gearIds.length) return;
    const rows = await Gear.findAll({ where: { id: gearIds, channelId }, attributes: ['id', 'archivedAt', 'make', 'model'], transaction });
    if (rows.length !== gearIds.length) throw fieldError('gearIds', 'Pick gear from this channel’s gear list');
    const archived = rows.find((g) => g.archivedAt && !alreadyLinked.includes(g.id));
    if (archived) throw fieldError('gearIds', `${gearName(archived)} is archived: restore it on the Gear page first`);
  }

  private async namesOf(ids: (string | null | undefined)[], transaction: Transaction): Promise<Map<string, string>> {
    const list = [...new Set(ids.filter((x): x is string => !!x))];
    if (!list.length) return new Map();
    const rows = await this.sequelize.query<{ id: string; name: string }>(`SELECT id, name FROM users WHERE id IN (:list)`, { replacements: { list }, type: QueryTypes.SELECT, transaction });
    return new Map(rows.map((r) => [r.id, r.name]));
  }

  private async gearNames(ids: string[], transaction: Transaction): Promise<Map<string, string>> {
    if (!ids.length) return new Map();
    const rows = await Gear.findAll({ where: { id: ids }, attributes: ['id', 'make', 'model'], transaction });
    return new Map(rows.map((g) => [g.id, gearName(g)]));
  }
}
