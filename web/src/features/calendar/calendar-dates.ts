// Calendar-day arithmetic on "YYYY-MM-DD" strings (dates have no zone; UTC math keeps them exact),
// and where an event falls in a chosen time zone.
import { zonedParts, type CalendarEvent } from '@midgray/shared';

const DAY_MS = 86_400_000;
const pad = (n: number) => String(n).padStart(2, '0');

/** "2026-05-02" + n days. */
export function addDays(date: string, n: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + n * DAY_MS).toISOString().slice(0, 10);
}

/** Monday = 0 … Sunday = 6 of a date. */
export function weekdayIndex(date: string): number {
  return (new Date(`${date}T00:00:00Z`).getUTCDay() + 6) % 7;
}

/** The first day of the month of `date`. */
export const monthStart = (date: string) => `${date.slice(0, 7)}-01`;

/** The first day of the month `n` months after the month of `date`. */
export function addMonths(date: string, n: number): string {
  const [y, m] = date.split('-').map(Number);
  const d = new Date(Date.UTC(y, m - 1 + n, 1));
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-01`;
}

/** The 42 days (six Monday-first weeks) the month grid of `month` shows. */
export function monthGrid(month: string): string[] {
  const first = monthStart(month);
  const start = addDays(first, -weekdayIndex(first));
  return Array.from({ length: 42 }, (_, i) => addDays(start, i));
}

/** Today's date in `zone`. */
export function todayIn(zone: string, now = new Date()): string {
  const p = zonedParts(now, zone);
  return `${p.year}-${pad(p.month)}-${pad(p.day)}`;
}

/** The day an event falls on for a viewer in `zone` (whole-day events keep their date). */
export function eventDay(e: CalendarEvent, zone: string): string {
  if (e.date) return e.date;
  const p = zonedParts(e.at!, zone);
  return `${p.year}-${pad(p.month)}-${pad(p.day)}`;
}

/** "18:00" — the event's wall-clock time in `zone`, or null for whole-day events. */
export function eventTime(e: CalendarEvent, zone: string): string | null {
  if (!e.at) return null;
  const p = zonedParts(e.at, zone);
  return `${pad(p.hour)}:${pad(p.minute)}`;
}

/** Events grouped by the day they fall on in `zone`, each day in time order (whole-day first). */
export function eventsByDay(events: CalendarEvent[], zone: string): Map<string, CalendarEvent[]> {
  const days = new Map<string, CalendarEvent[]>();
  for (const e of events) {
    const day = eventDay(e, zone);
    const list = days.get(day) ?? [];
    list.push(e);
    days.set(day, list);
  }
  for (const list of days.values()) list.sort((a, b) => (eventTime(a, zone) ?? '').localeCompare(eventTime(b, zone) ?? '') || a.kind.localeCompare(b.kind));
  return days;
}

/** "May 2026" for the month of `date`. */
export function monthTitle(date: string): string {
  return new Date(`${date}T12:00:00Z`).toLocaleDateString(undefined, { month: 'long', year: 'numeric', timeZone: 'UTC' });
}

/** "Sat 2 May" for a date. */
export function dayTitle(date: string): string {
  return new Date(`${date}T12:00:00Z`).toLocaleDateString(undefined, { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });
}
