// Compares what ffprobe found in a file with the capture values of a test's spec sheet.
// Spec-sheet values are typed by people ("3840×2160 (UHD)", "23.976 fps", "10-bit", "4:2:2",
// "H.265 / HEVC in MOV"), so each value has a small reader; a value it cannot read is reported
// as not compared (with the reason), never guessed.
import type { FootageKind, ProbeComparedKey, ProbeSummary, SpecMismatch, SpecSkip } from './schemas/footage.ts';
import { parseBitrateMbps } from './test-plan.ts';

const MINUS = '\u2212';

/** Frame size in pixels. */
export interface Resolution {
  width: number;
  height: number;
}

// Named sizes people write instead of numbers. UHD: SMPTE ST 2036-1 / ITU-R BT.2020 (3840×2160,
// 7680×4320); DCI: Digital Cinema System Specification container sizes (4096×2160, 2048×1080);
// HD: SMPTE ST 274 (1920×1080) and ST 296 (1280×720).
const NAMED_RESOLUTIONS: [RegExp, Resolution][] = [
  [/\b8k\s*uhd\b|\buhd[-\s]*2\b|\b4320p\b/i, { width: 7680, height: 4320 }],
  [/\b(dci\s*4k|4k\s*dci)\b/i, { width: 4096, height: 2160 }],
  [/\b(dci\s*2k|2k\s*dci)\b/i, { width: 2048, height: 1080 }],
  [/\b(4k\s*uhd|uhd(?:[-\s]*1)?|2160p)\b/i, { width: 3840, height: 2160 }],
  [/\b(full\s*hd|fhd|1080[pi])\b/i, { width: 1920, height: 1080 }],
  [/\b720p\b/i, { width: 1280, height: 720 }],
];

/** Reads "3840×2160", "3840 x 2160 (UHD)", "DCI 4K" or "1080p"; null when it names no size. */
export function parseResolution(text: string): Resolution | null {
  const m = /(\d{2,5})\s*[×xX*]\s*(\d{2,5})/.exec(text);
  if (m) return { width: Number(m[1]), height: Number(m[2]) };
  for (const [re, r] of NAMED_RESOLUTIONS) if (re.test(text)) return { ...r };
  return null;
}

/** A frame rate as an exact fraction of frames per second. */
export interface Rational {
  num: number;
  den: number;
}

// NTSC-family rates are N·1000/1001 (SMPTE ST 12-1 counts 30000/1001 as "29.97"); people write
// them rounded to two or three decimals.
const NTSC_BASES = [24, 30, 48, 60, 96, 120, 240];

/** Reads "23.976 fps", "23.98", "24000/1001", "25p" or "29.97"; NTSC-style decimals become N·1000/1001. Null when no rate. */
export function parseFrameRate(text: string): Rational | null {
  const frac = /(\d+)\s*\/\s*(\d+)/.exec(text);
  if (frac && Number(frac[2]) > 0) return { num: Number(frac[1]), den: Number(frac[2]) };
  const m = /(\d+(?:[.,]\d+)?)\s*(?:fps|p\b|frames?|$|\s)/i.exec(text.trim());
  if (!m) return null;
  const value = Number(m[1].replace(',', '.'));
  if (!(value > 0 && value <= 1000)) return null;
  if (Number.isInteger(value)) return { num: value, den: 1 };
  for (const base of NTSC_BASES) {
    const ntsc = (base * 1000) / 1001;
    if (Math.abs(value - ntsc) < 0.006) return { num: base * 1000, den: 1001 };
  }
  // Any other decimal: keep it exact in thousandths.
  return { num: Math.round(value * 1000), den: 1000 };
}

/** Reads ffprobe's rational "24000/1001" (or "0/0" for none); null when absent or zero. */
export function parseProbeRate(rate: string | null | undefined): Rational | null {
  if (!rate) return null;
  const r = parseFrameRate(rate);
  return r && r.num > 0 ? r : null;
}

/** Returns the frames per second of a fraction. */
export const rationalFps = (r: Rational) => r.num / r.den;

/** Returns a frame rate for people: "23.976 fps (24000/1001)" for NTSC-style fractions, "25 fps" otherwise. */
export function describeFrameRate(r: Rational): string {
  const fps = rationalFps(r);
  const text = `${Number(fps.toFixed(3))} fps`;
  return r.den === 1 || Number.isInteger(fps) ? text : `${text} (${r.num}/${r.den})`;
}

