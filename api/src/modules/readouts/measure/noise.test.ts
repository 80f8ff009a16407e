import { describe, expect, it } from 'vitest';
import { ColorSpace, Lab_D65, XYZ_D65, sRGB, sRGB_Linear, to } from 'colorjs.io/fn';
import { InvalidInputError } from '@midgray/shared/errors';
import { LUMA_709 } from '@midgray/shared/color';
import type { Frame } from './frame.ts';
import { exposureFractions, gridNoiseReadout, noiseReadout } from './noise.ts';
import { seededRandom, synthChartFrame } from './synth.ts';

for (const space of [XYZ_D65, sRGB_Linear, sRGB, Lab_D65]) ColorSpace.register(space);

/** CIELAB (D65) of linear sRGB by the independent reference library. */
function referenceLab(linear: readonly number[]): number[] {
  return to({ space: sRGB_Linear, coords: [linear[0], linear[1], linear[2]], alpha: 1 }, Lab_D65).coords as number[];
}

const within = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual / expected - 1)).toBeLessThanOrEqual(relative);

describe('noise readout on synthetic frames with known Gaussian noise (invented data)', () => {
  // Ground truth is the generator's σ; SNR = mean / σ (ISO 15739 vocabulary), reported as 20·log10.
  // Population σ over the centre tenth of a 2400×1600 frame: 38 400 pixels, standard error ≈ 0.4 %.
  const cases = [0.002, 0.005, 0.01, 0.02].flatMap((sigma) =>
    (['srgb', 'bt709'] as const).map((transfer) => ({ sigma, transfer })),
  );

  it.each(cases)('when σ = $sigma (linear luma, $transfer), then σ and SNR come back within 2 %', ({ sigma, transfer }) => {
    const { frame } = synthChartFrame({ width: 2400, height: 1600, layout: 'flat', noiseSigma: sigma, transfer, seed: 11 });
    const readout = noiseReadout(frame, null, { transfer });
    expect(readout.pixelCount).toBe(240 * 160);
    within(readout.meanLinearLuma, 0.18, 0.002);
    within(readout.sigmaLinearLuma, sigma, 0.02);
    within(readout.meanLinearLuma / readout.sigmaLinearLuma, 0.18 / sigma, 0.02);
    expect(readout.snrDb).toBeCloseTo(20 * Math.log10(readout.meanLinearLuma / readout.sigmaLinearLuma), 12);
    // Luma-only noise moves R, G and B together: a grey stays grey, so no chroma noise.
    expect(readout.chromaSigmaA).toBeLessThan(1e-6);
    expect(readout.chromaSigmaB).toBeLessThan(1e-6);
  });

  it('when the frame is 8-bit, then σ still comes back within 2 % (σ well above one code)', () => {
    const { frame } = synthChartFrame({ width: 2400, height: 1600, layout: 'flat', noiseSigma: 0.02, bitDepth: 8, seed: 5 });
    const readout = noiseReadout(frame);
    within(readout.sigmaLinearLuma, 0.02, 0.02);
  });

  it('when noise is independent per channel, then luma σ and a*/b* σ follow first-order propagation', () => {
    // Luma σ = σc·√(Σ k²) with the BT.709-6 weights; a*/b* σ from the Jacobian of linear RGB → L*a*b*
    // computed by colorjs.io (independent library) with central differences at the grey.
    const sigmaC = 0.004;
    const { frame } = synthChartFrame({ width: 2400, height: 1600, layout: 'flat', chromaNoiseSigma: sigmaC, seed: 3 });
    const readout = noiseReadout(frame, { x: 600, y: 400, w: 1200, h: 800 });
    const lumaGain = Math.hypot(LUMA_709.r, LUMA_709.g, LUMA_709.b);
    within(readout.sigmaLinearLuma, sigmaC * lumaGain, 0.02);
    const h = 1e-6;
    let varA = 0;
    let varB = 0;
    for (let k = 0; k < 3; k++) {
      const plus = [0.18, 0.18, 0.18];
      const minus = [0.18, 0.18, 0.18];
      plus[k] += h;
      minus[k] -= h;
      const lp = referenceLab(plus), lm = referenceLab(minus);
      varA += ((lp[1] - lm[1]) / (2 * h)) ** 2 * sigmaC ** 2;
      varB += ((lp[2] - lm[2]) / (2 * h)) ** 2 * sigmaC ** 2;
    }
    within(readout.chromaSigmaA, Math.sqrt(varA), 0.03);
    within(readout.chromaSigmaB, Math.sqrt(varB), 0.03);
    expect(Math.abs(readout.meanA)).toBeLessThan(0.02);
    expect(Math.abs(readout.meanB)).toBeLessThan(0.02);
  });

  it('when the frame has no noise, then σ is 0 and SNR is null rather than infinite', () => {
    const { frame } = synthChartFrame({ width: 200, height: 100, layout: 'flat' });
    const readout = noiseReadout(frame);
    expect(readout.sigmaLinearLuma).toBe(0);
    expect(readout.snrDb).toBeNull();
  });
});

