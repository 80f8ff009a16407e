// Demo readouts. INVENTED DATA: no camera was measured. The frames are synthetic charts of our own
// (grey and colour patches, see api/src/modules/readouts/measure/synth.ts) with Gaussian noise
// that grows with ISO by a made-up law, and bracket frames that lose highlight and shadow detail
// at the extremes. They are stored as frame grabs and measured at seed time with the same code
// the readout job runs, so a fresh install shows real-looking readouts:
// - the K7 re-test (in Grade): its third-stop ISO sweep 400–3200 on firmware 3.1;
// - a published baseline episode of the same body on firmware 3.0 with the same sweep and a
//   latitude bracket ±3, so the compare page can put "before" and "after" side by side.
// The readout engine is pure (frames in, figures out; no database, no HTTP), which is why the
// seed may import it from the api workspace. Frames are small (480×270) to keep seeding quick.
import { createHash, randomUUID } from 'node:crypto';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { planSteps, specSheetDraftsFor, stillReadoutParams, type ReadoutParams, type ReadoutRegion, type TestKind } from '@midgray/shared';
import { syntheticChartLayout, synthChartFrame, type Frame } from '../../api/src/modules/readouts/measure/index.ts';
import { framePreview, noiseFigures, recoveryFigures, softwareVersion } from '../../api/src/modules/readouts/readout-figures.ts';
import { Activity, Episode, EpisodeGear, Footage, PublishSlot, Readout, SpecSheetLine, Test, TestStep } from '../src/index.ts';
import type { DemoContext, DemoStep } from './demo.ts';
import { K7_SWEEP_LINES } from './demo-plans.ts';

const W = 480;
const H = 270;
const day = 86_400_000;
const hour = 3_600_000;

/** Title of the published baseline episode (the browser tests find it by this). */
export const DEMO_BASELINE_TITLE = 'Firmware 3.0 baseline: K7 Mark II noise and latitude';

/** The region the host drew: the middle 60 % of the chart's L* 50 grey patch (row 4, column 4). */
function greyPatchRegion(): ReadoutRegion {
  const rect = syntheticChartLayout(W, H, 6, 4).rects[21];
  const round = (v: number) => Math.round(v * 10_000) / 10_000;
  return { x: round((rect.x + rect.w * 0.2) / W), y: round((rect.y + rect.h * 0.2) / H), w: round((rect.w * 0.6) / W), h: round((rect.h * 0.6) / H) };
}

/** The whole chart (the grid's area) in fractions of the frame. */
function chartRegion(): ReadoutRegion {
  const { chartRegion: r } = syntheticChartLayout(W, H, 6, 4);
  return { x: r.x / W, y: r.y / H, w: r.w / W, h: r.h / H };
}

/** Invented noise law: σ of linear luma at capture, growing with gain; `firmware` 3.0 is noisier. */
function sigmaAt(iso: number, firmware: '3.0' | '3.1'): number {
  return firmware === '3.1' ? 0.0164 * Math.pow(iso / 1600, 0.8) : 0.0213 * Math.pow(iso / 1600, 0.85);
}

/** Monday of the week containing `d` (UTC), as YYYY-MM-DD. */
function mondayOf(d: Date): string {
  const m = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  m.setUTCDate(m.getUTCDate() - ((m.getUTCDay() + 6) % 7));
  return m.toISOString().slice(0, 10);
}

function storageDir(): string {
  return resolve(process.env.STORAGE_DIR ?? '.data/storage');
}

/**
 * Stores `bytes` under `demo/<sha256>.<ext>` and returns the key. The synthetic frames are the
 * same on every seed, so content-addressed keys mean seeding again (every test database seeds the
 * demo) rewrites the same few files instead of piling up copies. Written to a temporary name and
 * renamed, so a concurrent seed never reads half a file.
 */
async function store(bytes: Buffer, ext: 'png' | 'jpg'): Promise<string> {
  const key = `demo/${createHash('sha256').update(bytes).digest('hex')}.${ext}`;
  const path = join(storageDir(), key);
  await mkdir(dirname(path), { recursive: true });
  const temporary = `${path}.${randomUUID()}.part`;
  await writeFile(temporary, bytes);
  await rename(temporary, path);
  return key;
}