/** Reads "10-bit", "10 bit", "12bit"; null when no bit depth. */
export function parseBitDepth(text: string): number | null {
  const m = /(\d{1,2})\s*-?\s*bits?\b/i.exec(text);
  return m ? Number(m[1]) : null;
}

/** Reads "4:2:2", "4:2:0", "4:4:4" (also "422"); null when none. */
export function parseChroma(text: string): string | null {
  const m = /\b4\s*:\s*([0-4])\s*:\s*([0-4])\b/.exec(text) ?? /\b4([0-4])([0-4])\b/.exec(text);
  return m ? `4:${m[1]}:${m[2]}` : null;
}

// Codec families by the names people write and ffprobe's codec_name. Open formats and standards
// only: ITU-T H.264 / H.265, AOMedia AV1, VP9, ISO/IEC 13818-2 (MPEG-2), ISO/IEC 15444 (JPEG 2000),
// FFV1 (RFC 9043), Motion JPEG, and the still formats.
const CODECS: { codec: string; label: string; words: RegExp }[] = [
  { codec: 'h264', label: 'H.264 / AVC', words: /\bh\.?\s*264\b|\bavc\b|\bx264\b/i },
  { codec: 'hevc', label: 'H.265 / HEVC', words: /\bh\.?\s*265\b|\bhevc\b|\bx265\b/i },
  { codec: 'av1', label: 'AV1', words: /\bav1\b/i },
  { codec: 'vp9', label: 'VP9', words: /\bvp9\b/i },
  { codec: 'mpeg2video', label: 'MPEG-2', words: /\bmpeg-?2\b/i },
  { codec: 'mpeg4', label: 'MPEG-4 Part 2', words: /\bmpeg-?4\s*part\s*2\b/i },
  { codec: 'jpeg2000', label: 'JPEG 2000', words: /\bjpeg\s*2000\b|\bj2k\b/i },
  { codec: 'ffv1', label: 'FFV1', words: /\bffv1\b/i },
  { codec: 'mjpeg', label: 'Motion JPEG', words: /\bmotion\s*jpeg\b|\bmjpe?g\b/i },
  { codec: 'rawvideo', label: 'Uncompressed', words: /\buncompressed\b|\braw\s*video\b/i },
  { codec: 'png', label: 'PNG', words: /\bpng\b/i },
  { codec: 'tiff', label: 'TIFF', words: /\btiff?\b/i },
  { codec: 'dpx', label: 'DPX', words: /\bdpx\b/i },
];

/** Returns the codec family a spec-sheet value names ("H.265 / HEVC in MOV" → hevc), or null. */
export function parseCodec(text: string): string | null {
  return CODECS.find((c) => c.words.test(text))?.codec ?? null;
}

/** Returns a readable codec name for ffprobe's codec_name ("hevc" → "H.265 / HEVC"). */
export function codecLabel(codec: string): string {
  return CODECS.find((c) => c.codec === codec)?.label ?? codec;
}

/** The spec-sheet values a comparison reads: key → value as typed. */
export type SpecValues = Partial<Record<ProbeComparedKey, string>>;

/** Spec-sheet labels of the lines a probe is compared with. */
export const PROBE_KEY_LABELS: Record<ProbeComparedKey, string> = {
  resolution: 'Resolution',
  frame_rate: 'Frame rate',
  codec: 'Codec',
  bit_depth: 'Bit depth',
  chroma_subsampling: 'Chroma subsampling',
  bitrate: 'Bitrate',
};

/**
 * Bitrate check (our own tolerance, not a standard): a camera's average over a clip may sit below
 * its nominal rate (variable-bitrate modes spend less on easy scenes such as charts) and a little
 * above it (audio and container overhead are in the file's figure), but a wrong quality mode is
 * off by a factor of about 1.5 or more. So a clip averaging 0.5–1.25 × the sheet's rate matches,
 * and clips shorter than BITRATE_MIN_SECONDS are not judged: their average depends on where the
 * key frames fall.
 */
export const BITRATE_MATCH_RATIO = { low: 0.5, high: 1.25 } as const;
export const BITRATE_MIN_SECONDS = 5;

/** Returns a bitrate for people: "148.2 Mb/s", "1.20 Gb/s", "800 kb/s" (SI, IEC 80000-13). */
export function describeBitrate(bitsPerSecond: number): string {
  if (bitsPerSecond >= 1e9) return `${(bitsPerSecond / 1e9).toFixed(2)} Gb/s`;
  if (bitsPerSecond >= 1e6) return `${Number((bitsPerSecond / 1e6).toFixed(1))} Mb/s`;
  return `${Math.round(bitsPerSecond / 1e3)} kb/s`;
}

