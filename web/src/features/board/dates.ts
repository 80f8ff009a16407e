// How the board and the episode page write dates: calendar dates as they are, instants in a
// named zone (the embargo's own, or the channel's), always with the zone said.

const dateFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const instantFormats = new Map<string, Intl.DateTimeFormat>();

/** "Fri 8 May 2026" for a calendar date 'YYYY-MM-DD'. */
export function formatDay(date: string): string {
  return dateFormat.format(new Date(`${date}T00:00:00Z`));
}

/** "Tue 12 May 2026, 15:00" — the wall clock of an instant in `zone`. */
export function formatInstant(iso: string, zone: string): string {
  let f = instantFormats.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone: zone });
    instantFormats.set(zone, f);
  }
  return f.format(new Date(iso));
}

/** "Week of Mon 4 May 2026" for a stored publish week (its Monday). */
export function formatWeek(monday: string): string {
  return `Week of ${formatDay(monday)}`;
}