async function pngOf(frame: Frame): Promise<Buffer> {
  const { default: sharp } = await import('sharp');
  return sharp(frame.data, { raw: { width: frame.width, height: frame.height, channels: 3 } }).toColourspace('rgb16').png({ compressionLevel: 1 }).toBuffer();
}

/** A frame's PNG file and JPEG preview, encoded on sharp's threads while the next frame is made. */
interface Encoded {
  bytes: Buffer;
  preview: Buffer;
}
const encode = (frame: Frame): Promise<Encoded> => Promise.all([pngOf(frame), framePreview(frame)]).then(([bytes, preview]) => ({ bytes, preview }));

/**
 * Stores an encoded frame as a verified frame grab of `stepId`, with a thumbnail as uploads get
 * (the frame's JPEG preview, which is also the readouts' "measured frame").
 */
async function frameGrab(ctx: DemoContext, episodeId: string, stepId: string, name: string, encoded: Promise<Encoded>, at: Date) {
  const { bytes, preview } = await encoded;
  const sha = createHash('sha256').update(bytes).digest('hex');
  const id = randomUUID();
  const storageKey = await store(bytes, 'png');
  const thumbnailKey = await store(preview, 'jpg');
  const footage = await Footage.create(
    {
      id,
      channelId: ctx.channelId,
      episodeId,
      stepId,
      kind: 'frame_grab',
      status: 'verified',
      uploaderId: ctx.people['dario.fenwick'],
      originalName: name,
      format: 'png',
      sizeBytes: bytes.length,
      storageKey,
      thumbnailKey,
      clientSha256: sha,
      serverSha256: sha,
      specMismatches: [],
      checkedAt: at,
      createdAt: at,
    },
    { transaction: ctx.transaction },
  );
  return { footage, preview };
}

interface DemoReadout {
  testId: string;
  stepId: string;
  footageId: string;
  referenceFootageId?: string;
  kind: 'noise' | 'recovery';
  params: ReadoutParams;
  results: object;
  /** JPEG previews of the measured and the reference frame. */
  preview: Buffer;
  referencePreview?: Buffer;
  differenceMap?: Buffer;
  at: Date;
}

async function readout(ctx: DemoContext, r: DemoReadout) {
  await Readout.create(
    {
      channelId: ctx.channelId,
      testId: r.testId,
      stepId: r.stepId,
      footageId: r.footageId,
      referenceFootageId: r.referenceFootageId ?? null,
      kind: r.kind,
      status: 'done',
      params: r.params,
      softwareVersion: softwareVersion(),
      results: r.results,
      frameKey: await store(r.preview, 'jpg'),
      referenceFrameKey: r.referencePreview ? await store(r.referencePreview, 'jpg') : null,
      differenceMapKey: r.differenceMap ? await store(r.differenceMap, 'png') : null,
      requestedBy: ctx.people['dario.fenwick'],
      createdAt: r.at,
      startedAt: r.at,
      finishedAt: new Date(+r.at + 2000),
    },
    { transaction: ctx.transaction },
  );
}

const baseParams = (region: ReadoutRegion | null): ReadoutParams => stillReadoutParams({ region });

