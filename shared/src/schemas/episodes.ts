// Episodes and the board (issue #3): request bodies, the board payload, the episode page.
import { z } from 'zod';
import { STAGES } from '../stages.ts';
import { mondayOfIsoWeek, parseIsoWeek } from '../weeks.ts';
import { DateOnlySchema, RoleSchema, UuidSchema } from './common.ts';
import { GearKindSchema, GearSchema, GearSourceSchema } from './gear.ts';

export const StageSchema = z.enum(STAGES, { message: `Use a stage: ${STAGES.join(', ')}` });

export const EPISODE_TITLE_MAX = 200;
export const EPISODE_GEAR_MAX = 30;
export const MOVE_REASON_MAX = 500;
/** The largest `toIndex` of a move; any index past a column's end means "last", so this one always does. */
export const MOVE_INDEX_END = 100_000;

export const EpisodeTitleSchema = z.string().trim().min(1, 'Give the episode a title').max(EPISODE_TITLE_MAX, `Keep the title under ${EPISODE_TITLE_MAX} characters`);

/**
 * A target publish week: an ISO week ("2026-W19") or any date in it ("2026-05-06"), stored as the
 * week's Monday ("2026-05-04").
 */
export const PublishWeekSchema = z
  .string()
  .trim()
  .refine((s) => parseIsoWeek(s) !== null || DateOnlySchema.safeParse(s).success, { message: 'Use a week like 2026-W19 or any date in it, like 2026-05-06' })
  .transform((s) => mondayOfIsoWeek(s));

const GearIdsSchema = z
  .array(UuidSchema)
  .max(EPISODE_GEAR_MAX, `At most ${EPISODE_GEAR_MAX} gear items per episode`)
  .transform((ids) => [...new Set(ids)]);

/** Creating an episode from the board: it lands at the end of the Plan column. */
export const CreateEpisodeInputSchema = z.strictObject({
  title: EpisodeTitleSchema,
  gearIds: GearIdsSchema.default([]),
  hostId: UuidSchema.nullable().default(null),
  editorId: UuidSchema.nullable().default(null),
  targetPublishWeek: PublishWeekSchema.nullable().default(null),
  shootDate: DateOnlySchema.nullable().default(null),
});
export type CreateEpisodeInput = z.input<typeof CreateEpisodeInputSchema>;

/** Editing an episode: any subset of fields plus the `version` it was read at (stale → 409). */
export const UpdateEpisodeInputSchema = z.strictObject({
  version: z.number().int().min(1),
  title: EpisodeTitleSchema.optional(),
  gearIds: GearIdsSchema.optional(),
  hostId: UuidSchema.nullable().optional(),
  editorId: UuidSchema.nullable().optional(),
  targetPublishWeek: PublishWeekSchema.nullable().optional(),
  shootDate: DateOnlySchema.nullable().optional(),
  /** Where the video is out; needed before Scheduled → Live. Producers and admins only. */
  publicUrl: z
    .string()
    .trim()
    .max(2048)
    .regex(/^https?:\/\/\S+$/i, 'Enter the full web address of the published video, starting with https://')
    .nullable()
    .optional(),
});
export type UpdateEpisodeInput = z.input<typeof UpdateEpisodeInputSchema>;

/**
 * Moving a card: to a stage and an index in that column (0 = top; past the end = last), with the
 * episode's `version` as the mover saw it, and a reason when it goes back a stage.
 */
export const MoveEpisodeInputSchema = z.strictObject({
  toStage: StageSchema,
  toIndex: z.number().int().min(0, 'The index in the column starts at 0').max(MOVE_INDEX_END, `Use ${MOVE_INDEX_END} or less (anything past the end of the column means last)`),
  version: z.number().int().min(1),
  reason: z.string().trim().max(MOVE_REASON_MAX, `Keep the reason under ${MOVE_REASON_MAX} characters`).optional(),
});
export type MoveEpisodeInput = z.input<typeof MoveEpisodeInputSchema>;

/** Archiving or restoring: the `version` the person saw. */
export const ArchiveEpisodeInputSchema = z.strictObject({ version: z.number().int().min(1) });
export type ArchiveEpisodeInput = z.infer<typeof ArchiveEpisodeInputSchema>;

// ---------------------------------------------------------------------------------------------------
// The episode form (create and edit): what a person types, '' for empty, turned into the API input.

const isWeekInput = (s: string) => parseIsoWeek(s) !== null || DateOnlySchema.safeParse(s).success;

export const EpisodeFormSchema = z.object({
  title: EpisodeTitleSchema,
  gearIds: z.array(UuidSchema).max(EPISODE_GEAR_MAX, `At most ${EPISODE_GEAR_MAX} gear items per episode`),
  hostId: z.union([z.literal(''), UuidSchema]),
  editorId: z.union([z.literal(''), UuidSchema]),
  targetPublishWeek: z.string().trim().refine((s) => s === '' || isWeekInput(s), { message: 'Use a week like 2026-W19 or any date in it' }),
  shootDate: z.union([z.literal(''), DateOnlySchema]),
});
export type EpisodeForm = z.input<typeof EpisodeFormSchema>;

