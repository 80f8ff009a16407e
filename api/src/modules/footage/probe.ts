// Reads a file with ffprobe (Debian's ffmpeg package) and makes a small thumbnail with ffmpeg +
// sharp. Commands get the server's own storage path as one argument (never through a shell).
import { execFile } from 'node:child_process';
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname } from 'node:path';
import { promisify } from 'node:util';
import sharp from 'sharp';
import { describePixelFormat, parseProbeRate, rationalFps, type ProbeSummary } from '@midgray/shared';

const run = promisify(execFile);

/** ffprobe's JSON (-show_format -show_streams), the parts we read. */
export interface FfprobeOutput {
  format?: { format_name?: string; duration?: string; bit_rate?: string; tags?: Record<string, string> };
  streams?: {
    codec_type?: string;
    codec_name?: string;
    codec_long_name?: string;
    profile?: string;
    width?: number;
    height?: number;
    r_frame_rate?: string;
    avg_frame_rate?: string;
    pix_fmt?: string;
    bits_per_raw_sample?: string;
    duration?: string;
    bit_rate?: string;
    tags?: Record<string, string>;
    disposition?: { attached_pic?: number };
  }[];
}

/** Runs ffprobe on `path`; returns its parsed JSON or throws with ffprobe's message. */
export async function ffprobe(path: string, timeoutMs = 60_000): Promise<FfprobeOutput> {
  try {
    const { stdout } = await run('ffprobe', ['-v', 'error', '-print_format', 'json', '-show_format', '-show_streams', '--', path], { timeout: timeoutMs, maxBuffer: 16 * 1024 * 1024 });
    return JSON.parse(stdout) as FfprobeOutput;
  } catch (err) {
    const e = err as { stderr?: string; message: string };
    throw new Error(`ffprobe could not read the file: ${(e.stderr || e.message).trim().split('\n').slice(-1)[0]}`);
  }
}

const num = (v: string | number | undefined | null) => {
  const n = typeof v === 'number' ? v : v ? Number(v) : NaN;
  return Number.isFinite(n) && n > 0 ? n : null;
};

/** True for ffprobe's still-image demuxers (image2, png_pipe, …): no frame rate or duration to speak of. */
const isStill = (formatName: string | undefined) => !!formatName && /(^|,)(image2|[a-z0-9]+_pipe)(,|$)/.test(formatName);

/** Reduces ffprobe's output to the values Midgray shows and compares (first video stream). */
export function summariseProbe(out: FfprobeOutput): ProbeSummary {
  const streams = out.streams ?? [];
  const video = streams.find((s) => s.codec_type === 'video' && !s.disposition?.attached_pic) ?? null;
  const still = isStill(out.format?.format_name);
  const pix = describePixelFormat(video?.pix_fmt);
  const rate = still ? null : (parseProbeRate(video?.r_frame_rate) ?? parseProbeRate(video?.avg_frame_rate));
  const rawBits = num(video?.bits_per_raw_sample);
  const timecode = out.format?.tags?.timecode ?? streams.map((s) => s.tags?.timecode).find(Boolean) ?? null;
  return {
    container: out.format?.format_name ?? null,
    codec: video?.codec_name ?? null,
    codecLongName: video?.codec_long_name ?? null,
    profile: video?.profile ?? null,
    width: video?.width ?? null,
    height: video?.height ?? null,
    frameRate: rate ? `${rate.num}/${rate.den}` : null,
    fps: rate ? rationalFps(rate) : null,
    bitDepth: rawBits ?? pix.bitDepth,
    chromaSubsampling: pix.chroma,
    pixelFormat: video?.pix_fmt ?? null,
    durationSeconds: still ? null : (num(out.format?.duration) ?? num(video?.duration)),
    bitrateBitsPerSecond: still ? null : (num(out.format?.bit_rate) ?? num(video?.bit_rate)),
    timecode,
    audioStreams: streams.filter((s) => s.codec_type === 'audio').length,
  };
}

/** Longest side of a thumbnail, in pixels. */
export const THUMBNAIL_PX = 480;

/**
 * Writes a JPEG thumbnail of one frame (10 % into a video, capped at 5 s; the image itself for
 * stills) to `outPath`. ffmpeg decodes and scales; sharp encodes.
 */
export async function writeThumbnail(path: string, outPath: string, durationSeconds: number | null): Promise<void> {
  const at = durationSeconds ? Math.min(5, durationSeconds * 0.1) : 0;
  const args = ['-v', 'error', ...(at > 0 ? ['-ss', at.toFixed(3)] : []), '-i', path, '-frames:v', '1', '-vf', `scale=${THUMBNAIL_PX}:${THUMBNAIL_PX}:force_original_aspect_ratio=decrease`, '-f', 'image2pipe', '-c:v', 'png', '-'];
  const { stdout } = await run('ffmpeg', args, { encoding: 'buffer', timeout: 120_000, maxBuffer: 64 * 1024 * 1024 });
  if (!stdout.length) throw new Error('ffmpeg produced no frame');
  const jpeg = await sharp(stdout).jpeg({ quality: 78, mozjpeg: true }).toBuffer();
  await mkdir(dirname(outPath), { recursive: true });
  await writeFile(outPath, jpeg);
}
