/**
 * Instants and IANA time zones without a date library: everything goes through `Intl`, whose
 * zone rules come from the IANA tz database bundled with the JavaScript engine (ICU).
 *
 * Why: embargoes and publish slots are stored as an instant plus the zone they were entered in
 * (STYLE.md habit 9). People read them as wall-clock time in that zone, so we need both directions:
 * instant → wall clock (`zonedParts`, `formatInstantInZone`) and wall clock → instant
 * (`zonedTimeToInstant`).
 */
import { InvalidInputError } from './errors.ts';

/** Wall-clock fields of an instant in a zone (month 1–12, hour 0–23). */
export interface ZonedParts {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

/** How to resolve a wall-clock time that a zone skips (spring forward) or repeats (fall back). */
export type Disambiguation = 'compatible' | 'earlier' | 'later' | 'reject';

const MS_PER_MINUTE = 60_000;
const MS_PER_DAY = 86_400_000;

// One formatter per zone: building an Intl.DateTimeFormat is far slower than using one.
const partsFormatters = new Map<string, Intl.DateTimeFormat>();

function partsFormatter(timeZone: string): Intl.DateTimeFormat {
  let formatter = partsFormatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-US', {
      timeZone,
      // h23, not hour12:false: some engines print midnight as "24" with hour12:false.
      hourCycle: 'h23',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
      era: 'short',
    });
    partsFormatters.set(timeZone, formatter);
  }
  return formatter;
}

/** Offset strings like "+01:00" are accepted by newer Intl versions but are not IANA names. */
const IANA_NAME_SHAPE = /^[A-Za-z][A-Za-z0-9_+\-]*(\/[A-Za-z0-9_+\-]+)*$/;

/** Remembered answers of isValidTimeZone (bounded: names come from data and forms). */
const zoneValidity = new Map<string, boolean>();

/** True when `name` is an IANA zone name (or link) this engine knows, e.g. "Europe/Berlin", "UTC". */
export function isValidTimeZone(name: string): boolean {
  if (typeof name !== 'string' || !IANA_NAME_SHAPE.test(name)) return false;
  // Building a formatter is the costly part (a board renders hundreds of dates): remember answers.
  const known = zoneValidity.get(name);
  if (known !== undefined) return known;
  let valid: boolean;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    valid = true;
  } catch {
    valid = false;
  }
  if (zoneValidity.size < 1000) zoneValidity.set(name, valid);
  return valid;
}

/** The engine's spelling of a zone name ("europe/berlin" → "Europe/Berlin"), or null when invalid. */
export function canonicalTimeZone(name: string): string | null {
  if (!isValidTimeZone(name)) return null;
  return new Intl.DateTimeFormat('en-US', { timeZone: name }).resolvedOptions().timeZone;
}

function assertZone(timeZone: string): void {
  if (!isValidTimeZone(timeZone)) {
    throw new InvalidInputError(`"${timeZone}" is not a time zone name like Europe/Berlin`, 'timeZone');
  }
}

/** Milliseconds since the epoch of an ISO instant or Date; throws InvalidInputError when unreadable. */
export function instantToMs(instant: string | Date): number {
  const ms = instant instanceof Date ? instant.getTime() : Date.parse(instant);
  if (!Number.isFinite(ms)) {
    throw new InvalidInputError(`"${String(instant)}" is not a date-time with a zone or offset`, 'instant');
  }
  return ms;
}

function partsAtMs(ms: number, timeZone: string): ZonedParts {
  const fields: Record<string, string> = {};
  for (const part of partsFormatter(timeZone).formatToParts(new Date(ms))) fields[part.type] = part.value;
  const yearOfEra = Number(fields.year);
  // en-US eras are "AD"/"BC"; BC year n is astronomical year 1 − n.
  const year = fields.era === 'BC' ? 1 - yearOfEra : yearOfEra;
  return {
    year,
    month: Number(fields.month),
    day: Number(fields.day),
    hour: Number(fields.hour),
    minute: Number(fields.minute),
    second: Number(fields.second),
  };
}

