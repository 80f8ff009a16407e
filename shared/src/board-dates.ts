/**
 * The dates that matter on a board card and the episode page (issue #3): the next one coming up
 * (embargo lift, gear due back, approved publish slot), how close it is, and two conflicts worth a
 * flag: gear due back before the shoot, and a publish slot before a gear embargo lifts.
 *
 * Pure: the caller passes `now` and the channel's time zone, so "today" is the channel's today.
 * Due-back and shoot dates are calendar dates; embargoes and slots are instants with their zone.
 */
import { STAGES, type Stage } from './stages.ts';
import { daysBetween } from './weeks.ts';
import { formatInstantWithZoneName, instantToMs, zonedParts } from './zones.ts';

/** A date counts as "soon" (warning colour, icon and word) when it is at most this many days away. */
export const DATE_WARNING_DAYS = 3;

/** A gear item reduced to its name and dates. */
export interface DatedGear {
  name: string;
  /** 'YYYY-MM-DD' or null. */
  dueBackOn: string | null;
  /** ISO instant or null; always together with `embargoZone`. */
  embargoAt: string | null;
  embargoZone: string | null;
}

/** A publish slot (issue #7): the instant, the zone it was proposed in, and whether it is approved. */
export interface DatedSlot {
  startsAt: string;
  zone: string;
  status: 'proposed' | 'approved';
}

/** What the date rules read from an episode. */
export interface EpisodeDates {
  stage: Stage;
  /** 'YYYY-MM-DD' or null. */
  shootDate: string | null;
  gear: DatedGear[];
  slots: DatedSlot[];
}

export type DateFlagCode = 'due_back_before_shoot' | 'embargo_after_slot';

/** A conflict between dates, with the sentence shown to people. */
export interface DateFlag {
  code: DateFlagCode;
  gearName: string;
  message: string;
}

const stageAt = (s: Stage) => STAGES.indexOf(s);

/**
 * Gear due back before the episode's shoot date. Checked while the shoot is still ahead (Plan and
 * Shoot); due back ON the shoot day is not flagged (it can go back after the last take).
 */
export function dueBackBeforeShootFlags(ep: EpisodeDates): DateFlag[] {
  if (!ep.shootDate || stageAt(ep.stage) > stageAt('shoot')) return [];
  return ep.gear
    .filter((g) => g.dueBackOn !== null && g.dueBackOn < ep.shootDate!)
    .map((g) => ({
      code: 'due_back_before_shoot' as const,
      gearName: g.name,
      message: `${g.name} is due back on ${g.dueBackOn}, before the shoot on ${ep.shootDate}`,
    }));
}

/**
 * The publish-slot check: a proposed or approved slot earlier than the embargo of any of the
 * episode's gear. Compares instants (a slot and an embargo entered in different zones compare
 * correctly). Checked until the episode is live.
 */
export function embargoAfterSlotFlags(ep: EpisodeDates): DateFlag[] {
  if (ep.stage === 'live') return [];
  const flags: DateFlag[] = [];
  for (const slot of ep.slots) {
    const slotMs = instantToMs(slot.startsAt);
    for (const g of ep.gear) {
      if (!g.embargoAt || !g.embargoZone) continue;
      if (slotMs < instantToMs(g.embargoAt)) {
        const kind = slot.status === 'approved' ? 'Approved' : 'Proposed';
        flags.push({
          code: 'embargo_after_slot',
          gearName: g.name,
          message: `${kind} slot ${formatInstantWithZoneName(slot.startsAt, slot.zone)} is before the embargo of ${g.name} lifts (${formatInstantWithZoneName(g.embargoAt, g.embargoZone)})`,
        });
      }
    }
  }
  return flags;
}

/** Every date conflict of an episode: due back before the shoot, then slots before embargoes. */
export function episodeDateFlags(ep: EpisodeDates): DateFlag[] {
  return [...dueBackBeforeShootFlags(ep), ...embargoAfterSlotFlags(ep)];
}

