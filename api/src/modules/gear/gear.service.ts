/**
 * The channel's gear list: read by every member, managed by producers and admins. Items are
 * archived rather than deleted once an episode uses them, so old episodes keep their gear.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Gear } from '@midgray/db';
import { gearName, type CreateGearInput, type Gear as GearDto, type UpdateGearInput } from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';

type GearRow = {
  id: string;
  kind: GearDto['kind'];
  make: string;
  model: string;
  serial: string | null;
  source: GearDto['source'];
  sponsored: boolean;
  received_on: string | null;
  due_back_on: string | null;
  embargo_at: Date | null;
  embargo_zone: string | null;
  notes: string;
  archived_at: Date | null;
  version: number;
  episode_count: number;
};

/** Gear columns plus how many episodes (not archived) use each item. */
const GEAR_SELECT = `SELECT g.id, g.kind, g.make, g.model, g.serial, g.source, g.sponsored, g.received_on, g.due_back_on, g.embargo_at, g.embargo_zone,
       g.notes, g.archived_at, g.version,
       (SELECT count(*)::int FROM episode_gear x JOIN episodes e ON e.id = x.episode_id WHERE x.gear_id = g.id AND e.archived_at IS NULL) AS episode_count
  FROM gear g`;

function toDto(r: GearRow): GearDto {
  return {
    id: r.id,
    kind: r.kind,
    make: r.make,
    model: r.model,
    serial: r.serial,
    source: r.source,
    sponsored: r.sponsored,
    receivedOn: r.received_on,
    dueBackOn: r.due_back_on,
    embargoAt: r.embargo_at ? new Date(r.embargo_at).toISOString() : null,
    embargoZone: r.embargo_zone,
    notes: r.notes,
    archivedAt: r.archived_at ? new Date(r.archived_at).toISOString() : null,
    version: r.version,
    episodeCount: r.episode_count,
  };
}

/** The gear of one episode (archived items too: the episode still names them), by make and model. */
export async function gearOfEpisode(sequelize: Sequelize, episodeId: string): Promise<GearDto[]> {
  const rows = await sequelize.query<GearRow>(`${GEAR_SELECT} JOIN episode_gear eg ON eg.gear_id = g.id WHERE eg.episode_id = :episodeId ORDER BY g.make, g.model, g.id`, {
    replacements: { episodeId },
    type: QueryTypes.SELECT,
  });
  return rows.map(toDto);
}

export class GearService {
  constructor(private readonly sequelize: Sequelize) {}

  /** The channel's gear by make and model; archived items only when asked. */
  async list(channelId: string, includeArchived: boolean): Promise<GearDto[]> {
    const rows = await this.sequelize.query<GearRow>(
      `${GEAR_SELECT} WHERE g.channel_id = :channelId ${includeArchived ? '' : 'AND g.archived_at IS NULL'} ORDER BY g.archived_at NULLS FIRST, g.make, g.model, g.id`,
      { replacements: { channelId }, type: QueryTypes.SELECT },
    );
    return rows.map(toDto);
  }

  private async one(gearId: string, transaction?: Transaction): Promise<GearDto> {
    const rows = await this.sequelize.query<GearRow>(`${GEAR_SELECT} WHERE g.id = :gearId`, { replacements: { gearId }, type: QueryTypes.SELECT, transaction });
    if (!rows[0]) throw new AppError('not_found', 'Gear not found');
    return toDto(rows[0]);
  }

  /** Adds an item to the channel's gear list. */
  async create(channelId: string, actorId: string, input: CreateGearInput): Promise<GearDto> {
    return this.sequelize.transaction(async (transaction) => {
      const g = await Gear.create({ channelId, ...input }, { transaction });
      await recordActivity({ channelId, actorId, subjectType: 'gear', subjectId: g.id, action: 'gear.created', toValue: gearName(g) }, transaction);
      return this.one(g.id, transaction);
    });
  }

  /** Edits, archives (`archived: true`) or restores an item; a stale `version` answers 409. */
  async update(channelId: string, actorId: string, gearId: string, input: UpdateGearInput): Promise<GearDto> {
    return this.sequelize.transaction(async (transaction) => {
      const g = await Gear.findOne({ where: { id: gearId, channelId }, transaction, lock: transaction.LOCK.UPDATE });
      if (!g) throw new AppError('not_found', 'Gear not found');
      if (g.version !== input.version) {
        throw new AppError('stale_version', `Someone changed ${gearName(g)} meanwhile: reload the gear list and apply your change again`, { currentVersion: g.version });
      }
      const { version: _v, archived, ...fields } = input;
      const merged = { receivedOn: g.receivedOn, dueBackOn: g.dueBackOn, ...fields };
      if (merged.receivedOn && merged.dueBackOn && merged.dueBackOn < merged.receivedOn) {
        throw new AppError('validation_failed', `Check dueBackOn: The due-back date is before the date it was received (${merged.receivedOn})`, {
          fieldErrors: { 'body.dueBackOn': [`The due-back date is before the date it was received (${merged.receivedOn})`] },
        });
      }
      const changed = Object.keys(fields).filter((k) => {
        const before = g.get(k as keyof Gear);
        const after = (fields as Record<string, unknown>)[k];
        return (before instanceof Date ? before.toISOString() : before) !== (typeof after === 'string' && k === 'embargoAt' ? new Date(after).toISOString() : after);
      });
      const wasArchived = g.archivedAt !== null;
      const archivedAt = archived === undefined ? g.archivedAt : archived ? (g.archivedAt ?? new Date()) : null;
      await g.update({ ...fields, archivedAt, version: g.version + 1 }, { transaction });
      if (changed.length) {
        await recordActivity({ channelId, actorId, subjectType: 'gear', subjectId: g.id, action: 'gear.updated', toValue: gearName(g), details: { fields: changed } }, transaction);
      }
      if (archived !== undefined && archived !== wasArchived) {
        await recordActivity({ channelId, actorId, subjectType: 'gear', subjectId: g.id, action: archived ? 'gear.archived' : 'gear.restored', toValue: gearName(g) }, transaction);
      }
      return this.one(g.id, transaction);
    });
  }

  /** Deletes an item no episode uses (one that is used must be archived instead: 409). */
  async remove(channelId: string, actorId: string, gearId: string): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      const g = await Gear.findOne({ where: { id: gearId, channelId }, transaction, lock: transaction.LOCK.UPDATE });
      if (!g) throw new AppError('not_found', 'Gear not found');
      const used = await this.sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM episode_gear WHERE gear_id = :gearId`, { replacements: { gearId }, type: QueryTypes.SELECT, transaction });
      if (used[0].n > 0) {
        throw new AppError('conflict', `${gearName(g)} is used by ${used[0].n} ${used[0].n === 1 ? 'episode' : 'episodes'}: archive it instead, so those episodes keep it`);
      }
      await g.destroy({ transaction });
      await recordActivity({ channelId, actorId, subjectType: 'gear', subjectId: gearId, action: 'gear.deleted', fromValue: gearName(g) }, transaction);
    });
  }
}
