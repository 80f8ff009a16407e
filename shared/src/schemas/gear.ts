// Gear (issue #3): the items under test with where they came from, when they go back and when
// their review embargo lifts. The embargo is an instant plus the IANA zone it was announced in.
import { z } from 'zod';
import { formatLocalDateTime, isValidTimeZone, zonedTimeToInstant } from '../zones.ts';
import { DateOnlySchema, InstantSchema, TimeZoneSchema, UuidSchema } from './common.ts';

export const GEAR_KINDS = ['body', 'lens', 'light', 'recorder', 'other'] as const;
export const GearKindSchema = z.enum(GEAR_KINDS, { message: `Pick a kind: ${GEAR_KINDS.join(', ')}` });
export type GearKind = z.infer<typeof GearKindSchema>;

export const GEAR_SOURCES = ['loaner', 'rental', 'owned', 'purchased'] as const;
export const GearSourceSchema = z.enum(GEAR_SOURCES, { message: `Pick a source: ${GEAR_SOURCES.join(', ')}` });
export type GearSource = z.infer<typeof GearSourceSchema>;

/** Kind and source names as people read them. */
export const GEAR_KIND_LABELS: Record<GearKind, string> = { body: 'Body', lens: 'Lens', light: 'Light', recorder: 'Recorder', other: 'Other' };
export const GEAR_SOURCE_LABELS: Record<GearSource, string> = { loaner: 'Loaner', rental: 'Rental', owned: 'Owned', purchased: 'Purchased' };

export const GEAR_MAKE_MAX = 80;
export const GEAR_MODEL_MAX = 120;
export const GEAR_SERIAL_MAX = 64;
export const GEAR_NOTES_MAX = 2000;

/** "Korvala K9 Cine": how a gear item is named on cards, flags and messages. */
export function gearName(g: { make: string; model: string }): string {
  return `${g.make} ${g.model}`.trim();
}

/** One gear item as the API returns it. Dates are 'YYYY-MM-DD'; `embargoAt` an ISO instant (UTC). */
export const GearSchema = z.object({
  id: UuidSchema,
  kind: GearKindSchema,
  make: z.string(),
  model: z.string(),
  serial: z.string().nullable(),
  source: GearSourceSchema,
  sponsored: z.boolean(),
  receivedOn: z.string().nullable(),
  dueBackOn: z.string().nullable(),
  embargoAt: z.string().nullable(),
  embargoZone: z.string().nullable(),
  notes: z.string(),
  archivedAt: z.string().nullable(),
  version: z.number().int(),
  /** Episodes (not archived) that use this item. */
  episodeCount: z.number().int(),
});
export type Gear = z.infer<typeof GearSchema>;

const GearFieldsSchema = z.strictObject({
  kind: GearKindSchema,
  make: z.string().trim().min(1, 'Give the make, e.g. Korvala').max(GEAR_MAKE_MAX),
  model: z.string().trim().min(1, 'Give the model, e.g. K9 Cine').max(GEAR_MODEL_MAX),
  serial: z.string().trim().max(GEAR_SERIAL_MAX).nullable().transform((s) => (s ? s : null)),
  source: GearSourceSchema,
  sponsored: z.boolean(),
  receivedOn: DateOnlySchema.nullable(),
  dueBackOn: DateOnlySchema.nullable(),
  embargoAt: InstantSchema.nullable(),
  embargoZone: TimeZoneSchema.nullable(),
  notes: z.string().max(GEAR_NOTES_MAX),
});

type GearDates = { receivedOn?: string | null; dueBackOn?: string | null; embargoAt?: string | null; embargoZone?: string | null };

/** Cross-field rules shared by create and update: both embargo parts or neither; due back not before received. */
function checkGearDates(v: GearDates, ctx: z.RefinementCtx) {
  if (v.embargoAt !== undefined || v.embargoZone !== undefined) {
    if ((v.embargoAt ?? null) === null && (v.embargoZone ?? null) !== null) {
      ctx.addIssue({ code: 'custom', path: ['embargoAt'], message: 'Give the embargo date and time too, or clear its time zone' });
    }
    if ((v.embargoAt ?? null) !== null && (v.embargoZone ?? null) === null) {
      ctx.addIssue({ code: 'custom', path: ['embargoZone'], message: 'Give the time zone the embargo was announced in, e.g. Europe/Berlin' });
    }
  }
  if (v.receivedOn && v.dueBackOn && v.dueBackOn < v.receivedOn) {
    ctx.addIssue({ code: 'custom', path: ['dueBackOn'], message: `The due-back date is before the date it was received (${v.receivedOn})` });
  }
}

/** Creating a gear item (producers and admins). Optional fields default to empty. */
export const CreateGearInputSchema = GearFieldsSchema.extend({
  serial: GearFieldsSchema.shape.serial.default(null),
  sponsored: z.boolean().default(false),
  receivedOn: DateOnlySchema.nullable().default(null),
  dueBackOn: DateOnlySchema.nullable().default(null),
  embargoAt: InstantSchema.nullable().default(null),
  embargoZone: TimeZoneSchema.nullable().default(null),
  notes: z.string().max(GEAR_NOTES_MAX).default(''),
}).superRefine(checkGearDates);
export type CreateGearInput = z.input<typeof CreateGearInputSchema>;