// Which lines apply to which kind of file: a graded render is a delivery (its codec and depth
// are the editor's choice), a frame grab a still (no frame rate, codec or sampling of the shoot).
const KEYS_BY_KIND: Record<FootageKind, readonly ProbeComparedKey[]> = {
  camera_original: ['resolution', 'frame_rate', 'codec', 'bit_depth', 'chroma_subsampling', 'bitrate'],
  graded_render: ['resolution', 'frame_rate'],
  frame_grab: ['resolution'],
};

/** Returns a signed number with a real minus sign: −1920, +2. */
const signed = (n: number, digits = 0) => `${n < 0 ? MINUS : '+'}${Math.abs(n).toFixed(digits)}`;

/** The outcome of comparing one file with a spec sheet. */
export interface SpecComparison {
  mismatches: SpecMismatch[];
  /** Keys compared and found equal. */
  matched: ProbeComparedKey[];
  skipped: SpecSkip[];
}

/**
 * Compares a probe with a spec sheet's values for the lines that apply to `kind`. A line that is
 * empty, unreadable or not measurable in the file is skipped with the reason; a difference gives
 * the exact values and how far apart they are.
 */
export function compareProbeWithSpec(probe: ProbeSummary, spec: SpecValues, kind: FootageKind): SpecComparison {
  const out: SpecComparison = { mismatches: [], matched: [], skipped: [] };
  const skip = (key: ProbeComparedKey, reason: string) => out.skipped.push({ key, label: PROBE_KEY_LABELS[key], reason });
  const differ = (key: ProbeComparedKey, expected: string, actual: string, difference: string) =>
    out.mismatches.push({ key, label: PROBE_KEY_LABELS[key], expected, actual, difference });

  for (const key of KEYS_BY_KIND[kind]) {
    const text = spec[key]?.trim() ?? '';
    if (!text) {
      skip(key, 'The spec sheet has no value for this line');
      continue;
    }
    switch (key) {
      case 'resolution': {
        const want = parseResolution(text);
        if (!want) { skip(key, `"${text}" names no frame size: write it as width×height, e.g. 3840×2160`); break; }
        if (probe.width == null || probe.height == null) { skip(key, 'The file reports no frame size'); break; }
        if (want.width === probe.width && want.height === probe.height) { out.matched.push(key); break; }
        const dw = probe.width - want.width;
        const dh = probe.height - want.height;
        differ(key, `${want.width}×${want.height}`, `${probe.width}×${probe.height}`,
          `recorded ${probe.width}×${probe.height}, the spec sheet says ${want.width}×${want.height} (width ${signed(dw)} px, height ${signed(dh)} px)`);
        break;
      }
      case 'frame_rate': {
        const want = parseFrameRate(text);
        if (!want) { skip(key, `"${text}" names no frame rate: write it like 23.976 fps or 25 fps`); break; }
        const got = parseProbeRate(probe.frameRate);
        if (!got) { skip(key, 'The file reports no frame rate'); break; }
        const delta = rationalFps(got) - rationalFps(want);
        // Equal when the two agree to the 0.001 fps people write (23.976 ≙ 24000/1001).
        if (Math.abs(delta) < 0.0005) { out.matched.push(key); break; }
        differ(key, describeFrameRate(want), describeFrameRate(got),
          `recorded ${describeFrameRate(got)}, the spec sheet says ${describeFrameRate(want)} (${signed(delta, 3)} fps)`);
        break;
      }
      case 'codec': {
        const want = parseCodec(text);
        if (!want) { skip(key, `"${text}" is not a codec Midgray can check (it knows H.264, H.265, AV1, VP9, MPEG-2, JPEG 2000, FFV1, Motion JPEG, uncompressed)`); break; }
        if (!probe.codec) { skip(key, 'The file reports no video codec'); break; }
        if (probe.codec === want) { out.matched.push(key); break; }
        differ(key, codecLabel(want), codecLabel(probe.codec), `recorded ${codecLabel(probe.codec)}, the spec sheet says ${codecLabel(want)}`);
        break;
      }
      case 'bit_depth': {
        const want = parseBitDepth(text);
        if (!want) { skip(key, `"${text}" names no bit depth: write it like 10-bit`); break; }
        if (probe.bitDepth == null) { skip(key, 'The file reports no bit depth'); break; }
        if (probe.bitDepth === want) { out.matched.push(key); break; }
        const d = probe.bitDepth - want;
        differ(key, `${want}-bit`, `${probe.bitDepth}-bit`,
          `recorded ${probe.bitDepth}-bit, the spec sheet says ${want}-bit (${signed(d)} ${Math.abs(d) === 1 ? 'bit' : 'bits'} per sample)`);
        break;
      }
      case 'chroma_subsampling': {
        const want = parseChroma(text);
        if (!want) { skip(key, `"${text}" names no chroma subsampling: write it like 4:2:2`); break; }
        if (!probe.chromaSubsampling) { skip(key, 'The file reports no chroma subsampling'); break; }
        if (probe.chromaSubsampling === want) { out.matched.push(key); break; }
        differ(key, want, probe.chromaSubsampling, `recorded ${probe.chromaSubsampling}, the spec sheet says ${want}`);
        break;
      }
      case 'bitrate': {
        const mbps = parseBitrateMbps(text);
        if (!mbps) { skip(key, `"${text}" names no bitrate: write it like 150 Mb/s`); break; }
        if (probe.bitrateBitsPerSecond == null || probe.bitrateBitsPerSecond <= 0) { skip(key, 'The file reports no bitrate'); break; }
        if (probe.durationSeconds == null || probe.durationSeconds < BITRATE_MIN_SECONDS) {
          skip(key, `The clip is shorter than ${BITRATE_MIN_SECONDS} s: its average bitrate says little about the recording mode`);
          break;
        }
        const want = mbps * 1e6;
        const ratio = probe.bitrateBitsPerSecond / want;
        if (ratio >= BITRATE_MATCH_RATIO.low && ratio <= BITRATE_MATCH_RATIO.high) { out.matched.push(key); break; }
        const percent = (ratio - 1) * 100;
        differ(key, describeBitrate(want), describeBitrate(probe.bitrateBitsPerSecond),
          `recorded ${describeBitrate(probe.bitrateBitsPerSecond)} on average, the spec sheet says ${describeBitrate(want)} (${signed(percent)} %): check the recording mode`);
        break;
      }
    }
  }
  return out;
}

