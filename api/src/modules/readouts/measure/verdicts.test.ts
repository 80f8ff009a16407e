import { describe, expect, it } from 'vitest';
import { DEFAULT_DELTA_E_THRESHOLD, DEFAULT_SNR_THRESHOLD_DB, SNR_EXCELLENT_DB, ceilingIso, latitudeWindow } from './verdicts.ts';

describe('thresholds', () => {
  it('the defaults are the figures their sources give', () => {
    // ISO 12232:2019 §6.3 note 3: S/N 10 "first acceptable" → 20·log10(10) = 20 dB; S/N 40 "first excellent" → 32.04 dB.
    expect(DEFAULT_SNR_THRESHOLD_DB).toBe(20 * Math.log10(10));
    expect(SNR_EXCELLENT_DB).toBeCloseTo(32.04, 2);
    // Song & Luo (2001): mean image ΔE above ≈ 2.5 is perceptible.
    expect(DEFAULT_DELTA_E_THRESHOLD).toBe(2.5);
  });
});

describe('ceilingIso', () => {
  const sweep = [
    { iso: 100, snrDb: 38 },
    { iso: 200, snrDb: 35 },
    { iso: 400, snrDb: 31 },
    { iso: 800, snrDb: 26 },
    { iso: 1600, snrDb: 21 },
    { iso: 3200, snrDb: 17 },
  ];

  it('is the highest ISO at or above the threshold', () => {
    expect(ceilingIso(sweep)).toBe(1600);
    expect(ceilingIso(sweep, 26)).toBe(800); // exactly at the threshold counts
    expect(ceilingIso(sweep, SNR_EXCELLENT_DB)).toBe(200);
  });

  it('is null when no step meets the threshold or there are no steps', () => {
    expect(ceilingIso(sweep, 40)).toBeNull();
    expect(ceilingIso([])).toBeNull();
  });

  it('ignores order, and with two native gains takes the highest passing ISO', () => {
    const dualGain = [
      { iso: 3200, snrDb: 24 },
      { iso: 800, snrDb: 26 },
      { iso: 1600, snrDb: 18 },
      { iso: 6400, snrDb: 19 },
    ];
    expect(ceilingIso(dualGain, 20)).toBe(3200);
  });

  it('does not let a step without a finite SNR (σ = 0: clipped or crushed flat) pass', () => {
    expect(ceilingIso([{ iso: 100, snrDb: 30 }, { iso: 200, snrDb: null }, { iso: 400, snrDb: Number.NaN }])).toBe(100);
  });

  it('refuses a non-positive ISO', () => {
    expect(() => ceilingIso([{ iso: 0, snrDb: 30 }])).toThrow(RangeError);
  });
});

describe('latitudeWindow', () => {
  const bracket = [
    { offsetStops: -3, meanDeltaE: 6.1 },
    { offsetStops: -2, meanDeltaE: 2.4 },
    { offsetStops: -1, meanDeltaE: 1.1 },
    { offsetStops: 0, meanDeltaE: 0 },
    { offsetStops: 1, meanDeltaE: 1.6 },
    { offsetStops: 2, meanDeltaE: 3.2 },
    { offsetStops: 3, meanDeltaE: 9.5 },
  ];

  it('is the contiguous run of offsets around 0 within the threshold', () => {
    expect(latitudeWindow(bracket)).toEqual({ minStops: -2, maxStops: 1, offsets: [-2, -1, 0, 1] });
    expect(latitudeWindow(bracket, 1.6)).toEqual({ minStops: -1, maxStops: 1, offsets: [-1, 0, 1] }); // ≤ counts
    expect(latitudeWindow(bracket, 10)).toEqual({ minStops: -3, maxStops: 3, offsets: [-3, -2, -1, 0, 1, 2, 3] });
  });

  it('stops at the first failing step even if a step further out passes again', () => {
    const bumpy = [...bracket.filter((s) => s.offsetStops !== 3), { offsetStops: 3, meanDeltaE: 1 }];
    expect(latitudeWindow(bumpy)?.maxStops).toBe(1);
  });

  it('is only 0 when both neighbours fail, and null when 0 is missing or fails', () => {
    expect(latitudeWindow(bracket, 0.5)).toEqual({ minStops: 0, maxStops: 0, offsets: [0] });
    expect(latitudeWindow(bracket.filter((s) => s.offsetStops !== 0))).toBeNull();
    expect(latitudeWindow([{ offsetStops: 0, meanDeltaE: 3 }])).toBeNull();
    expect(latitudeWindow([])).toBeNull();
  });

  it('handles third stops, unsorted input, duplicates (worst wins) and NaN (fails)', () => {
    const thirds = [
      { offsetStops: 2 / 3, meanDeltaE: 2.0 },
      { offsetStops: 0, meanDeltaE: 0 },
      { offsetStops: -1 / 3, meanDeltaE: 0.8 },
      { offsetStops: 1 / 3, meanDeltaE: 1.0 },
      { offsetStops: 0.3333333333, meanDeltaE: 1.2 }, // same step stored with fewer digits
      { offsetStops: 1, meanDeltaE: 2.6 },
      { offsetStops: -2 / 3, meanDeltaE: Number.NaN },
    ];
    const rounded = (w: ReturnType<typeof latitudeWindow>) =>
      w && { minStops: +w.minStops.toFixed(6), maxStops: +w.maxStops.toFixed(6), offsets: w.offsets.map((o) => +o.toFixed(6)) };
    expect(rounded(latitudeWindow(thirds))).toEqual({ minStops: -0.333333, maxStops: 0.666667, offsets: [-0.333333, 0, 0.333333, 0.666667] });
    const duplicateFail = [...thirds, { offsetStops: 1 / 3, meanDeltaE: 2.7 }];
    expect(rounded(latitudeWindow(duplicateFail))).toEqual({ minStops: -0.333333, maxStops: 0, offsets: [-0.333333, 0] });
  });
});
