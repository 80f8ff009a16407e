import { describe, expect, it } from 'vitest';
import { InvalidInputError } from './errors.ts';
import { SPEC_SHEET_LINES, SPEC_SHEET_LINE_KEYS, specSheetLinesForPlan } from './spec-sheet.ts';

const kit = { minFNumber: 1.4, maxFNumber: 22, ndDensities: [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1, 2.4], shutterAngles: [180] };

describe('standard spec-sheet lines', () => {
  it('lists the nineteen lines of the product brief in a stable order', () => {
    expect(SPEC_SHEET_LINES.map((l) => l.label)).toEqual([
      'Body', 'Lens', 'Resolution', 'Frame rate', 'Shutter', 'Aperture', 'ND', 'ISO', 'White balance',
      'Gamma / log profile', 'Colour space', 'Codec', 'Bit depth', 'Chroma subsampling', 'Bitrate',
      'Monitoring LUT', 'Lighting', 'Scene / chart', 'Media',
    ]);
    expect(SPEC_SHEET_LINES.map((l) => l.key)).toEqual([...SPEC_SHEET_LINE_KEYS]);
    expect(SPEC_SHEET_LINES.map((l) => l.position)).toEqual(SPEC_SHEET_LINES.map((_, i) => i));
  });
  it('requires the capture settings a test cannot be compared without', () => {
    const required = SPEC_SHEET_LINES.filter((l) => l.requiredByDefault).map((l) => l.key);
    expect(required).toEqual(expect.arrayContaining(['body', 'lens', 'frame_rate', 'shutter', 'aperture', 'nd', 'iso', 'codec']));
    expect(required).not.toContain('monitoring_lut');
    expect(required).not.toContain('media');
  });
});

describe('specSheetLinesForPlan', () => {
  it('when an ISO sweep 100–51200 in full stops, then ISO reads "100–51200, full stops" and the exposure lines are filled', () => {
    const lines = specSheetLinesForPlan('iso_sweep', {
      baseIso: 800,
      minIso: 100,
      maxIso: 51200,
      step: 'full',
      base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24000 / 1001, ndDensity: 0.6 },
      kit,
    });
    const value = Object.fromEntries(lines.map((l) => [l.key, l.value]));
    expect(value.iso).toBe('100–51200, full stops');
    // NTSC-family rate 24000/1001 is labelled 23.976 fps (common practice).
    expect(value.frame_rate).toBe('23.976 fps');
    // 180° at 23.976 fps is 1001/48000 s ≈ 1/48 s (common practice: the 180° rule).
    expect(value.shutter).toBe('180° (1/48 s)');
    expect(value.aperture).toBe('f/2.8–f/4, varies by step (base f/4)');
    expect(value.nd).toBe('0.0–2.4, varies by step (base 0.6)');
    expect(value.body).toBe('');
    expect(lines.every((l) => !l.checked)).toBe(true);
    expect(lines).toHaveLength(19);
  });
  it('when a latitude bracket, then ISO is the fixed base and lighting says how far the dimmer moves', () => {
    const lines = specSheetLinesForPlan('latitude_bracket', {
      baseIso: 800,
      base: { fNumber: 4, shutter: { kind: 'seconds', seconds: 1 / 50 }, fps: 25 },
      maxOffsetStops: 2,
      step: 'full',
      kit: { minFNumber: 4, maxFNumber: 4, lightsDimmable: true, lightDownStops: 2, lightUpStops: 2 },
      priority: ['light'],
    });
    const value = Object.fromEntries(lines.map((l) => [l.key, l.value]));
    expect(value.iso).toBe('800');
    // 1/50 s at 25 fps is a 180° shutter (t = angle / (360 · fps)).
    expect(value.shutter).toBe('180° (1/50 s)');
    expect(value.aperture).toBe('f/4');
    expect(value.nd).toBe('0.0');
    expect(value.lighting).toBe('Light level varies by step: −2 to +2 stops from the base level');
  });
  it('when a custom test, then the lines are blank with their default flags', () => {
    const lines = specSheetLinesForPlan('custom');
    expect(lines.every((l) => l.value === '')).toBe(true);
    expect(lines.find((l) => l.key === 'iso')).toMatchObject({ required: true, inDescription: true, checked: false });
  });
  it('when the plan input is invalid, then InvalidInputError', () => {
    expect(() =>
      specSheetLinesForPlan('iso_sweep', {
        baseIso: 800,
        minIso: 100,
        maxIso: 400,
        step: 'full',
        base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 0 },
        kit,
      }),
    ).toThrow(InvalidInputError);
  });
});
