// Readouts end to end: frames arrive through the real tus endpoint, readouts run as pg-boss jobs
// (a worker on this test's own queue schema), and the stored results are read back through the
// API. Frames are synthetic charts (invented data) whose noise is known.
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Footage, Readout } from '@midgray/db';
import { mixedSettingsNote, type CompareDto, type NoiseResults, type ReadoutDto, type RecoveryResults, type RunReadoutsResultDto, type TestDto, type TestReadoutsDto } from '@midgray/shared';
import { Jobs } from '../src/jobs/jobs.ts';
import { READOUT_STALE_HOURS, registerReadoutJob, sweepStaleReadouts } from '../src/modules/readouts/readout-job.ts';
import { synthChartFrame, type SynthChartOptions } from '../src/modules/readouts/measure/index.ts';
import { channelWithTeam, newUser, startTestApp, type Client, type TestContext } from './helpers.ts';
import { BRACKET_INPUT, ISO_SWEEP_INPUT, makeEpisode } from './plan-fixtures.ts';
import { pngOf, storageOf, storeFootage } from './readout-fixtures.ts';

const run = promisify(execFile);
const JOBS_SCHEMA = 'readouts_api_test';
const W = 320;
const H = 180;

let ctx: TestContext;
let worker: Jobs;
let team: Awaited<ReturnType<typeof channelWithTeam>>['team'];
let channelId: string;
let outsider: Client;
let sweep: TestDto;
let bracket: TestDto;
let episodeId: string;
let tmp: string;

/** Uploads `bytes` through the tus endpoint (creation, then one PATCH) and returns the footage row. */
async function tusUpload(client: Client, meta: { episodeId: string; stepId: string; kind: string; filename: string }, bytes: Buffer) {
  const metadata = Object.entries(meta)
    .map(([k, v]) => `${k} ${Buffer.from(v).toString('base64')}`)
    .join(',');
  const created = await client.agent
    .post('/api/uploads')
    .set('Tus-Resumable', '1.0.0')
    .set('Upload-Length', String(bytes.length))
    .set('Upload-Metadata', metadata)
    .set('X-CSRF-Token', client.csrf);
  expect(created.status, created.text).toBe(201);
  const uploadId = String(created.headers.location).split('/').pop()!;
  const patched = await client.agent
    .patch(`/api/uploads/${uploadId}`)
    .set('Tus-Resumable', '1.0.0')
    .set('Upload-Offset', '0')
    .set('Content-Type', 'application/offset+octet-stream')
    .set('X-CSRF-Token', client.csrf)
    .send(bytes);
  expect(patched.status, patched.text).toBe(204);
  const footage = await Footage.findOne({ where: { uploadId } });
  expect(footage?.status).not.toBe('receiving');
  return footage!;
}

/** A synthetic chart frame as a 16-bit PNG (invented data). */
const chartPng = async (options: SynthChartOptions) => pngOf(synthChartFrame({ width: W, height: H, ...options }).frame);

/** Polls the test's readouts until no readout is queued or running. */
async function settled(testId: string, client: Client = team.editor): Promise<TestReadoutsDto> {
  const deadline = Date.now() + 45_000;
  for (;;) {
    const res = await client.get(`/api/tests/${testId}/readouts`).expect(200);
    const body = res.body as TestReadoutsDto;
    if (!body.steps.some((s) => s.pending)) return body;
    if (Date.now() > deadline) throw new Error('readouts did not finish in time');
    await new Promise((r) => setTimeout(r, 200));
  }
}

const stepAt = (t: TestDto, pick: (s: TestDto['steps'][number]) => boolean) => t.steps.find(pick)!;

