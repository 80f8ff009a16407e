// Reads for publishing: the composer's context (episode, spec sheets, gear, channel settings),
// slots, embargoes, footage counts — and `publishingFacts`, which the board's stage moves use.
// Every function takes the caller's transaction (or none for plain reads).
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Description, Episode, PublishSlot } from '@midgray/db';
import {
  ChannelSettingsSchema,
  descriptionInputFrom,
  disclosureRequired,
  resolveDisclosure,
  type DescriptionContext,
  type DescriptionParts,
  type DescriptionTest,
  type Embargo,
  type PublishSlot as PublishSlotDto,
  type StageFacts,
} from '@midgray/shared';

/** The sequelize instance the models were registered on (one per app). */
function db(): Sequelize {
  const s = Episode.sequelize;
  if (!s) throw new Error('models are not initialised');
  return s;
}

const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : null);

/** The parts of an empty description (nothing saved yet). */
export const EMPTY_PARTS: DescriptionParts = { summary: '', chapters: [], gearLinks: [], disclosure: '' };

/** The stored parts of a description row, as the shared DTO. */
export function partsOf(d: Description | null): DescriptionParts {
  if (!d) return EMPTY_PARTS;
  return { summary: d.summary, chapters: d.chapters ?? [], gearLinks: d.gearLinks ?? [], disclosure: d.disclosure };
}

/** One gear item of an episode with its dates. */
export interface EpisodeGearRow {
  id: string;
  name: string;
  source: 'loaner' | 'rental' | 'owned' | 'purchased';
  sponsored: boolean;
  dueBackOn: string | null;
  embargoAt: string | null;
  embargoZone: string | null;
}

/** The gear of the episodes `episodeIds` (archived gear too: it was still used), keyed by episode. */
export async function gearOfEpisodes(episodeIds: string[], transaction?: Transaction): Promise<Map<string, EpisodeGearRow[]>> {
  const byEpisode = new Map<string, EpisodeGearRow[]>(episodeIds.map((id) => [id, []]));
  if (episodeIds.length === 0) return byEpisode;
  const rows = await db().query<{ episode_id: string; id: string; make: string; model: string; source: EpisodeGearRow['source']; sponsored: boolean; due_back_on: string | null; embargo_at: Date | null; embargo_zone: string | null }>(
    `SELECT eg.episode_id, g.id, g.make, g.model, g.source, g.sponsored, g.due_back_on::text AS due_back_on, g.embargo_at, g.embargo_zone
       FROM episode_gear eg JOIN gear g ON g.id = eg.gear_id
      WHERE eg.episode_id IN (:episodeIds)
      ORDER BY g.make, g.model, g.id`,
    { replacements: { episodeIds }, type: QueryTypes.SELECT, transaction },
  );
  for (const r of rows) {
    byEpisode.get(r.episode_id)?.push({
      id: r.id,
      name: `${r.make} ${r.model}`.trim(),
      source: r.source,
      sponsored: r.sponsored,
      dueBackOn: r.due_back_on,
      embargoAt: iso(r.embargo_at),
      embargoZone: r.embargo_zone,
    });
  }
  return byEpisode;
}

/** Embargoes among `gear`, in the shape the stage rules and the schedule read. */
export function embargoesOf(gear: EpisodeGearRow[]): Embargo[] {
  return gear
    .filter((g) => g.embargoAt && g.embargoZone)
    .map((g) => ({ gearId: g.id, gearName: g.name, embargoAt: g.embargoAt!, zone: g.embargoZone! }));
}

/** Spec-sheet lines of the episodes' tests, grouped per episode as the composer wants them. */
async function testsOfEpisodes(episodeIds: string[], transaction?: Transaction): Promise<Map<string, DescriptionTest[]>> {
  const byEpisode = new Map<string, DescriptionTest[]>(episodeIds.map((id) => [id, []]));
  if (episodeIds.length === 0) return byEpisode;
  const rows = await db().query<{ episode_id: string; test_id: string; name: string; test_position: number; key: string | null; label: string | null; value: string | null; in_description: boolean | null; position: number | null }>(
    `SELECT t.episode_id, t.id AS test_id, t.name, t.position AS test_position, l.key, l.label, l.value, l.in_description, l.position
       FROM tests t LEFT JOIN spec_sheet_lines l ON l.test_id = t.id
      WHERE t.episode_id IN (:episodeIds)
      ORDER BY t.position, t.id, l.position, l.id`,
    { replacements: { episodeIds }, type: QueryTypes.SELECT, transaction },
  );
  const tests = new Map<string, DescriptionTest & { episodeId: string }>();
  for (const r of rows) {
    let test = tests.get(r.test_id);
    if (!test) {
      test = { episodeId: r.episode_id, name: r.name, order: r.test_position, specLines: [] };
      tests.set(r.test_id, test);
    }
    if (r.key !== null) {
      test.specLines.push({ key: r.key, label: r.label ?? r.key, value: r.value ?? '', inDescription: !!r.in_description, order: r.position ?? 0 });
    }
  }
  for (const { episodeId, ...test } of tests.values()) byEpisode.get(episodeId)?.push(test);
  return byEpisode;
}

