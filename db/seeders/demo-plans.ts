// Demo test plans: an ISO sweep and a latitude bracket on the two K9 episodes (still in plan),
// and a third-stop ISO sweep on the K7 re-test (in grade) with every step shot and most observed.
// Steps come from the same shared generators the product runs; every value here is invented.
import { planSteps, specSheetDraftsFor, type TestKind } from '@midgray/shared';
import { Activity, LightingCircuit, LightingFixture, SpecSheetLine, Test, TestStep } from '../src/index.ts';
import type { DemoContext, DemoStep } from './demo.ts';

const NTSC_24 = 24000 / 1001;
const KIT = { minFNumber: 1.4, maxFNumber: 16, ndDensities: [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1, 2.4], shutterAngles: [180], lightsDimmable: false, lightDownStops: 0, lightUpStops: 0 };
const PRIORITY = ['nd', 'aperture', 'shutter', 'light'];

async function addTest(
  ctx: DemoContext,
  p: { episode: string; kind: TestKind; name: string; position: number; inputs: Record<string, unknown>; secondsPerStep: number; lines: Record<string, string>; checked?: string[] },
) {
  const { transaction } = ctx;
  const episodeId = ctx.episodes[p.episode];
  const test = await Test.create({ episodeId, kind: p.kind, name: p.name, position: p.position, inputs: p.inputs, secondsPerStep: p.secondsPerStep, readoutRegion: { x: 0.4, y: 0.4, w: 0.2, h: 0.2 } }, { transaction });
  const steps = [];
  for (const d of planSteps(p.kind, p.inputs)) {
    steps.push(await TestStep.create({ testId: test.id, index: d.index, label: d.label, iso: d.iso, offsetStops: d.offsetStops, planned: d.planned, plannedSeconds: p.secondsPerStep }, { transaction }));
  }
  await SpecSheetLine.bulkCreate(
    specSheetDraftsFor(p.kind, p.inputs).map((l) => ({ testId: test.id, key: l.key, label: l.label, value: p.lines[l.key] ?? l.value, checked: p.checked?.includes(l.key) ?? false, inDescription: l.inDescription, required: l.required, position: l.position, custom: false })),
    { transaction },
  );
  await Activity.create({ channelId: ctx.channelId, actorId: ctx.people['ilse.marrow'], subjectType: 'test', subjectId: test.id, episodeId, action: 'test.created', toValue: p.name, details: { kind: p.kind, steps: steps.length } }, { transaction });
  return { test, steps };
}

async function addLighting(ctx: DemoContext, testId: string, circuits: { label: string; volts: number; breakerAmps: number; fixtures: { name: string; watts: number; quantity?: number }[] }[]) {
  const { transaction } = ctx;
  let fixturePosition = 0;
  for (const [position, c] of circuits.entries()) {
    const circuit = await LightingCircuit.create({ testId, label: c.label, volts: c.volts, breakerAmps: c.breakerAmps, position }, { transaction });
    for (const f of c.fixtures) await LightingFixture.create({ testId, circuitId: circuit.id, name: f.name, watts: f.watts, quantity: f.quantity ?? 1, position: fixturePosition++ }, { transaction });
  }
}

const K9_LINES = {
  body: 'Korvala K9 Cine, firmware 0.9 (pre-production)',
  lens: 'Brightwell Prime 50 T1.5, at T4',
  resolution: '4096×2160 (DCI 4K)',
  codec: 'Intra-frame 4:2:2, MXF wrapper',
  bit_depth: '10-bit',
  chroma_subsampling: '4:2:2',
  bitrate: '400 Mb/s',
  gamma_profile: 'Korvala Log 3',
  colour_space: 'Korvala Wide Gamut',
  media: 'Datavault 1 TB card',
};

/** Test plans of the demo episodes (see file comment). */
/** Spec-sheet values of the K7 re-test's sweep (firmware 3.1); the firmware 3.0 baseline shares most of them. */
export const K7_SWEEP_LINES: Record<string, string> = {
  body: 'Korvala K7 Mark II, firmware 3.1',
  lens: 'Brightwell Zoom 24-70 T2.9 at 50 mm, T2.9',
  resolution: '3840×2160 (UHD)',
  white_balance: '4300 K',
  gamma_profile: 'Korvala Log 2',
  colour_space: 'Korvala Wide Gamut',
  codec: 'Long-GOP 4:2:0, MP4 wrapper',
  bit_depth: '10-bit',
  chroma_subsampling: '4:2:0',
  bitrate: '150 Mb/s',
  lighting: 'Tungsten fresnel through diffusion, fixed level',
  scene_chart: 'Grey card and a still-life with deep shadows',
  media: 'House SSD 2',
};

