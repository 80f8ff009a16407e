// ISO 8601 week dates. Expected values:
//  - ISO 8601 week rules as summarised in Markus Kuhn's "A summary of the international standard date
//    and time notation": "the first week of the year 1997 lasts from 1996-12-30 to 1997-01-05".
//  - Worked examples of the ISO week date system: 2006-W52-7 is Sunday 31 December 2006;
//    2020-W01-1 is Monday 30 December 2019; 2015-W53-6 is 2 January 2016; 2026-W22-4 is 28 May 2026.
//  - 53-week years: a year has 53 ISO weeks when it starts on a Thursday, or is a leap year starting
//    on a Wednesday (ISO 8601 week rule; 2004, 2009, 2015, 2020 and 2026 are such years — checked
//    against the 1 January weekdays of the Gregorian calendar).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { daysBetween, formatIsoWeek, isoWeekOf, isoWeeksInYear, mondayOfIsoWeek, parseIsoWeek } from './weeks.ts';

describe('isoWeekOf', () => {
  it('puts the days around new year in the right week-numbering year (Kuhn, ISO 8601 summary)', () => {
    expect(isoWeekOf('1996-12-30')).toEqual({ year: 1997, week: 1 });
    expect(isoWeekOf('1997-01-05')).toEqual({ year: 1997, week: 1 });
    expect(isoWeekOf('1996-12-29')).toEqual({ year: 1996, week: 52 });
  });

  it('matches published week-date examples', () => {
    expect(isoWeekOf('2006-12-31')).toEqual({ year: 2006, week: 52 }); // 2006-W52-7
    expect(isoWeekOf('2019-12-30')).toEqual({ year: 2020, week: 1 }); // 2020-W01-1
    expect(isoWeekOf('2016-01-02')).toEqual({ year: 2015, week: 53 }); // 2015-W53-6
    expect(isoWeekOf('2026-05-28')).toEqual({ year: 2026, week: 22 }); // 2026-W22-4
  });

  it('refuses dates that do not exist', () => {
    expect(() => isoWeekOf('2026-02-30')).toThrow(/does not exist|not a date that exists/);
    expect(() => isoWeekOf('next week')).toThrow(/not a date/);
  });
});

describe('isoWeeksInYear', () => {
  it('has 53 weeks in years starting on Thursday, or leap years starting on Wednesday', () => {
    for (const year of [2004, 2009, 2015, 2020, 2026]) expect(isoWeeksInYear(year), String(year)).toBe(53);
    for (const year of [2005, 2019, 2021, 2024, 2025, 2027]) expect(isoWeeksInYear(year), String(year)).toBe(52);
  });
});

describe('mondayOfIsoWeek', () => {
  it('returns the Monday of a week given as "YYYY-Www"', () => {
    expect(mondayOfIsoWeek('1997-W01')).toBe('1996-12-30'); // Kuhn
    expect(mondayOfIsoWeek('2020-W01')).toBe('2019-12-30');
    expect(mondayOfIsoWeek('2015-W53')).toBe('2015-12-28'); // 2015-W53-6 = 2016-01-02, so its Monday is 5 days earlier
    expect(mondayOfIsoWeek('2026W22')).toBe('2026-05-25'); // 2026-W22-4 = 2026-05-28
  });

  it('returns the Monday of the week containing a date', () => {
    expect(mondayOfIsoWeek('2006-12-31')).toBe('2006-12-25'); // Sunday of 2006-W52
    expect(mondayOfIsoWeek('2026-05-25')).toBe('2026-05-25'); // a Monday stays
    expect(mondayOfIsoWeek('2016-01-02')).toBe('2015-12-28');
  });

  it('refuses week 53 of a 52-week year and other nonsense', () => {
    expect(parseIsoWeek('2025-W53')).toBeNull();
    expect(() => mondayOfIsoWeek('2025-W53')).toThrow(/not a week that exists/);
    expect(() => mondayOfIsoWeek('2026-W00')).toThrow(/not a week that exists/);
    expect(() => mondayOfIsoWeek('soon')).toThrow(/not a date/);
  });

  it('round-trips: the Monday of a date lies in the same ISO week, and is a Monday (property)', () => {
    fc.assert(
      fc.property(fc.date({ min: new Date('1990-01-01T00:00:00Z'), max: new Date('2090-12-31T00:00:00Z'), noInvalidDate: true }), (d) => {
        const date = d.toISOString().slice(0, 10);
        const monday = mondayOfIsoWeek(date);
        expect(new Date(`${monday}T00:00:00Z`).getUTCDay()).toBe(1);
        expect(isoWeekOf(monday)).toEqual(isoWeekOf(date));
        expect(mondayOfIsoWeek(formatIsoWeek(isoWeekOf(date)))).toBe(monday);
        const gap = daysBetween(monday, date);
        expect(gap >= 0 && gap <= 6).toBe(true);
      }),
    );
  });
});

describe('daysBetween', () => {
  it('counts calendar days across month and leap-day boundaries (Gregorian calendar)', () => {
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2); // 2024 is a leap year
    expect(daysBetween('2026-02-28', '2026-03-01')).toBe(1);
    expect(daysBetween('2026-03-01', '2026-02-28')).toBe(-1);
    expect(daysBetween('2025-12-31', '2026-12-31')).toBe(365);
  });
});