beforeAll(async () => {
  ctx = await startTestApp({ env: { JOBS_SCHEMA } });
  // The worker: same code as the server's, on this test's queue schema and storage folder.
  worker = new Jobs(process.env.DATABASE_URL!, { schema: JOBS_SCHEMA, pollingIntervalSeconds: 0.5 });
  registerReadoutJob(worker, { sequelize: ctx.sequelize, storageDir: storageOf(ctx) });
  await worker.startWorkers();
  ({ team, channelId } = await channelWithTeam(ctx));
  outsider = await newUser(ctx, 'Olu Outsider');
  await outsider.post('/api/channels', { name: 'Another bench', timeZone: 'UTC' }).expect(201);
  const episode = await makeEpisode(channelId, 'Readout journey');
  episodeId = episode.id;
  sweep = (await team.host.post(`/api/episodes/${episodeId}/tests`, { kind: 'iso_sweep', name: 'Sweep 100–1600', inputs: ISO_SWEEP_INPUT }).expect(201)).body;
  bracket = (await team.host.post(`/api/episodes/${episodeId}/tests`, { kind: 'latitude_bracket', name: 'Bracket ±2', inputs: BRACKET_INPUT }).expect(201)).body;
  tmp = await mkdtemp(join(tmpdir(), 'midgray-readouts-'));
});

afterAll(async () => {
  await worker?.stop();
  await ctx?.close();
  if (tmp) await rm(tmp, { recursive: true, force: true });
});

