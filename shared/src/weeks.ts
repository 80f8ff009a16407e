/**
 * ISO 8601 week dates for the episode's target publish week: weeks start on Monday, and week 01 of
 * a year is the week with that year's first Thursday (equivalently, the week containing 4 January).
 * Dates are calendar dates ('YYYY-MM-DD') with no time zone; the arithmetic runs on UTC midnights.
 */
import { InvalidInputError } from './errors.ts';

const MS_PER_DAY = 86_400_000;
const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const WEEK = /^(\d{4})-?W(\d{2})$/i;

/** The ISO week-numbering year and week (1–53) of a calendar date. */
export interface IsoWeek {
  year: number;
  week: number;
}

function dateToUtcMs(date: string): number {
  const m = DATE.exec(date);
  if (!m) throw new InvalidInputError(`"${date}" is not a date like 2026-05-14`, 'date');
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) {
    throw new InvalidInputError(`"${date}" is not a date that exists on the calendar`, 'date');
  }
  return ms;
}

const msToDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** ISO weekday: Monday = 1 … Sunday = 7. */
function isoWeekday(ms: number): number {
  return ((new Date(ms).getUTCDay() + 6) % 7) + 1;
}

/** Monday of ISO week 1 of `year` (the Monday on or before 4 January). */
function mondayOfWeekOne(year: number): number {
  const jan4 = Date.UTC(year, 0, 4);
  return jan4 - (isoWeekday(jan4) - 1) * MS_PER_DAY;
}

/** Number of ISO weeks in `year`: 52 or 53. */
export function isoWeeksInYear(year: number): number {
  return Math.round((mondayOfWeekOne(year + 1) - mondayOfWeekOne(year)) / (7 * MS_PER_DAY));
}

/** The ISO week of a date ('2008-12-29' → { year: 2009, week: 1 }). */
export function isoWeekOf(date: string): IsoWeek {
  const ms = dateToUtcMs(date);
  // The Thursday of the same week decides the week-numbering year.
  const thursday = ms + (4 - isoWeekday(ms)) * MS_PER_DAY;
  const year = new Date(thursday).getUTCFullYear();
  const week = Math.floor((thursday - mondayOfWeekOne(year)) / (7 * MS_PER_DAY)) + 1;
  return { year, week };
}

/** Parses "2026-W19" (or "2026W19"); null when it is not a week that exists. */
export function parseIsoWeek(text: string): IsoWeek | null {
  const m = WEEK.exec(text.trim());
  if (!m) return null;
  const year = Number(m[1]);
  const week = Number(m[2]);
  if (week < 1 || week > isoWeeksInYear(year)) return null;
  return { year, week };
}

/** "2026-W19" for a week. */
export function formatIsoWeek(w: IsoWeek): string {
  return `${w.year}-W${String(w.week).padStart(2, '0')}`;
}

/**
 * The Monday ('YYYY-MM-DD') of the ISO week given as "2026-W19" or as any date in it.
 * Throws InvalidInputError for anything else.
 */
export function mondayOfIsoWeek(weekOrDate: string): string {
  const week = parseIsoWeek(weekOrDate);
  if (week) return msToDate(mondayOfWeekOne(week.year) + (week.week - 1) * 7 * MS_PER_DAY);
  if (WEEK.test(weekOrDate.trim())) throw new InvalidInputError(`"${weekOrDate}" is not a week that exists`, 'week');
  const ms = dateToUtcMs(weekOrDate.trim());
  return msToDate(ms - (isoWeekday(ms) - 1) * MS_PER_DAY);
}

/** Whole days from `from` to `to` (both 'YYYY-MM-DD'); negative when `to` is earlier. */
export function daysBetween(from: string, to: string): number {
  return Math.round((dateToUtcMs(to) - dateToUtcMs(from)) / MS_PER_DAY);
}