function partsAsUtcMs(p: ZonedParts): number {
  const date = new Date(0);
  date.setUTCFullYear(p.year, p.month - 1, p.day);
  date.setUTCHours(p.hour, p.minute, p.second, 0);
  return date.getTime();
}

/** Wall-clock fields of `instant` in `timeZone`. */
export function zonedParts(instant: string | Date, timeZone: string): ZonedParts {
  assertZone(timeZone);
  return partsAtMs(instantToMs(instant), timeZone);
}

function offsetMsAt(ms: number, timeZone: string): number {
  // Intl works in whole seconds; drop the milliseconds so they don't leak into the offset.
  const wholeSecondMs = Math.floor(ms / 1000) * 1000;
  return partsAsUtcMs(partsAtMs(wholeSecondMs, timeZone)) - wholeSecondMs;
}

/** The zone's offset from UTC at `instant`, in minutes east of Greenwich (Berlin in summer: 120). */
export function zoneOffsetMinutes(instant: string | Date, timeZone: string): number {
  assertZone(timeZone);
  return offsetMsAt(instantToMs(instant), timeZone) / MS_PER_MINUTE;
}

const LOCAL_DATE_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2}))?$/;

/** Parses "2026-05-02T15:00" (seconds optional, a space may replace the T) into checked fields. */
export function parseLocalDateTime(local: string): ZonedParts {
  const match = LOCAL_DATE_TIME.exec(local.trim());
  if (!match) {
    throw new InvalidInputError(`"${local}" is not a local date-time like 2026-05-02T15:00`, 'localDateTime');
  }
  const [year, month, day, hour, minute, second = 0] = match.slice(1).map((v) => (v === undefined ? 0 : Number(v)));
  const parts: ZonedParts = { year, month, day, hour, minute, second };
  const roundTrip = new Date(partsAsUtcMs(parts));
  const valid =
    month >= 1 &&
    month <= 12 &&
    hour <= 23 &&
    minute <= 59 &&
    second <= 59 &&
    roundTrip.getUTCFullYear() === year &&
    roundTrip.getUTCMonth() === month - 1 &&
    roundTrip.getUTCDate() === day;
  if (!valid) throw new InvalidInputError(`"${local}" is not a date and time that exists on the calendar`, 'localDateTime');
  return parts;
}

/**
 * The UTC instant (ISO string, e.g. "2026-05-02T13:00:00.000Z") at which the wall clock in `timeZone`
 * shows `local` ("2026-05-02T15:00").
 *
 * A wall-clock time can occur twice (clocks go back) or never (clocks go forward). `compatible`, the
 * default, takes the earlier of two and, for a skipped time, moves forward by the length of the gap
 * (02:30 on a spring-forward night of a one-hour jump becomes 03:30) — the same choice as the
 * `compatible` option of the TC39 Temporal proposal. `reject` throws InvalidInputError instead.
 */
export function zonedTimeToInstant(
  local: string,
  timeZone: string,
  disambiguation: Disambiguation = 'compatible',
): string {
  assertZone(timeZone);
  const wallAsUtc = partsAsUtcMs(parseLocalDateTime(local));
  // Offsets a day either side bracket any transition near this wall time (real zones change offset
  // at most once a day). Each distinct offset gives a candidate; keep those the zone agrees with.
  const offsets = [...new Set([-MS_PER_DAY, 0, MS_PER_DAY].map((d) => offsetMsAt(wallAsUtc + d, timeZone)))];
  const candidates = offsets
    .map((offset) => wallAsUtc - offset)
    .filter((ms) => offsetMsAt(ms, timeZone) === wallAsUtc - ms)
    .sort((a, b) => a - b);
  const unique = [...new Set(candidates)];

  if (unique.length === 1) return new Date(unique[0]).toISOString();

  if (unique.length > 1) {
    if (disambiguation === 'reject') {
      throw new InvalidInputError(`${local} happens twice in ${timeZone} (clocks go back); pick the earlier or the later one`, 'localDateTime');
    }
    return new Date(disambiguation === 'later' ? unique[unique.length - 1] : unique[0]).toISOString();
  }

  // Skipped wall time: the offset before the gap yields the later instant, the one after it the earlier.
  if (disambiguation === 'reject') {
    throw new InvalidInputError(`${local} does not exist in ${timeZone} (clocks go forward)`, 'localDateTime');
  }
  const before = offsetMsAt(wallAsUtc - MS_PER_DAY, timeZone);
  const after = offsetMsAt(wallAsUtc + MS_PER_DAY, timeZone);
  const ms = disambiguation === 'earlier' ? wallAsUtc - after : wallAsUtc - before;
  return new Date(ms).toISOString();
}

