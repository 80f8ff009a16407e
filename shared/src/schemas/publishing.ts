// Publishing (issue #7): the episode description as stored and edited, publish slots and their
// approval, the approval queue, calendar events, and each user's e-mail and calendar-feed settings.
import { z } from 'zod';
import { RoleSchema, UuidSchema, DateOnlySchema, TimeZoneSchema } from './common.ts';
import {
  ChaptersSchema,
  ComposedDescriptionSchema,
  DescriptionGearLinkSchema,
  DescriptionGearSchema,
  DescriptionSettingsSchema,
  DescriptionTestSchema,
  DescriptionWarningSchema,
  DESCRIPTION_DISCLOSURE_MAX,
  DESCRIPTION_SUMMARY_MAX,
  DESCRIPTION_TITLE_FIELD_MAX,
  DESCRIPTION_SIGN_OFF_MAX,
  GEAR_LINKS_MAX,
  PastedChaptersSchema,
  type DescriptionInput,
} from './description.ts';

// ---------------------------------------------------------------------------------------------------
// E-mail kinds (each can be switched off on the profile)

/** Every kind of e-mail Midgray sends; a user can opt out of each one. */
export const MAIL_KINDS = ['approval_requested', 'slot_decided', 'footage_ready', 'gear_due_back', 'invitation'] as const;
export const MailKindSchema = z.enum(MAIL_KINDS, { message: `Unknown e-mail kind: use one of ${MAIL_KINDS.join(', ')}` });
export type MailKind = z.infer<typeof MailKindSchema>;

/** How the profile page names each kind, and who gets it. */
export const MAIL_KIND_TEXT: Record<MailKind, { label: string; who: string }> = {
  approval_requested: { label: 'Publish date waiting for approval', who: 'Producers, when an episode in Approval has a proposed publish slot' },
  slot_decided: { label: 'Publish slot approved or rejected', who: 'The host and editor of the episode, with the producer’s comment' },
  footage_ready: { label: 'Footage ready for pickup', who: 'Editors, when footage of an episode has been verified' },
  gear_due_back: { label: 'Gear due back in 3 days', who: 'Producers, once per item and due date' },
  invitation: { label: 'Invitations to channels', who: 'Anyone an admin invites; switch off to get no more invitations' },
};

// ---------------------------------------------------------------------------------------------------
// Description

/** The parts of a description the team edits; everything else comes from the episode and channel. */
export const DescriptionPartsSchema = z.strictObject({
  summary: z.string().max(DESCRIPTION_SUMMARY_MAX),
  chapters: ChaptersSchema,
  gearLinks: z.array(DescriptionGearLinkSchema).max(GEAR_LINKS_MAX, `At most ${GEAR_LINKS_MAX} links`),
  /** The episode's own disclosure; blank = the channel default when one is required. */
  disclosure: z.string().max(DESCRIPTION_DISCLOSURE_MAX),
});
export type DescriptionParts = z.infer<typeof DescriptionPartsSchema>;

/** Saving the parts: `version` is the one the editor started from (0 when there was none yet). */
export const SaveDescriptionInputSchema = DescriptionPartsSchema.extend({ version: z.number().int().min(0) });
export type SaveDescriptionInput = z.infer<typeof SaveDescriptionInputSchema>;

/** What the composer needs besides the parts: read from the episode, its tests, gear and channel. */
export const DescriptionContextSchema = z.object({
  title: z.string().max(DESCRIPTION_TITLE_FIELD_MAX),
  tests: z.array(DescriptionTestSchema),
  gear: z.array(DescriptionGearSchema),
  signOff: z.string().max(DESCRIPTION_SIGN_OFF_MAX),
  durationSeconds: z.number().int().positive().optional(),
  settings: DescriptionSettingsSchema,
});
export type DescriptionContext = z.infer<typeof DescriptionContextSchema>;

