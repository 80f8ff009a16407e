import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from './errors.ts';
import { actualFromPlanned, parseBitrateMbps, planSteps, specSheetDraftsFor, stepDifference } from './test-plan.ts';
import type { PlannedSettings } from './schemas/test-plans.ts';

const SWEEP = {
  baseIso: 800,
  minIso: 100,
  maxIso: 6400,
  step: 'full',
  base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24000 / 1001, ndDensity: 0.9 },
  kit: { minFNumber: 1.4, maxFNumber: 16, ndDensities: [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1], shutterAngles: [180] },
} as const;

const planned = (p: Partial<PlannedSettings> = {}): PlannedSettings => ({
  fps: 24,
  iso: 800,
  fNumber: 4,
  shutterAngleDeg: 180,
  shutterSeconds: 1 / 48,
  ndDensity: 0.6,
  lightChangeStops: 0,
  ...p,
});

describe('planSteps', () => {
  it('gives one step per full stop of an ISO sweep, labelled by ISO (ISO 12232 marked series: 100, 200 … 6400)', () => {
    const steps = planSteps('iso_sweep', SWEEP);
    expect(steps.map((s) => s.iso)).toEqual([100, 200, 400, 800, 1600, 3200, 6400]);
    expect(steps.map((s) => s.index)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(steps[3]).toMatchObject({ label: 'ISO 800', offsetStops: null, planned: { iso: 800, ndDensity: 0.9, fNumber: 4, shutterAngleDeg: 180 } });
    // 180° at 24000/1001 fps is 1001/48000 s (common practice: 180° at 24 fps is 1/48 s).
    expect(steps[0].planned.shutterSeconds).toBeCloseTo(1001 / 48000, 12);
  });

  it('labels a bracket by its offset and keeps the grade correction', () => {
    const steps = planSteps('latitude_bracket', { baseIso: 800, base: SWEEP.base, maxOffsetStops: 1, step: 'third', kit: SWEEP.kit });
    expect(steps.map((s) => s.label)).toEqual(['−1 stops', '−⅔ stops', '−⅓ stops', '0 (reference)', '+⅓ stops', '+⅔ stops', '+1 stops']);
    expect(steps.map((s) => s.offsetStops)).toEqual([-1, -2 / 3, -1 / 3, 0, 1 / 3, 2 / 3, 1]);
    expect(steps[0].planned.gradeCorrectionLabel).toBe('+1 stop in the grade');
    expect(steps.every((s) => s.iso === 800)).toBe(true);
  });

  it('keeps custom steps as typed and derives the shutter time from the angle (172.8° at 24 fps = 1/50 s)', () => {
    const steps = planSteps('custom', { fps: 24, steps: [{ label: 'Flicker check', shutterAngleDeg: 172.8 }, { label: 'Open' }] });
    expect(steps[0].planned.shutterSeconds).toBeCloseTo(1 / 50, 12);
    expect(steps[1].planned).toMatchObject({ iso: null, shutterSeconds: null, notes: '' });
  });

  it('refuses bad custom input with the step number in the message', () => {
    expect(() => planSteps('custom', { fps: 24, steps: [] })).toThrow(new InvalidInputError('Add at least one step', 'steps'));
    expect(() => planSteps('custom', { fps: 24, steps: [{ label: 'a' }, { label: '  ' }] })).toThrow('Step 2: Each step needs a label');
    expect(() => planSteps('custom', { fps: 0, steps: [{ label: 'a' }] })).toThrow('Frame rate must be a number from 0 to 1000');
  });

  it('passes generator errors through as InvalidInputError (→ 422)', () => {
    expect(() => planSteps('iso_sweep', { ...SWEEP, minIso: 6400, maxIso: 100 })).toThrow(InvalidInputError);
  });
});

describe('specSheetDraftsFor', () => {
  it('pre-fills the ISO range of a sweep and only the frame rate of a custom test', () => {
    expect(specSheetDraftsFor('iso_sweep', SWEEP).find((l) => l.key === 'iso')!.value).toBe('100–6400, full stops');
    const custom = specSheetDraftsFor('custom', { fps: 30000 / 1001, steps: [{ label: 'a' }] });
    expect(custom.find((l) => l.key === 'frame_rate')!.value).toBe('29.97 fps');
    expect(custom.filter((l) => l.value !== '')).toHaveLength(1);
  });
});

describe('parseBitrateMbps (IEC 80000-13: k = 10³, M = 10⁶, G = 10⁹; 1 byte = 8 bits)', () => {
  it.each([
    ['400', 400],
    ['400 Mb/s', 400],
    ['400 Mbps', 400],
    ['400Mbit/s', 400],
    ['1.2 Gb/s', 1200],
    ['1,200 Mb/s', 1200],
    ['50 MB/s', 400],
    ['800 kb/s', 0.8],
    ['  280 Mb/s (intra-frame 4:2:2, from the recorder)', 280],
  ])('reads %s as %f Mb/s', (text, mbps) => {
    expect(parseBitrateMbps(text)).toBeCloseTo(mbps, 9);
  });

  it('returns null when the line names no bitrate', () => {
    for (const text of ['', 'ask the rental house', '0 Mb/s', '-5 Mb/s']) expect(parseBitrateMbps(text)).toBeNull();
  });
});

describe('stepDifference', () => {
  it('is zero with no changes when shot as planned', () => {
    expect(stepDifference(planned(), { iso: 800, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0.6, lightChangeStops: 0 })).toEqual({ stops: 0, changes: [] });
  });

  it('counts a doubled ISO as +1 stop (ISO 12232 arithmetic speeds: S doubles per stop)', () => {
    const d = stepDifference(planned(), { iso: 1600, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0.6, lightChangeStops: 0 });
    expect(d.stops).toBeCloseTo(1, 12);
    expect(d.changes).toEqual(['ISO 800 → 1600']);
  });

  it('counts f/4 → f/5.6 as −1 stop (standard f-number series: √2 per stop, marked 5.6 = 2^2.5)', () => {
    const d = stepDifference(planned(), { iso: 800, fNumber: 5.6, shutterAngleDeg: 180, ndDensity: 0.6, lightChangeStops: 0 });
    expect(d.stops).toBeCloseTo(-1, 12);
    expect(d.changes).toEqual(['f/4 → f/5.6']);
  });

  it('counts 180° → 90° as −1 stop and ND 0.6 → 0.9 as about −1 stop (ND 0.3 ≈ 1 stop, common practice)', () => {
    expect(stepDifference(planned(), { iso: 800, fNumber: 4, shutterAngleDeg: 90, ndDensity: 0.6, lightChangeStops: 0 }).stops).toBeCloseTo(-1, 12);
    const nd = stepDifference(planned(), { iso: 800, fNumber: 4, shutterAngleDeg: 180, ndDensity: 0.9, lightChangeStops: 0 });
    expect(nd.stops).toBeCloseTo(-0.3 / Math.log10(2), 9); // density D takes away D / log10(2) stops
    expect(nd.changes).toEqual(['ND 0.6 → 0.9']);
  });

  it('gives no total when the plan leaves a control open, but still lists the changes', () => {
    const d = stepDifference(planned({ fNumber: null }), { iso: 1000, fNumber: 2.8, shutterAngleDeg: 180, ndDensity: 0.6, lightChangeStops: 0 });
    expect(d.stops).toBeNull();
    expect(d.changes).toEqual(['ISO 800 → 1000']);
  });

  it('property: the difference of a change and its reverse cancel out', () => {
    const isos = [100, 125, 160, 200, 250, 320, 400, 500, 640, 800, 1000, 1250, 1600, 3200];
    const fs = [1.4, 2, 2.8, 4, 5.6, 8, 11, 16];
    fc.assert(
      fc.property(fc.constantFrom(...isos), fc.constantFrom(...fs), fc.integer({ min: 1, max: 360 }), fc.integer({ min: 0, max: 12 }), (iso, fNumber, angle, nd10) => {
        const a = planned();
        const actual = { iso, fNumber, shutterAngleDeg: angle, ndDensity: nd10 / 10, lightChangeStops: 0 };
        const there = stepDifference(a, actual).stops!;
        const back = stepDifference({ ...a, ...actual, fps: 24, shutterSeconds: angle / (360 * 24) }, actualFromPlanned(a, actual)).stops!;
        expect(there + back).toBeCloseTo(0, 9);
      }),
    );
  });
});
