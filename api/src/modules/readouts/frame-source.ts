// Frames for readouts from stored footage: a still (PNG, JPEG, TIFF) is decoded as it is; a video
// (or a DPX still, which sharp cannot read) goes through ffmpeg, which writes the frame at the
// chosen time as a 16-bit RGB PNG that `decodeFrame` then reads.
//
// Why not plain `ffmpeg -ss T -i F -frames:v 1 -pix_fmt rgb48be out.png`: on ffmpeg 5.1 that path
// converts limited-range ("video range") Y′CbCr to 16-bit RGB WITHOUT expanding the range
// (a mid grey coded Y′ = 126 comes out as 126/255 instead of 128/255; checked in
// frame-source.test.ts). The zscale filter (zimg) converts with the stream's own matrix and range,
// so codes arrive full range as the readout engine expects. Untagged streams get the usual
// assumption (BT.709 from 720 lines up, BT.601 below).
import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { InvalidInputError } from '@midgray/shared';
import { decodeFrame, type Frame } from './measure/index.ts';

const run = promisify(execFile);

/** Formats sharp decodes directly (no time: a still is its own frame). */
const SHARP_FORMATS = new Set(['png', 'jpeg', 'tiff']);
/** Still formats that need ffmpeg to decode. */
const FFMPEG_STILLS = new Set(['dpx']);

/** True when footage of `format` (the sniffed format of the footage row) is a moving picture. */
export function isVideoFormat(format: string): boolean {
  return !SHARP_FORMATS.has(format) && !FFMPEG_STILLS.has(format);
}

/** What ffprobe tells about the first video stream, as far as frame extraction needs it. */
export interface VideoStreamInfo {
  width: number | null;
  height: number | null;
  pixelFormat: string | null;
  colorSpace: string | null;
  colorRange: string | null;
  durationSeconds: number | null;
}

/** Reads the first video stream's size, pixel format, colour tags and duration with ffprobe. */
export async function probeVideoStream(path: string): Promise<VideoStreamInfo> {
  let stdout: string;
  try {
    ({ stdout } = await run(
      'ffprobe',
      ['-v', 'error', '-select_streams', 'v:0', '-show_entries', 'stream=width,height,pix_fmt,color_space,color_range,duration:format=duration', '-of', 'json', '--', path],
      { timeout: 60_000, maxBuffer: 4 * 1024 * 1024 },
    ));
  } catch (err) {
    throw new InvalidInputError(`ffprobe could not read the file: ${lastLine(err)}`, 'footage');
  }
  const out = JSON.parse(stdout) as { streams?: Record<string, string | number>[]; format?: { duration?: string } };
  const s = out.streams?.[0];
  if (!s) throw new InvalidInputError('the file has no video stream to take a frame from', 'footage');
  const known = (v: unknown) => (typeof v === 'string' && v && v !== 'unknown' ? v : null);
  const duration = Number(s.duration ?? out.format?.duration);
  return {
    width: typeof s.width === 'number' ? s.width : null,
    height: typeof s.height === 'number' ? s.height : null,
    pixelFormat: known(s.pix_fmt),
    colorSpace: known(s.color_space),
    colorRange: known(s.color_range),
    durationSeconds: Number.isFinite(duration) && duration > 0 ? duration : null,
  };
}

const ZSCALE_MATRIX: Record<string, string> = { bt709: '709', bt470bg: '470bg', smpte170m: '170m', bt2020nc: '2020_ncl' };

/**
 * The ffmpeg filter that turns the stream's pixels into full-range 16-bit RGB: zscale with the
 * stream's Y′CbCr matrix and range for Y′CbCr sources; nothing extra for RGB sources.
 */
export function extractionFilter(info: Pick<VideoStreamInfo, 'pixelFormat' | 'colorSpace' | 'colorRange' | 'height'>): string {
  const pix = info.pixelFormat ?? '';
  if (!/^yuv|^nv|^p0|^y2|^uyv|^yuyv|^v210|^ayuv/.test(pix)) return 'format=rgb48be';
  const matrix = ZSCALE_MATRIX[info.colorSpace ?? ''] ?? ((info.height ?? 0) >= 720 ? '709' : '170m');
  const full = pix.startsWith('yuvj') || info.colorRange === 'pc';
  return `zscale=matrixin=${matrix}:rangein=${full ? 'full' : 'limited'}:range=full,format=gbrp16le,format=rgb48be`;
}

