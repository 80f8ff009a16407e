// The figures a readout stores, on synthetic chart frames (invented data, see measure/synth.ts).
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { centreTenthRegion, synthChartFrame } from './measure/index.ts';
import { framePreview, neutralPatchIndex, noiseFigures, recoveryFigures, regionToPixels, softwareVersion } from './readout-figures.ts';

describe('regions in fractions of the frame', () => {
  it('rounds edges to whole pixels and keeps them inside the frame', () => {
    expect(regionToPixels(1920, 1080, { x: 0.25, y: 0.5, w: 0.5, h: 0.25 })).toEqual({ x: 480, y: 540, w: 960, h: 270 });
    expect(regionToPixels(640, 360, { x: 0, y: 0, w: 1, h: 1 })).toEqual({ x: 0, y: 0, w: 640, h: 360 });
    // A sliver thinner than a pixel still measures one pixel.
    expect(regionToPixels(100, 100, { x: 0.999, y: 0.5, w: 0.001, h: 0.001 })).toEqual({ x: 99, y: 50, w: 1, h: 1 });
  });

  it('defaults to the centre tenth', () => {
    expect(regionToPixels(3840, 2160, null)).toEqual(centreTenthRegion(3840, 2160));
  });
});

describe('noise figures', () => {
  const chart = synthChartFrame({ width: 960, height: 540, noiseSigma: 0.004, chromaNoiseSigma: 0.002, seed: 21 });
  const frac = (r: { x: number; y: number; w: number; h: number }) => ({ x: r.x / 960, y: r.y / 540, w: r.w / 960, h: r.h / 540 });

  it('with a grid over the chart, the headline comes from the patch nearest neutral L* 50', () => {
    const figures = noiseFigures(chart.frame, { region: frac(chart.chartRegion), grid: { cols: 6, rows: 4, patch: null }, transfer: 'srgb' });
    // The synthetic chart's last row holds greys at L* 96, 80.8, 65.6, 50.4, 35.2, 20: the fourth is nearest 50.
    expect(figures.patchIndex).toBe(3 * 6 + 3);
    expect(figures.headline).toBe('patch');
    const patch = figures.grid!.patches[21];
    expect([patch.col, patch.row]).toEqual([3, 3]);
    expect(figures.snrDb).toBe(patch.snrDb);
    expect(figures.meanL).toBeCloseTo(50.4, 0);
    // Ground truth of the generator: linear luma of the patch / σ (0.004 luma ⊕ 0.002 per channel).
    const y = chart.patches[21].linearRgb[0];
    const sigma = Math.hypot(0.004, 0.002 * Math.hypot(0.2126, 0.7152, 0.0722));
    expect(Math.abs(patch.sigmaLinearLuma / sigma - 1)).toBeLessThan(0.03);
    expect(patch.snrDb!).toBeCloseTo(20 * Math.log10(y / sigma), 0);
    expect(patch.chromaNoise).toBeCloseTo(Math.hypot(patch.chromaSigmaA, patch.chromaSigmaB), 12);
  });

  it('an explicit patch wins over the automatic pick', () => {
    const figures = noiseFigures(chart.frame, { region: frac(chart.chartRegion), grid: { cols: 6, rows: 4, patch: 18 }, transfer: 'srgb' });
    expect(figures.patchIndex).toBe(18);
    expect(figures.meanL).toBeCloseTo(96, 0);
  });

  it('without a grid the headline is the region itself', () => {
    const figures = noiseFigures(chart.frame, { region: null, grid: null, transfer: 'srgb' });
    expect([figures.headline, figures.patchIndex, figures.grid]).toEqual(['region', null, null]);
    expect(figures.region).toEqual(centreTenthRegion(960, 540));
    expect([figures.width, figures.height, figures.bitDepth, figures.transfer]).toEqual([960, 540, 16, 'srgb']);
  });

  it('picks the first of two equally neutral patches, so the pick never flips between runs', () => {
    expect(neutralPatchIndex([{ meanL: 60, meanA: 0, meanB: 0 }, { meanL: 40, meanA: 0, meanB: 0 }, { meanL: 50, meanA: 6, meanB: 8 }])).toBe(0);
    expect(neutralPatchIndex([{ meanL: 60, meanA: 0, meanB: 0 }, { meanL: 52, meanA: 1, meanB: 0 }])).toBe(1);
  });
});