/**
 * Returns the chroma subsampling and bit depth per sample of an FFmpeg pixel format name
 * ("yuv422p10le" → 4:2:2, 10). RGB/GBR formats are 4:4:4, grey formats 4:0:0; null parts when unknown.
 * Names follow FFmpeg's libavutil/pixfmt.h; the api's probe tests check the depths against ffprobe's own table.
 */
export function describePixelFormat(pixFmt: string | null | undefined): { chroma: string | null; bitDepth: number | null } {
  if (!pixFmt) return { chroma: null, bitDepth: null };
  const f = pixFmt.toLowerCase().replace(/(le|be)$/, '');
  let chroma: string | null = null;
  const yuv = /^yuvj?a?4(\d)(\d)p/.exec(f);
  if (yuv) chroma = `4:${yuv[1]}:${yuv[2]}`;
  else if (/^(nv12|nv21|p01\d)$/.test(f)) chroma = '4:2:0';
  else if (/^(nv16|nv20|p21\d|yuyv422|uyvy422|yvyu422|y21\d)$/.test(f)) chroma = '4:2:2';
  else if (/^(nv24|nv42|p41\d|ayuv|vuya|vuyx|uyva|xv30|xv36|xv48)$/.test(f)) chroma = '4:4:4';
  else if (/^(rgb|bgr|gbr|argb|abgr|0rgb|0bgr|x2rgb|x2bgr)/.test(f)) chroma = '4:4:4';
  else if (/^(gray|ya)/.test(f)) chroma = '4:0:0';

  let bitDepth: number | null = null;
  const planar = /^(?:yuvj?a?4\d\dp|gbra?p|gray|ya)(\d+)?$/.exec(f);
  const semi = /^p[024](\d\d)$/.exec(f);
  if (planar) bitDepth = planar[1] ? Number(planar[1]) : 8;
  else if (semi) bitDepth = Number(semi[1]);
  else if (/^(nv12|nv21|nv16|nv24|nv42|yuyv422|uyvy422|yvyu422|ayuv|vuya|vuyx|uyva|rgb24|bgr24|rgba|bgra|argb|abgr|0rgb|rgb0|0bgr|bgr0)$/.test(f)) bitDepth = 8;
  else if (/^(nv20|y210|xv30|x2rgb10|x2bgr10)$/.test(f)) bitDepth = 10;
  else if (/^(y212|xv36)$/.test(f)) bitDepth = 12;
  else if (/^(rgb48|bgr48|rgba64|bgra64|xv48)$/.test(f)) bitDepth = 16;
  return { chroma, bitDepth };
}