describe('colour cast', () => {
  it('reports mean a*, b* equal to the L*a*b* of the frame colour by colorjs.io, with the trade signs', () => {
    for (const linear of [
      [0.2, 0.18, 0.16], // warm: +a* (towards magenta-red), +b* (towards yellow)
      [0.16, 0.2, 0.18], // green cast: −a*
      [0.17, 0.18, 0.21], // blue cast: −b*
    ] as const) {
      const { frame } = synthChartFrame({ width: 64, height: 64, layout: 'flat', flatLinearRgb: linear, captureBitDepth: 0 });
      const readout = noiseReadout(frame, { x: 0, y: 0, w: 64, h: 64 });
      // Expected from the frame's actual codes, decoded and converted by the reference library.
      const codes = [frame.data[0], frame.data[1], frame.data[2]].map((c) => c / 65535);
      const expected = to({ space: sRGB, coords: [codes[0], codes[1], codes[2]], alpha: 1 }, Lab_D65).coords as number[];
      expect(readout.meanL).toBeCloseTo(expected[0], 6);
      expect(readout.meanA).toBeCloseTo(expected[1], 6);
      expect(readout.meanB).toBeCloseTo(expected[2], 6);
    }
    const warm = noiseReadout(synthChartFrame({ width: 32, height: 32, layout: 'flat', flatLinearRgb: [0.2, 0.18, 0.16] }).frame);
    const green = noiseReadout(synthChartFrame({ width: 32, height: 32, layout: 'flat', flatLinearRgb: [0.16, 0.2, 0.18] }).frame);
    const blue = noiseReadout(synthChartFrame({ width: 32, height: 32, layout: 'flat', flatLinearRgb: [0.17, 0.18, 0.21] }).frame);
    expect(warm.meanA).toBeGreaterThan(0);
    expect(warm.meanB).toBeGreaterThan(0);
    expect(green.meanA).toBeLessThan(0);
    expect(blue.meanB).toBeLessThan(0);
  });
});

/** A 16-bit frame filled with one code. */
function filledFrame(width: number, height: number, code: number, bitDepth: 8 | 16 = 16): Frame {
  const data = bitDepth === 16 ? new Uint16Array(width * height * 3) : new Uint8Array(width * height * 3);
  data.fill(code);
  return { width, height, channels: 3, bitDepth, data };
}

