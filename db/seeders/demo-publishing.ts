// Demo publishing: descriptions with versions and chapters, and publish slots — the Panel 600
// episode waits in Approval with a proposed slot, the zoom long-term notes went live on an approved
// slot, the K7 re-test has a draft and a proposed slot while still in Grade. Invented text throughout;
// shop addresses use the reserved example.* domains.
import { formatInstantWithZoneName, zonedTimeToInstant } from '@midgray/shared';
import { Activity, Description, DescriptionVersion, PublishSlot } from '../src/index.ts';
import type { DemoContext, DemoStep } from './demo.ts';

const DAY_MS = 86_400_000;

/** "YYYY-MM-DD" `days` from `now` in `zone`'s calendar (close enough for demo dates: UTC date + days). */
const dayFrom = (now: Date, days: number) => new Date(+now + days * DAY_MS).toISOString().slice(0, 10);

/** The instant of `time` on the day `days` from now, on the wall clock of `zone`. */
const at = (now: Date, days: number, time: string, zone: string) => new Date(zonedTimeToInstant(`${dayFrom(now, days)}T${time}`, zone));

type Parts = { summary: string; chapters: { label: string; startSeconds: number }[]; gearLinks: { url: string; label: string; commission: boolean }[]; disclosure: string };

/** Saves `versions` of a description in order (each a full snapshot) with their activity lines. */
async function describe(ctx: DemoContext, episodeKey: string, versions: { by: string; daysAgo: number; parts: Parts; changed: string[] }[]) {
  const { transaction, channelId } = ctx;
  const episodeId = ctx.episodes[episodeKey];
  let n = 0;
  for (const v of versions) {
    n++;
    const authorId = ctx.people[v.by];
    const createdAt = new Date(+ctx.now - v.daysAgo * DAY_MS);
    await DescriptionVersion.create({ episodeId, version: n, snapshot: v.parts, changedParts: v.changed, restoredFrom: null, authorId, createdAt }, { transaction });
    await Activity.create(
      { channelId, actorId: authorId, subjectType: 'description', subjectId: episodeId, episodeId, action: 'description.saved', fromValue: n > 1 ? String(n - 1) : null, toValue: String(n), details: { changed: v.changed }, createdAt },
      { transaction },
    );
  }
  const last = versions[versions.length - 1];
  await Description.create({ episodeId, ...last.parts, version: n, updatedById: ctx.people[last.by] }, { transaction });
}

export const demoPublishing: DemoStep = async (ctx) => {
  const { now, transaction, channelId, people } = ctx;
  const host = people['ilse.marrow'];
  const editor = people['dario.fenwick'];
  const producer = people['noor.halvard'];

  // --- Panel 600 on location: in Approval, description saved twice, a proposed slot ------------
  const panelSummary =
    'We took the Lumetra Panel 600 out of the studio: a riverside night exterior and a grey-card interior, ' +
    'both at 3200 K and 5600 K. How true is the colour at each end of its range, and does it flicker at high shutter speeds?\n\n' +
    'Short answer: skin tones hold up at 5600 K, the warm end drifts slightly green, and we saw no flicker up to 1/2000 s.';
  const panelChapters = [
    { label: 'Why a location test', startSeconds: 0 },
    { label: 'Colour at 5600 K', startSeconds: 74 },
    { label: 'Colour at 3200 K', startSeconds: 251 },
    { label: 'Flicker at high shutter speeds', startSeconds: 432 },
    { label: 'Verdict', startSeconds: 618 },
  ];
  const panelLinks = [
    { url: 'https://shop.example/lumetra-panel-600', label: 'Lumetra Panel 600', commission: true },
    { url: 'https://shop.example/korvala-k7-mark-ii', label: 'Korvala K7 Mark II', commission: false },
  ];
  await describe(ctx, 'panel', [
    { by: 'ilse.marrow', daysAgo: 3, changed: ['summary'], parts: { summary: panelSummary, chapters: [], gearLinks: [], disclosure: '' } },
    { by: 'dario.fenwick', daysAgo: 1, changed: ['chapters', 'gearLinks'], parts: { summary: panelSummary, chapters: panelChapters, gearLinks: panelLinks, disclosure: '' } },
  ]);
  const panelSlot = await PublishSlot.create(
    { episodeId: ctx.episodes.panel, startsAt: at(now, 5, '18:00', 'Europe/Berlin'), zone: 'Europe/Berlin', status: 'proposed', proposalNote: 'Evening slot, a week after the lens episode.', proposedById: host, createdAt: new Date(+now - DAY_MS) },
    { transaction },
  );
  await Activity.create(
    { channelId, actorId: host, subjectType: 'publish_slot', subjectId: panelSlot.id, episodeId: ctx.episodes.panel, action: 'slot.proposed', toValue: formatInstantWithZoneName(panelSlot.startsAt, 'Europe/Berlin'), details: { startsAt: panelSlot.startsAt.toISOString(), zone: 'Europe/Berlin' }, createdAt: new Date(+now - DAY_MS) },
    { transaction },
  );

  // --- Zoom 24-70 long-term notes: live, on an approved slot -------------------------------------
  const zoomSummary =
    'A year with the Brightwell Zoom 24-70 T2.9 on the Korvala K7: what wore, what held its calibration, ' +
    'and whether the focus scale still matches after two hundred shoot days.';
  await describe(ctx, 'zoomreview', [
    {
      by: 'ilse.marrow',
      daysAgo: 24,
      changed: ['summary', 'chapters'],
      parts: {
        summary: zoomSummary,
        chapters: [
          { label: 'Intro', startSeconds: 0 },
          { label: 'Build and wear', startSeconds: 58 },
          { label: 'Focus scale check', startSeconds: 240 },
          { label: 'Breathing and flare', startSeconds: 401 },
        ],
        gearLinks: [{ url: 'https://shop.example/brightwell-zoom-24-70', label: 'Brightwell Zoom 24-70 T2.9', commission: false }],
        disclosure: '',
      },
    },
  ]);
  const zoomSlot = await PublishSlot.create(
    {
      episodeId: ctx.episodes.zoomreview,
      startsAt: at(now, -20, '17:00', 'Europe/Berlin'),
      zone: 'Europe/Berlin',
      status: 'approved',
      proposedById: editor,
      decidedById: producer,
      decidedAt: new Date(+now - 22 * DAY_MS),
      comment: 'Good slot, no embargo on this one.',
      createdAt: new Date(+now - 23 * DAY_MS),
    },
    { transaction },
  );
  await Activity.create(
    { channelId, actorId: producer, subjectType: 'publish_slot', subjectId: zoomSlot.id, episodeId: ctx.episodes.zoomreview, action: 'slot.approved', fromValue: 'proposed', toValue: 'approved', reason: zoomSlot.comment },
    { transaction },
  );

  // --- K7 re-test: still in Grade, a first draft and a proposed slot from New York ---------------
  await describe(ctx, 'k7iso', [
    {
      by: 'dario.fenwick',
      daysAgo: 0,
      changed: ['summary'],
      parts: { summary: 'Firmware 3.1 promised cleaner shadows on the Korvala K7 Mark II. We re-ran our third-stop ISO sweep to check.', chapters: [], gearLinks: [], disclosure: '' },
    },
  ]);
  await PublishSlot.create(
    { episodeId: ctx.episodes.k7iso, startsAt: at(now, 12, '11:00', 'America/New_York'), zone: 'America/New_York', status: 'proposed', proposedById: editor },
    { transaction },
  );
};