/** The composer's input from the stored context and the edited parts — the same on web and api. */
export function descriptionInputFrom(context: DescriptionContext, parts: DescriptionParts): DescriptionInput {
  return {
    title: context.title,
    summary: parts.summary,
    tests: context.tests,
    chapters: parts.chapters,
    gearLinks: parts.gearLinks,
    gear: context.gear,
    disclosure: parts.disclosure,
    signOff: context.signOff,
    ...(context.durationSeconds !== undefined ? { durationSeconds: context.durationSeconds } : {}),
    settings: context.settings,
  };
}

const PersonRefSchema = z.object({ id: UuidSchema, name: z.string() });
export type PersonRef = z.infer<typeof PersonRefSchema>;

/** An episode's description as the Description tab loads it. */
export const EpisodeDescriptionSchema = z.object({
  episodeId: UuidSchema,
  /** 0 while nothing has been saved yet. */
  version: z.number().int(),
  parts: DescriptionPartsSchema,
  context: DescriptionContextSchema,
  composed: ComposedDescriptionSchema,
  disclosure: z.object({ required: z.boolean(), reasons: z.array(z.string()), present: z.boolean() }),
  updatedAt: z.string().nullable(),
  updatedBy: PersonRefSchema.nullable(),
  canEdit: z.boolean(),
});
export type EpisodeDescription = z.infer<typeof EpisodeDescriptionSchema>;

/** One saved version of a description: who, when, what changed, and the full snapshot. */
export const DescriptionVersionSchema = z.object({
  id: UuidSchema,
  version: z.number().int(),
  author: PersonRefSchema.nullable(),
  createdAt: z.string(),
  /** Names of the parts that differ from the previous version. */
  changed: z.array(z.enum(['summary', 'chapters', 'gearLinks', 'disclosure'])),
  /** The version this one restored, when it was a restore. */
  restoredFrom: z.number().int().nullable(),
  snapshot: DescriptionPartsSchema,
  characters: z.number().int(),
});
export type DescriptionVersion = z.infer<typeof DescriptionVersionSchema>;

export const DescriptionVersionParamsSchema = z.strictObject({ id: UuidSchema, versionId: UuidSchema });
/** Restoring an old version: `version` is the current version the editor sees (stale → 409). */
export const RestoreDescriptionInputSchema = z.strictObject({ version: z.number().int().min(1) });
export type RestoreDescriptionInput = z.infer<typeof RestoreDescriptionInputSchema>;

export const ParseChaptersInputSchema = z.strictObject({ text: PastedChaptersSchema });
export const ParsedChaptersSchema = z.object({
  chapters: ChaptersSchema,
  errors: z.array(z.object({ line: z.number().int(), text: z.string(), message: z.string() })),
});
export type ParsedChapters = z.infer<typeof ParsedChaptersSchema>;

// ---------------------------------------------------------------------------------------------------
// Publish slots

export const SLOT_STATUSES = ['proposed', 'approved', 'rejected', 'superseded'] as const;
export const SlotStatusSchema = z.enum(SLOT_STATUSES);
export type SlotStatus = z.infer<typeof SlotStatusSchema>;

/** "14:30" on a 24-hour clock. */
export const WallTimeSchema = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a time like 14:30 (24-hour clock)');

/** Proposing a publish slot: the wall-clock date and time in the zone the person means. */
export const ProposeSlotInputSchema = z.strictObject({
  date: DateOnlySchema,
  time: WallTimeSchema,
  zone: TimeZoneSchema,
  /** Optional note for the producer. */
  comment: z.string().trim().max(2000).optional(),
});
export type ProposeSlotInput = z.infer<typeof ProposeSlotInputSchema>;

export const SLOT_COMMENT_MAX = 2000;
export const ApproveSlotInputSchema = z.strictObject({ comment: z.string().trim().max(SLOT_COMMENT_MAX).optional() });
export type ApproveSlotInput = z.infer<typeof ApproveSlotInputSchema>;
export const RejectSlotInputSchema = z.strictObject({
  comment: z.string().trim().min(1, 'Say why the slot is rejected, so the host and editor can propose a better one').max(SLOT_COMMENT_MAX),
});
export type RejectSlotInput = z.infer<typeof RejectSlotInputSchema>;

