import { describe, expect, it } from 'vitest';
import * as exposure from './exposure.ts';
import * as pkg from './index.ts';

describe('public exposure module', () => {
  it('exports the names other code and outside checks call', () => {
    // Names fixed by issue 4.
    const names = [
      'stopsBetween', 'apertureStops', 'ev100', 'shutterAngleToSeconds', 'secondsToShutterAngle',
      'ndStops', 'ndDensityForStops', 'ndTransmission', 'nominalIsoSeries', 'nominalApertureSeries',
      'nominalShutterSeries', 'isoSweepPlan', 'latitudeBracketPlan', 'bytesForBitrate', 'formatBytesBoth',
      'uploadSeconds', 'circuitLoads',
    ] as const;
    for (const name of names) {
      expect(typeof exposure[name], name).toBe('function');
      expect(pkg[name], name).toBe(exposure[name]);
    }
    expect(typeof pkg.framesToTimecode).toBe('function');
    expect(typeof pkg.timecodeToFrames).toBe('function');
    expect(typeof pkg.specSheetLinesForPlan).toBe('function');
    expect(pkg.IsoSweepInputSchema).toBeDefined();
  });
});
