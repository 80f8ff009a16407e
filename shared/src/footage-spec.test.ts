import { describe, expect, it } from 'vitest';
import {
  compareProbeWithSpec,
  describeFrameRate,
  describePixelFormat,
  parseBitDepth,
  parseChroma,
  parseCodec,
  parseFrameRate,
  parseResolution,
  rationalFps,
} from './footage-spec.ts';
import { allFootageExtensions, kindForFile, type ProbeSummary } from './schemas/footage.ts';

const uhd2398: ProbeSummary = {
  container: 'mov,mp4,m4a,3gp,3g2,mj2',
  codec: 'hevc',
  codecLongName: 'H.265 / HEVC (High Efficiency Video Coding)',
  profile: 'Main 10',
  width: 3840,
  height: 2160,
  frameRate: '24000/1001',
  fps: 24000 / 1001,
  bitDepth: 10,
  chromaSubsampling: '4:2:0',
  pixelFormat: 'yuv420p10le',
  durationSeconds: 2.002,
  bitrateBitsPerSecond: 1_000_000,
  timecode: '01:00:00:00',
  audioStreams: 0,
};

describe('parseResolution', () => {
  it('when width×height is written with ×, x or *, then reads both numbers', () => {
    expect(parseResolution('3840×2160 (UHD)')).toEqual({ width: 3840, height: 2160 });
    expect(parseResolution('1920 x 1080')).toEqual({ width: 1920, height: 1080 });
    expect(parseResolution('4096*2160')).toEqual({ width: 4096, height: 2160 });
  });
  it('when a named size is written, then reads the standard size', () => {
    expect(parseResolution('UHD')).toEqual({ width: 3840, height: 2160 }); // SMPTE ST 2036-1 / ITU-R BT.2020: UHD-1 is 3840×2160
    expect(parseResolution('DCI 4K')).toEqual({ width: 4096, height: 2160 }); // DCI specification: 4K container 4096×2160
    expect(parseResolution('2K DCI')).toEqual({ width: 2048, height: 1080 }); // DCI specification: 2K container 2048×1080
    expect(parseResolution('1080p')).toEqual({ width: 1920, height: 1080 }); // SMPTE ST 274: 1920×1080
    expect(parseResolution('720p')).toEqual({ width: 1280, height: 720 }); // SMPTE ST 296: 1280×720
    expect(parseResolution('8K UHD')).toEqual({ width: 7680, height: 4320 }); // ITU-R BT.2020: 7680×4320
  });
  it('when the value is ambiguous ("4K") or empty, then null', () => {
    expect(parseResolution('4K')).toBeNull();
    expect(parseResolution('')).toBeNull();
  });
});

describe('parseFrameRate', () => {
  it('when an NTSC-family rate is written rounded, then reads N·1000/1001', () => {
    // NTSC-family rates 24000/1001, 30000/1001, 60000/1001 (SMPTE ST 12-1 names them 23.976, 29.97, 59.94).
    expect(parseFrameRate('23.976 fps')).toEqual({ num: 24000, den: 1001 });
    expect(parseFrameRate('23.98')).toEqual({ num: 24000, den: 1001 });
    expect(parseFrameRate('29.97p')).toEqual({ num: 30000, den: 1001 });
    expect(parseFrameRate('59.94 fps')).toEqual({ num: 60000, den: 1001 });
  });
  it('when a whole rate or a fraction is written, then reads it exactly', () => {
    expect(parseFrameRate('25 fps')).toEqual({ num: 25, den: 1 });
    expect(parseFrameRate('24')).toEqual({ num: 24, den: 1 });
    expect(parseFrameRate('24000/1001')).toEqual({ num: 24000, den: 1001 });
  });
  it('when no rate is written, then null', () => {
    expect(parseFrameRate('as fast as possible')).toBeNull();
  });
  it('describes NTSC fractions with both forms', () => {
    expect(describeFrameRate({ num: 24000, den: 1001 })).toBe('23.976 fps (24000/1001)');
    expect(describeFrameRate({ num: 25, den: 1 })).toBe('25 fps');
    expect(rationalFps({ num: 30000, den: 1001 })).toBeCloseTo(29.97003, 5);
  });
});

describe('bit depth, chroma and codec readers', () => {
  it('reads the ways people write them', () => {
    expect(parseBitDepth('10-bit')).toBe(10);
    expect(parseBitDepth('12 bit log')).toBe(12);
    expect(parseBitDepth('deep')).toBeNull();
    expect(parseChroma('4:2:2')).toBe('4:2:2');
    expect(parseChroma('YUV 422')).toBe('4:2:2');
    expect(parseChroma('full')).toBeNull();
    expect(parseCodec('H.265 / HEVC in MOV')).toBe('hevc');
    expect(parseCodec('H.264 long GOP')).toBe('h264');
    expect(parseCodec('AVC-Intra')).toBe('h264');
    expect(parseCodec('JPEG 2000')).toBe('jpeg2000');
    expect(parseCodec('House secret codec')).toBeNull();
  });
});

