// The date rules of the board (issue #3: "the next date that matters … with a warning colour when it
// is within 3 days or past"; "a gear item due back before its episode's shoot date, or an embargo
// later than a proposed publish slot, is flagged"). Zone offsets come from the IANA tz database:
// Europe/Berlin is UTC+2 in summer (CEST), America/Los_Angeles UTC−7 (PDT), Pacific/Auckland
// UTC+12 in May (NZST). All gear is fictional.
import { describe, expect, it } from 'vitest';
import { DATE_WARNING_DAYS, dueBackBeforeShootFlags, embargoAfterSlotFlags, episodeDateFlags, nextKeyDate, urgencyWords, type EpisodeDates } from './board-dates.ts';

const k9 = { name: 'Korvala K9 Cine', dueBackOn: '2026-05-08', embargoAt: '2026-05-12T13:00:00.000Z', embargoZone: 'Europe/Berlin' };
const lens = { name: 'Brightwell Prime 50', dueBackOn: '2026-05-20', embargoAt: null, embargoZone: null };

const ep = (over: Partial<EpisodeDates> = {}): EpisodeDates => ({ stage: 'plan', shootDate: '2026-05-06', gear: [k9, lens], slots: [], ...over });

describe('due back before the shoot', () => {
  it('flags gear that must go back before the shoot day, naming both dates', () => {
    expect(dueBackBeforeShootFlags(ep({ shootDate: '2026-05-10' }))).toEqual([
      { code: 'due_back_before_shoot', gearName: 'Korvala K9 Cine', message: 'Korvala K9 Cine is due back on 2026-05-08, before the shoot on 2026-05-10' },
    ]);
  });

  it('does not flag gear due back on the shoot day or later, nor episodes without a shoot date', () => {
    expect(dueBackBeforeShootFlags(ep({ shootDate: '2026-05-08' }))).toEqual([]);
    expect(dueBackBeforeShootFlags(ep({ shootDate: '2026-05-01' }))).toEqual([]);
    expect(dueBackBeforeShootFlags(ep({ shootDate: null }))).toEqual([]);
  });

  it('stops flagging once the shoot is done (Grade onwards)', () => {
    expect(dueBackBeforeShootFlags(ep({ stage: 'shoot', shootDate: '2026-05-10' }))).toHaveLength(1);
    expect(dueBackBeforeShootFlags(ep({ stage: 'grade', shootDate: '2026-05-10' }))).toEqual([]);
  });
});

describe('embargo after a publish slot', () => {
  it('flags a proposed slot before the embargo, in both zones', () => {
    const flags = embargoAfterSlotFlags(ep({ stage: 'approval', slots: [{ startsAt: '2026-05-12T09:00:00Z', zone: 'America/Los_Angeles', status: 'proposed' }] }));
    // 09:00 UTC = 02:00 in Los Angeles (PDT); 13:00 UTC = 15:00 in Berlin (CEST).
    expect(flags).toEqual([
      {
        code: 'embargo_after_slot',
        gearName: 'Korvala K9 Cine',
        message: 'Proposed slot 2026-05-12 02:00 America/Los_Angeles is before the embargo of Korvala K9 Cine lifts (2026-05-12 15:00 Europe/Berlin)',
      },
    ]);
  });

  it('compares instants, not wall clocks: 08:00 in Los Angeles is after 15:00 in Berlin the same day', () => {
    // 08:00 PDT = 15:00 UTC, two hours after the 13:00 UTC embargo, though 08:00 < 15:00 on the clock.
    expect(embargoAfterSlotFlags(ep({ slots: [{ startsAt: '2026-05-12T15:00:00Z', zone: 'America/Los_Angeles', status: 'approved' }] }))).toEqual([]);
    // A slot exactly at the embargo is not before it.
    expect(embargoAfterSlotFlags(ep({ slots: [{ startsAt: '2026-05-12T13:00:00Z', zone: 'UTC', status: 'approved' }] }))).toEqual([]);
    expect(embargoAfterSlotFlags(ep({ slots: [{ startsAt: '2026-05-12T12:59:00Z', zone: 'UTC', status: 'approved' }] }))[0].message).toBe(
      'Approved slot 2026-05-12 12:59 UTC is before the embargo of Korvala K9 Cine lifts (2026-05-12 15:00 Europe/Berlin)',
    );
  });

  it('is not checked once the episode is live', () => {
    expect(embargoAfterSlotFlags(ep({ stage: 'live', slots: [{ startsAt: '2026-05-01T00:00:00Z', zone: 'UTC', status: 'approved' }] }))).toEqual([]);
  });

  it('episodeDateFlags lists both kinds, due-back first', () => {
    const flags = episodeDateFlags(ep({ stage: 'shoot', shootDate: '2026-05-10', slots: [{ startsAt: '2026-05-11T10:00:00Z', zone: 'UTC', status: 'proposed' }] }));
    expect(flags.map((f) => f.code)).toEqual(['due_back_before_shoot', 'embargo_after_slot']);
  });
});

