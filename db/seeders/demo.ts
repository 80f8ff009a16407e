// The demo scenario: a fictional channel, its people, gear and episodes. Every brand, model,
// person and figure here is invented for the demo. Idempotent: running it twice changes nothing.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { formatLocalDateTime, zonedTimeToInstant } from '@midgray/shared';
import { Activity, Channel, Episode, EpisodeGear, Gear, lockUntilCommit, Membership, User } from '../src/index.ts';
import { DEMO_CHANNEL_NAME, DEMO_PEOPLE } from '../src/demo/people.ts';
import { demoTestPlans } from './demo-plans.ts';
import { demoPublishing } from './demo-publishing.ts';
import { demoBoard } from './demo-board.ts';
import { demoReadouts } from './demo-readouts.ts';
import { demoFootage } from './demo-footage.ts';

/** A step of the demo seed; later features add theirs to DEMO_STEPS. */
export type DemoStep = (ctx: DemoContext) => Promise<void>;

export interface DemoContext {
  sequelize: Sequelize;
  transaction: Transaction;
  channelId: string;
  people: Record<string, string>; // login → user id
  gear: Record<string, string>; // key → gear id
  episodes: Record<string, string>; // key → episode id
  now: Date;
}

const day = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);
/** An instant `days` from `now` at a wall-clock time in `zone`, as embargoes are announced ("15:00 Berlin time"). */
const wallClockIn = (now: Date, days: number, time: string, zone: string) => new Date(zonedTimeToInstant(`${formatLocalDateTime(new Date(+now + days * 86_400_000), zone).slice(0, 10)}T${time}`, zone));

/** Monday of the week containing `d` (UTC), as YYYY-MM-DD. */
function mondayOf(d: Date) {
  const m = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  m.setUTCDate(m.getUTCDate() - ((m.getUTCDay() + 6) % 7));
  return isoDate(m);
}

const baseSteps: DemoStep[] = [
  async function gearList(ctx) {
    const { now, transaction, channelId } = ctx;
    const items = [
      { key: 'k9', kind: 'body', make: 'Korvala', model: 'K9 Cine', serial: 'KV9-004417', source: 'loaner', sponsored: false, receivedOn: isoDate(new Date(+now - 6 * day)), dueBackOn: isoDate(new Date(+now + 2 * day)), embargoAt: wallClockIn(now, 9, '15:00', 'Europe/Berlin'), embargoZone: 'Europe/Berlin', notes: 'Pre-production firmware 0.9. Return with both batteries.' },
      { key: 'k7', kind: 'body', make: 'Korvala', model: 'K7 Mark II', serial: 'KV7-118203', source: 'owned', sponsored: false, receivedOn: '2025-03-02', dueBackOn: null, embargoAt: null, embargoZone: null, notes: 'House reference body.' },
      { key: 'lens50', kind: 'lens', make: 'Brightwell', model: 'Prime 50 T1.5', serial: 'BW50-2231', source: 'rental', sponsored: false, receivedOn: isoDate(new Date(+now - 3 * day)), dueBackOn: isoDate(new Date(+now + 12 * day)), embargoAt: null, embargoZone: null, notes: 'Rental house order 5521.' },
      { key: 'zoom', kind: 'lens', make: 'Brightwell', model: 'Zoom 24-70 T2.9', serial: 'BWZ-0098', source: 'owned', sponsored: false, receivedOn: '2024-11-20', dueBackOn: null, embargoAt: null, embargoZone: null, notes: '' },
      { key: 'panel', kind: 'light', make: 'Lumetra', model: 'Panel 600 Bi-colour', serial: 'LM6-7781', source: 'purchased', sponsored: true, receivedOn: '2026-09-14', dueBackOn: null, embargoAt: null, embargoZone: null, notes: 'Sent by the maker as a sponsorship: disclose.' },
      { key: 'rec', kind: 'recorder', make: 'Datavault', model: 'Field 7 Recorder', serial: 'DV7-3310', source: 'loaner', sponsored: false, receivedOn: isoDate(new Date(+now - 1 * day)), dueBackOn: isoDate(new Date(+now + 20 * day)), embargoAt: wallClockIn(now, 4, '06:00', 'America/Los_Angeles'), embargoZone: 'America/Los_Angeles', notes: '' },
    ] as const;
    for (const g of items) {
      const { key, ...row } = g;
      const created = await Gear.create({ channelId, ...row }, { transaction });
      ctx.gear[key] = created.id;
    }
  },
  async function episodes(ctx) {
    const { now, transaction, channelId, people } = ctx;
    const host = people['ilse.marrow'];
    const editor = people['dario.fenwick'];
    const list = [
      { key: 'k9noise', title: 'K9 Cine: noise across the whole ISO range', stage: 'plan', gear: ['k9', 'lens50'], week: 14, shoot: 1 },
      { key: 'k9latitude', title: 'K9 Cine: how far can over- and under-exposure be pulled back?', stage: 'plan', gear: ['k9', 'lens50', 'panel'], week: 14, shoot: 2 },
      { key: 'recorder', title: 'Field 7 recorder: codecs and card speed', stage: 'shoot', gear: ['rec', 'k7'], week: 7, shoot: 0 },
      { key: 'k7iso', title: 'K7 Mark II after firmware 3.1: noise re-test', stage: 'grade', gear: ['k7', 'zoom'], week: 7, shoot: -4 },
      { key: 'panel', title: 'Panel 600 on location: colour and flicker', stage: 'approval', gear: ['panel', 'k7'], week: 3, shoot: -9 },
      { key: 'zoomreview', title: 'Zoom 24-70 T2.9 long-term notes', stage: 'live', gear: ['zoom', 'k7'], week: -10, shoot: -30 },
    ] as const;
    const positions: Record<string, number> = {};
    for (const e of list) {
      const position = positions[e.stage] ?? 0;
      positions[e.stage] = position + 1;
      const ep = await Episode.create(
        {
          channelId,
          title: e.title,
          stage: e.stage,
          position,
          hostId: host,
          editorId: editor,
          targetPublishWeek: mondayOf(new Date(+now + e.week * day)),
          shootDate: isoDate(new Date(+now + e.shoot * day)),
          publicUrl: e.stage === 'live' ? 'https://video.example/watch/zoom-2470-notes' : null,
          createdById: host,
        },
        { transaction },
      );
      ctx.episodes[e.key] = ep.id;
      for (const g of e.gear) await EpisodeGear.create({ episodeId: ep.id, gearId: ctx.gear[g] }, { transaction });
      await Activity.create({ channelId, actorId: host, subjectType: 'episode', subjectId: ep.id, episodeId: ep.id, action: 'episode.created', toValue: 'plan', details: {} }, { transaction });
    }
  },
];