/** Noise readouts of every step of an ISO sweep, on frames whose noise follows `sigmaAt`. */
async function measureSweep(ctx: DemoContext, test: Test, steps: TestStep[], firmware: '3.0' | '3.1', when: Date, prefix: string) {
  const region = greyPatchRegion();
  await test.update({ readoutRegion: region }, { transaction: ctx.transaction });
  const grid = { cols: 6, rows: 4, patch: null };
  // Frames and figures first (main thread), encoding overlapping on sharp's threads; rows after.
  const measured = steps.map((step, i) => {
    const sigma = sigmaAt(step.iso!, firmware);
    const frame = synthChartFrame({ width: W, height: H, noiseSigma: sigma, chromaNoiseSigma: sigma * 0.45, seed: 100 + i + (firmware === '3.0' ? 50 : 0) }).frame;
    return {
      step,
      encoded: encode(frame),
      figures: noiseFigures(frame, { region, grid: null, transfer: 'srgb' }),
      // An earlier run with a 6×4 grid over the whole chart (headline: the patch nearest mid grey),
      // before the region was drawn on the grey patch: kept as history.
      earlier: step.iso === 800 ? noiseFigures(frame, { region: chartRegion(), grid, transfer: 'srgb' }) : null,
    };
  });
  for (const [i, m] of measured.entries()) {
    const at = new Date(+when + i * 60_000);
    const { footage, preview } = await frameGrab(ctx, test.episodeId, m.step.id, `${prefix}-ISO${String(m.step.iso).padStart(4, '0')}.png`, m.encoded, at);
    if (m.earlier) {
      await readout(ctx, { testId: test.id, stepId: m.step.id, footageId: footage.id, kind: 'noise', params: { ...baseParams(chartRegion()), grid }, results: m.earlier, preview, at: new Date(+at + 5 * 60_000) });
    }
    await readout(ctx, { testId: test.id, stepId: m.step.id, footageId: footage.id, kind: 'noise', params: baseParams(region), results: m.figures, preview, at: new Date(+at + 2 * hour) });
  }
  await Activity.create(
    { channelId: ctx.channelId, actorId: ctx.people['dario.fenwick'], subjectType: 'test', subjectId: test.id, episodeId: test.episodeId, action: 'readouts.requested', details: { kind: 'noise', readouts: steps.length, skipped: 0 }, createdAt: new Date(+when + 2 * hour) },
    { transaction: ctx.transaction },
  );
}

/**
 * Stops between the reference exposure and the point where the invented chart's white patch
 * would clip: the demo camera keeps two stops of headroom above the chart, so the bracket clips
 * only at +3, and the grade brings every frame to the same level (noise at capture grows with it).
 */
const BRACKET_HEADROOM_STOPS = 2;
/** σ of linear luma at capture for the bracket (before the grade's gain): invented. */
const BRACKET_SIGMA = 0.0008;

/**
 * A bracket frame as the grade delivers it: shot `offset` stops off and pulled back; highlights
 * that clipped at capture are graded to white (as colourists usually do), shadows that reached
 * the floor stay black.
 */
function bracketFrame(offset: number, seed: number): Frame {
  const opts = { width: W, height: H, noiseSigma: BRACKET_SIGMA, chromaNoiseSigma: BRACKET_SIGMA * 0.45, seed, exposureOffsetStops: offset - BRACKET_HEADROOM_STOPS };
  const graded = synthChartFrame(opts).frame;
  if (offset - BRACKET_HEADROOM_STOPS > 0) {
    const captured = synthChartFrame({ ...opts, recover: false }).frame;
    const max = 65535;
    for (let i = 0; i < graded.data.length; i++) if (captured.data[i] >= max) graded.data[i] = max;
  }
  return graded;
}

/** Recovery readouts of a latitude bracket: every step against the 0-stop frame. */
async function measureBracket(ctx: DemoContext, test: Test, steps: TestStep[], when: Date) {
  const region = greyPatchRegion();
  await test.update({ readoutRegion: region }, { transaction: ctx.transaction });
  const zero = steps.find((s) => Math.abs(Number(s.offsetStops)) < 1e-6)!;
  const made = steps.map((step, i) => {
    const frame = bracketFrame(Number(step.offsetStops), 300 + i);
    return { step, frame, encoded: encode(frame) };
  });
  const frames = new Map<string, { frame: Frame; footageId: string; preview: Buffer }>();
  for (const [i, { step, frame, encoded }] of made.entries()) {
    const offset = Number(step.offsetStops);
    const sign = offset > 0 ? '+' : offset < 0 ? '−' : '±';
    const { footage, preview } = await frameGrab(ctx, test.episodeId, step.id, `bracket-${sign}${Math.abs(offset)}-graded.png`, encoded, new Date(+when + i * 60_000));
    frames.set(step.id, { frame, footageId: footage.id, preview });
  }
  const reference = frames.get(zero.id)!;
  for (const [i, step] of steps.entries()) {
    const own = frames.get(step.id)!;
    const { results, differenceMap } = await recoveryFigures(own.frame, reference.frame, { region, transfer: 'srgb', stride: null });
    await readout(ctx, {
      testId: test.id,
      stepId: step.id,
      footageId: own.footageId,
      referenceFootageId: reference.footageId,
      kind: 'recovery',
      params: { ...baseParams(region), referenceTransfer: 'srgb', referenceStepId: zero.id },
      results,
      preview: own.preview,
      referencePreview: reference.preview,
      differenceMap,
      at: new Date(+when + 3 * hour + i * 30_000),
    });
  }
}