export const demoTestPlans: DemoStep = async (ctx) => {
  const day = 86_400_000;
  // K9 noise: a full-stop sweep 100–25600; white balance and chart are still open, so the
  // episode cannot move to Shoot yet. One circuit runs over 80 % of its breaker.
  const noise = await addTest(ctx, {
    episode: 'k9noise',
    kind: 'iso_sweep',
    name: 'ISO sweep 100–25600',
    position: 0,
    secondsPerStep: 10,
    inputs: { baseIso: 800, minIso: 100, maxIso: 25600, step: 'full', base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: NTSC_24, ndDensity: 0.9 }, kit: KIT, priority: PRIORITY },
    lines: { ...K9_LINES, lighting: 'Two bi-colour panels at 5600 K, 45° each side of the chart' },
    checked: ['body', 'lens'],
  });
  await addLighting(ctx, noise.test.id, [
    { label: 'Wall socket A', volts: 230, breakerAmps: 16, fixtures: [{ name: 'Lumetra Panel 600 Bi-colour', watts: 600, quantity: 2 }] },
    { label: 'Kitchen circuit', volts: 230, breakerAmps: 10, fixtures: [{ name: 'Open-face 1000 W', watts: 1000 }, { name: 'Backlight 800 W', watts: 800 }, { name: 'Practical lamp', watts: 150 }] },
  ]);

  // K9 latitude: ±5 stops in full stops at ISO 800; every required line is filled.
  const bracket = await addTest(ctx, {
    episode: 'k9latitude',
    kind: 'latitude_bracket',
    name: 'Latitude bracket ±5',
    position: 0,
    secondsPerStep: 8,
    inputs: { baseIso: 800, base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: NTSC_24, ndDensity: 1.5 }, maxOffsetStops: 5, step: 'full', kit: KIT, priority: PRIORITY },
    lines: { ...K9_LINES, white_balance: '5600 K, tint 0', lighting: 'One bi-colour panel, 5600 K, fixed level', scene_chart: '24-patch colour chart and a grey card, lit evenly' },
  });
  await addLighting(ctx, bracket.test.id, [{ label: 'Wall socket A', volts: 230, breakerAmps: 16, fixtures: [{ name: 'Lumetra Panel 600 Bi-colour', watts: 600 }] }]);

  // K7 re-test (in grade): a third-stop sweep 400–3200, all shot four days ago.
  const k7 = await addTest(ctx, {
    episode: 'k7iso',
    kind: 'iso_sweep',
    name: 'ISO sweep 400–3200 in thirds',
    position: 0,
    secondsPerStep: 6,
    inputs: { baseIso: 800, minIso: 400, maxIso: 3200, step: 'third', base: { fNumber: 2.8, shutter: { kind: 'angle', angleDeg: 180 }, fps: 25, ndDensity: 0.6 }, kit: { ...KIT, maxFNumber: 22 }, priority: PRIORITY },
    lines: K7_SWEEP_LINES,
    checked: ['body', 'lens', 'resolution', 'frame_rate', 'shutter', 'aperture', 'nd', 'iso', 'white_balance', 'gamma_profile', 'colour_space', 'codec', 'bit_depth', 'chroma_subsampling', 'bitrate'],
  });
  const notes: Record<number, [string, number]> = {
    400: ['Below base: highlights clip about a stop earlier.', 4],
    800: ['Base ISO: clean, fine even grain.', 5],
    1000: ['Indistinguishable from 800 on the monitor.', 5],
    1250: ['First visible grain in the shadows.', 4],
    1600: ['Shadow noise visible, still tight.', 4],
    2000: ['Magenta tint creeping into the blacks.', 3],
    2500: ['Blotchy chroma noise under the table.', 3],
    3200: ['Noise obvious at 100 %; usable for the web only.', 2],
  };
  const shotAt = new Date(+ctx.now - 4 * day + 10 * 3_600_000);
  for (const [i, step] of k7.steps.entries()) {
    const planned = step.planned as { iso: number; fNumber: number; shutterAngleDeg: number; ndDensity: number };
    // One step was shot a third of a stop off by mistake: the plan shows the difference.
    const actual = step.iso === 1250 ? { ...planned, fNumber: 2.8, lightChangeStops: 0 } : { iso: planned.iso, fNumber: planned.fNumber, shutterAngleDeg: planned.shutterAngleDeg, ndDensity: planned.ndDensity, lightChangeStops: 0 };
    const [observation, rating] = notes[step.iso!] ?? ['', null];
    await step.update(
      { actual: { iso: actual.iso, fNumber: actual.fNumber, shutterAngleDeg: actual.shutterAngleDeg, ndDensity: actual.ndDensity, lightChangeStops: 0 }, observation, rating, shotAt: new Date(+shotAt + i * 4 * 60_000), shotById: ctx.people['ilse.marrow'], version: 2 },
      { transaction: ctx.transaction },
    );
  }
};