/** Steps run in order after people, channel and memberships exist. Later features append theirs. */
export const DEMO_STEPS: DemoStep[] = [...baseSteps];
DEMO_STEPS.push(demoTestPlans);
DEMO_STEPS.push(demoPublishing);
DEMO_STEPS.push(demoBoard);
// After the test plans: measures the K7 sweep they made and adds a measured baseline episode.
DEMO_STEPS.push(demoReadouts);
// After the test plans: footage of the K7 sweep's first steps.
DEMO_STEPS.push(demoFootage);

/**
 * Seeds the demo scenario once; returns false when it was already there. "There" means the demo
 * admin's account exists: demo accounts are made only by this seed, and no one deletes accounts,
 * so renaming the channel or removing people from it never brings a second demo. Two starts at
 * once wait for each other (an advisory lock held by the seeding transaction).
 */
export async function seedDemo(sequelize: Sequelize, now = new Date()): Promise<boolean> {
  const admin = DEMO_PEOPLE.find((p) => p.role === 'admin')!;
  return sequelize.transaction(async (transaction) => {
    await lockUntilCommit(transaction, 'midgray.seed', 'demo');
    const existing = await sequelize.query<{ id: string }>(`SELECT id FROM users WHERE provider = 'github' AND provider_id = :pid LIMIT 1`, {
      replacements: { pid: admin.providerId },
      type: QueryTypes.SELECT,
      transaction,
    });
    if (existing.length) return false;
    const people: Record<string, string> = {};
    for (const p of DEMO_PEOPLE) {
      const [u] = await User.findOrCreate({
        where: { provider: 'github', providerId: p.providerId },
        defaults: { provider: 'github', providerId: p.providerId, login: p.login, name: p.name, email: p.email },
        transaction,
      });
      people[p.login] = u.id;
    }
    const channel = await Channel.create(
      {
        name: DEMO_CHANNEL_NAME,
        timeZone: 'Europe/Berlin',
        settings: {
          defaultDisclosure: 'Some gear in this video was lent to us by its maker for testing and goes back after the review. The maker did not see or approve this video before publication.',
          signOff: 'Tested and filmed by the Lumen Test Bench crew. Questions about our methods? Ask in the comments.',
          trackingParams: [{ key: 'ref', value: 'lumenbench' }],
        },
      },
      { transaction },
    );
    for (const p of DEMO_PEOPLE) if (p.role) await Membership.create({ channelId: channel.id, userId: people[p.login], role: p.role }, { transaction });
    const ctx: DemoContext = { sequelize, transaction, channelId: channel.id, people, gear: {}, episodes: {}, now };
    for (const step of DEMO_STEPS) await step(ctx);
    return true;
  });
}