/** An episode with its channel, as publishing needs it. */
export interface EpisodeHead {
  id: string;
  channelId: string;
  channelName: string;
  channelTimeZone: string;
  title: string;
  stage: Episode['stage'];
  version: number;
  position: number;
  hostId: string | null;
  editorId: string | null;
  publicUrl: string | null;
  settings: ReturnType<typeof ChannelSettingsSchema.parse>;
}

type HeadRow = { id: string; channel_id: string; channel_name: string; time_zone: string; settings: unknown; title: string; stage: Episode['stage']; version: number; position: number; host_id: string | null; editor_id: string | null; public_url: string | null };

const HEAD_SELECT = `SELECT e.id, e.channel_id, c.name AS channel_name, c.time_zone, c.settings, e.title, e.stage, e.version, e.position,
            e.host_id, e.editor_id, e.public_url
       FROM episodes e JOIN channels c ON c.id = e.channel_id`;

function toHead(r: HeadRow): EpisodeHead {
  return {
    id: r.id,
    channelId: r.channel_id,
    channelName: r.channel_name,
    channelTimeZone: r.time_zone,
    title: r.title,
    stage: r.stage,
    version: r.version,
    position: r.position,
    hostId: r.host_id,
    editorId: r.editor_id,
    publicUrl: r.public_url,
    settings: ChannelSettingsSchema.parse(r.settings ?? {}),
  };
}

