// Time-zone helpers for the browser: the viewer's own zone and the list of IANA names the engine
// knows (for pickers). Conversion and formatting come from @midgray/shared (zones.ts).

/** The viewer's IANA zone as the browser reports it ("UTC" when it cannot tell). */
export function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

const FALLBACK = ['UTC', 'Europe/London', 'Europe/Berlin', 'America/New_York', 'America/Chicago', 'America/Los_Angeles', 'Asia/Tokyo', 'Australia/Sydney'];

let cached: string[] | null = null;
/** Every IANA zone name the engine supports, UTC first, then alphabetical. */
export function allTimeZones(): string[] {
  if (cached) return cached;
  const supported = (Intl as unknown as { supportedValuesOf?: (k: string) => string[] }).supportedValuesOf?.('timeZone') ?? FALLBACK;
  cached = ['UTC', ...supported.filter((z) => z !== 'UTC')];
  return cached;
}