describe('noise readouts of an ISO sweep', () => {
  // The region: the middle of the synthetic chart's L* 50 grey patch, in fractions of the frame.
  const chart = synthChartFrame({ width: W, height: H });
  const grey = chart.patches[21].rect;
  const region = { x: (grey.x + grey.w * 0.2) / W, y: (grey.y + grey.h * 0.2) / H, w: (grey.w * 0.6) / W, h: (grey.h * 0.6) / H };
  const greyLinear = chart.patches[21].linearRgb[1];
  let first: ReadoutDto;

  it('when an editor saves the region and runs the sweep, then each step with a frame is measured and stored', async () => {
    const iso100 = stepAt(sweep, (s) => s.iso === 100);
    const iso1600 = stepAt(sweep, (s) => s.iso === 1600);
    // Two frames through the real upload endpoint: clean at ISO 100, noisy at ISO 1600.
    await tusUpload(team.editor, { episodeId, stepId: iso100.id, kind: 'frame_grab', filename: 'sweep-iso100.png' }, await chartPng({ noiseSigma: 0.002, seed: 1 }));
    await tusUpload(team.editor, { episodeId, stepId: iso1600.id, kind: 'frame_grab', filename: 'sweep-iso1600.png' }, await chartPng({ noiseSigma: 0.03, seed: 2 }));

    await team.editor.put(`/api/tests/${sweep.id}/readout-region`, { region }).expect(200);
    const ran = await team.editor.post(`/api/tests/${sweep.id}/readouts`, {}).expect(202);
    const result = ran.body as RunReadoutsResultDto;
    expect(result.queued.map((r) => r.stepId).sort()).toEqual([iso100.id, iso1600.id].sort());
    expect(result.queued.every((r) => r.status === 'queued' || r.status === 'running' || r.status === 'done')).toBe(true);
    expect(result.skipped.map((s) => s.reason)).toEqual(['no footage yet', 'no footage yet', 'no footage yet']);

    const t = await settled(sweep.id);
    const s100 = t.steps.find((s) => s.id === iso100.id)!;
    const s1600 = t.steps.find((s) => s.id === iso1600.id)!;
    expect(s100.latest?.status).toBe('done');
    const r100 = s100.latest!.results as NoiseResults;
    const r1600 = s1600.latest!.results as NoiseResults;
    // Ground truth of the generator: mean = the patch's linear level, σ = the luma noise given.
    expect(Math.abs(r100.meanLinearLuma / greyLinear - 1)).toBeLessThan(0.01);
    expect(Math.abs(r1600.sigmaLinearLuma / 0.03 - 1)).toBeLessThan(0.05);
    expect(r100.snrDb!).toBeGreaterThan(20);
    expect(r1600.snrDb!).toBeLessThan(20);
    // Parameters and version travel with the figures.
    expect(s100.latest!.params).toMatchObject({ region, grid: null, transfer: 'srgb', transferFrom: 'auto', frameTimeSeconds: null, snrThresholdDb: 20 });
    expect(s100.latest!.softwareVersion).toMatch(/^readouts \d+\.\d+\.\d+; sharp /);
    expect(s100.latest!.footageName).toBe('sweep-iso100.png');
    expect(s100.latest!.requestedBy?.id).toBe(team.editor.userId);
    // The verdict with the channel's default threshold, shown with it.
    expect(t.verdict).toMatchObject({ kind: 'noise', ceilingIso: 100, stepsMeasured: 2, stepsTotal: 5, mixedSettings: [], thresholds: { snrThresholdDb: 20, deltaEThreshold: 2.5 } });
    expect(t.test.readoutRegion).toEqual(region);
    first = s100.latest!;

    const jpeg = await team.host.get(`/api/readouts/${first.id}/frame.jpg`).expect(200);
    expect(jpeg.headers['content-type']).toBe('image/jpeg');
    expect((await sharp(jpeg.body).metadata()).width).toBe(W);
  });

  it('when the same step is run again, then a new row is added and the old one is kept unchanged', async () => {
    const iso100 = stepAt(sweep, (s) => s.iso === 100);
    const before = await Readout.findByPk(first.id);
    const again = (await team.admin.post(`/api/steps/${iso100.id}/readouts`, { grid: { cols: 6, rows: 4, patch: null }, region: { x: chart.chartRegion.x / W, y: chart.chartRegion.y / H, w: chart.chartRegion.w / W, h: chart.chartRegion.h / H } }).expect(202)).body as RunReadoutsResultDto;
    expect(again.queued).toHaveLength(1);
    expect(again.queued[0].id).not.toBe(first.id);
    const t = await settled(sweep.id);
    const step = t.steps.find((s) => s.id === iso100.id)!;
    expect(step.history.map((r) => r.id)).toEqual([again.queued[0].id, first.id]);
    expect(step.latest!.id).toBe(again.queued[0].id);
    const latest = step.latest!.results as NoiseResults;
    expect(latest.headline).toBe('patch');
    expect(latest.patchIndex).toBe(21);
    expect(latest.grid!.patches).toHaveLength(24);
    const after = await Readout.findByPk(first.id);
    expect(after!.results).toEqual(before!.results);
    expect(after!.params).toEqual(before!.params);
    expect(await Readout.count({ where: { stepId: iso100.id } })).toBe(2);
    // That step is now measured on a grid over the whole chart, the others on the saved region: the verdict says so.
    expect(t.verdict.mixedSettings).toEqual(['region', 'grid']);
    expect(mixedSettingsNote(t.verdict.mixedSettings)).toBe('The steps were measured with different region, patch grid: run the readouts again on the whole test so every step is measured the same way.');
  });

  it('when the channel raises its SNR threshold, then the ceiling follows and is shown with the new threshold', async () => {
    const channel = (await team.admin.get(`/api/channels/${channelId}`).expect(200)).body as { version: number };
    await team.admin.patch(`/api/channels/${channelId}`, { version: channel.version, settings: { snrThresholdDb: 60 } }).expect(200);
    const t = (await team.host.get(`/api/tests/${sweep.id}/readouts`).expect(200)).body as TestReadoutsDto;
    expect(t.verdict.thresholds.snrThresholdDb).toBe(60);
    expect(t.verdict.ceilingIso).toBeNull();
    // The rows keep the threshold in force when they were requested.
    expect(t.steps.find((s) => s.iso === 100)!.latest!.params.snrThresholdDb).toBe(20);
    const now = (await team.admin.get(`/api/channels/${channelId}`).expect(200)).body as { version: number };
    await team.admin.patch(`/api/channels/${channelId}`, { version: now.version, settings: { snrThresholdDb: 20 } }).expect(200);
  });

  it('exports the readout table as CSV, one line per step, with the threshold and the host’s notes made safe', async () => {
    const iso100 = stepAt(sweep, (s) => s.iso === 100);
    const fresh = (await team.host.get(`/api/tests/${sweep.id}`).expect(200)).body as TestDto;
    const step = fresh.steps.find((s) => s.id === iso100.id)!;
    await team.host.patch(`/api/steps/${iso100.id}`, { version: step.version, observation: '=clean, "no" banding', rating: 4 }).expect(200);
    const res = await team.producer.get(`/api/tests/${sweep.id}/readouts.csv`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe('attachment; filename="readouts-sweep-100-1600.csv"');
    const lines = res.text.split('\r\n');
    expect(lines[0].split(',').slice(0, 6)).toEqual(['step', 'iso', 'offset_stops', 'snr_db', 'snr_threshold_db', 'meets_threshold']);
    expect(lines).toHaveLength(1 + 5 + 1); // header, 5 steps, the empty string after the final CRLF
    const line100 = lines.find((l) => l.includes(',100,'))!;
    const cells = line100.split(',');
    expect(Number(cells[3])).toBeGreaterThan(20);
    expect(cells[4]).toBe('20');
    expect(cells[5]).toBe('yes');
    expect(line100).toContain(`,4,"'=clean, ""no"" banding"`);
    // A step never measured has its plan columns and empty figures.
    const line400 = lines.find((l) => l.includes(',400,'))!;
    expect(line400.split(',')[3]).toBe('');
  });
});

describe('recovery readouts of a latitude bracket', () => {
  it('when the 0-stop, −1 and +2 frames are in, then ΔE00 against the 0-stop frame, noise and the difference map are stored', async () => {
    const zero = stepAt(bracket, (s) => s.offsetStops === 0);
    const plus2 = stepAt(bracket, (s) => s.offsetStops === 2);
    const minus1 = stepAt(bracket, (s) => s.offsetStops === -1);
    await tusUpload(team.editor, { episodeId, stepId: zero.id, kind: 'frame_grab', filename: 'bracket-0.png' }, await chartPng({ noiseSigma: 0.003, seed: 7 }));
    await tusUpload(team.editor, { episodeId, stepId: plus2.id, kind: 'frame_grab', filename: 'bracket+2.png' }, await chartPng({ noiseSigma: 0.003, seed: 8, exposureOffsetStops: 2 }));
    await tusUpload(team.editor, { episodeId, stepId: minus1.id, kind: 'frame_grab', filename: 'bracket-1.png' }, await chartPng({ noiseSigma: 0.003, seed: 9, exposureOffsetStops: -1 }));
    // Noise is compared on the middle of the L* 50 grey patch.
    const grey = synthChartFrame({ width: W, height: H }).patches[21].rect;
    await team.admin.put(`/api/tests/${bracket.id}/readout-region`, { region: { x: (grey.x + grey.w * 0.2) / W, y: (grey.y + grey.h * 0.2) / H, w: (grey.w * 0.6) / W, h: (grey.h * 0.6) / H } }).expect(200);
    const ran = (await team.editor.post(`/api/tests/${bracket.id}/readouts`, {}).expect(202)).body as RunReadoutsResultDto;
    expect(ran.queued).toHaveLength(3);
    expect(ran.skipped.map((s) => s.reason)).toEqual(['no frame grab or graded render yet', 'no frame grab or graded render yet']);
    expect(ran.queued.every((r) => r.kind === 'recovery' && r.params.referenceStepId === zero.id)).toBe(true);

    const t = await settled(bracket.id);
    const byOffset = (o: number) => t.steps.find((s) => s.offsetStops === o)!.latest!.results as RecoveryResults;
    expect(byOffset(0).meanDeltaE).toBe(0); // the reference against itself
    expect(byOffset(0).noiseRatio).toBe(1);
    expect(byOffset(2).meanDeltaE).toBeGreaterThan(2.5); // highlights flattened at capture
    expect(byOffset(-1).meanDeltaE).toBeLessThan(2.5);
    expect(byOffset(-1).noiseStops!).toBeGreaterThan(0.8); // pushed one stop: about twice the σ
    expect(t.verdict).toMatchObject({ kind: 'recovery', latitudeWindow: { minStops: -1, maxStops: 0, offsets: [-1, 0] }, stepsMeasured: 3 });

    const readout = t.steps.find((s) => s.offsetStops === 2)!.latest!;
    const map = await team.host.get(`/api/readouts/${readout.id}/difference-map.png`).expect(200);
    expect(map.headers['content-type']).toBe('image/png');
    const meta = await sharp(map.body).metadata();
    expect([meta.width, meta.height]).toEqual([byOffset(2).mapWidth, byOffset(2).mapHeight]);
    await team.host.get(`/api/readouts/${readout.id}/reference-frame.jpg`).expect(200);
  });

  it('refuses a recovery readout on an ISO sweep and a step of another test, saying why', async () => {
    const refused = await team.editor.post(`/api/tests/${sweep.id}/readouts`, { kind: 'recovery' }).expect(422);
    expect(refused.body.error.message).toMatch(/latitude bracket's steps with its 0-stop step/);
    const foreign = await team.editor.post(`/api/tests/${bracket.id}/readouts`, { stepIds: [sweep.steps[0].id] }).expect(422);
    expect(foreign.body.error.message).toMatch(/not part of "Bracket ±2"/);
  });
});

describe('frames taken from a video', () => {
  it('measures the middle frame of a camera original with BT.709 decoding, and a time past the end fails with the reason', async () => {
    const iso400 = stepAt(sweep, (s) => s.iso === 400);
    const clip = join(tmp, 'A001_C004.mov');
    await run('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', `color=c=0x808080:s=${W}x${H}:d=2:r=24`, '-c:v', 'libx264', '-pix_fmt', 'yuv420p', '-colorspace', 'bt709', '-color_range', 'tv', clip], { timeout: 60_000 });
    await tusUpload(team.host, { episodeId, stepId: iso400.id, kind: 'camera_original', filename: 'A001_C004.mov' }, await readFile(clip));
    await team.editor.post(`/api/steps/${iso400.id}/readouts`, {}).expect(202);
    let t = await settled(sweep.id);
    const latest = t.steps.find((s) => s.id === iso400.id)!.latest!;
    expect(latest.params).toMatchObject({ transfer: 'bt709', transferFrom: 'auto', frameTimeSeconds: 1 });
    expect(latest.softwareVersion).toMatch(/; ffmpeg \S+$/);
    const r = latest.results as NoiseResults;
    expect(r.sigmaLinearLuma).toBe(0); // a flat grey: no noise at all
    expect(r.snrDb).toBeNull();

    // The probe has not run (no footage workers here), so the length is only found by the job.
    await team.editor.post(`/api/steps/${iso400.id}/readouts`, { frameTimeSeconds: 5 }).expect(202);
    t = await settled(sweep.id);
    const failed = t.steps.find((s) => s.id === iso400.id)!.history[0];
    expect(failed.status).toBe('failed');
    expect(failed.error).toMatch(/A001_C004\.mov: the video is 2\.00 s long/);
    expect(t.steps.find((s) => s.id === iso400.id)!.latest!.id).toBe(latest.id);
  });
});

describe('who may do what', () => {
  it('hosts and producers read readouts but may not run them or set the region', async () => {
    for (const who of [team.host, team.producer]) {
      await who.get(`/api/episodes/${episodeId}/readouts`).expect(200);
      const run = await who.post(`/api/tests/${sweep.id}/readouts`, {}).expect(403);
      expect(run.body.error.message).toMatch(/needs editor or admin/);
      await who.put(`/api/tests/${sweep.id}/readout-region`, { region: null }).expect(403);
    }
    const tab = (await team.host.get(`/api/episodes/${episodeId}/readouts`).expect(200)).body as { canRun: boolean; tests: TestReadoutsDto[] };
    expect(tab.canRun).toBe(false);
    expect(tab.tests.map((t) => t.test.id)).toEqual([sweep.id, bracket.id]);
    const editorTab = (await team.editor.get(`/api/episodes/${episodeId}/readouts`).expect(200)).body as { canRun: boolean };
    expect(editorTab.canRun).toBe(true);
  });

  it('a member of another channel gets 404 for every readout path, never a hint', async () => {
    const [readout] = await Readout.findAll({ where: { testId: sweep.id }, limit: 1 });
    for (const path of [`/api/tests/${sweep.id}/readouts`, `/api/tests/${sweep.id}/readouts.csv`, `/api/episodes/${episodeId}/readouts`, `/api/readouts/${readout.id}/frame.jpg`, `/api/readouts/${readout.id}/difference-map.png`, `/api/steps/${sweep.steps[0].id}/frame.jpg`]) {
      const res = await outsider.get(path);
      expect(res.status, path).toBe(404);
    }
    await outsider.post(`/api/tests/${sweep.id}/readouts`, {}).expect(404);
    // Their own channel cannot reach these tests through the compare page either.
    const theirs = (await outsider.get('/api/auth/me').expect(200)).body.channels[0].id as string;
    await outsider.get(`/api/channels/${theirs}/readouts/compare?tests=${sweep.id},${bracket.id}`).expect(404);
  });

  it('a readout whose job was lost is closed by the sweep, so the step no longer waits for it', async () => {
    const iso200 = stepAt(sweep, (s) => s.iso === 200);
    const footage = await storeFootage(storageOf(ctx), { channelId, episodeId, stepId: null, kind: 'frame_grab', originalName: 'spare.png', format: 'png' }, await chartPng({ seed: 5 }));
    const lost = await Readout.create({ channelId, testId: sweep.id, stepId: iso200.id, footageId: footage!.id, kind: 'noise', status: 'queued', params: {}, softwareVersion: 'test', createdAt: new Date(Date.now() - (READOUT_STALE_HOURS + 1) * 3_600_000) });
    const fresh = await Readout.create({ channelId, testId: sweep.id, stepId: iso200.id, footageId: footage!.id, kind: 'noise', status: 'running', params: {}, softwareVersion: 'test', createdAt: new Date(Date.now() - 60_000) });
    expect(await sweepStaleReadouts(ctx.sequelize)).toBeGreaterThanOrEqual(1);
    await lost.reload();
    await fresh.reload();
    expect([lost.status, fresh.status]).toEqual(['failed', 'running']);
    expect(lost.error).toMatch(/job was lost/);
    await fresh.destroy();
  });

  it('a readout without a difference map answers 404 with a reason', async () => {
    const noise = await Readout.findOne({ where: { testId: sweep.id, status: 'done' } });
    const res = await team.host.get(`/api/readouts/${noise!.id}/difference-map.png`).expect(404);
    expect(res.body.error.message).toBe('This readout has no difference map');
  });
});

describe('comparing tests across episodes', () => {
  it('puts the curves of two sweeps side by side with their ceilings, and refuses tests of different kinds', async () => {
    const other = await makeEpisode(channelId, 'Second body');
    const sweep2 = (await team.host.post(`/api/episodes/${other.id}/tests`, { kind: 'iso_sweep', name: 'Second body sweep', inputs: ISO_SWEEP_INPUT }).expect(201)).body as TestDto;
    const s100 = stepAt(sweep2, (s) => s.iso === 100);
    await tusUpload(team.editor, { episodeId: other.id, stepId: s100.id, kind: 'frame_grab', filename: 'second-iso100.png' }, await chartPng({ noiseSigma: 0.05, seed: 11 }));
    await team.editor.post(`/api/tests/${sweep2.id}/readouts`, {}).expect(202);
    await settled(sweep2.id);

    const listed = (await team.host.get(`/api/channels/${channelId}/readouts/tests`).expect(200)).body as { id: string; stepsMeasured: number }[];
    expect(listed.find((t) => t.id === sweep2.id)?.stepsMeasured).toBe(1);
    const cmp = (await team.host.get(`/api/channels/${channelId}/readouts/compare?tests=${sweep.id},${sweep2.id}`).expect(200)).body as CompareDto;
    expect(cmp.readoutKind).toBe('noise');
    expect(cmp.series.map((s) => s.test.episodeTitle)).toEqual(['Readout journey', 'Second body']);
    expect(cmp.series[0].verdict.ceilingIso).toBe(100);
    expect(cmp.series[1].verdict.ceilingIso).toBeNull(); // σ 0.05 on a mid grey: under 20 dB
    expect(cmp.series[1].points.find((p) => p.iso === 100)!.snrDb!).toBeLessThan(20);
    expect(cmp.thresholds.snrThresholdDb).toBe(20);

    const mixed = await team.host.get(`/api/channels/${channelId}/readouts/compare?tests=${sweep.id},${bracket.id}`).expect(422);
    expect(mixed.body.error.message).toMatch(/Compare tests of the same kind/);
    await team.host.get(`/api/channels/${channelId}/readouts/compare?tests=${sweep.id}`).expect(400);
  });
});
