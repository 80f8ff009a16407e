import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from './errors.ts';
import { formatChapterTime, framesToTimecode, parseChapterTime, timecodeToFrames } from './timecode.ts';

const DF30 = 30000 / 1001;
const DF60 = 60000 / 1001;

describe('framesToTimecode, drop-frame 29.97', () => {
  // SMPTE ST 12-1 drop-frame: frame labels 00 and 01 are skipped at the start of each minute
  // except minutes 00, 10, 20, 30, 40, 50. Worked values checked by hand: a dropped minute holds
  // 1798 frames, ten minutes 17 982, an hour 107 892.
  it('when frame 1799, then the last frame of the first minute, 00:00:59;29', () => {
    expect(framesToTimecode(1799, DF30, { dropFrame: true })).toBe('00:00:59;29');
  });
  it('when frame 1800, then 00:01:00;02 (;00 and ;01 skipped)', () => {
    expect(framesToTimecode(1800, DF30, { dropFrame: true })).toBe('00:01:00;02');
  });
  it('when frame 17982, then 00:10:00;00 (tenth minute keeps its labels)', () => {
    expect(framesToTimecode(17982, DF30, { dropFrame: true })).toBe('00:10:00;00');
  });
  it('when frame 107892, then 01:00:00;00', () => {
    // 29.97 × 3600 = 107 892 frames in an hour of clock time; published timecode explanations
    // give the same 108-frame gap against 30 fps counting.
    expect(framesToTimecode(107892, DF30, { dropFrame: true })).toBe('01:00:00;00');
  });
  it('when the last frame of the day, then 23:59:59;29', () => {
    // Published timecode library documentation: 24 h at 29.97 drop-frame is 24 × 107 892 = 2 589 408 frames.
    expect(framesToTimecode(2_589_407, DF30, { dropFrame: true })).toBe('23:59:59;29');
  });
  it('accepts 29.97 typed with two decimals', () => {
    expect(framesToTimecode(1800, 29.97, { dropFrame: true })).toBe('00:01:00;02');
  });
});

describe('framesToTimecode, drop-frame 59.94', () => {
  // SMPTE ST 12-1 at 59.94: four labels (00–03) skipped per minute, except each tenth minute.
  it('when frame 3600, then 00:01:00;04', () => {
    expect(framesToTimecode(3600, DF60, { dropFrame: true })).toBe('00:01:00;04');
  });
  it('when frame 35964, then 00:10:00;00', () => {
    // 36 000 − 9 × 4 = 35 964 frames in ten minutes.
    expect(framesToTimecode(35964, DF60, { dropFrame: true })).toBe('00:10:00;00');
  });
  it('when frame 215784, then 01:00:00;00', () => {
    // 59.94 × 3600 = 215 784 frames in an hour.
    expect(framesToTimecode(215784, DF60, { dropFrame: true })).toBe('01:00:00;00');
  });
});

describe('framesToTimecode, non-drop', () => {
  it('when 90000 frames at 25 fps, then 01:00:00:00', () => {
    // SMPTE ST 12-1 non-drop: 25 × 3600 frames in an hour.
    expect(framesToTimecode(90000, 25)).toBe('01:00:00:00');
  });
  it('when 86399 frames at 24 fps, then 00:59:59:23', () => {
    // SMPTE ST 12-1 non-drop at 24 fps: frames 00–23.
    expect(framesToTimecode(86399, 24)).toBe('00:59:59:23');
  });
  it('when 23.976 fps, then it counts 24 labels a second without dropping', () => {
    // common practice: 24000/1001 material uses 24-frame non-drop timecode.
    expect(framesToTimecode(86400, 24000 / 1001)).toBe('01:00:00:00');
  });
  it('when 29.97 without drop-frame, then an hour of labels is 108000 frames', () => {
    // SMPTE ST 12-1 non-drop at 30000/1001: labels run at 30 a second, so they drift 108 frames an hour.
    expect(framesToTimecode(108000, DF30)).toBe('01:00:00:00');
  });
});