export const EMPTY_EPISODE_FORM: EpisodeForm = { title: '', gearIds: [], hostId: '', editorId: '', targetPublishWeek: '', shootDate: '' };

/** The create/edit body for validated form values ('' → null; the week → its Monday). */
export function episodeFormToInput(f: EpisodeForm) {
  return {
    title: f.title.trim(),
    gearIds: f.gearIds,
    hostId: f.hostId === '' ? null : f.hostId,
    editorId: f.editorId === '' ? null : f.editorId,
    targetPublishWeek: f.targetPublishWeek.trim() === '' ? null : mondayOfIsoWeek(f.targetPublishWeek.trim()),
    shootDate: f.shootDate === '' ? null : f.shootDate,
  };
}

// ---------------------------------------------------------------------------------------------------
// Board query: filters and how many cards of each column to send

/** Cards of a column sent at first; "Show more" asks for this many more. */
export const BOARD_COLUMN_PAGE = 20;
/** The most cards of one column a single board request sends. */
export const BOARD_COLUMN_MAX = 1000;
export const BOARD_SEARCH_MAX = 200;
/** Search words beyond this many are ignored (each one must appear in the title). */
export const BOARD_SEARCH_WORDS_MAX = 8;

const ColumnLimitSchema = z.coerce
  .number({ error: 'A column limit must be a number of cards' })
  .int('A column limit must be a whole number of cards')
  .min(1, 'A column limit must be at least 1 card')
  .max(BOARD_COLUMN_MAX, `A column sends at most ${BOARD_COLUMN_MAX} cards at a time`);

const SHOW_ITEM = new RegExp(`^(${STAGES.join('|')}):(\\d{1,4})$`);

/**
 * GET /api/channels/:channelId/board?q=&gearId=&personId=&mine=true&limit=20&show=grade:40,live:60
 * `q`: words that must all appear in the title (any case); `gearId`/`personId`: cards naming that
 * gear / with that host or editor; `mine`: the caller is host or editor; `limit`: cards per column
 * (default BOARD_COLUMN_PAGE); `show`: a larger count for named columns ("Show more").
 */
export const BoardQuerySchema = z.strictObject({
  q: z
    .string({ error: 'Send the search once, as text' })
    .max(BOARD_SEARCH_MAX, `Keep the search under ${BOARD_SEARCH_MAX} characters`)
    .optional()
    .transform((v) => (v ?? '').trim().split(/\s+/).filter(Boolean).slice(0, BOARD_SEARCH_WORDS_MAX).join(' ')),
  gearId: UuidSchema.optional(),
  personId: UuidSchema.optional(),
  mine: z.enum(['true', 'false'], { message: 'Use mine=true or mine=false' }).optional().transform((v) => v === 'true'),
  limit: ColumnLimitSchema.optional().transform((v) => v ?? BOARD_COLUMN_PAGE),
  show: z
    .string({ error: 'Send show once, e.g. show=grade:40,live:60' })
    .max(200)
    .optional()
    .transform((v, ctx) => {
      const out: Partial<Record<(typeof STAGES)[number], number>> = {};
      for (const item of (v ?? '').split(',').filter(Boolean)) {
        const m = SHOW_ITEM.exec(item.trim());
        const n = m ? Number(m[2]) : NaN;
        if (!m || n < 1 || n > BOARD_COLUMN_MAX) {
          ctx.addIssue({ code: 'custom', message: `Use show=stage:count with a stage (${STAGES.join(', ')}) and 1–${BOARD_COLUMN_MAX} cards, e.g. show=grade:40; “${item}” is not that` });
          return z.NEVER;
        }
        out[m[1] as (typeof STAGES)[number]] = n;
      }
      return out;
    }),
});
export type BoardQuery = z.output<typeof BoardQuerySchema>;
export type BoardQueryInput = Partial<Pick<BoardQuery, 'q' | 'gearId' | 'personId' | 'mine' | 'limit' | 'show'>>;

/** The query string of a board request ('' when everything is default), in one canonical order. */
export function boardSearchParams(query: BoardQueryInput): string {
  const p = new URLSearchParams();
  const q = (query.q ?? '').trim();
  if (q) p.set('q', q);
  if (query.gearId) p.set('gearId', query.gearId);
  if (query.personId) p.set('personId', query.personId);
  if (query.mine) p.set('mine', 'true');
  if (query.limit && query.limit !== BOARD_COLUMN_PAGE) p.set('limit', String(query.limit));
  const show = STAGES.filter((s) => query.show?.[s]).map((s) => `${s}:${query.show![s]}`);
  if (show.length) p.set('show', show.join(','));
  const text = p.toString();
  return text ? `?${text}` : '';
}