describe('describePixelFormat', () => {
  it('reads chroma subsampling and bit depth from FFmpeg pixel format names (libavutil/pixfmt.h)', () => {
    expect(describePixelFormat('yuv420p')).toEqual({ chroma: '4:2:0', bitDepth: 8 });
    expect(describePixelFormat('yuv422p10le')).toEqual({ chroma: '4:2:2', bitDepth: 10 });
    expect(describePixelFormat('yuv444p12le')).toEqual({ chroma: '4:4:4', bitDepth: 12 });
    expect(describePixelFormat('yuvj422p')).toEqual({ chroma: '4:2:2', bitDepth: 8 });
    expect(describePixelFormat('p010le')).toEqual({ chroma: '4:2:0', bitDepth: 10 });
    expect(describePixelFormat('nv12')).toEqual({ chroma: '4:2:0', bitDepth: 8 });
    expect(describePixelFormat('gbrp10le')).toEqual({ chroma: '4:4:4', bitDepth: 10 });
    expect(describePixelFormat('rgb48le')).toEqual({ chroma: '4:4:4', bitDepth: 16 });
    expect(describePixelFormat('gray16le')).toEqual({ chroma: '4:0:0', bitDepth: 16 });
    expect(describePixelFormat('something_new')).toEqual({ chroma: null, bitDepth: null });
  });
});

