import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../errors.ts';
import { bytesForBitrate, cardRecordingSeconds, formatBytesBoth, storageEstimate, uploadSeconds } from './storage.ts';

describe('bytesForBitrate', () => {
  it('when 8 Mb/s for 1 s, then one million bytes', () => {
    // IEC 80000-13: mega = 10^6 and one byte is 8 bits.
    expect(bytesForBitrate(8, 1)).toBe(1_000_000);
  });
  it('when 100 Mb/s for a minute, then 750 MB', () => {
    // IEC 80000-13: 100 × 10^6 bit/s × 60 s / 8 = 750 × 10^6 bytes.
    expect(bytesForBitrate(100, 60)).toBe(750_000_000);
  });
  it('when 400 Mb/s for an hour, then 180 GB', () => {
    // IEC 80000-13: 400 × 10^6 × 3600 / 8 = 180 × 10^9 bytes (giga = 10^9).
    expect(bytesForBitrate(400, 3600)).toBe(180_000_000_000);
  });
  it('when no time, then no bytes', () => {
    expect(bytesForBitrate(100, 0)).toBe(0);
  });
});

describe('formatBytesBoth', () => {
  it('when 12.5 × 10^9 bytes, then "12.5 GB (11.6 GiB)"', () => {
    // IEC 80000-13: GB = 10^9, GiB = 2^30 = 1 073 741 824 bytes; 12.5e9 / 2^30 = 11.64.
    expect(formatBytesBoth(12.5e9)).toBe('12.5 GB (11.6 GiB)');
  });
  it('when 2^30 bytes, then "1.07 GB (1.00 GiB)"', () => {
    // IEC 80000-13: 1 GiB ≈ 1.074 GB.
    expect(formatBytesBoth(2 ** 30)).toBe('1.07 GB (1.00 GiB)');
  });
  it('when 10^12 bytes, then "1.00 TB (931 GiB)"', () => {
    // IEC 80000-13: 10^12 / 2^30 = 931.3 GiB (a "1 TB" drive).
    expect(formatBytesBoth(1e12)).toBe('1.00 TB (931 GiB)');
  });
  it('when 750 MB, then 715 MiB', () => {
    // IEC 80000-13: MiB = 2^20 bytes; 750e6 / 2^20 = 715.3.
    expect(formatBytesBoth(750e6)).toBe('750 MB (715 MiB)');
  });
  it('when a value rounds up to the next unit, then it says the next unit', () => {
    expect(formatBytesBoth(999_999_999)).toBe('1.00 GB (954 MiB)');
    expect(formatBytesBoth(0)).toBe('0 B (0 B)');
    expect(formatBytesBoth(512)).toBe('512 B (512 B)');
  });
});

describe('uploadSeconds and cardRecordingSeconds', () => {
  it('when 1 GB over 100 Mb/s, then 80 s', () => {
    // IEC 80000-13: 10^9 bytes × 8 = 8 × 10^9 bits; at 10^8 bit/s that is 80 s.
    expect(uploadSeconds(1e9, 100)).toBe(80);
  });
  it('when 750 MB over 50 Mb/s, then 120 s', () => {
    // IEC 80000-13: 6 × 10^9 bits / 5 × 10^7 bit/s.
    expect(uploadSeconds(750e6, 50)).toBe(120);
  });
  it('when 12.5 GB over 1000 Mb/s, then 100 s', () => {
    // IEC 80000-13: 10^11 bits over a 10^9 bit/s link.
    expect(uploadSeconds(12.5e9, 1000)).toBe(100);
  });
  it('when a 256 GB card records at 400 Mb/s, then 5120 s (85 min 20 s)', () => {
    // IEC 80000-13: 256 × 10^9 × 8 / (400 × 10^6).
    expect(cardRecordingSeconds(256e9, 400)).toBe(5120);
    expect(cardRecordingSeconds(128e9, 200)).toBe(5120);
    expect(cardRecordingSeconds(64e9, 400)).toBe(1280);
  });
});

describe('storageEstimate', () => {
  it('when ten steps of 20 s at 500 Mb/s, then 12.5 GB and 100 s at 1 Gb/s', () => {
    // IEC 80000-13: 500 × 10^6 × 200 / 8 = 12.5 × 10^9 bytes.
    expect(
      storageEstimate({ megabitsPerSecond: 500, secondsPerStep: 20, steps: 10, linkMegabitsPerSecond: 1000 }),
    ).toEqual({ seconds: 200, bytes: 12.5e9, label: '12.5 GB (11.6 GiB)', uploadSeconds: 100 });
  });
});

describe('invalid input', () => {
  it('when a bitrate, link speed or duration is zero, negative, NaN or Infinity, then InvalidInputError', () => {
    for (const v of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => bytesForBitrate(v, 60)).toThrow(InvalidInputError);
      expect(() => uploadSeconds(1e9, v)).toThrow(InvalidInputError);
      expect(() => cardRecordingSeconds(1e9, v)).toThrow(InvalidInputError);
    }
    expect(() => bytesForBitrate(100, -1)).toThrow(InvalidInputError);
    expect(() => formatBytesBoth(Number.NaN)).toThrow(InvalidInputError);
    expect(() => uploadSeconds(1e9, 0)).toThrow('Link speed must be a positive number of megabits per second (got 0).');
    expect(() =>
      storageEstimate({ megabitsPerSecond: 100, secondsPerStep: 10, steps: 2.5, linkMegabitsPerSecond: 100 }),
    ).toThrow(/whole number/);
  });
});