// ---------------------------------------------------------------------------------------------------
// Responses

/** A publish slot as the board and the episode page need it (issue #7 owns slots). */
export const BoardSlotSchema = z.object({ startsAt: z.string(), zone: z.string(), status: z.enum(['proposed', 'approved']) });
export type BoardSlot = z.infer<typeof BoardSlotSchema>;

/** One card of the board. Counts are null when the feature that owns them is not installed. */
export const BoardCardSchema = z.object({
  id: UuidSchema,
  title: z.string(),
  stage: StageSchema,
  position: z.number().int(),
  version: z.number().int(),
  hostId: UuidSchema.nullable(),
  editorId: UuidSchema.nullable(),
  gearIds: z.array(UuidSchema),
  shootDate: z.string().nullable(),
  targetPublishWeek: z.string().nullable(),
  footageCount: z.number().int().nullable(),
  openSpecLines: z.number().int().nullable(),
  slots: z.array(BoardSlotSchema),
});
export type BoardCard = z.infer<typeof BoardCardSchema>;

/** Gear as the board needs it (names, dates for flags). */
export const BoardGearSchema = z.object({
  id: UuidSchema,
  kind: GearKindSchema,
  name: z.string(),
  source: GearSourceSchema,
  /** Archived gear still named by a card; pickers leave it out. */
  archived: z.boolean(),
  dueBackOn: z.string().nullable(),
  embargoAt: z.string().nullable(),
  embargoZone: z.string().nullable(),
});
export type BoardGear = z.infer<typeof BoardGearSchema>;

/** A member as the board needs it (initials, filters, pickers). */
export const BoardPersonSchema = z.object({ userId: UuidSchema, name: z.string(), role: RoleSchema });
export type BoardPerson = z.infer<typeof BoardPersonSchema>;

/** How many episodes a column holds, and how many of them pass the board's filters. */
export const BoardColumnCountSchema = z.object({ total: z.number().int(), matching: z.number().int() });
export type BoardColumnCount = z.infer<typeof BoardColumnCountSchema>;

/**
 * GET /api/channels/:channelId/board: the first cards of each column that pass the filters
 * (ordered by stage, then position; positions are places in the whole column), every column's
 * counts, the channel's gear and people.
 */
export const BoardSchema = z.object({
  channelId: UuidSchema,
  timeZone: z.string(),
  /** Server time the board was read at (ISO instant). */
  readAt: z.string(),
  episodes: z.array(BoardCardSchema),
  columns: z.record(StageSchema, BoardColumnCountSchema),
  gear: z.array(BoardGearSchema),
  people: z.array(BoardPersonSchema),
});
export type Board = z.infer<typeof BoardSchema>;

/** One line of an episode's activity: who, when, what, from → to, why. */
export const ActivityEntrySchema = z.object({
  id: z.string(),
  action: z.string(),
  actorName: z.string().nullable(),
  createdAt: z.string(),
  fromValue: z.string().nullable(),
  toValue: z.string().nullable(),
  reason: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
});
export type ActivityEntry = z.infer<typeof ActivityEntrySchema>;

const PersonSchema = z.object({ id: UuidSchema, name: z.string() });

/** GET /api/episodes/:id: the header, the gear, the people and the activity list. */
export const EpisodeDetailSchema = z.object({
  id: UuidSchema,
  channelId: UuidSchema,
  title: z.string(),
  stage: StageSchema,
  position: z.number().int(),
  version: z.number().int(),
  host: PersonSchema.nullable(),
  editor: PersonSchema.nullable(),
  gear: z.array(GearSchema),
  targetPublishWeek: z.string().nullable(),
  shootDate: z.string().nullable(),
  publicUrl: z.string().nullable(),
  archivedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  slots: z.array(BoardSlotSchema),
  footageCount: z.number().int().nullable(),
  openSpecLines: z.number().int().nullable(),
  activity: z.array(ActivityEntrySchema),
});
export type EpisodeDetail = z.infer<typeof EpisodeDetailSchema>;

/** An archived episode in the archive list. */
export const ArchivedEpisodeSchema = z.object({
  id: UuidSchema,
  title: z.string(),
  stage: StageSchema,
  version: z.number().int(),
  archivedAt: z.string(),
  archivedBy: z.string().nullable(),
  hostName: z.string().nullable(),
  editorName: z.string().nullable(),
});
export type ArchivedEpisode = z.infer<typeof ArchivedEpisodeSchema>;

/** What a successful move answers: the moved card's new place and version. */
export const MoveResultSchema = z.object({ id: UuidSchema, stage: StageSchema, position: z.number().int(), version: z.number().int() });
export type MoveResult = z.infer<typeof MoveResultSchema>;
