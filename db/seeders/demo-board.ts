// Demo board: two more episodes in Plan that show what the board explains. One is ready to move
// to Shoot (a custom test with every required spec-sheet line filled); the other is not (frame
// rate and codec still empty) and its K9 body must go back before its shoot day, so its card
// carries a date flag. Titles, gear and values are invented.
import { QueryTypes } from 'sequelize';
import { planSteps, specSheetDraftsFor } from '@midgray/shared';
import { Activity, Episode, EpisodeGear, SpecSheetLine, Test, TestStep } from '../src/index.ts';
import type { DemoContext, DemoStep } from './demo.ts';

const day = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);
const NTSC_24 = 24000 / 1001;

/** Titles of the two board demo episodes (the browser tests find the cards by them). */
export const DEMO_BOARD_TITLES = {
  ready: 'Prime 50 T1.5: sharpness from centre to corner',
  blocked: 'Panel 600 at high frame rates: any flicker?',
} as const;

const FILLED: Record<string, string> = {
  body: 'Korvala K7 Mark II, firmware 3.1',
  lens: 'Brightwell Prime 50 T1.5',
  resolution: '3840×2160 (UHD)',
  shutter: '180° (1/48 s)',
  aperture: 'T1.5, T2.8, T5.6',
  nd: '0.6',
  iso: '800',
  white_balance: '5600 K',
  gamma_profile: 'Korvala Log 3',
  colour_space: 'Korvala Wide Gamut',
  codec: 'Intra-frame 4:2:2, MOV wrapper',
  bit_depth: '10-bit',
  chroma_subsampling: '4:2:2',
  bitrate: '400 Mb/s',
  lighting: 'Two bi-colour panels at 5600 K, even on the chart within 1/10 stop',
  scene_chart: 'Siemens-star chart wall, 3 m',
};

async function customTest(ctx: DemoContext, episodeId: string, name: string, steps: string[], values: Record<string, string>) {
  const { transaction } = ctx;
  const inputs = { fps: NTSC_24, steps: steps.map((label) => ({ label, notes: '' })) };
  const test = await Test.create({ episodeId, kind: 'custom', name, position: 0, inputs, secondsPerStep: 10 }, { transaction });
  for (const d of planSteps('custom', inputs)) {
    await TestStep.create({ testId: test.id, index: d.index, label: d.label, iso: d.iso, offsetStops: d.offsetStops, planned: d.planned, plannedSeconds: 10 }, { transaction });
  }
  await SpecSheetLine.bulkCreate(
    specSheetDraftsFor('custom', inputs).map((l) => {
      const value = l.key in values ? values[l.key] : l.value;
      return { testId: test.id, key: l.key, label: l.label, value, checked: value.trim() !== '', inDescription: l.inDescription, required: l.required, position: l.position, custom: false };
    }),
    { transaction },
  );
}

/** Adds the two board demo episodes at the end of the Plan column. */
export const demoBoard: DemoStep = async (ctx) => {
  const { transaction, channelId, now, people } = ctx;
  const host = people['ilse.marrow'];
  const editor = people['dario.fenwick'];
  const [{ n }] = await ctx.sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM episodes WHERE channel_id = :channelId AND stage = 'plan' AND archived_at IS NULL`, {
    replacements: { channelId },
    type: QueryTypes.SELECT,
    transaction,
  });
  const episodes = [
    { key: 'sharpness', title: DEMO_BOARD_TITLES.ready, gear: ['lens50', 'k7'], shoot: 3, week: 21, test: { name: 'Chart at three apertures', steps: ['T1.5', 'T2.8', 'T5.6'], values: FILLED } },
    // The K9 is due back 2 days from now (gear list), before this shoot 6 days from now: a date flag.
    { key: 'flicker', title: DEMO_BOARD_TITLES.blocked, gear: ['panel', 'k9'], shoot: 6, week: 28, test: { name: 'Shutter sweep at 100 and 120 fps', steps: ['100 fps, 180°', '120 fps, 180°', '120 fps, 360°'], values: { ...FILLED, frame_rate: '', codec: '' } } },
  ];
  for (const [i, e] of episodes.entries()) {
    const monday = new Date(+now + e.week * day);
    monday.setUTCDate(monday.getUTCDate() - ((monday.getUTCDay() + 6) % 7));
    const ep = await Episode.create(
      { channelId, title: e.title, stage: 'plan', position: n + i, hostId: host, editorId: editor, shootDate: isoDate(new Date(+now + e.shoot * day)), targetPublishWeek: isoDate(monday), createdById: host },
      { transaction },
    );
    ctx.episodes[e.key] = ep.id;
    for (const g of e.gear) await EpisodeGear.create({ episodeId: ep.id, gearId: ctx.gear[g] }, { transaction });
    await Activity.create({ channelId, actorId: host, subjectType: 'episode', subjectId: ep.id, episodeId: ep.id, action: 'episode.created', toValue: 'plan', details: { title: e.title } }, { transaction });
    await customTest(ctx, ep.id, e.test.name, e.test.steps, e.test.values);
  }
};
