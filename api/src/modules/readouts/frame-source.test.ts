// Frame extraction through ffmpeg against clips made with ffmpeg's own test sources.
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InvalidInputError } from '@midgray/shared';
import { extractionFilter, frameTime, isVideoFormat, loadFrame } from './frame-source.ts';
import { maxCode, type Frame } from './measure/index.ts';

const run = promisify(execFile);
let dir: string;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'midgray-frames-'));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

async function ffmpeg(args: string[]) {
  await run('ffmpeg', ['-v', 'error', '-y', ...args], { timeout: 120_000 });
}

/** Mean code of channel `c` over the whole frame, as a fraction of full scale. */
function meanOf(frame: Frame, c: number): number {
  let sum = 0;
  for (let i = c; i < frame.data.length; i += 3) sum += frame.data[i];
  return sum / (frame.data.length / 3) / maxCode(frame);
}

describe('frames taken from video', () => {
  it('when a BT.709 limited-range clip holds mid grey, then the frame comes back full range, 16-bit', async () => {
    // The encoder stores RGB 128/255 as Y′ = 16 + 219·(128/255) ≈ 125.9 → 126 (ITU-R BT.709-6 part 4,
    // 8-bit quantisation of E′Y); expanding back gives (126 − 16) / 219 = 0.50228 of full scale.
    const clip = join(dir, 'grey709.mp4');
    await ffmpeg(['-f', 'lavfi', '-i', 'color=c=0x808080:s=320x180:d=2:r=24', '-c:v', 'libx264', '-pix_fmt', 'yuv420p', '-color_primaries', 'bt709', '-color_trc', 'bt709', '-colorspace', 'bt709', '-color_range', 'tv', clip]);
    const { frame, seconds, isVideo } = await loadFrame(clip, 'isobmff', null);
    expect(isVideo).toBe(true);
    expect(seconds).toBeCloseTo(1, 2); // the middle of a 2 s clip
    expect(frame.bitDepth).toBe(16);
    expect([frame.width, frame.height]).toEqual([320, 180]);
    for (const c of [0, 1, 2]) expect(meanOf(frame, c)).toBeCloseTo(110 / 219, 3);
  });

  it('when the clip is untagged and HD-sized, then BT.709 coefficients are assumed (a saturated red stays red)', async () => {
    // Red encoded with the BT.709 matrix and decoded with it returns R = 192/255, G ≈ B ≈ 0; decoded
    // with the BT.601 matrix instead (ITU-R BT.601 luma weights 0.299/0.587/0.114 against BT.709's
    // 0.2126/0.7152/0.0722) R comes back near 175/255 (tried with ffmpeg 5.1's zscale), so R tells them apart.
    const clip = join(dir, 'red-untagged.mp4');
    await ffmpeg(['-f', 'lavfi', '-i', 'color=c=0xC00000:s=1280x720:d=1:r=24', '-vf', 'scale=out_color_matrix=bt709:out_range=tv', '-c:v', 'libx264', '-pix_fmt', 'yuv444p', '-qp', '0', clip]);
    const { frame } = await loadFrame(clip, 'isobmff', 0.5);
    expect(meanOf(frame, 0)).toBeCloseTo(0xc0 / 255, 2);
    expect(meanOf(frame, 1)).toBeLessThan(0.01);
    expect(meanOf(frame, 2)).toBeLessThan(0.01);
  });

  it('takes the frame at the time asked for, the middle by default, and refuses a time past the end', async () => {
    // Three seconds: red, then green, then blue.
    const clip = join(dir, 'rgb.mp4');
    await ffmpeg([
      '-f', 'lavfi', '-i', 'color=c=red:s=160x90:d=1:r=24',
      '-f', 'lavfi', '-i', 'color=c=lime:s=160x90:d=1:r=24',
      '-f', 'lavfi', '-i', 'color=c=blue:s=160x90:d=1:r=24',
      '-filter_complex', '[0][1][2]concat=n=3:v=1', '-c:v', 'libx264', '-pix_fmt', 'yuv420p', clip,
    ]);
    const dominant = (f: Frame) => [0, 1, 2].reduce((best, c) => (meanOf(f, c) > meanOf(f, best) ? c : best), 0);
    expect(dominant((await loadFrame(clip, 'isobmff', null)).frame)).toBe(1); // 1.5 s: green
    expect(dominant((await loadFrame(clip, 'isobmff', 0.4)).frame)).toBe(0);
    expect(dominant((await loadFrame(clip, 'isobmff', 2.6)).frame)).toBe(2);
    await expect(loadFrame(clip, 'isobmff', 7)).rejects.toThrow(/3\.00 s long/);
  });

  it('when the file is not a video, then the error says so in words (no server path)', async () => {
    const junk = join(dir, 'junk.mov');
    await writeFile(junk, 'not a movie at all');
    const err = await loadFrame(junk, 'isobmff', null).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InvalidInputError);
    expect((err as Error).message).toMatch(/ffprobe could not read the file/);
    expect((err as Error).message).not.toContain(dir);
  });
});

describe('frames from stills', () => {
  it('decodes a 16-bit PNG as it is, with no frame time', async () => {
    const data = new Uint16Array(4 * 2 * 3).fill(40_000);
    const png = await sharp(data, { raw: { width: 4, height: 2, channels: 3 } }).toColourspace('rgb16').png().toBuffer();
    const path = join(dir, 'still.png');
    await writeFile(path, png);
    const { frame, seconds, isVideo } = await loadFrame(path, 'png', 12);
    expect([seconds, isVideo, frame.bitDepth]).toEqual([null, false, 16]);
    expect(Array.from(frame.data.slice(0, 3))).toEqual([40_000, 40_000, 40_000]);
  });

  it('knows which formats are moving pictures', () => {
    expect(['png', 'jpeg', 'tiff', 'dpx'].map(isVideoFormat)).toEqual([false, false, false, false]);
    expect(['isobmff', 'matroska', 'mxf', 'avi'].map(isVideoFormat)).toEqual([true, true, true, true]);
  });
});

describe('the extraction filter', () => {
  it('uses the stream’s matrix and range when tagged, BT.709 from 720 lines and BT.601 below when not', () => {
    expect(extractionFilter({ pixelFormat: 'yuv420p', colorSpace: 'bt709', colorRange: 'tv', height: 480 })).toContain('matrixin=709:rangein=limited');
    expect(extractionFilter({ pixelFormat: 'yuv422p10le', colorSpace: null, colorRange: null, height: 2160 })).toContain('matrixin=709:rangein=limited');
    expect(extractionFilter({ pixelFormat: 'yuv420p', colorSpace: null, colorRange: null, height: 576 })).toContain('matrixin=170m');
    expect(extractionFilter({ pixelFormat: 'yuvj420p', colorSpace: 'bt470bg', colorRange: null, height: 1080 })).toContain('matrixin=470bg:rangein=full');
    expect(extractionFilter({ pixelFormat: 'rgb48le', colorSpace: null, colorRange: null, height: 1080 })).toBe('format=rgb48be');
  });

  it('picks the middle by default and refuses a time at or past the end', () => {
    expect(frameTime(undefined, 10)).toBe(5);
    expect(frameTime(null, null)).toBe(0);
    expect(frameTime(2.5, 10)).toBe(2.5);
    expect(() => frameTime(10, 10)).toThrow(InvalidInputError);
  });
});
