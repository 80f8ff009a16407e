// Publish slots: propose (a new proposal supersedes the current one; a change after approval sends
// the episode back to Approval), approve (refused before a gear embargo or without a required
// disclosure; moves the episode to Scheduled), reject with a comment, mark live, and the producer's
// approval queue. Every change runs in one transaction with its activity lines; e-mail goes after commit.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Description, Episode, PublishSlot } from '@midgray/db';
import {
  canRole,
  checkStageMove,
  factsPastApproval,
  composeDescription,
  descriptionInputFrom,
  disclosureRequired,
  formatInstantWithZoneName,
  formatLocalDateTime,
  resolveDisclosure,
  STAGE_LABELS,
  zonedTimeToInstant,
  type ApprovalQueue,
  type ApproveSlotInput,
  type EpisodeSchedule,
  type MarkLiveInput,
  type ProposeSlotInput,
  type RejectSlotInput,
  type Role,
  type Stage,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';
import { lockBoard } from '../episodes/episodes.repository.ts';
import type { EpisodeMoved } from '../episodes/episodes.service.ts';
import { notifyApprovalRequested, notifySlotDecided, type MailDeps } from '../../mail/notifications.ts';
import { approvalBlockers } from './approval-rules.ts';
import {
  currentOf,
  descriptionContext,
  descriptionContexts,
  embargoesOf,
  endOfColumn,
  episodeHead,
  episodeHeadsInStage,
  footageStatus,
  gearOfEpisodes,
  partsOf,
  hasContent,
  slotById,
  slotsOfEpisodes,
  slotTakenIntoApproval,
  type EpisodeHead,
} from './publishing.repository.ts';

/** Moves an episode to the end of `to`'s column, closing the gap it leaves; bumps its version; logs it. */
async function moveEpisode(h: EpisodeHead, to: Stage, actorId: string, reason: string, transaction: Transaction, extra: { publicUrl?: string } = {}) {
  const position = await endOfColumn(h.channelId, to, transaction, h.id);
  await Episode.update(
    { stage: to, position, version: h.version + 1, ...(extra.publicUrl !== undefined ? { publicUrl: extra.publicUrl } : {}) },
    { where: { id: h.id }, transaction },
  );
  // Keep the old column a gap-free sequence (the board relies on it).
  await Episode.sequelize!.query(
    `UPDATE episodes SET position = position - 1
      WHERE channel_id = :channelId AND stage = :from AND archived_at IS NULL AND position > :position`,
    { replacements: { channelId: h.channelId, from: h.stage, position: h.position }, transaction },
  );
  await recordActivity(
    { channelId: h.channelId, actorId, subjectType: 'episode', subjectId: h.id, episodeId: h.id, action: 'episode.moved', fromValue: h.stage, toValue: to, reason, details: { position } },
    transaction,
  );
}

/** The disclosure state of an episode as the composer resolves it. */
async function disclosureOf(h: EpisodeHead, transaction?: Transaction) {
  const row = await Description.findByPk(h.id, { transaction });
  const context = await descriptionContext(h, transaction);
  const input = descriptionInputFrom(context, partsOf(row));
  const need = disclosureRequired(input);
  return { required: need.required, reasons: need.reasons, present: resolveDisclosure(input) !== '' };
}

/**
 * The board's after-move listener (app.ts wires it): when a move took an episode into Approval with a
 * slot proposed before the move, its producers get the approval request. Runs after the move committed.
 */
export function approvalRequestOnEntry(mail: MailDeps): (moved: EpisodeMoved) => Promise<void> {
  return async (moved) => {
    if (moved.to !== 'approval' || moved.from === 'approval') return;
    const slotId = await slotTakenIntoApproval(moved.episodeId);
    if (slotId) await notifyApprovalRequested(mail, { slotId, movedById: moved.actorId });
  };
}

/** Publish slots and their approval. */
export class SlotsService {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly mail: MailDeps,
  ) {}

  private async head(episodeId: string, transaction?: Transaction, lock = false) {
    const h = await episodeHead(episodeId, transaction, lock);
    if (!h) throw new AppError('not_found', 'Episode not found');
    return h;
  }

  /**
   * The episode, locked for a change that may move it on the board: the board's lock first (as the
   * board's own moves take it, so positions stay a gap-free sequence and no deadlock can form), then the row.
   */
  private async headForMove(episodeId: string, transaction: Transaction) {
    const unlocked = await this.head(episodeId, transaction);
    await lockBoard(unlocked.channelId, transaction);
    return this.head(episodeId, transaction, true);
  }

  /** The Schedule tab: current slot, history (newest first), embargoes, and what the caller may do. */
  async schedule(episodeId: string, role: Role, transaction?: Transaction): Promise<EpisodeSchedule> {
    const h = await this.head(episodeId, transaction);
    const slots = await slotsOfEpisodes([h.id], transaction);
    const gear = await gearOfEpisodes([h.id], transaction);
    const history = slots.get(h.id) ?? [];
    return {
      episode: { id: h.id, title: h.title, stage: h.stage, version: h.version, publicUrl: h.publicUrl, channelTimeZone: h.channelTimeZone },
      current: currentOf(history),
      history,
      embargoes: embargoesOf(gear.get(h.id) ?? []),
      role,
      canPropose: canRole(role, 'slot.propose') && h.stage !== 'live',
      canDecide: canRole(role, 'slot.approve'),
    };
  }

  /**
   * Proposes a slot from a wall-clock date and time in `zone`. The current proposed or approved slot
   * is superseded; if it was approved and the episode is Scheduled, the episode goes back to Approval.
   */
  async propose(episodeId: string, actorId: string, role: Role, input: ProposeSlotInput, now = new Date()): Promise<EpisodeSchedule> {
    const local = `${input.date}T${input.time}`;
    const startsAt = zonedTimeToInstant(local, input.zone);
    // A time the clocks skip (spring forward) does not exist; say so instead of moving it silently.
    if (formatLocalDateTime(startsAt, input.zone) !== `${input.date} ${input.time}`) {
      throw new AppError('invalid_input', `${input.date} ${input.time} does not exist in ${input.zone} (the clocks go forward then): pick another time`, { field: 'time' });
    }
    if (new Date(startsAt) <= now) {
      throw new AppError('invalid_input', `${formatInstantWithZoneName(startsAt, input.zone)} is in the past: propose a future date and time`, { field: 'date' });
    }
    const result = await this.sequelize.transaction(async (transaction) => {
      const h = await this.headForMove(episodeId, transaction);
      if (h.stage === 'live') throw new AppError('invalid_input', 'The episode is already live: its publish slot can no longer change');
      const current = await PublishSlot.findOne({ where: { episodeId, status: ['proposed', 'approved'] }, transaction, lock: transaction.LOCK.UPDATE });
      let backToApproval = false;
      if (current) {
        const was = current.status;
        await current.update({ status: 'superseded' }, { transaction });
        await recordActivity(
          { channelId: h.channelId, actorId, subjectType: 'publish_slot', subjectId: current.id, episodeId, action: 'slot.superseded', fromValue: was, toValue: 'superseded' },
          transaction,
        );
        backToApproval = was === 'approved' && h.stage === 'scheduled';
      }
      const slot = await PublishSlot.create(
        { episodeId, startsAt: new Date(startsAt), zone: input.zone, status: 'proposed', proposalNote: input.comment || null, proposedById: actorId },
        { transaction },
      );
      await recordActivity(
        {
          channelId: h.channelId,
          actorId,
          subjectType: 'publish_slot',
          subjectId: slot.id,
          episodeId,
          action: 'slot.proposed',
          // Read as people entered them: wall clock and zone; the instants stay in details.
          fromValue: current ? formatInstantWithZoneName(current.startsAt, current.zone) : null,
          toValue: formatInstantWithZoneName(startsAt, input.zone),
          details: { startsAt, zone: input.zone, supersedes: current?.id ?? null, previousStartsAt: current ? new Date(current.startsAt).toISOString() : null },
        },
        transaction,
      );
      if (backToApproval) {
        await moveEpisode(h, 'approval', actorId, 'The publish slot changed after approval: it needs a new approval', transaction);
      }
      const stageNow: Stage = backToApproval ? 'approval' : h.stage;
      return { slotId: slot.id, stageNow };
    });
    // One approval request per slot put before the producers: here if proposed in Approval, else by the board move into Approval (approvalRequestOnEntry).
    if (result.stageNow === 'approval') await notifyApprovalRequested(this.mail, { slotId: result.slotId });
    return this.schedule(episodeId, role);
  }

  /** Approves a proposed slot and moves the episode to Scheduled, or refuses with every reason (422). */
  async approve(slotId: string, actorId: string, role: Role, input: ApproveSlotInput, now = new Date()): Promise<EpisodeSchedule> {
    const episodeId = await this.sequelize.transaction(async (transaction) => {
      const slot = await this.lockedSlot(slotId, transaction);
      const h = await this.headForMove(slot.episodeId, transaction);
      const gear = (await gearOfEpisodes([h.id], transaction)).get(h.id) ?? [];
      const blockers = approvalBlockers({
        role,
        stage: h.stage,
        slot: { startsAt: new Date(slot.startsAt).toISOString(), zone: slot.zone },
        embargoes: embargoesOf(gear),
        channelZone: h.channelTimeZone,
        disclosure: await disclosureOf(h, transaction),
        now,
      });
      if (blockers.length > 0) {
        throw new AppError('stage_rule_failed', `This slot cannot be approved. ${blockers.join(' ')}`, { missing: blockers });
      }
      await slot.update({ status: 'approved', decidedById: actorId, decidedAt: now, comment: input.comment || null }, { transaction });
      await recordActivity(
        { channelId: h.channelId, actorId, subjectType: 'publish_slot', subjectId: slot.id, episodeId: h.id, action: 'slot.approved', fromValue: 'proposed', toValue: 'approved', reason: input.comment || null, details: { startsAt: new Date(slot.startsAt).toISOString(), zone: slot.zone } },
        transaction,
      );
      await moveEpisode(h, 'scheduled', actorId, `Publish slot ${formatInstantWithZoneName(slot.startsAt, slot.zone)} approved`, transaction);
      return h.id;
    });
    await notifySlotDecided(this.mail, { slotId });
    return this.schedule(episodeId, role);
  }

  /** Rejects a proposed slot with the producer's comment; the episode stays where it is. */
  async reject(slotId: string, actorId: string, role: Role, input: RejectSlotInput, now = new Date()): Promise<EpisodeSchedule> {
    const episodeId = await this.sequelize.transaction(async (transaction) => {
      const slot = await this.lockedSlot(slotId, transaction);
      const h = await this.head(slot.episodeId, transaction, true);
      await slot.update({ status: 'rejected', decidedById: actorId, decidedAt: now, comment: input.comment }, { transaction });
      await recordActivity(
        { channelId: h.channelId, actorId, subjectType: 'publish_slot', subjectId: slot.id, episodeId: h.id, action: 'slot.rejected', fromValue: 'proposed', toValue: 'rejected', reason: input.comment },
        transaction,
      );
      return h.id;
    });
    await notifySlotDecided(this.mail, { slotId });
    return this.schedule(episodeId, role);
  }

  private async lockedSlot(slotId: string, transaction: Transaction) {
    const slot = await PublishSlot.findByPk(slotId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!slot) throw new AppError('not_found', 'Publish slot not found');
    if (slot.status !== 'proposed') {
      const what = { approved: 'already approved', rejected: 'already rejected', superseded: 'replaced by a newer proposal' }[slot.status as 'approved'];
      throw new AppError('conflict', `This slot was ${what}: reload the queue to see the current one`, { status: slot.status });
    }
    return slot;
  }

  /** Marks a Scheduled episode Live with its public URL, once the approved slot has come. */
  async markLive(episodeId: string, actorId: string, role: Role, input: MarkLiveInput, now = new Date()): Promise<EpisodeSchedule> {
    await this.sequelize.transaction(async (transaction) => {
      const h = await this.headForMove(episodeId, transaction);
      if (h.version !== input.version) {
        throw new AppError('stale_version', 'Someone changed this episode meanwhile: reload and try again', { currentVersion: h.version });
      }
      if (h.stage !== 'scheduled') {
        throw new AppError('stage_rule_failed', `The episode is in ${STAGE_LABELS[h.stage]}: only a Scheduled episode can go live`, { missing: [`The episode is in ${STAGE_LABELS[h.stage]}`] });
      }
      const approved = await PublishSlot.findOne({ where: { episodeId, status: 'approved' }, transaction });
      const check = checkStageMove({
        from: 'scheduled',
        to: 'live',
        role,
        facts: factsPastApproval({
          ...(approved ? { approvedSlotAt: new Date(approved.startsAt).toISOString() } : {}),
          now: now.toISOString(),
          publicUrl: input.publicUrl,
        }),
      });
      if (!check.allowed) throw new AppError('stage_rule_failed', `The episode cannot go live yet: ${check.missing.join('; ')}`, { missing: check.missing });
      await moveEpisode(h, 'live', actorId, `Published at ${input.publicUrl}`, transaction, { publicUrl: input.publicUrl });
    });
    return this.schedule(episodeId, role);
  }

  /**
   * The producer's queue: every episode in Approval with its slot in the channel's zone and the
   * viewer's, gear embargoes and due-back dates, footage counts, description warnings, and what
   * would stop approval. A fixed number of queries for any queue length.
   */
  async queue(channelId: string, role: Role, viewerZone: string | undefined, now = new Date()): Promise<ApprovalQueue> {
    const tz = await this.sequelize.query<{ time_zone: string }>('SELECT time_zone FROM channels WHERE id = :channelId', { replacements: { channelId }, type: QueryTypes.SELECT });
    const channelZone = tz[0]?.time_zone ?? 'UTC';
    const viewer = viewerZone ?? channelZone;
    const heads = await episodeHeadsInStage(channelId, 'approval');
    const ids = heads.map((h) => h.id);
    const [contexts, gear, slots, descriptions, footage, people] = await Promise.all([
      descriptionContexts(heads),
      gearOfEpisodes(ids),
      slotsOfEpisodes(ids),
      Description.findAll({ where: { episodeId: ids } }),
      footageStatus(ids),
      this.sequelize.query<{ id: string; name: string }>(
        `SELECT id, name FROM users WHERE id IN (SELECT host_id FROM episodes WHERE id IN (:ids) UNION SELECT editor_id FROM episodes WHERE id IN (:ids))`,
        { replacements: { ids: ids.length ? ids : ['00000000-0000-0000-0000-000000000000'] }, type: QueryTypes.SELECT },
      ),
    ]);
    const names = new Map(people.map((p) => [p.id, p.name]));
    const person = (id: string | null) => (id && names.has(id) ? { id, name: names.get(id)! } : null);
    const rows = new Map(descriptions.map((d) => [d.episodeId, d]));
    const items = heads.map((h) => {
      const parts = partsOf(rows.get(h.id) ?? null);
      const input = descriptionInputFrom(contexts.get(h.id)!, parts);
      const need = disclosureRequired(input);
      const disclosure = { required: need.required, reasons: need.reasons, present: resolveDisclosure(input) !== '' };
      const slot = currentOf(slots.get(h.id) ?? []);
      const episodeGear = gear.get(h.id) ?? [];
      const slotMs = slot ? Date.parse(slot.startsAt) : null;
      const blockers: string[] = [];
      if (!slot) blockers.push('No publish slot is proposed: the host or editor proposes one on the Schedule tab.');
      else if (slot.status === 'proposed') {
        blockers.push(...approvalBlockers({ role, stage: h.stage, slot, embargoes: embargoesOf(episodeGear), channelZone, disclosure, now }));
      }
      return {
        episode: { id: h.id, title: h.title, version: h.version, host: person(h.hostId), editor: person(h.editorId) },
        slot,
        slotInChannelZone: slot ? formatInstantWithZoneName(slot.startsAt, channelZone) : null,
        slotInViewerZone: slot ? formatInstantWithZoneName(slot.startsAt, viewer) : null,
        gear: episodeGear.map((g) => ({
          ...g,
          embargoText: g.embargoAt && g.embargoZone ? formatInstantWithZoneName(g.embargoAt, g.embargoZone) : null,
          embargoInChannelZone: g.embargoAt ? formatInstantWithZoneName(g.embargoAt, channelZone) : null,
          slotBeforeEmbargo: slotMs !== null && !!g.embargoAt && slotMs < Date.parse(g.embargoAt),
          // Due back at the start of that day in the channel's zone (a date has no time of its own).
          dueBackBeforeSlot: slotMs !== null && !!g.dueBackOn && Date.parse(zonedTimeToInstant(`${g.dueBackOn}T00:00`, channelZone)) < slotMs,
        })),
        footage: footage ? (footage.get(h.id) ?? null) : null,
        descriptionWarnings: composeDescription(input).warnings,
        hasDescription: hasContent(parts),
        blockers,
      };
    });
    return { channelTimeZone: channelZone, viewerTimeZone: viewer, items };
  }

  /** The slot's episode id, for routes keyed by slot. */
  async episodeOfSlot(slotId: string): Promise<string> {
    const s = await slotById(slotId);
    if (!s) throw new AppError('not_found', 'Publish slot not found');
    return s.episodeId;
  }
}