export type KeyDateKind = 'embargo' | 'due_back' | 'publish_slot';
export type Urgency = 'past' | 'soon' | 'later';

/** The next date that matters for an episode. */
export interface KeyDate {
  kind: KeyDateKind;
  /** "Embargo lifts", "Due back", "Publishes". */
  what: string;
  /** The gear item it concerns, when it concerns one. */
  gearName: string | null;
  /** 'YYYY-MM-DD' for due-back dates, an ISO instant otherwise. */
  at: string;
  /** The zone an instant is read in (its own zone); null for calendar dates. */
  zone: string | null;
  /** Calendar days from today in the channel's zone to the date (negative = past). */
  daysAway: number;
  urgency: Urgency;
}

function todayIn(nowIso: string, timeZone: string): string {
  const p = zonedParts(nowIso, timeZone);
  return `${String(p.year).padStart(4, '0')}-${String(p.month).padStart(2, '0')}-${String(p.day).padStart(2, '0')}`;
}

function urgencyOf(isPast: boolean, daysAway: number): Urgency {
  if (isPast) return 'past';
  return daysAway <= DATE_WARNING_DAYS ? 'soon' : 'later';
}

/**
 * The next date that matters, or null (live episodes, or nothing dated). Candidates: embargoes
 * still to lift, gear due-back dates (overdue ones included), the approved publish slot. A date in
 * the past comes first (it needs action now), then the earliest.
 */
export function nextKeyDate(ep: EpisodeDates, nowIso: string, timeZone: string): KeyDate | null {
  if (ep.stage === 'live') return null;
  const nowMs = instantToMs(nowIso);
  const today = todayIn(nowIso, timeZone);
  const candidates: (KeyDate & { sortMs: number })[] = [];

  for (const g of ep.gear) {
    if (g.embargoAt && g.embargoZone) {
      const ms = instantToMs(g.embargoAt);
      if (ms >= nowMs) {
        const daysAway = daysBetween(today, todayIn(g.embargoAt, timeZone));
        candidates.push({ kind: 'embargo', what: 'Embargo lifts', gearName: g.name, at: g.embargoAt, zone: g.embargoZone, daysAway, urgency: urgencyOf(false, daysAway), sortMs: ms });
      }
    }
    if (g.dueBackOn) {
      const daysAway = daysBetween(today, g.dueBackOn);
      candidates.push({
        kind: 'due_back',
        what: 'Due back',
        gearName: g.name,
        at: g.dueBackOn,
        zone: null,
        daysAway,
        urgency: urgencyOf(daysAway < 0, daysAway),
        sortMs: Date.parse(`${g.dueBackOn}T00:00:00Z`),
      });
    }
  }
  const approved = ep.slots.find((s) => s.status === 'approved');
  if (approved) {
    const ms = instantToMs(approved.startsAt);
    const daysAway = daysBetween(today, todayIn(approved.startsAt, timeZone));
    candidates.push({ kind: 'publish_slot', what: 'Publishes', gearName: null, at: approved.startsAt, zone: approved.zone, daysAway, urgency: urgencyOf(ms < nowMs, daysAway), sortMs: ms });
  }
  if (candidates.length === 0) return null;
  candidates.sort((a, b) => Number(b.urgency === 'past') - Number(a.urgency === 'past') || a.sortMs - b.sortMs);
  const { sortMs: _ignored, ...next } = candidates[0];
  return next;
}

/** "Overdue by 2 days", "Today", "Tomorrow", "In 5 days" — the words beside the warning icon. */
export function urgencyWords(k: Pick<KeyDate, 'daysAway' | 'urgency'>): string {
  if (k.urgency === 'past') return k.daysAway < 0 ? `Overdue by ${-k.daysAway} ${-k.daysAway === 1 ? 'day' : 'days'}` : 'Overdue';
  if (k.daysAway === 0) return 'Today';
  if (k.daysAway === 1) return 'Tomorrow';
  return `In ${k.daysAway} days`;
}
