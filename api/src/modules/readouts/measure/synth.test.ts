import { describe, expect, it } from 'vitest';
import { linearToSrgb, bt709Oetf } from '@midgray/shared/color';
import { seededGaussian, synthChartFrame, SYNTH_SURROUND_LINEAR } from './synth.ts';
import { exposureFractions } from './noise.ts';

describe('synthChartFrame (invented test data)', () => {
  it('is deterministic for a seed and changes with the seed', () => {
    const a = synthChartFrame({ width: 64, height: 36, noiseSigma: 0.01, seed: 7 }).frame.data;
    const b = synthChartFrame({ width: 64, height: 36, noiseSigma: 0.01, seed: 7 }).frame.data;
    const c = synthChartFrame({ width: 64, height: 36, noiseSigma: 0.01, seed: 8 }).frame.data;
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(Array.from(a)).not.toEqual(Array.from(c));
  });

  it('encodes noiseless patches to the nearest code of the IEC 61966-2-1 / BT.709-6 formulas', () => {
    // The generator encodes through an interpolated table; its code must be the formula's value
    // (IEC 61966-2-1 encoding; ITU-R BT.709-6 OETF) rounded, give or take the table's ~1e-7 at a tie.
    for (const transfer of ['srgb', 'bt709'] as const) {
      const encode = transfer === 'srgb' ? linearToSrgb : bt709Oetf;
      const chart = synthChartFrame({ width: 300, height: 200, transfer, captureBitDepth: 0 });
      const { frame } = chart;
      for (const patch of chart.patches) {
        const i = ((patch.rect.y + 1) * frame.width + patch.rect.x + 1) * 3;
        for (let k = 0; k < 3; k++) {
          expect(Math.abs(frame.data[i + k] - encode(patch.linearRgb[k]) * 65535)).toBeLessThanOrEqual(0.5 + 1e-4);
        }
      }
      expect(Math.abs(frame.data[0] - encode(SYNTH_SURROUND_LINEAR) * 65535)).toBeLessThanOrEqual(0.5 + 1e-4);
    }
  });

  it('has a 6×4 chart by default whose last row is greys from L* 96 to 20', () => {
    const chart = synthChartFrame({ width: 600, height: 400 });
    expect(chart.patches).toHaveLength(24);
    const greys = chart.patches.filter((p) => p.row === 3);
    // CIE 15: Y = ((L* + 16) / 116)^3 for L* > 8.
    expect(greys[0].linearRgb[1]).toBeCloseTo(Math.pow(112 / 116, 3), 12);
    expect(greys[5].linearRgb[1]).toBeCloseTo(Math.pow(36 / 116, 3), 12);
    for (const p of greys) expect(new Set(p.linearRgb).size).toBe(1);
  });

  it('when shot N stops over without recovery, clips exactly the pixels the scene model says', () => {
    // Expected from the scene model by hand: capture v · 2^N clamped to 1, 12-bit quantised,
    // sRGB encoded (IEC 61966-2-1); clipped when a code reaches 65535 − floor(0.002 · 65535).
    const codeOf = (v: number) => Math.round(linearToSrgb(Math.min(1, Math.round(Math.min(1, v) * 4095) / 4095)) * 65535);
    for (const stops of [1, 2, 3]) {
      const chart = synthChartFrame({ width: 480, height: 270, exposureOffsetStops: stops, recover: false });
      const clips = (rgb: readonly number[]) => rgb.some((v) => codeOf(v * 2 ** stops) >= 65404);
      let clippedPixels = clips([SYNTH_SURROUND_LINEAR, SYNTH_SURROUND_LINEAR, SYNTH_SURROUND_LINEAR]) ? 480 * 270 : 0;
      for (const p of chart.patches) if (clips(p.linearRgb)) clippedPixels += p.rect.w * p.rect.h;
      expect(clippedPixels).toBeGreaterThan(0);
      expect(exposureFractions(chart.frame).clippedFraction).toBe(clippedPixels / (480 * 270));
    }
  });

  it('draws standard normal noise (mean 0, σ 1 over 200 000 draws)', () => {
    const next = seededGaussian(99);
    let sum = 0;
    let sumSq = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) {
      const v = next();
      sum += v;
      sumSq += v * v;
    }
    const mean = sum / n;
    // Standard errors: mean 1/√n ≈ 0.0022, σ ≈ 1/√(2n) ≈ 0.0016.
    expect(Math.abs(mean)).toBeLessThan(0.01);
    expect(Math.sqrt(sumSq / n - mean * mean)).toBeCloseTo(1, 2);
  });
});
