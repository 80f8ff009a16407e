import { describe, expect, it } from 'vitest';
import type { CalendarEvent } from '@midgray/shared';
import { addDays, addMonths, eventDay, eventsByDay, eventTime, monthGrid, todayIn, weekdayIndex } from './calendar-dates.ts';

const event = (over: Partial<CalendarEvent>): CalendarEvent => ({
  id: 'e',
  kind: 'slot_proposed',
  title: 'T',
  channelId: '00000000-0000-4000-8000-000000000001',
  channelName: 'C',
  episodeId: null,
  gearId: null,
  at: null,
  zone: null,
  date: null,
  ...over,
});

describe('calendar dates', () => {
  it('lays a month out in six Monday-first weeks (ISO 8601 weeks start on Monday)', () => {
    // 1 February 2026 is a Sunday, so the grid starts on Monday 26 January and ends on Sunday 8 March.
    const grid = monthGrid('2026-02-14');
    expect(grid).toHaveLength(42);
    expect(grid[0]).toBe('2026-01-26');
    expect(grid[6]).toBe('2026-02-01');
    expect(grid[41]).toBe('2026-03-08');
    expect(weekdayIndex('2026-01-26')).toBe(0);
    expect(weekdayIndex('2026-02-01')).toBe(6);
  });

  it('adds days across month and leap-year ends, and months across the year end', () => {
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29'); // 2028 is a leap year (divisible by 4, not by 100)
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
    expect(addMonths('2026-12-15', 1)).toBe('2027-01-01');
    expect(addMonths('2026-01-31', -1)).toBe('2025-12-01');
  });

  it('puts an instant on the day and time of the chosen zone, and keeps whole-day dates as they are', () => {
    // 23:30 UTC on 2 May is 01:30 on 3 May in Berlin (UTC+2 in summer) and 19:30 on 2 May in New York (UTC−4).
    const late = event({ at: '2026-05-02T23:30:00.000Z', zone: 'UTC' });
    expect(eventDay(late, 'Europe/Berlin')).toBe('2026-05-03');
    expect(eventTime(late, 'Europe/Berlin')).toBe('01:30');
    expect(eventDay(late, 'America/New_York')).toBe('2026-05-02');
    expect(eventTime(late, 'America/New_York')).toBe('19:30');
    const due = event({ kind: 'gear_due_back', date: '2026-05-02' });
    expect(eventDay(due, 'Asia/Tokyo')).toBe('2026-05-02');
    expect(eventTime(due, 'Asia/Tokyo')).toBeNull();
  });

  it('groups events per day with whole-day entries first, then by time', () => {
    const days = eventsByDay(
      [
        event({ id: 'b', at: '2026-05-02T16:00:00.000Z' }),
        event({ id: 'a', at: '2026-05-02T07:00:00.000Z' }),
        event({ id: 'd', kind: 'shoot_day', date: '2026-05-02' }),
      ],
      'UTC',
    );
    expect(days.get('2026-05-02')!.map((e) => e.id)).toEqual(['d', 'a', 'b']);
  });

  it('tells today in a zone: the same instant can be two dates', () => {
    const now = new Date('2026-05-02T23:30:00.000Z');
    expect(todayIn('Europe/Berlin', now)).toBe('2026-05-03');
    expect(todayIn('UTC', now)).toBe('2026-05-02');
  });
});