describe('compareProbeWithSpec', () => {
  const sheet = { resolution: '3840×2160 (UHD)', frame_rate: '23.976 fps', codec: 'H.265 / HEVC', bit_depth: '10-bit', chroma_subsampling: '4:2:0' };

  it('when a UHD 24000/1001 file meets a sheet saying 3840×2160 at 23.976 fps, then everything matches', () => {
    const r = compareProbeWithSpec(uhd2398, sheet, 'camera_original');
    expect(r.mismatches).toEqual([]);
    expect(r.matched).toEqual(['resolution', 'frame_rate', 'codec', 'bit_depth', 'chroma_subsampling']);
  });

  it('when a 1920×1080 25 fps 8-bit 4:2:0 H.264 file meets that sheet, then each difference is spelt out exactly', () => {
    const hd25: ProbeSummary = { ...uhd2398, codec: 'h264', width: 1920, height: 1080, frameRate: '25/1', fps: 25, bitDepth: 8, pixelFormat: 'yuv420p' };
    const r = compareProbeWithSpec(hd25, { ...sheet, chroma_subsampling: '4:2:2' }, 'camera_original');
    const by = Object.fromEntries(r.mismatches.map((m) => [m.key, m]));
    expect(by.resolution.difference).toBe('recorded 1920×1080, the spec sheet says 3840×2160 (width −1920 px, height −1080 px)');
    // 25 − 24000/1001 = 1.024 fps (to three decimals)
    expect(by.frame_rate.difference).toBe('recorded 25 fps, the spec sheet says 23.976 fps (24000/1001) (+1.024 fps)');
    expect(by.frame_rate.expected).toBe('23.976 fps (24000/1001)');
    expect(by.codec.difference).toBe('recorded H.264 / AVC, the spec sheet says H.265 / HEVC');
    expect(by.bit_depth.difference).toBe('recorded 8-bit, the spec sheet says 10-bit (−2 bits per sample)');
    expect(by.chroma_subsampling.difference).toBe('recorded 4:2:0, the spec sheet says 4:2:2');
    expect(r.matched).toEqual([]);
  });

  it('when 24 fps is recorded against 23.976, then the 0.024 fps difference is not rounded away', () => {
    const r = compareProbeWithSpec({ ...uhd2398, frameRate: '24/1', fps: 24 }, sheet, 'camera_original');
    expect(r.mismatches.map((m) => m.difference)).toEqual(['recorded 24 fps, the spec sheet says 23.976 fps (24000/1001) (+0.024 fps)']);
  });

  describe('bitrate (our tolerance: 0.5–1.25 × the sheet, clips of 5 s or more)', () => {
    const long = (bps: number): ProbeSummary => ({ ...uhd2398, durationSeconds: 12, bitrateBitsPerSecond: bps });
    const bitrateSheet = { ...sheet, bitrate: '150 Mb/s' };

    it('when a 12 s clip averages 131.6 Mb/s against 150 Mb/s (variable bitrate on an easy scene), then it matches', () => {
      const r = compareProbeWithSpec(long(131_600_000), bitrateSheet, 'camera_original');
      expect(r.mismatches).toEqual([]);
      expect(r.matched).toContain('bitrate');
    });

    it('when a clip averages 400 Mb/s against 150 Mb/s (another quality mode), then the difference is spelt out in SI units', () => {
      // 400 / 150 − 1 = +166.7 %, shown as +167 % (Mb/s = 10⁶ bit/s, IEC 80000-13).
      const r = compareProbeWithSpec(long(400_000_000), bitrateSheet, 'camera_original');
      expect(r.mismatches).toEqual([{ key: 'bitrate', label: 'Bitrate', expected: '150 Mb/s', actual: '400 Mb/s', difference: 'recorded 400 Mb/s on average, the spec sheet says 150 Mb/s (+167 %): check the recording mode' }]);
    });

    it('judges the edges of the band as written: 0.5 × and 1.25 × match, just outside does not', () => {
      expect(compareProbeWithSpec(long(75_000_000), bitrateSheet, 'camera_original').matched).toContain('bitrate');
      expect(compareProbeWithSpec(long(187_500_000), bitrateSheet, 'camera_original').matched).toContain('bitrate');
      expect(compareProbeWithSpec(long(74_000_000), bitrateSheet, 'camera_original').mismatches.map((m) => m.key)).toEqual(['bitrate']);
      expect(compareProbeWithSpec(long(1_200_000_000), { bitrate: '1.2 Gb/s' }, 'camera_original').matched).toEqual(['bitrate']);
    });

    it('skips clips shorter than 5 s, files without a bitrate, unreadable lines, and renders and stills', () => {
      const short = compareProbeWithSpec({ ...uhd2398, durationSeconds: 2.002, bitrateBitsPerSecond: 9e8 }, bitrateSheet, 'camera_original');
      expect(short.mismatches).toEqual([]);
      expect(short.skipped.find((x) => x.key === 'bitrate')?.reason).toMatch(/shorter than 5 s/);
      expect(compareProbeWithSpec({ ...long(1), bitrateBitsPerSecond: null }, bitrateSheet, 'camera_original').skipped.map((x) => x.key)).toContain('bitrate');
      expect(compareProbeWithSpec(long(1e8), { bitrate: 'as high as it goes' }, 'camera_original').skipped.find((x) => x.key === 'bitrate')?.reason).toMatch(/names no bitrate/);
      expect(compareProbeWithSpec(long(9e8), bitrateSheet, 'graded_render').mismatches).toEqual([]);
    });
  });

  it('when lines are empty or unreadable, then they are skipped with a reason, not guessed', () => {
    const r = compareProbeWithSpec(uhd2398, { resolution: '4K', frame_rate: '', codec: 'House secret codec' }, 'camera_original');
    expect(r.mismatches).toEqual([]);
    expect(r.skipped.map((s) => s.key)).toEqual(['resolution', 'frame_rate', 'codec', 'bit_depth', 'chroma_subsampling', 'bitrate']);
    expect(r.skipped[0].reason).toMatch(/width×height/);
  });

  it('when the file is a frame grab, then only its frame size is compared', () => {
    const still: ProbeSummary = { ...uhd2398, codec: 'png', frameRate: null, fps: null, bitDepth: 8, width: 1920, height: 1080 };
    const r = compareProbeWithSpec(still, sheet, 'frame_grab');
    expect(r.mismatches.map((m) => m.key)).toEqual(['resolution']);
    expect(r.skipped).toEqual([]);
  });
});

describe('kindForFile', () => {
  it('keeps the uploader’s choice when it accepts the file, else takes the first kind that does', () => {
    expect(kindForFile('A001_C003.mov', 'graded_render')).toBe('graded_render');
    expect(kindForFile('grab_iso800.png', 'camera_original')).toBe('frame_grab');
    expect(kindForFile('PLATE.JPG', 'graded_render')).toBe('frame_grab');
    // TIFF and DPX sequences may be camera originals or grabs: the choice stands.
    expect(kindForFile('frame_0001.dpx', 'frame_grab')).toBe('frame_grab');
    expect(kindForFile('frame_0001.dpx', 'camera_original')).toBe('camera_original');
    expect(kindForFile('notes.txt', 'camera_original')).toBeNull();
  });

  it('lists every accepted extension once', () => {
    const all = allFootageExtensions();
    expect(new Set(all).size).toBe(all.length);
    expect(all).toEqual(expect.arrayContaining(['.mp4', '.mov', '.mxf', '.png', '.jpg', '.tif', '.dpx']));
    expect(all).not.toContain('.txt');
  });
});