const pad2 = (n: number) => String(n).padStart(2, '0');

function formatWallClock(p: ZonedParts): string {
  const year = p.year >= 0 && p.year <= 9999 ? String(p.year).padStart(4, '0') : String(p.year);
  const seconds = p.second === 0 ? '' : `:${pad2(p.second)}`;
  return `${year}-${pad2(p.month)}-${pad2(p.day)} ${pad2(p.hour)}:${pad2(p.minute)}${seconds}`;
}

/** "2026-05-02 15:00" — wall clock of `instant` in `timeZone`, seconds shown only when not zero. */
export function formatLocalDateTime(instant: string | Date, timeZone: string): string {
  return formatWallClock(zonedParts(instant, timeZone));
}

function isUtcName(timeZone: string): boolean {
  return ['UTC', 'ETC/UTC', 'ETC/UCT', 'UCT', 'ETC/ZULU', 'ZULU', 'ETC/UNIVERSAL', 'UNIVERSAL'].includes(timeZone.toUpperCase());
}

/**
 * "2026-05-02 15:00 Europe/Berlin", or "2026-05-01 09:00 UTC" for UTC — wall clock plus the zone's
 * name; the same text on every engine (no locale-dependent abbreviations), so it is safe in error
 * messages that tests compare exactly.
 */
export function formatInstantWithZoneName(instant: string | Date, timeZone: string): string {
  const wall = formatLocalDateTime(instant, timeZone);
  return isUtcName(timeZone) ? `${wall} UTC` : `${wall} ${timeZone}`;
}

function zoneAbbreviation(ms: number, timeZone: string, locale: string): string {
  const parts = new Intl.DateTimeFormat(locale, { timeZone, timeZoneName: 'short' }).formatToParts(new Date(ms));
  return parts.find((p) => p.type === 'timeZoneName')?.value ?? '';
}

/**
 * "2026-05-02 15:00 CEST (Europe/Berlin)" — wall clock, the zone's short name and its IANA name.
 *
 * ICU only knows a letter abbreviation per locale ("EDT" in en-US, "CEST" in en-GB), so we ask en-US
 * then en-GB and otherwise print the offset as "UTC+5:30". The abbreviation can differ between ICU
 * versions; use `formatInstantWithZoneName` where text must be stable.
 */
export function formatInstantInZone(instant: string | Date, timeZone: string): string {
  const ms = instantToMs(instant);
  const wall = formatLocalDateTime(new Date(ms), timeZone);
  if (isUtcName(timeZone)) return `${wall} UTC`;
  let abbreviation = '';
  for (const locale of ['en-US', 'en-GB']) {
    const candidate = zoneAbbreviation(ms, timeZone, locale);
    if (/^[A-Z]{2,5}$/.test(candidate)) {
      abbreviation = candidate;
      break;
    }
  }
  if (!abbreviation) abbreviation = formatUtcOffset(offsetMsAt(ms, timeZone) / MS_PER_MINUTE);
  return `${wall} ${abbreviation} (${timeZone})`;
}

/** "UTC+2", "UTC-4", "UTC+5:30", "UTC" — an offset in minutes east of Greenwich as text. */
export function formatUtcOffset(offsetMinutes: number): string {
  if (offsetMinutes === 0) return 'UTC';
  const sign = offsetMinutes > 0 ? '+' : '-';
  const abs = Math.abs(Math.round(offsetMinutes));
  const hours = Math.floor(abs / 60);
  const minutes = abs % 60;
  return `UTC${sign}${hours}${minutes ? `:${pad2(minutes)}` : ''}`;
}