/** The time to take a frame at: the one asked for (checked against the duration) or the middle. */
export function frameTime(requested: number | null | undefined, durationSeconds: number | null): number {
  if (requested !== null && requested !== undefined) {
    if (durationSeconds !== null && requested >= durationSeconds) {
      throw new InvalidInputError(`the video is ${durationSeconds.toFixed(2)} s long; pick a frame time before that`, 'frameTimeSeconds');
    }
    return requested;
  }
  return durationSeconds !== null ? durationSeconds / 2 : 0;
}

/** Runs ffmpeg to write the frame at `seconds` (null for a still) as a 16-bit PNG; returns its decoded pixels. */
export async function extractFrame(path: string, seconds: number | null, info: VideoStreamInfo): Promise<Frame> {
  const dir = await mkdtemp(join(tmpdir(), 'midgray-frame-'));
  const out = join(dir, 'frame.png');
  try {
    const seek = seconds !== null ? ['-ss', seconds.toFixed(3)] : [];
    await run('ffmpeg', ['-v', 'error', '-nostdin', ...seek, '-i', path, '-frames:v', '1', '-vf', extractionFilter(info), '-pix_fmt', 'rgb48be', '-y', out], {
      timeout: 300_000,
      maxBuffer: 4 * 1024 * 1024,
    });
    return await decodeFrame(out);
  } catch (err) {
    if (err instanceof InvalidInputError) throw err;
    if ((err as { code?: string }).code === 'ERR_INPUT_FILE_MISSING' || /missing|no such/i.test(String((err as Error).message))) {
      throw new InvalidInputError(`ffmpeg found no frame at ${seconds?.toFixed(2) ?? 0} s`, 'frameTimeSeconds');
    }
    throw new InvalidInputError(`ffmpeg could not take a frame from the file: ${lastLine(err)}`, 'footage');
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** A frame and where it came from. */
export interface LoadedFrame {
  frame: Frame;
  /** Seconds into the video; null for a still. */
  seconds: number | null;
  isVideo: boolean;
}

/**
 * Decodes the frame of a stored file: stills as they are, videos at `requestedSeconds` (default
 * the middle, from `knownDuration` or ffprobe).
 */
export async function loadFrame(path: string, format: string, requestedSeconds: number | null | undefined, knownDuration: number | null = null): Promise<LoadedFrame> {
  if (SHARP_FORMATS.has(format)) {
    try {
      return { frame: await decodeFrame(path), seconds: null, isVideo: false };
    } catch (err) {
      if (err instanceof InvalidInputError) throw err;
      throw new InvalidInputError(`the image could not be decoded: ${lastLine(err)}`, 'footage');
    }
  }
  const info = await probeVideoStream(path);
  if (FFMPEG_STILLS.has(format)) return { frame: await extractFrame(path, null, info), seconds: null, isVideo: false };
  const seconds = frameTime(requestedSeconds, info.durationSeconds ?? knownDuration);
  return { frame: await extractFrame(path, seconds, info), seconds, isVideo: true };
}

let ffmpegVersion: Promise<string | null> | null = null;
/** "ffmpeg 5.1.9-…" from `ffmpeg -version`, read once; null when ffmpeg is missing. */
export function ffmpegVersionLine(): Promise<string | null> {
  ffmpegVersion ??= run('ffmpeg', ['-version'], { timeout: 10_000 })
    .then(({ stdout }) => {
      const m = /^ffmpeg version (\S+)/.exec(stdout);
      return m ? `ffmpeg ${m[1]}` : null;
    })
    .catch(() => null);
  return ffmpegVersion;
}

function lastLine(err: unknown): string {
  const e = err as { stderr?: string; message?: string };
  const text = (e.stderr || e.message || String(err)).trim();
  const line = text.split('\n').filter(Boolean).slice(-1)[0] ?? 'unknown error';
  // Server paths stay on the server: the message is stored and shown to people.
  return line.replace(/(?:\/[\w.@+-]+)+\/?/g, 'the file').slice(0, 300);
}
