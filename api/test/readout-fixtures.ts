// Readout fixtures shared by the readout API tests and the route matrix: a test with a frame grab
// on disk and a finished readout whose images exist, made straight in the database and storage.
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import sharp from 'sharp';
import { Footage, Readout } from '@midgray/db';
import { stillReadoutParams, type ReadoutParams } from '@midgray/shared';
import { noiseFigures, softwareVersion } from '../src/modules/readouts/readout-figures.ts';
import { synthChartFrame, type Frame } from '../src/modules/readouts/measure/index.ts';
import { readoutImageKey, writeStored } from '../src/modules/readouts/storage.ts';
import type { Client } from './helpers.ts';
import { ISO_SWEEP_INPUT, makeEpisode } from './plan-fixtures.ts';

/** The storage folder startTestApp gives the app. */
export const storageOf = (ctx: { mailboxDir: string }) => join(ctx.mailboxDir, 'storage');

/** A 16-bit PNG of `frame` (what the frame extractor writes). */
export function pngOf(frame: Frame): Promise<Buffer> {
  const image = sharp(frame.data, { raw: { width: frame.width, height: frame.height, channels: 3 } });
  return (frame.bitDepth === 16 ? image.toColourspace('rgb16') : image).png({ compressionLevel: 1 }).toBuffer();
}

/** Stores `bytes` as a footage file of `stepId` (status verified), like a finished upload. */
export async function storeFootage(
  storageDir: string,
  row: { channelId: string; episodeId: string; stepId: string | null; kind: 'frame_grab' | 'graded_render' | 'camera_original'; originalName: string; format: string; uploaderId?: string | null; probe?: object | null },
  bytes: Buffer,
) {
  const uploadId = randomBytes(16).toString('hex');
  const storageKey = `uploads/${uploadId}`;
  await writeStored(storageDir, storageKey, bytes);
  return Footage.create({ ...row, uploadId, status: 'verified', sizeBytes: bytes.length, storageKey, probe: row.probe ?? null });
}

/** Parameters of a plain noise readout (centre tenth, sRGB, default thresholds). */
export const NOISE_PARAMS: ReadoutParams = stillReadoutParams();

/**
 * An episode with two ISO sweep tests made by `host`; the first step of the first has a frame grab
 * and a done readout with all three images on disk. Returns their ids.
 */
export async function readoutScene(opts: { channelId: string; host: Client; storageDir: string; title?: string }) {
  const episode = await makeEpisode(opts.channelId, opts.title ?? 'Readout scene');
  const tests = [];
  for (const name of ['Sweep A', 'Sweep B']) {
    const created = await opts.host.post(`/api/episodes/${episode.id}/tests`, { kind: 'iso_sweep', name, inputs: ISO_SWEEP_INPUT });
    if (created.status !== 201) throw new Error(`readout scene: creating a test failed: ${created.status} ${JSON.stringify(created.body)}`);
    tests.push(created.body as { id: string; steps: { id: string; iso: number }[] });
  }
  const step = tests[0].steps[0];
  const chart = synthChartFrame({ width: 96, height: 54, noiseSigma: 0.01, seed: 3 });
  const footage = await storeFootage(
    opts.storageDir,
    { channelId: opts.channelId, episodeId: episode.id, stepId: step.id, kind: 'frame_grab', originalName: 'grab-iso100.png', format: 'png', uploaderId: opts.host.userId },
    await pngOf(chart.frame),
  );
  const readout = await Readout.create({
    channelId: opts.channelId,
    testId: tests[0].id,
    stepId: step.id,
    footageId: footage.id,
    kind: 'noise',
    status: 'done',
    params: NOISE_PARAMS,
    softwareVersion: softwareVersion(),
    results: noiseFigures(chart.frame, { region: null, grid: null, transfer: 'srgb' }),
    requestedBy: opts.host.userId,
    startedAt: new Date(),
    finishedAt: new Date(),
  });
  const jpeg = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#777' } }).jpeg().toBuffer();
  const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#123' } }).png().toBuffer();
  await readout.update({
    frameKey: await writeStored(opts.storageDir, readoutImageKey(readout.id, 'frame.jpg'), jpeg),
    referenceFrameKey: await writeStored(opts.storageDir, readoutImageKey(readout.id, 'reference.jpg'), jpeg),
    differenceMapKey: await writeStored(opts.storageDir, readoutImageKey(readout.id, 'difference-map.png'), png),
  });
  return { episodeId: episode.id, testId: tests[0].id, otherTestId: tests[1].id, stepId: step.id, footageId: footage.id, readoutId: readout.id };
}
