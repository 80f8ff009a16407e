import { describe, expect, it } from 'vitest';
import {
  BRACKET_MAX_OFFSET_STOPS,
  DEFAULT_CONTROL_PRIORITY,
  IsoSweepInputSchema,
  LatitudeBracketInputSchema,
  PLAN_ISO_MAX,
  PLAN_ISO_MIN,
  type IsoSweepInput,
  type LatitudeBracketInput,
} from './plans.ts';

const sweep = {
  baseIso: 800,
  minIso: 100,
  maxIso: 51200,
  step: 'full',
  base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24000 / 1001 },
  kit: { minFNumber: 1.4, maxFNumber: 22 },
};

describe('plan input schemas', () => {
  it('fills defaults: ND 0, empty kit lists, no dimmer, ND → aperture → shutter → light', () => {
    const parsed: IsoSweepInput = IsoSweepInputSchema.parse(sweep);
    expect(parsed.base.ndDensity).toBe(0);
    expect(parsed.kit).toMatchObject({ ndDensities: [], shutterAngles: [], lightsDimmable: false, lightDownStops: 0 });
    expect(parsed.priority).toEqual([...DEFAULT_CONTROL_PRIORITY]);
    expect(DEFAULT_CONTROL_PRIORITY).toEqual(['nd', 'aperture', 'shutter', 'light']);
  });
  it('exports the limits the forms show', () => {
    expect(BRACKET_MAX_OFFSET_STOPS).toBe(6);
    expect(PLAN_ISO_MIN).toBeLessThanOrEqual(6);
    expect(PLAN_ISO_MAX).toBe(409600);
  });
  it('reports each problem on its field with a message a person can act on', () => {
    const result = IsoSweepInputSchema.safeParse({ ...sweep, base: { ...sweep.base, fps: 0 } });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]).toMatchObject({
      path: ['base', 'fps'],
      message: 'Frame rate must be a positive number of frames per second (got 0).',
    });
    const tooFast = IsoSweepInputSchema.safeParse({ ...sweep, base: { ...sweep.base, fps: 5000 } });
    expect(tooFast.error!.issues[0]!.message).toBe('Frame rate must be at most 1000 frames per second (got 5000).');
    const reversedLens = IsoSweepInputSchema.safeParse({ ...sweep, kit: { minFNumber: 22, maxFNumber: 1.4 } });
    expect(reversedLens.error!.issues.map((i) => i.path.join('.'))).toContain('kit.minFNumber');
  });
  it('accepts a bracket of 1 to 6 stops and refuses more', () => {
    const bracket = { baseIso: 800, base: sweep.base, maxOffsetStops: 6, step: 'third', kit: sweep.kit };
    const parsed: LatitudeBracketInput = LatitudeBracketInputSchema.parse(bracket);
    expect(parsed.maxOffsetStops).toBe(6);
    expect(LatitudeBracketInputSchema.safeParse({ ...bracket, maxOffsetStops: 7 }).success).toBe(false);
    expect(LatitudeBracketInputSchema.safeParse({ ...bracket, step: 'half' }).success).toBe(false);
  });
});