const KIT = { minFNumber: 1.4, maxFNumber: 22, ndDensities: [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1, 2.4], shutterAngles: [180], lightsDimmable: false, lightDownStops: 0, lightUpStops: 0 };
const PRIORITY = ['nd', 'aperture', 'shutter', 'light'];
const BASE = { fNumber: 2.8, shutter: { kind: 'angle', angleDeg: 180 }, fps: 25, ndDensity: 0.6 };

/** A test with its generated steps (all shot) and spec sheet, on the baseline episode. */
async function shotTest(ctx: DemoContext, episodeId: string, kind: TestKind, name: string, position: number, inputs: Record<string, unknown>, shotAt: Date, notes: Record<string, [string, number]>) {
  const { transaction } = ctx;
  const test = await Test.create({ episodeId, kind, name, position, inputs, secondsPerStep: 6 }, { transaction });
  const steps: TestStep[] = [];
  for (const d of planSteps(kind, inputs)) {
    const key = kind === 'iso_sweep' ? String(d.iso) : String(d.offsetStops);
    const [observation, rating] = notes[key] ?? ['', null];
    const planned = d.planned as { iso?: number; fNumber?: number; shutterAngleDeg?: number; ndDensity?: number };
    steps.push(
      await TestStep.create(
        {
          testId: test.id,
          index: d.index,
          label: d.label,
          iso: d.iso,
          offsetStops: d.offsetStops,
          planned: d.planned,
          actual: { iso: planned.iso ?? d.iso ?? 800, fNumber: planned.fNumber ?? 2.8, shutterAngleDeg: planned.shutterAngleDeg ?? 180, ndDensity: planned.ndDensity ?? 0, lightChangeStops: 0 },
          shotAt: new Date(+shotAt + d.index * 4 * 60_000),
          shotById: ctx.people['ilse.marrow'],
          observation,
          rating,
          plannedSeconds: 6,
          version: 2,
        },
        { transaction },
      ),
    );
  }
  await SpecSheetLine.bulkCreate(
    specSheetDraftsFor(kind, inputs).map((l) => ({ testId: test.id, key: l.key, label: l.label, value: l.value || BASELINE_LINES[l.key] || '', checked: true, inDescription: l.inDescription, required: l.required, position: l.position, custom: false })),
    { transaction },
  );
  await Activity.create({ channelId: ctx.channelId, actorId: ctx.people['ilse.marrow'], subjectType: 'test', subjectId: test.id, episodeId, action: 'test.created', toValue: name, details: { kind, steps: steps.length } }, { transaction });
  return { test, steps };
}

const BASELINE_LINES: Record<string, string> = { ...K7_SWEEP_LINES, body: 'Korvala K7 Mark II, firmware 3.0', scene_chart: 'Grey card and a 24-patch chart' };