/** Episode and channel of `episodeId`, optionally locking the episode row; null when it does not exist. */
export async function episodeHead(episodeId: string, transaction?: Transaction, lock = false): Promise<EpisodeHead | null> {
  const rows = await db().query<HeadRow>(`${HEAD_SELECT} WHERE e.id = :episodeId ${lock ? 'FOR UPDATE OF e' : ''}`, {
    replacements: { episodeId },
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows[0] ? toHead(rows[0]) : null;
}

/** The channel's episodes (not archived) in `stage`, in board order. */
export async function episodeHeadsInStage(channelId: string, stage: Episode['stage'], transaction?: Transaction): Promise<EpisodeHead[]> {
  const rows = await db().query<HeadRow>(`${HEAD_SELECT} WHERE e.channel_id = :channelId AND e.stage = :stage AND e.archived_at IS NULL ORDER BY e.position, e.id`, {
    replacements: { channelId, stage },
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.map(toHead);
}

/** The composer's context for several episodes at once (two queries for any number of episodes). */
export async function descriptionContexts(heads: EpisodeHead[], transaction?: Transaction): Promise<Map<string, DescriptionContext>> {
  const ids = heads.map((h) => h.id);
  // Sequential: inside a transaction both queries share one connection.
  const gear = await gearOfEpisodes(ids, transaction);
  const tests = await testsOfEpisodes(ids, transaction);
  const contexts = new Map<string, DescriptionContext>();
  for (const h of heads) {
    contexts.set(h.id, {
      title: h.title,
      tests: tests.get(h.id) ?? [],
      gear: (gear.get(h.id) ?? []).map((g) => ({ name: g.name, source: g.source, sponsored: g.sponsored })),
      signOff: h.settings.signOff,
      settings: {
        descriptionMaxChars: h.settings.descriptionMaxChars,
        titleMaxChars: h.settings.titleMaxChars,
        trackingParams: h.settings.trackingParams,
        defaultDisclosure: h.settings.defaultDisclosure,
      },
    });
  }
  return contexts;
}

/** The composer's context of one episode. */
export async function descriptionContext(head: EpisodeHead, transaction?: Transaction): Promise<DescriptionContext> {
  return (await descriptionContexts([head], transaction)).get(head.id)!;
}

/** True when the parts hold anything a person wrote. */
export function hasContent(parts: DescriptionParts): boolean {
  return parts.summary.trim() !== '' || parts.chapters.length > 0 || parts.gearLinks.length > 0 || parts.disclosure.trim() !== '';
}

type SlotRow = {
  id: string;
  episode_id: string;
  starts_at: Date;
  zone: string;
  status: PublishSlotDto['status'];
  proposal_note: string | null;
  proposed_by_id: string | null;
  proposed_by_name: string | null;
  decided_by_id: string | null;
  decided_by_name: string | null;
  decided_at: Date | null;
  comment: string | null;
  created_at: Date;
};

function toSlotDto(r: SlotRow): PublishSlotDto {
  return {
    id: r.id,
    episodeId: r.episode_id,
    startsAt: iso(r.starts_at)!,
    zone: r.zone,
    status: r.status,
    proposedBy: r.proposed_by_id ? { id: r.proposed_by_id, name: r.proposed_by_name ?? 'Unknown' } : null,
    proposedAt: iso(r.created_at)!,
    proposalNote: r.proposal_note,
    decidedBy: r.decided_by_id ? { id: r.decided_by_id, name: r.decided_by_name ?? 'Unknown' } : null,
    decidedAt: iso(r.decided_at),
    comment: r.comment,
  };
}

const SLOT_SELECT = `SELECT s.id, s.episode_id, s.starts_at, s.zone, s.status, s.proposal_note, s.proposed_by_id, pu.name AS proposed_by_name,
         s.decided_by_id, du.name AS decided_by_name, s.decided_at, s.comment, s.created_at
    FROM publish_slots s
    LEFT JOIN users pu ON pu.id = s.proposed_by_id
    LEFT JOIN users du ON du.id = s.decided_by_id`;

/** Every slot of the episodes, newest first, keyed by episode. */
export async function slotsOfEpisodes(episodeIds: string[], transaction?: Transaction): Promise<Map<string, PublishSlotDto[]>> {
  const byEpisode = new Map<string, PublishSlotDto[]>(episodeIds.map((id) => [id, []]));
  if (episodeIds.length === 0) return byEpisode;
  const rows = await db().query<SlotRow>(`${SLOT_SELECT} WHERE s.episode_id IN (:episodeIds) ORDER BY s.created_at DESC, s.id`, {
    replacements: { episodeIds },
    type: QueryTypes.SELECT,
    transaction,
  });
  for (const r of rows) byEpisode.get(r.episode_id)?.push(toSlotDto(r));
  return byEpisode;
}

/** One slot by id as the DTO, or null. */
export async function slotById(slotId: string, transaction?: Transaction): Promise<PublishSlotDto | null> {
  const rows = await db().query<SlotRow>(`${SLOT_SELECT} WHERE s.id = :slotId`, { replacements: { slotId }, type: QueryTypes.SELECT, transaction });
  return rows[0] ? toSlotDto(rows[0]) : null;
}

/**
 * The proposed slot an episode, still in Approval, took there with its latest move into Approval:
 * null when its proposed slot came after that move (the proposal itself asked for approval) or
 * there is none. Moves and proposals append their activity lines under the board lock, so the log's
 * ids give their order; a slot without a proposal line (seeded data) counts as older than any move.
 */
export async function slotTakenIntoApproval(episodeId: string): Promise<string | null> {
  const rows = await db().query<{ id: string }>(
    `SELECT s.id FROM publish_slots s JOIN episodes e ON e.id = s.episode_id
      WHERE s.episode_id = :episodeId AND s.status = 'proposed' AND e.stage = 'approval' AND e.archived_at IS NULL
        AND COALESCE((SELECT max(a.id) FROM activities a WHERE a.episode_id = s.episode_id AND a.action = 'slot.proposed' AND a.subject_id = s.id::text), 0)
          < (SELECT max(a.id) FROM activities a WHERE a.episode_id = s.episode_id AND a.action = 'episode.moved' AND a.to_value = 'approval')
      LIMIT 1`,
    { replacements: { episodeId }, type: QueryTypes.SELECT },
  );
  return rows[0]?.id ?? null;
}

/** The live slot of an episode: the one proposed or approved (at most one, by a unique index). */
export function currentOf(slots: PublishSlotDto[]): PublishSlotDto | null {
  return slots.find((s) => s.status === 'proposed' || s.status === 'approved') ?? null;
}

/**
 * Footage counts per state for each episode, or null when the footage table is not installed (it
 * belongs to the footage feature; we read only its episode and state columns, whichever of
 * `state` / `status` it names the state by).
 */
export async function footageStatus(episodeIds: string[], transaction?: Transaction) {
  const columns = await db().query<{ column_name: string }>(
    `SELECT column_name FROM information_schema.columns
      WHERE table_schema = current_schema() AND table_name = 'footage' AND column_name IN ('episode_id', 'state', 'status')`,
    { type: QueryTypes.SELECT, transaction },
  );
  const names = new Set(columns.map((c) => c.column_name));
  const stateColumn = names.has('state') ? 'state' : names.has('status') ? 'status' : null;
  if (!names.has('episode_id') || !stateColumn) return null;
  const byEpisode = new Map<string, { total: number; receiving: number; received: number; verified: number; flagged: number }>();
  for (const id of episodeIds) byEpisode.set(id, { total: 0, receiving: 0, received: 0, verified: 0, flagged: 0 });
  if (episodeIds.length === 0) return byEpisode;
  const rows = await db().query<{ episode_id: string; state: string; n: string }>(
    `SELECT episode_id, ${stateColumn}::text AS state, count(*)::text AS n FROM footage WHERE episode_id IN (:episodeIds) GROUP BY 1, 2`,
    { replacements: { episodeIds }, type: QueryTypes.SELECT, transaction },
  );
  for (const r of rows) {
    const counts = byEpisode.get(r.episode_id);
    if (!counts) continue;
    const n = Number(r.n);
    counts.total += n;
    if (r.state === 'receiving' || r.state === 'received' || r.state === 'verified' || r.state === 'flagged') counts[r.state] += n;
  }
  return byEpisode;
}

/** What the stage rules need from publishing (see shared/src/stages.ts `StageFacts`). */
export type PublishingFacts = Pick<StageFacts, 'hasDescriptionDraft' | 'hasProposedSlot' | 'approvedSlotAt' | 'embargoes' | 'disclosureRequired' | 'disclosurePresent' | 'publicUrl'>;

/**
 * The publishing facts of an episode for `checkStageMove`, read inside the caller's transaction:
 * whether a description draft exists, whether a slot is proposed (or approved), the approved slot's
 * instant, the gear embargoes, and whether a disclosure is required and present (the episode's own
 * text, or the channel default, as the composer resolves it). Throws when the episode does not exist.
 */
export async function publishingFacts(episodeId: string, transaction: Transaction): Promise<PublishingFacts> {
  const head = await episodeHead(episodeId, transaction);
  if (!head) throw new Error(`episode ${episodeId} not found`);
  // One query after the other: they share the transaction's connection.
  const description = await Description.findByPk(episodeId, { transaction });
  const slots = await PublishSlot.findAll({ where: { episodeId, status: ['proposed', 'approved'] }, transaction });
  const gear = (await gearOfEpisodes([episodeId], transaction)).get(episodeId) ?? [];
  const context = await descriptionContext(head, transaction);
  const parts = partsOf(description);
  const input = descriptionInputFrom(context, parts);
  const need = disclosureRequired(input);
  const approved = slots.find((s) => s.status === 'approved');
  return {
    hasDescriptionDraft: hasContent(parts),
    hasProposedSlot: slots.length > 0,
    ...(approved ? { approvedSlotAt: new Date(approved.startsAt).toISOString() } : {}),
    embargoes: embargoesOf(gear).map(({ gearName, embargoAt, zone }) => ({ gearName, embargoAt, zone })),
    disclosureRequired: need.required,
    disclosurePresent: resolveDisclosure(input) !== '',
    ...(head.publicUrl ? { publicUrl: head.publicUrl } : {}),
  };
}

/** Position after the last card of `stage` in the channel's board column. */
export async function endOfColumn(channelId: string, stage: Episode['stage'], transaction: Transaction, exceptEpisodeId?: string): Promise<number> {
  const rows = await db().query<{ next: number }>(
    `SELECT COALESCE(max(position) + 1, 0)::int AS next FROM episodes
      WHERE channel_id = :channelId AND stage = :stage AND archived_at IS NULL AND id <> :except`,
    { replacements: { channelId, stage, except: exceptEpisodeId ?? '00000000-0000-0000-0000-000000000000' }, type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.next ?? 0;
}