describe('timecodeToFrames', () => {
  it('inverts the worked values', () => {
    // Same SMPTE ST 12-1 worked values as above.
    expect(timecodeToFrames('00:01:00;02', DF30)).toBe(1800);
    expect(timecodeToFrames('00:10:00;00', DF30)).toBe(17982);
    expect(timecodeToFrames('01:00:00;00', DF30)).toBe(107892);
    expect(timecodeToFrames('01:00:00;00', DF60)).toBe(215784);
    expect(timecodeToFrames('01:00:00:00', 25)).toBe(90000);
  });
  it('when 12:38:59;29 is followed by 12:39:00;02, then they are one frame apart', () => {
    // Published drop-frame explanation: …59;27, 59;28, 59;29, then the count skips to 00;02.
    expect(timecodeToFrames('12:39:00;02', DF30) - timecodeToFrames('12:38:59;29', DF30)).toBe(1);
  });
  it('when the tenth minute, then ;00 exists', () => {
    expect(timecodeToFrames('00:20:00;00', DF30) - timecodeToFrames('00:19:59;29', DF30)).toBe(1);
  });
  it('when a dropped label is asked for, then it explains and offers the next label', () => {
    expect(() => timecodeToFrames('00:01:00;00', DF30)).toThrow(/next label is 00:01:00;02/);
    expect(() => timecodeToFrames('00:01:00;03', DF60)).toThrow(InvalidInputError);
  });
  it('when the text or the numbers are out of range, then InvalidInputError', () => {
    expect(() => timecodeToFrames('1:2:3:4', 25)).toThrow(/HH:MM:SS:FF/);
    expect(() => timecodeToFrames('00:00:00:25', 25)).toThrow(/frames 00–24/);
    expect(() => timecodeToFrames('24:00:00:00', 25)).toThrow(/out of range/);
    expect(() => timecodeToFrames('00:60:00:00', 25)).toThrow(/out of range/);
    expect(() => timecodeToFrames('00:00:01;00', 25)).toThrow(/only at 29\.97/);
  });
});

describe('invalid frame counts and rates', () => {
  it('refuses negative, fractional or too-large counts, zero rates and drop-frame at other rates', () => {
    expect(() => framesToTimecode(-1, 25)).toThrow(InvalidInputError);
    expect(() => framesToTimecode(1.5, 25)).toThrow(InvalidInputError);
    expect(() => framesToTimecode(2_589_408, DF30, { dropFrame: true })).toThrow(/past 24 hours/);
    expect(() => framesToTimecode(10, 0)).toThrow('Frame rate must be a positive number of frames per second (got 0).');
    expect(() => framesToTimecode(10, Number.NaN)).toThrow(InvalidInputError);
    expect(() => framesToTimecode(10, 25, { dropFrame: true })).toThrow(/only at 29\.97 \(30000\/1001\) and 59\.94/);
  });
});

describe('timecode properties', () => {
  const rates = fc.constantFrom(
    { fps: DF30, dropFrame: true, perDay: 2_589_408 },
    { fps: DF60, dropFrame: true, perDay: 5_178_816 },
    { fps: DF30, dropFrame: false, perDay: 2_592_000 },
    { fps: 24000 / 1001, dropFrame: false, perDay: 2_073_600 },
    { fps: 25, dropFrame: false, perDay: 2_160_000 },
    { fps: 50, dropFrame: false, perDay: 4_320_000 },
  );
  it('frames → timecode → frames round-trips for drop-frame and non-drop', () => {
    fc.assert(
      fc.property(rates, fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (rate, at) => {
        const frames = Math.floor(at * rate.perDay);
        const tc = framesToTimecode(frames, rate.fps, { dropFrame: rate.dropFrame });
        expect(tc.includes(';')).toBe(rate.dropFrame);
        expect(timecodeToFrames(tc, rate.fps)).toBe(frames);
      }),
      { numRuns: 500 },
    );
  });
  it('consecutive frames never land on a dropped label', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2_589_406 }), (frame) => {
        const tc = framesToTimecode(frame, DF30, { dropFrame: true });
        const [, mm, ss, ff] = tc.split(/[:;]/).map(Number) as [number, number, number, number];
        expect(ss === 0 && ff < 2 && mm % 10 !== 0).toBe(false);
        expect(timecodeToFrames(framesToTimecode(frame + 1, DF30, { dropFrame: true }), DF30)).toBe(frame + 1);
      }),
      { numRuns: 500 },
    );
  });
});

describe('chapter times', () => {
  // The chapter format m:ss / h:mm:ss is the publishing platform's (from memory); the arithmetic
  // is sexagesimal as in ISO 8601 hh:mm:ss.
  it('when "4:05", then 245 s', () => {
    expect(parseChapterTime('4:05')).toBe(245);
  });
  it('when "1:02:03", then 3723 s', () => {
    expect(parseChapterTime('1:02:03')).toBe(3723);
  });
  it('when "0:00", then 0 s', () => {
    expect(parseChapterTime('0:00')).toBe(0);
  });
  it('formats under and over an hour', () => {
    expect(formatChapterTime(245)).toBe('4:05');
    expect(formatChapterTime(3723)).toBe('1:02:03');
    expect(formatChapterTime(59.9)).toBe('0:59');
    expect(formatChapterTime(3600)).toBe('1:00:00');
  });
  it('round-trips whole seconds', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 359_999 }), (s) => {
        expect(parseChapterTime(formatChapterTime(s))).toBe(s);
      }),
    );
  });
  it('refuses what is not a chapter time', () => {
    for (const text of ['4:5', '1:60', 'abc', '', '1:2:03']) expect(() => parseChapterTime(text)).toThrow(InvalidInputError);
    for (const s of [-1, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => formatChapterTime(s)).toThrow(InvalidInputError);
  });
});