describe('the next date that matters', () => {
  const now = '2026-05-05T10:00:00Z';

  it('picks the earliest upcoming date and says how many days away it is', () => {
    const next = nextKeyDate(ep(), now, 'Europe/Berlin');
    expect(next).toMatchObject({ kind: 'due_back', gearName: 'Korvala K9 Cine', at: '2026-05-08', daysAway: 3, urgency: 'soon' });
    expect(urgencyWords(next!)).toBe('In 3 days');
  });

  it(`warns at ${DATE_WARNING_DAYS} days or fewer, not at 4`, () => {
    expect(nextKeyDate(ep({ gear: [{ ...lens, dueBackOn: '2026-05-09' }] }), now, 'Europe/Berlin')).toMatchObject({ daysAway: 4, urgency: 'later' });
    expect(nextKeyDate(ep({ gear: [{ ...lens, dueBackOn: '2026-05-05' }] }), now, 'Europe/Berlin')).toMatchObject({ daysAway: 0, urgency: 'soon' });
  });

  it('puts an overdue date first, whatever else is coming', () => {
    const next = nextKeyDate(ep({ gear: [k9, { ...lens, dueBackOn: '2026-05-02' }] }), now, 'Europe/Berlin');
    expect(next).toMatchObject({ kind: 'due_back', gearName: 'Brightwell Prime 50', daysAway: -3, urgency: 'past' });
    expect(urgencyWords(next!)).toBe('Overdue by 3 days');
  });

  it('ignores an embargo that has already lifted, and counts days in the channel zone', () => {
    const lifted = { ...k9, dueBackOn: null, embargoAt: '2026-05-01T00:00:00Z' };
    expect(nextKeyDate(ep({ gear: [lifted] }), now, 'Europe/Berlin')).toBeNull();
    // Embargo at 2026-05-07 23:30 UTC: in Berlin that is already 2026-05-08 (01:30 CEST), 3 days from
    // Berlin's 2026-05-05; in Los Angeles it is still 2026-05-07 (16:30 PDT), 2 days away.
    const late = { ...k9, dueBackOn: null, embargoAt: '2026-05-07T23:30:00Z' };
    expect(nextKeyDate(ep({ gear: [late] }), now, 'Europe/Berlin')).toMatchObject({ kind: 'embargo', daysAway: 3, zone: 'Europe/Berlin' });
    expect(nextKeyDate(ep({ gear: [late] }), now, 'America/Los_Angeles')).toMatchObject({ daysAway: 2 });
  });

  it('"today" is the channel zone\'s today: 2026-05-05 22:30 UTC is already 6 May in Auckland', () => {
    const k = nextKeyDate(ep({ gear: [{ ...lens, dueBackOn: '2026-05-06' }] }), '2026-05-05T22:30:00Z', 'Pacific/Auckland');
    expect(k).toMatchObject({ daysAway: 0 });
    expect(urgencyWords(k!)).toBe('Today');
    expect(nextKeyDate(ep({ gear: [{ ...lens, dueBackOn: '2026-05-06' }] }), '2026-05-05T22:30:00Z', 'UTC')).toMatchObject({ daysAway: 1 });
  });

  it('includes the approved slot (not a proposed one); a passed approved slot is overdue', () => {
    const approved = { startsAt: '2026-05-06T16:00:00Z', zone: 'Europe/Berlin', status: 'approved' as const };
    expect(nextKeyDate(ep({ gear: [], slots: [approved] }), now, 'Europe/Berlin')).toMatchObject({ kind: 'publish_slot', what: 'Publishes', daysAway: 1, urgency: 'soon' });
    expect(urgencyWords({ daysAway: 1, urgency: 'soon' })).toBe('Tomorrow');
    expect(nextKeyDate(ep({ gear: [], slots: [{ ...approved, status: 'proposed' }] }), now, 'Europe/Berlin')).toBeNull();
    expect(nextKeyDate(ep({ gear: [], slots: [{ ...approved, startsAt: '2026-05-05T09:00:00Z' }] }), now, 'Europe/Berlin')).toMatchObject({ urgency: 'past', daysAway: 0 });
  });

  it('has nothing to say about live episodes', () => {
    expect(nextKeyDate(ep({ stage: 'live' }), now, 'Europe/Berlin')).toBeNull();
  });
});