describe('clipped and crushed fractions of the whole frame', () => {
  it('when a known set of pixels has one channel at the clip threshold, then that fraction comes back', () => {
    const frame = filledFrame(100, 80, 30000);
    const random = seededRandom(42);
    const picked = new Set<number>();
    while (picked.size < 137) picked.add(Math.floor(random() * 8000));
    for (const p of picked) frame.data[p * 3 + Math.floor(random() * 3)] = random() < 0.5 ? 65535 : 65404;
    // Just under the threshold (65535 − floor(0.002 · 65535) = 65404) is not clipped.
    let nearly = 0;
    for (let p = 0; p < 8000 && nearly < 50; p++) if (!picked.has(p)) { frame.data[p * 3 + 1] = 65403; nearly++; }
    const { clippedFraction, crushedFraction } = exposureFractions(frame);
    expect(clippedFraction).toBe(137 / 8000);
    expect(crushedFraction).toBe(0);
    expect(noiseReadout(frame).clippedFraction).toBe(137 / 8000); // whole frame, not the region
  });

  it('8-bit frames clip at 255 only by default; a wider tolerance is an option', () => {
    const frame = filledFrame(10, 10, 120, 8);
    frame.data[0] = 255;
    frame.data[4] = 254;
    expect(exposureFractions(frame).clippedFraction).toBe(1 / 100);
    expect(exposureFractions(frame, { clipTolerance: 0.004 }).clippedFraction).toBe(2 / 100); // 255 − 1
  });

  it('crushes pixels whose BT.709 luma code is at or below 0.5 % of full scale', () => {
    const frame = filledFrame(10, 10, 20000);
    const set = (p: number, r: number, g: number, b: number) => frame.data.set([r, g, b], p * 3);
    set(0, 0, 0, 0);
    set(1, 327, 327, 327); // luma 327 ≤ 327.675
    set(2, 328, 328, 328); // luma 328 > 327.675
    set(3, 1000, 200, 100); // luma 0.2126·1000 + 0.7152·200 + 0.0722·100 = 362.9 > 327.675
    set(4, 900, 150, 100); // luma 191.3 + 107.3 + 7.2 = 305.9 ≤ 327.675
    expect(exposureFractions(frame).crushedFraction).toBe(3 / 100);
  });
});

describe('regions and the grid', () => {
  it('rejects a region outside the frame', () => {
    const { frame } = synthChartFrame({ width: 100, height: 50, layout: 'flat' });
    expect(() => noiseReadout(frame, { x: 90, y: 0, w: 20, h: 10 })).toThrow(InvalidInputError);
  });

  it('measures each patch of a 6×4 chart: mean luma of the patch colour, σ within 2 %', () => {
    // Invented chart; expected mean = BT.709 luma of the patch's linear RGB, expected σ from the
    // generator: √(σl² + σc²·Σk²).
    const sigmaL = 0.004;
    const sigmaC = 0.002;
    const chart = synthChartFrame({ width: 1920, height: 1280, noiseSigma: sigmaL, chromaNoiseSigma: sigmaC, seed: 21 });
    const grid = gridNoiseReadout(chart.frame, chart.chartRegion, chart.cols, chart.rows);
    expect(grid.patches).toHaveLength(24);
    const expectedSigma = Math.sqrt(sigmaL ** 2 + sigmaC ** 2 * (LUMA_709.r ** 2 + LUMA_709.g ** 2 + LUMA_709.b ** 2));
    grid.patches.forEach((patch, i) => {
      const truth = chart.patches[i];
      expect([patch.col, patch.row]).toEqual([truth.col, truth.row]);
      const [r, g, b] = truth.linearRgb;
      expect(patch.meanLinearLuma).toBeCloseTo(LUMA_709.r * r + LUMA_709.g * g + LUMA_709.b * b, 3);
      within(patch.sigmaLinearLuma, expectedSigma, 0.02);
      // Mean L*a*b* of a patch is its colour's L*a*b* (colorjs.io), noise averaging out.
      const lab = referenceLab(truth.linearRgb);
      expect(Math.abs(patch.meanL - lab[0])).toBeLessThan(0.1);
      expect(Math.abs(patch.meanA - lab[1])).toBeLessThan(0.1);
      expect(Math.abs(patch.meanB - lab[2])).toBeLessThan(0.1);
    });
    expect(grid.clippedFraction).toBe(0);
  });
});
