import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import sharp from 'sharp';
import { ColorSpace, Lab, Lab_D65, XYZ_D50, XYZ_D65, deltaE2000 as referenceDeltaE2000, sRGB, sRGB_Linear, to } from 'colorjs.io/fn';
import { InvalidInputError } from '@midgray/shared/errors';
import type { Frame } from './frame.ts';
import {
  DIFFERENCE_MAP_LEGEND,
  defaultRecoveryStride,
  differenceMapColour,
  measureRecovery,
  recoveryReadout,
  selectKth,
} from './recovery.ts';
import { synthChartFrame } from './synth.ts';

for (const space of [XYZ_D65, XYZ_D50, sRGB_Linear, sRGB, Lab_D65, Lab]) ColorSpace.register(space);

/** ΔE00 between the colours of two 16-bit sRGB code triples, entirely by colorjs.io. */
function referenceDeltaE(codes1: readonly number[], codes2: readonly number[]): number {
  const lab = (c: readonly number[]) =>
    to({ space: sRGB, coords: [c[0] / 65535, c[1] / 65535, c[2] / 65535], alpha: 1 }, Lab_D65).coords as [number, number, number];
  // Both colours already in D65 L*a*b*; colorjs.io's ΔE00 formula reads them as given.
  return referenceDeltaE2000({ space: Lab, coords: lab(codes1), alpha: 1 }, { space: Lab, coords: lab(codes2), alpha: 1 });
}

function flatFrame(width: number, height: number, codes: readonly number[]): Frame {
  const data = new Uint16Array(width * height * 3);
  for (let i = 0; i < data.length; i += 3) data.set(codes, i);
  return { width, height, channels: 3, bitDepth: 16, data };
}

describe('recovery readout', () => {
  it('when the frames are identical, then ΔE00 is 0 everywhere and the noise ratio is 1', async () => {
    const { frame } = synthChartFrame({ width: 480, height: 270, noiseSigma: 0.01, chromaNoiseSigma: 0.005, seed: 4 });
    const copy: Frame = { ...frame, data: frame.data.slice() };
    const readout = await recoveryReadout(copy, frame);
    expect(readout).toMatchObject({ meanDeltaE: 0, p95DeltaE: 0, maxDeltaE: 0, noiseRatio: 1, noiseStops: 0 });
    expect(readout.sampleCount).toBe(480 * 270);
  });

  it('when every pixel is shifted to another colour, then mean, p95 and max equal that pair’s ΔE00 by colorjs.io', () => {
    const pairs: Array<[number[], number[]]> = [
      [[30000, 30000, 30000], [31000, 30000, 29000]],
      [[52000, 21000, 9000], [50000, 23000, 12000]],
      [[8000, 40000, 20000], [8000, 40000, 26000]],
      [[1000, 2000, 60000], [1500, 2500, 58000]],
    ];
    for (const [reference, shifted] of pairs) {
      const expected = referenceDeltaE(reference, shifted);
      const m = measureRecovery(flatFrame(64, 48, shifted), flatFrame(64, 48, reference), { stride: 1 });
      expect(m.meanDeltaE).toBeCloseTo(expected, 6);
      expect(m.p95DeltaE).toBeCloseTo(expected, 5); // stored as float32 for the percentile
      expect(m.maxDeltaE).toBeCloseTo(expected, 6);
    }
  });

  it('takes p95 by nearest rank: 6 % of pixels off → p95 is their ΔE; 4 % off → p95 is 0', () => {
    const reference = [30000, 30000, 30000];
    const shifted = [36000, 30000, 24000];
    const expected = referenceDeltaE(reference, shifted);
    for (const [offRows, p95] of [[6, expected], [4, 0]] as const) {
      const recovered = flatFrame(100, 100, reference);
      for (let i = 0; i < offRows * 100 * 3; i += 3) recovered.data.set(shifted, i);
      const m = measureRecovery(recovered, flatFrame(100, 100, reference), { stride: 1 });
      expect(m.meanDeltaE).toBeCloseTo((expected * offRows) / 100, 6);
      expect(m.p95DeltaE).toBeCloseTo(p95, 5);
      expect(m.maxDeltaE).toBeCloseTo(expected, 6);
    }
  });

  it('samples on a stride grid: every pixel up to about a megapixel, 2 at 1920×1080, 4 at 3840×2160', () => {
    expect(defaultRecoveryStride(1000, 1000)).toBe(1);
    expect(defaultRecoveryStride(1280, 720)).toBe(1);
    expect(defaultRecoveryStride(1920, 1080)).toBe(2);
    expect(defaultRecoveryStride(3840, 2160)).toBe(4);
    expect(defaultRecoveryStride(7680, 4320)).toBe(8);
    const frame = flatFrame(100, 70, [20000, 20000, 20000]);
    expect(measureRecovery(frame, frame, { stride: 3 }).sampleCount).toBe(34 * 24);
    expect(() => measureRecovery(frame, frame, { stride: 0 })).toThrow(InvalidInputError);
  });

  it('compares noise in the region: a frame 2 stops under, pushed back, carries 4× the σ (+2 stops)', () => {
    // Synthetic model: the same capture σ multiplied by 2^2 when the grade pushes the exposure back.
    const reference = synthChartFrame({ width: 1200, height: 800, layout: 'flat', noiseSigma: 0.003, seed: 1 }).frame;
    const recovered = synthChartFrame({
      width: 1200,
      height: 800,
      layout: 'flat',
      noiseSigma: 0.003,
      exposureOffsetStops: -2,
      captureBitDepth: 0,
      seed: 2,
    }).frame;
    const m = measureRecovery(recovered, reference, { region: { x: 200, y: 200, w: 800, h: 400 } });
    expect(Math.abs(m.noiseRatio! / 4 - 1)).toBeLessThan(0.02);
    expect(m.noiseStops!).toBeCloseTo(2, 1);
  });

  it('reports clipped and crushed fractions of the recovered frame', () => {
    const reference = flatFrame(10, 10, [30000, 30000, 30000]);
    const recovered = flatFrame(10, 10, [30000, 30000, 30000]);
    recovered.data.set([65535, 60000, 50000], 0);
    recovered.data.set([0, 0, 0, 0, 0, 0], 3);
    const m = measureRecovery(recovered, reference);
    expect(m.clippedFraction).toBe(0.01);
    expect(m.crushedFraction).toBe(0.02);
  });

  it('refuses frames of different sizes', () => {
    expect(() => measureRecovery(flatFrame(10, 10, [1, 1, 1]), flatFrame(10, 11, [1, 1, 1]))).toThrow(InvalidInputError);
  });
});

