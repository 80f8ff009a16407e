// Expected offsets and transition instants come from the IANA tz database rules:
//   `europe`:       Rule EU 1981 max Mar lastSun 1:00u (+1:00 S); Rule EU 1996 max Oct lastSun 1:00u (0)
//                   Zone Europe/Berlin 1:00 Germany/EU CE%sT  → CET = UTC+1, CEST = UTC+2
//   `northamerica`: Rule US 2007 max Mar Sun>=8 2:00 (+1:00 D); Rule US 2007 max Nov Sun>=1 2:00 (0 S)
//                   Zone America/New_York -5:00 US E%sT        → EST = UTC−5, EDT = UTC−4
//   `asia`:         Zone Asia/Kolkata 5:30 - IST (no daylight saving)
// 2026 calendar: last Sunday of March = 29th, of October = 25th; second Sunday of March = 8th,
// first Sunday of November = 1st.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  canonicalTimeZone,
  formatInstantInZone,
  formatInstantWithZoneName,
  formatLocalDateTime,
  formatUtcOffset,
  isValidTimeZone,
  parseLocalDateTime,
  zoneOffsetMinutes,
  zonedParts,
  zonedTimeToInstant,
} from './zones.ts';

describe('zoneOffsetMinutes', () => {
  it('Europe/Berlin is UTC+2 in summer and UTC+1 in winter', () => {
    expect(zoneOffsetMinutes('2026-07-01T12:00:00Z', 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMinutes('2026-01-15T12:00:00Z', 'Europe/Berlin')).toBe(60);
  });

  it('Europe/Berlin changes at 01:00 UTC on the last Sundays of March and October', () => {
    expect(zoneOffsetMinutes('2026-03-29T00:59:59Z', 'Europe/Berlin')).toBe(60);
    expect(zoneOffsetMinutes('2026-03-29T01:00:00Z', 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMinutes('2026-10-25T00:59:59Z', 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMinutes('2026-10-25T01:00:00Z', 'Europe/Berlin')).toBe(60);
  });

  it('America/New_York moves to UTC−4 at 02:00 EST on 2026-03-08 and back at 02:00 EDT on 2026-11-01', () => {
    expect(zoneOffsetMinutes('2026-03-08T06:59:59Z', 'America/New_York')).toBe(-300);
    expect(zoneOffsetMinutes('2026-03-08T07:00:00Z', 'America/New_York')).toBe(-240);
    expect(zoneOffsetMinutes('2026-11-01T05:59:59Z', 'America/New_York')).toBe(-240);
    expect(zoneOffsetMinutes('2026-11-01T06:00:00Z', 'America/New_York')).toBe(-300);
  });

  it('Asia/Kolkata is UTC+5:30 all year', () => {
    expect(zoneOffsetMinutes('2026-01-15T12:00:00Z', 'Asia/Kolkata')).toBe(330);
    expect(zoneOffsetMinutes('2026-07-01T12:00:00Z', 'Asia/Kolkata')).toBe(330);
  });
});

describe('zonedTimeToInstant', () => {
  it('converts a Berlin wall time in summer and in winter', () => {
    expect(zonedTimeToInstant('2026-05-02T15:00', 'Europe/Berlin')).toBe('2026-05-02T13:00:00.000Z');
    expect(zonedTimeToInstant('2026-01-15T15:00', 'Europe/Berlin')).toBe('2026-01-15T14:00:00.000Z');
    expect(zonedTimeToInstant('2026-05-02 15:00:30', 'Europe/Berlin')).toBe('2026-05-02T13:00:30.000Z');
  });

  it('converts New York either side of the 2026-03-08 change', () => {
    expect(zonedTimeToInstant('2026-03-08T01:59', 'America/New_York')).toBe('2026-03-08T06:59:00.000Z');
    expect(zonedTimeToInstant('2026-03-08T03:00', 'America/New_York')).toBe('2026-03-08T07:00:00.000Z');
  });

  it('converts a zone with a half-hour offset', () => {
    expect(zonedTimeToInstant('2026-05-02T18:30', 'Asia/Kolkata')).toBe('2026-05-02T13:00:00.000Z');
    expect(zonedTimeToInstant('2026-05-02T13:00', 'UTC')).toBe('2026-05-02T13:00:00.000Z');
  });

  // Gap and overlap choices follow the `disambiguation` option of the TC39 Temporal proposal:
  // 'compatible' = 'later' for a skipped time, 'earlier' for a repeated one.
  it('moves a skipped wall time (02:30 on 2026-03-08 in New York) forward by the gap', () => {
    expect(zonedTimeToInstant('2026-03-08T02:30', 'America/New_York')).toBe('2026-03-08T07:30:00.000Z'); // 03:30 EDT
    expect(zonedTimeToInstant('2026-03-08T02:30', 'America/New_York', 'later')).toBe('2026-03-08T07:30:00.000Z');
    expect(zonedTimeToInstant('2026-03-08T02:30', 'America/New_York', 'earlier')).toBe('2026-03-08T06:30:00.000Z'); // 01:30 EST
    expect(() => zonedTimeToInstant('2026-03-08T02:30', 'America/New_York', 'reject')).toThrow(/does not exist/);
    expect(zonedTimeToInstant('2026-03-29T02:30', 'Europe/Berlin')).toBe('2026-03-29T01:30:00.000Z'); // 03:30 CEST
  });

  it('takes the earlier of a repeated wall time (01:30 on 2026-11-01 in New York) unless told otherwise', () => {
    expect(zonedTimeToInstant('2026-11-01T01:30', 'America/New_York')).toBe('2026-11-01T05:30:00.000Z'); // EDT
    expect(zonedTimeToInstant('2026-11-01T01:30', 'America/New_York', 'later')).toBe('2026-11-01T06:30:00.000Z'); // EST
    expect(() => zonedTimeToInstant('2026-11-01T01:30', 'America/New_York', 'reject')).toThrow(/happens twice/);
    expect(zonedTimeToInstant('2026-10-25T02:30', 'Europe/Berlin')).toBe('2026-10-25T00:30:00.000Z'); // CEST
    expect(zonedTimeToInstant('2026-10-25T02:30', 'Europe/Berlin', 'later')).toBe('2026-10-25T01:30:00.000Z'); // CET
  });

  it('round-trips any instant through its wall time (self-consistency)', () => {
    const zones = ['Europe/Berlin', 'America/New_York', 'Asia/Kolkata', 'Australia/Lord_Howe', 'UTC'];
    fc.assert(
      fc.property(
        fc.integer({ min: Date.UTC(1990, 0, 1) / 1000, max: Date.UTC(2090, 0, 1) / 1000 }),
        fc.constantFrom(...zones),
        (seconds, zone) => {
          const instant = new Date(seconds * 1000).toISOString();
          const p = zonedParts(instant, zone);
          const local = `${String(p.year).padStart(4, '0')}-${String(p.month).padStart(2, '0')}-${String(p.day).padStart(2, '0')}T${String(p.hour).padStart(2, '0')}:${String(p.minute).padStart(2, '0')}:${String(p.second).padStart(2, '0')}`;
          const earlier = zonedTimeToInstant(local, zone, 'earlier');
          const later = zonedTimeToInstant(local, zone, 'later');
          // The instant is one of the (at most two) readings of its own wall time.
          expect([earlier, later]).toContain(instant);
        },
      ),
      { numRuns: 500 },
    );
  });

  it('refuses dates that do not exist and malformed input', () => {
    // Gregorian calendar: 2028 is a leap year, 2026 is not.
    expect(zonedTimeToInstant('2028-02-29T12:00', 'UTC')).toBe('2028-02-29T12:00:00.000Z');
    expect(() => parseLocalDateTime('2026-02-29T12:00')).toThrow(/exists on the calendar/);
    expect(() => parseLocalDateTime('2026-05-02T24:00')).toThrow(/exists on the calendar/);
    expect(() => parseLocalDateTime('2026-05-02')).toThrow(/like 2026-05-02T15:00/);
    expect(() => zonedTimeToInstant('2026-05-02T15:00', 'Europe/Atlantis')).toThrow(/time zone/);
  });
});

describe('isValidTimeZone', () => {
  it('accepts IANA names and links the engine knows', () => {
    for (const zone of ['Europe/Berlin', 'America/New_York', 'Asia/Kolkata', 'UTC', 'Etc/GMT+5', 'America/Argentina/Buenos_Aires']) {
      expect(isValidTimeZone(zone)).toBe(true);
    }
  });

  it('refuses unknown names, offsets and blanks', () => {
    for (const zone of ['Europe/Atlantis', 'Mars/Tharsis_Plain', '+01:00', 'UTC+2', '', ' Europe/Berlin', 'Europe/Berlin/']) {
      expect(isValidTimeZone(zone)).toBe(false);
    }
  });

  it('gives the canonical spelling', () => {
    expect(canonicalTimeZone('europe/berlin')).toBe('Europe/Berlin');
    expect(canonicalTimeZone('Europe/Atlantis')).toBeNull();
  });
});

describe('formatting', () => {
  it('formats an instant with its zone abbreviation and IANA name', () => {
    // CEST/CET and EDT/EST from the tz database's CE%sT and E%sT formats; ICU supplies the text.
    expect(formatInstantInZone('2026-05-02T13:00:00Z', 'Europe/Berlin')).toBe('2026-05-02 15:00 CEST (Europe/Berlin)');
    expect(formatInstantInZone('2026-01-15T14:00:00Z', 'Europe/Berlin')).toBe('2026-01-15 15:00 CET (Europe/Berlin)');
    expect(formatInstantInZone('2026-05-02T13:00:00Z', 'America/New_York')).toBe('2026-05-02 09:00 EDT (America/New_York)');
    expect(formatInstantInZone('2026-05-02T13:00:00Z', 'Asia/Kolkata')).toBe('2026-05-02 18:30 UTC+5:30 (Asia/Kolkata)');
    expect(formatInstantInZone('2026-05-02T13:00:00Z', 'UTC')).toBe('2026-05-02 13:00 UTC');
  });

  it('formats with the zone name only (stable text for messages), seconds only when not zero', () => {
    expect(formatInstantWithZoneName('2026-05-02T13:00:00Z', 'Europe/Berlin')).toBe('2026-05-02 15:00 Europe/Berlin');
    expect(formatInstantWithZoneName('2026-05-01T09:00:00Z', 'UTC')).toBe('2026-05-01 09:00 UTC');
    expect(formatInstantWithZoneName('2026-05-01T09:00:07Z', 'Etc/UTC')).toBe('2026-05-01 09:00:07 UTC');
    expect(formatLocalDateTime('2026-12-31T23:30:00Z', 'Asia/Kolkata')).toBe('2027-01-01 05:00');
  });

  it('prints midnight as 00, never 24', () => {
    expect(formatLocalDateTime('2026-05-01T22:00:00Z', 'Europe/Berlin')).toBe('2026-05-02 00:00');
  });

  it('formats offsets', () => {
    expect(formatUtcOffset(0)).toBe('UTC');
    expect(formatUtcOffset(120)).toBe('UTC+2');
    expect(formatUtcOffset(-240)).toBe('UTC-4');
    expect(formatUtcOffset(330)).toBe('UTC+5:30');
    expect(formatUtcOffset(-570)).toBe('UTC-9:30');
  });
});