/** Readouts of the demo (see the file comment). Runs after the test plans step. */
export const demoReadouts: DemoStep = async (ctx) => {
  const { transaction, now } = ctx;
  const started = performance.now();
  const cpu = process.cpuUsage();

  // 1. The K7 re-test in Grade: frame grabs and noise readouts of its sweep (made by the plans step).
  const k7 = await Test.findOne({ where: { episodeId: ctx.episodes.k7iso, kind: 'iso_sweep' }, order: [['position', 'ASC']], transaction });
  if (k7) {
    const steps = await TestStep.findAll({ where: { testId: k7.id }, order: [['index', 'ASC']], transaction });
    await measureSweep(ctx, k7, steps, '3.1', new Date(+now - 3 * day), 'K7-fw31');
  }

  // 2. The published baseline: same body on firmware 3.0, an ISO sweep and a latitude bracket.
  const live = await Episode.count({ where: { channelId: ctx.channelId, stage: 'live' }, transaction });
  const shootDate = new Date(+now - 70 * day);
  const episode = await Episode.create(
    {
      channelId: ctx.channelId,
      title: DEMO_BASELINE_TITLE,
      stage: 'live',
      position: live,
      hostId: ctx.people['ilse.marrow'],
      editorId: ctx.people['dario.fenwick'],
      targetPublishWeek: mondayOf(new Date(+now - 56 * day)),
      shootDate: shootDate.toISOString().slice(0, 10),
      publicUrl: 'https://video.example/watch/k7-firmware-30-baseline',
      createdById: ctx.people['ilse.marrow'],
    },
    { transaction },
  );
  ctx.episodes.baseline = episode.id;
  for (const g of ['k7', 'zoom']) await EpisodeGear.create({ episodeId: episode.id, gearId: ctx.gear[g] }, { transaction });
  // It went out eight weeks ago on an approved slot (17:00 in Berlin, summer time).
  const published = new Date(+now - 56 * day);
  await PublishSlot.create(
    {
      episodeId: episode.id,
      startsAt: new Date(Date.UTC(published.getUTCFullYear(), published.getUTCMonth(), published.getUTCDate(), 15, 0)),
      zone: 'Europe/Berlin',
      status: 'approved',
      proposedById: ctx.people['dario.fenwick'],
      decidedById: ctx.people['noor.halvard'],
      decidedAt: new Date(+now - 60 * day),
      createdAt: new Date(+now - 61 * day),
    },
    { transaction },
  );
  await Activity.create({ channelId: ctx.channelId, actorId: ctx.people['ilse.marrow'], subjectType: 'episode', subjectId: episode.id, episodeId: episode.id, action: 'episode.created', toValue: 'plan', details: {} }, { transaction });

  const sweep = await shotTest(
    ctx,
    episode.id,
    'iso_sweep',
    'ISO sweep 400–3200 in thirds (firmware 3.0)',
    0,
    { baseIso: 800, minIso: 400, maxIso: 3200, step: 'third', base: BASE, kit: KIT, priority: PRIORITY },
    new Date(+shootDate + 10 * hour),
    {
      '800': ['Base ISO: clean.', 5],
      '1250': ['Grain visible in the shadows.', 4],
      '1600': ['Noisy shadows; chroma blotches.', 3],
      '3200': ['Too noisy for anything but the web.', 1],
    },
  );
  await measureSweep(ctx, sweep.test, sweep.steps, '3.0', new Date(+shootDate + 2 * day), 'K7-fw30');

  const bracket = await shotTest(
    ctx,
    episode.id,
    'latitude_bracket',
    'Latitude bracket ±3 (firmware 3.0)',
    1,
    { baseIso: 800, base: { ...BASE, ndDensity: 0.9 }, maxOffsetStops: 3, step: 'full', kit: KIT, priority: PRIORITY },
    new Date(+shootDate + 13 * hour),
    {
      '-3': ['Pushed three stops: noise everywhere, blacks crushed.', 1],
      '-2': ['Muddy shadows after the push.', 2],
      '-1': ['Fine after the grade.', 4],
      '0': ['Reference.', 5],
      '1': ['Holds well; the white patch is at its limit.', 4],
      '2': ['Brightest patches flat after pulling back.', 2],
      '3': ['Highlights gone.', 1],
    },
  );
  await measureBracket(ctx, bracket.test, bracket.steps, new Date(+shootDate + 2 * day));
  if (process.env.DEMO_TIMING) console.log(`[demo] readouts seeded in ${Math.round(performance.now() - started)} ms (CPU ${Math.round((process.cpuUsage(cpu).user + process.cpuUsage(cpu).system) / 1000)} ms)`);
};
