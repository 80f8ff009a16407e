import { describe, expect, it } from 'vitest';
import type { ReadoutVerdict } from '@midgray/shared';
import { regionFromCorners } from './components/region-picker.tsx';
import { formatDb, formatNumber, formatPercent, formatStops, formatStopsShort, isoToX, thresholdSource, verdictHeadline, xToIso } from './readout-format.ts';
import { runInput } from './run-options.ts';

const verdict = (v: Partial<ReadoutVerdict>): ReadoutVerdict => ({
  kind: 'noise',
  thresholds: { snrThresholdDb: 20, deltaEThreshold: 2.5 },
  ceilingIso: null,
  latitudeWindow: null,
  stepsMeasured: 3,
  stepsTotal: 5,
  mixedSettings: [],
  ...v,
});

describe('readout figures on screen', () => {
  it('writes units beside numbers and a true minus sign', () => {
    expect(formatDb(23.456)).toBe('23.5 dB');
    expect(formatDb(null)).toBe('—');
    expect(formatNumber(-0.4567, 2)).toBe('\u22120.46');
    expect(formatNumber(-0.001, 2)).toBe('0.00'); // no "−0.00"
    expect(formatPercent(0)).toBe('0 %');
    expect(formatPercent(0.00026)).toBe('0.026 %');
    expect(formatPercent(0.2330)).toBe('23.3 %');
    expect(formatStops(2)).toBe('+2 stops');
    expect(formatStops(-1)).toBe('\u22121 stop');
    expect(formatStops(1 / 3)).toBe('+0.33 stops');
    expect(formatStopsShort(0)).toBe('0');
  });

  it('puts ISO on a log2 axis: one stop is one unit, nominal third-stop values come back as marked', () => {
    // ISO 12232 nominal third-stop series (common practice: 400, 500, 640, 800 …).
    expect(isoToX(1600) - isoToX(800)).toBe(1);
    for (const iso of [400, 500, 640, 800, 1000, 1250, 1600, 2000, 2500, 3200]) expect(xToIso(isoToX(iso))).toBe(iso);
  });

  it('states the verdict with or without a result', () => {
    expect(verdictHeadline(verdict({ ceilingIso: 1600 }))).toBe('Ceiling ISO 1600');
    expect(verdictHeadline(verdict({}))).toBe('Ceiling ISO: no step meets the threshold');
    expect(verdictHeadline(verdict({ stepsMeasured: 0 }))).toBe('Ceiling ISO: not measured yet');
    expect(verdictHeadline(verdict({ kind: 'recovery', latitudeWindow: { minStops: -1, maxStops: 2, offsets: [-1, 0, 1, 2] } }))).toBe('Latitude window \u22121 to +2 stops');
    expect(verdictHeadline(verdict({ kind: 'recovery', latitudeWindow: null }))).toMatch(/reference step is not within/);
  });

  it('names the source of a default threshold, and says when the channel chose its own', () => {
    expect(thresholdSource('noise', { snrThresholdDb: 20, deltaEThreshold: 2.5 })).toMatch(/ISO 12232:2019/);
    expect(thresholdSource('noise', { snrThresholdDb: 26, deltaEThreshold: 2.5 })).toMatch(/^Set by this channel/);
    expect(thresholdSource('recovery', { snrThresholdDb: 20, deltaEThreshold: 2.5 })).toMatch(/Song & Luo/);
  });
});

describe('drawing a region', () => {
  it('spans the two corners in any drag direction and stays inside the frame', () => {
    expect(regionFromCorners({ x: 0.6, y: 0.7 }, { x: 0.2, y: 0.1 })).toEqual({ x: 0.2, y: 0.1, w: 0.4, h: 0.6 });
    expect(regionFromCorners({ x: -0.5, y: 0.5 }, { x: 1.5, y: 0.6 })).toEqual({ x: 0, y: 0.5, w: 1, h: 0.1 });
    // A click without a drag still gives a usable rectangle.
    const dot = regionFromCorners({ x: 1, y: 1 }, { x: 1, y: 1 });
    expect(dot.x + dot.w).toBeLessThanOrEqual(1);
    expect(dot.w).toBeGreaterThan(0);
  });
});

describe('run options', () => {
  it('sends only what differs from the server’s defaults', () => {
    expect(runInput({ grid: null, transfer: 'auto', frameTimeSeconds: '' }, 'noise')).toEqual({});
    expect(runInput({ grid: { cols: 6, rows: 4, patch: null }, transfer: 'bt709', frameTimeSeconds: '2.5' }, 'noise')).toEqual({ grid: { cols: 6, rows: 4, patch: null }, transfer: 'bt709', frameTimeSeconds: 2.5 });
    // A grid means nothing to a recovery readout.
    expect(runInput({ grid: { cols: 6, rows: 4, patch: null }, transfer: 'auto', frameTimeSeconds: 'x' }, 'recovery')).toEqual({});
  });
});