describe('recovery figures', () => {
  it('against itself: ΔE00 0, noise ratio 1, and the reference fractions equal the frame’s', async () => {
    const { frame } = synthChartFrame({ width: 320, height: 180, noiseSigma: 0.003, seed: 4, exposureOffsetStops: 0 });
    const { results, differenceMap } = await recoveryFigures(frame, frame, { region: null, transfer: 'srgb', stride: null });
    expect([results.meanDeltaE, results.p95DeltaE, results.maxDeltaE, results.noiseRatio]).toEqual([0, 0, 0, 1]);
    expect(results.referenceClippedFraction).toBe(results.clippedFraction);
    expect(results.referenceCrushedFraction).toBe(results.crushedFraction);
    const meta = await sharp(differenceMap).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['png', results.mapWidth, results.mapHeight]);
  });

  it('a frame 3 stops over, pulled back, has lost its highlights: far beyond a just-noticeable difference', async () => {
    const reference = synthChartFrame({ width: 320, height: 180, noiseSigma: 0.003, seed: 4 }).frame;
    const over = synthChartFrame({ width: 320, height: 180, noiseSigma: 0.003, seed: 5, exposureOffsetStops: 3 }).frame;
    const { results } = await recoveryFigures(over, reference, { region: null, transfer: 'srgb', stride: 2 });
    expect(results.stride).toBe(2);
    expect(results.sampleCount).toBe(160 * 90);
    expect(results.meanDeltaE).toBeGreaterThan(2.5);
    // The flattened highlights are a minority of pixels with large differences: p95 well above the mean.
    expect(results.p95DeltaE).toBeGreaterThan(2 * results.meanDeltaE);
  });

  it('a frame 4 stops under, pushed back, has crushed shadows the reference does not have', async () => {
    const chart = synthChartFrame({ width: 320, height: 180, noiseSigma: 0.004, seed: 4 });
    const reference = chart.frame;
    const under = synthChartFrame({ width: 320, height: 180, noiseSigma: 0.004, seed: 6, exposureOffsetStops: -4 }).frame;
    // Noise compared on the middle of the L* 50 grey patch.
    const grey = chart.patches[21].rect;
    const region = { x: (grey.x + grey.w * 0.2) / 320, y: (grey.y + grey.h * 0.2) / 180, w: (grey.w * 0.6) / 320, h: (grey.h * 0.6) / 180 };
    const { results } = await recoveryFigures(under, reference, { region, transfer: 'srgb', stride: 1 });
    expect(results.referenceCrushedFraction).toBe(0);
    expect(results.crushedFraction).toBeGreaterThan(0.01);
    expect(results.noiseStops!).toBeGreaterThan(3); // pushed 4 stops: σ × 16 before clamping at black
  });
});

describe('software version and previews', () => {
  it('names the method and the decoder versions', () => {
    expect(softwareVersion()).toMatch(/^readouts \d+\.\d+\.\d+; sharp \d+\.\d+\.\d+; libvips \d+\.\d+/);
    expect(softwareVersion('ffmpeg 5.1')).toMatch(/; ffmpeg 5\.1$/);
  });

  it('previews a 16-bit frame as an 8-bit JPEG no wider than 1280 px', async () => {
    const { frame } = synthChartFrame({ width: 1920, height: 1080 });
    const meta = await sharp(await framePreview(frame)).metadata();
    expect([meta.format, meta.width, meta.height, meta.depth]).toEqual(['jpeg', 1280, 720, 'uchar']);
  });
});