/** Marking a scheduled episode live: the address where the video is out. */
export const MarkLiveInputSchema = z.strictObject({
  publicUrl: z
    .string()
    .trim()
    .max(2048)
    .regex(/^https?:\/\/\S+$/i, 'Enter the full web address of the published video, starting with https://'),
  version: z.number().int().min(1),
});
export type MarkLiveInput = z.infer<typeof MarkLiveInputSchema>;

export const PublishSlotSchema = z.object({
  id: UuidSchema,
  episodeId: UuidSchema,
  /** The instant (ISO, UTC). */
  startsAt: z.string(),
  /** The IANA zone the slot was proposed in. */
  zone: z.string(),
  status: SlotStatusSchema,
  proposedBy: PersonRefSchema.nullable(),
  proposedAt: z.string(),
  proposalNote: z.string().nullable(),
  decidedBy: PersonRefSchema.nullable(),
  decidedAt: z.string().nullable(),
  comment: z.string().nullable(),
});
export type PublishSlot = z.infer<typeof PublishSlotSchema>;

/** A gear embargo as the schedule shows it: instant and the zone it was announced in. */
export const EmbargoSchema = z.object({ gearId: UuidSchema, gearName: z.string(), embargoAt: z.string(), zone: z.string() });
export type Embargo = z.infer<typeof EmbargoSchema>;

export const STAGE_VALUES = ['plan', 'shoot', 'grade', 'approval', 'scheduled', 'live'] as const;

/** The Schedule tab: the episode's current slot, its history and what approval will check. */
export const EpisodeScheduleSchema = z.object({
  episode: z.object({
    id: UuidSchema,
    title: z.string(),
    stage: z.enum(STAGE_VALUES),
    version: z.number().int(),
    publicUrl: z.string().nullable(),
    channelTimeZone: z.string(),
  }),
  current: PublishSlotSchema.nullable(),
  history: z.array(PublishSlotSchema),
  embargoes: z.array(EmbargoSchema),
  role: RoleSchema,
  canPropose: z.boolean(),
  canDecide: z.boolean(),
});
export type EpisodeSchedule = z.infer<typeof EpisodeScheduleSchema>;

// ---------------------------------------------------------------------------------------------------
// Approval queue

export const ApprovalsQuerySchema = z.strictObject({ zone: TimeZoneSchema.optional() });

export const QueueGearSchema = z.object({
  id: UuidSchema,
  name: z.string(),
  source: z.enum(['loaner', 'rental', 'owned', 'purchased']),
  sponsored: z.boolean(),
  dueBackOn: z.string().nullable(),
  embargoAt: z.string().nullable(),
  embargoZone: z.string().nullable(),
  /** Embargo in its own zone and in the channel's, e.g. "2026-05-02 09:00 America/Los_Angeles". */
  embargoText: z.string().nullable(),
  embargoInChannelZone: z.string().nullable(),
  /** True when the proposed slot is before this embargo lifts (approval will be refused). */
  slotBeforeEmbargo: z.boolean(),
  /** True when the gear must go back before the slot (only a warning). */
  dueBackBeforeSlot: z.boolean(),
});
export type QueueGear = z.infer<typeof QueueGearSchema>;

/** Footage counts by state, or null when the footage feature is not installed. */
export const FootageStatusSchema = z
  .object({ total: z.number().int(), receiving: z.number().int(), received: z.number().int(), verified: z.number().int(), flagged: z.number().int() })
  .nullable();