describe('difference map', () => {
  it('is a PNG with one pixel per cell, coloured by the legend', async () => {
    const reference = flatFrame(320, 180, [30000, 30000, 30000]);
    const recovered = flatFrame(320, 180, [30000, 30000, 30000]);
    // Right half far off (ΔE00 ≫ 10), left half identical.
    for (let y = 0; y < 180; y++) for (let x = 160; x < 320; x++) recovered.data.set([60000, 5000, 5000], (y * 320 + x) * 3);
    const readout = await recoveryReadout(recovered, reference, { mapWidth: 32 });
    expect([readout.mapWidth, readout.mapHeight]).toEqual([32, 18]);
    const { data, info } = await sharp(readout.differenceMap).raw().toBuffer({ resolveWithObject: true });
    expect([info.width, info.height, info.channels]).toEqual([32, 18, 3]);
    expect(Array.from(data.subarray(0, 3))).toEqual([...DIFFERENCE_MAP_LEGEND[0].rgb]);
    const last = (18 * 32 - 1) * 3;
    expect(Array.from(data.subarray(last, last + 3))).toEqual([...DIFFERENCE_MAP_LEGEND[DIFFERENCE_MAP_LEGEND.length - 1].rgb]);
  });

  it('interpolates between legend stops and clamps above the last', () => {
    expect(differenceMapColour(0)).toEqual([16, 16, 24]);
    expect(differenceMapColour(2.5)).toEqual([0, 160, 160]);
    expect(differenceMapColour(1.75)).toEqual([15, 110, 155]);
    expect(differenceMapColour(40)).toEqual([255, 60, 120]);
    expect(differenceMapColour(Number.NaN)).toEqual([128, 128, 128]);
  });
});

describe('selectKth', () => {
  it('returns what sorting returns (fast-check)', () => {
    fc.assert(
      fc.property(fc.array(fc.float({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 300 }), fc.nat(), (values, k) => {
        const index = k % values.length;
        const sorted = Float32Array.from(values).sort();
        return selectKth(Float32Array.from(values), index) === sorted[index]; // === also equates −0 and +0
      }),
    );
  });
});