/**
 * Editing a gear item: any subset of fields plus the `version` it was read at (stale → 409).
 * `archived` archives or restores it. Embargo parts travel together.
 */
export const UpdateGearInputSchema = GearFieldsSchema.partial()
  .extend({ version: z.number().int().min(1), archived: z.boolean().optional() })
  .superRefine((v, ctx) => {
    if ((v.embargoAt === undefined) !== (v.embargoZone === undefined)) {
      ctx.addIssue({ code: 'custom', path: [v.embargoAt === undefined ? 'embargoAt' : 'embargoZone'], message: 'Send the embargo date-time and its time zone together' });
      return;
    }
    checkGearDates(v, ctx);
  });
export type UpdateGearInput = z.input<typeof UpdateGearInputSchema>;

export const GearListQuerySchema = z.strictObject({
  archived: z.enum(['true', 'false']).optional().transform((v) => v === 'true'),
});

// ---------------------------------------------------------------------------------------------------
// The gear form: what a person types (strings, '' for empty), turned into the API input.

const LOCAL_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/;
const optionalDate = z.union([z.literal(''), DateOnlySchema]);

/**
 * The gear form's values. The embargo is typed as the wall-clock time in the zone it was announced
 * in (as the maker's e-mail says it), and turned into an instant with `zonedTimeToInstant`.
 */
export const GearFormSchema = z
  .object({
    kind: GearKindSchema,
    make: z.string().trim().min(1, 'Give the make, e.g. Korvala').max(GEAR_MAKE_MAX),
    model: z.string().trim().min(1, 'Give the model, e.g. K9 Cine').max(GEAR_MODEL_MAX),
    serial: z.string().trim().max(GEAR_SERIAL_MAX),
    source: GearSourceSchema,
    sponsored: z.boolean(),
    receivedOn: optionalDate,
    dueBackOn: optionalDate,
    embargoLocal: z.union([z.literal(''), z.string().regex(LOCAL_DATE_TIME, 'Use a date and time like 2026-05-02T15:00')]),
    embargoZone: z.string().trim(),
    notes: z.string().max(GEAR_NOTES_MAX),
  })
  .superRefine((v, ctx) => {
    if (v.embargoLocal !== '' && v.embargoZone === '') {
      ctx.addIssue({ code: 'custom', path: ['embargoZone'], message: 'Give the time zone the embargo was announced in, e.g. Europe/Berlin' });
    }
    if (v.embargoZone !== '' && !isValidTimeZone(v.embargoZone)) {
      ctx.addIssue({ code: 'custom', path: ['embargoZone'], message: 'Unknown time zone: use an IANA name such as Europe/Berlin or America/New_York' });
    } else if (v.embargoLocal !== '' && v.embargoZone !== '') {
      try {
        zonedTimeToInstant(v.embargoLocal, v.embargoZone);
      } catch (err) {
        ctx.addIssue({ code: 'custom', path: ['embargoLocal'], message: (err as Error).message });
      }
    }
    if (v.receivedOn && v.dueBackOn && v.dueBackOn < v.receivedOn) {
      ctx.addIssue({ code: 'custom', path: ['dueBackOn'], message: `The due-back date is before the date it was received (${v.receivedOn})` });
    }
  });
export type GearForm = z.infer<typeof GearFormSchema>;

/** Empty form values for a new item. */
export const EMPTY_GEAR_FORM: GearForm = {
  kind: 'body',
  make: '',
  model: '',
  serial: '',
  source: 'loaner',
  sponsored: false,
  receivedOn: '',
  dueBackOn: '',
  embargoLocal: '',
  embargoZone: '',
  notes: '',
};

/** The form values of an existing item: its embargo shown as wall-clock time in its own zone. */
export function gearToForm(g: Gear): GearForm {
  return {
    kind: g.kind,
    make: g.make,
    model: g.model,
    serial: g.serial ?? '',
    source: g.source,
    sponsored: g.sponsored,
    receivedOn: g.receivedOn ?? '',
    dueBackOn: g.dueBackOn ?? '',
    embargoLocal: g.embargoAt && g.embargoZone ? formatLocalDateTime(g.embargoAt, g.embargoZone).replace(' ', 'T').slice(0, 16) : '',
    embargoZone: g.embargoZone ?? '',
    notes: g.notes,
  };
}

/** The API input for validated form values (the embargo's wall clock → instant in its zone). */
export function gearFormToInput(f: GearForm) {
  const embargo = f.embargoLocal !== '' && f.embargoZone !== '';
  return {
    kind: f.kind,
    make: f.make.trim(),
    model: f.model.trim(),
    serial: f.serial.trim() === '' ? null : f.serial.trim(),
    source: f.source,
    sponsored: f.sponsored,
    receivedOn: f.receivedOn === '' ? null : f.receivedOn,
    dueBackOn: f.dueBackOn === '' ? null : f.dueBackOn,
    embargoAt: embargo ? zonedTimeToInstant(f.embargoLocal, f.embargoZone) : null,
    embargoZone: embargo ? f.embargoZone : null,
    notes: f.notes,
  } satisfies z.input<typeof CreateGearInputSchema>;
}