export const ApprovalQueueItemSchema = z.object({
  episode: z.object({ id: UuidSchema, title: z.string(), version: z.number().int(), host: PersonRefSchema.nullable(), editor: PersonRefSchema.nullable() }),
  slot: PublishSlotSchema.nullable(),
  slotInChannelZone: z.string().nullable(),
  slotInViewerZone: z.string().nullable(),
  gear: z.array(QueueGearSchema),
  footage: FootageStatusSchema,
  descriptionWarnings: z.array(DescriptionWarningSchema),
  hasDescription: z.boolean(),
  /** Why the API would refuse approval right now, one sentence each; empty when it can be approved. */
  blockers: z.array(z.string()),
});
export type ApprovalQueueItem = z.infer<typeof ApprovalQueueItemSchema>;

export const ApprovalQueueSchema = z.object({
  channelTimeZone: z.string(),
  viewerTimeZone: z.string(),
  items: z.array(ApprovalQueueItemSchema),
});
export type ApprovalQueue = z.infer<typeof ApprovalQueueSchema>;

// ---------------------------------------------------------------------------------------------------
// Calendar

export const CALENDAR_EVENT_KINDS = ['slot_proposed', 'slot_approved', 'embargo_lift', 'gear_due_back', 'shoot_day'] as const;
export const CalendarEventKindSchema = z.enum(CALENDAR_EVENT_KINDS);
export type CalendarEventKind = z.infer<typeof CalendarEventKindSchema>;

/** Words (never colour alone) that tell the kinds apart, on the page and in the feed. */
export const CALENDAR_EVENT_LABELS: Record<CalendarEventKind, string> = {
  slot_proposed: 'Proposed publish slot',
  slot_approved: 'Approved publish slot',
  embargo_lift: 'Embargo lifts',
  gear_due_back: 'Gear due back',
  shoot_day: 'Shoot day',
};

/** One calendar entry: either an instant (`at`, with the zone it was entered in) or a whole day (`date`). */
export const CalendarEventSchema = z.object({
  /** Stable across requests: the feed uses it as the event's UID. */
  id: z.string(),
  kind: CalendarEventKindSchema,
  title: z.string(),
  channelId: UuidSchema,
  channelName: z.string(),
  episodeId: UuidSchema.nullable(),
  gearId: UuidSchema.nullable(),
  at: z.string().nullable(),
  zone: z.string().nullable(),
  date: z.string().nullable(),
});
export type CalendarEvent = z.infer<typeof CalendarEventSchema>;

/** Up to 400 days at once (a month view with its neighbours, or the agenda). */
export const CALENDAR_RANGE_MAX_DAYS = 400;
export const CalendarQuerySchema = z
  .strictObject({ from: DateOnlySchema, to: DateOnlySchema })
  .refine((q) => q.from <= q.to, { message: '"from" must not be after "to"', path: ['from'] })
  .refine((q) => (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 <= CALENDAR_RANGE_MAX_DAYS, {
    message: `Ask for at most ${CALENDAR_RANGE_MAX_DAYS} days at once`,
    path: ['to'],
  });
export type CalendarQuery = z.infer<typeof CalendarQuerySchema>;

export const CalendarFeedParamsSchema = z.strictObject({ token: z.string().min(1).max(200) });

// ---------------------------------------------------------------------------------------------------
// Profile

export const ProfileSchema = z.object({
  user: z.object({ id: UuidSchema, name: z.string(), login: z.string(), email: z.string().nullable() }),
  email: z.array(z.object({ kind: MailKindSchema, label: z.string(), who: z.string(), enabled: z.boolean() })),
  calendarFeed: z.object({ active: z.boolean(), createdAt: z.string().nullable() }),
});
export type Profile = z.infer<typeof ProfileSchema>;

export const UpdateEmailPreferencesInputSchema = z.strictObject({
  optOuts: z.array(MailKindSchema).max(MAIL_KINDS.length),
});
export type UpdateEmailPreferencesInput = z.infer<typeof UpdateEmailPreferencesInputSchema>;

/** Returned once, when a feed URL is made or reset: Midgray keeps only a hash of the secret. */
export const CalendarFeedCreatedSchema = z.object({ url: z.string(), createdAt: z.string() });
export type CalendarFeedCreated = z.infer<typeof CalendarFeedCreatedSchema>;

