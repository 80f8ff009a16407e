import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../errors.ts';
import {
  apertureStops,
  ev100,
  ndDensityForStops,
  ndStops,
  ndTransmission,
  secondsToShutterAngle,
  shutterAngleToSeconds,
  stopsBetween,
} from './math.ts';

describe('stopsBetween', () => {
  it('when ISO doubles, then it is one stop', () => {
    // ISO 5800 arithmetic scale: doubling the speed is one stop (100/21° → 200/24°, +3° per stop).
    expect(stopsBetween(100, 200)).toBe(1);
  });
  it('when the sweep runs ISO 100 → 51200, then it spans 9 stops', () => {
    // ISO 5800 logarithmic pairs: 100/21° and 51200/48° are (48 − 21) / 3 = 9 stops apart.
    expect(stopsBetween(100, 51200)).toBe(9);
  });
  it('when exposure time halves, then it is minus one stop', () => {
    // APEX: Tv = log2(1/t); 1/64 s is Tv 6 and 1/128 s is Tv 7.
    expect(stopsBetween(2 ** -6, 2 ** -7)).toBe(-1);
  });
  it('when the times are the marked 1/60 and 1/30, then it is one stop', () => {
    // Standard shutter-speed series: adjacent full stops 1/60 → 1/30 double the time.
    expect(stopsBetween(1 / 60, 1 / 30)).toBeCloseTo(1, 12);
  });
  it('is antisymmetric', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (a, b) => {
        expect(stopsBetween(a, b) + stopsBetween(b, a)).toBeCloseTo(0, 9);
      }),
    );
  });
});

describe('apertureStops', () => {
  it('when going f/1 → f/16, then it is 8 stops', () => {
    // APEX: Av = log2(N²); f/16 has Av 8, f/1 has Av 0.
    expect(apertureStops(1, 16)).toBe(8);
  });
  it('when going f/1 → the exact f/5.6, then it is 5 stops', () => {
    // APEX Av table: f/5.6 is Av 5 (N = 2^2.5 = 5.657).
    expect(apertureStops(1, 2 ** 2.5)).toBeCloseTo(5, 12);
  });
  it('when going between marked neighbours f/2.8 → f/4, then it is about one stop', () => {
    // Standard f-number series: adjacent full stops are one stop apart (markings are rounded).
    expect(apertureStops(2.8, 4)).toBeCloseTo(1, 1);
  });
  it('when opening up f/4 → f/2, then it is minus two stops', () => {
    // Standard f-number series: f/4, f/2.8, f/2 are two full stops.
    expect(apertureStops(4, 2)).toBe(-2);
  });
});

describe('ev100', () => {
  it('when f/1 at 1 s, then EV 0', () => {
    // APEX (ASA PH2.5-1960): Ev = Av + Tv, and f/1 (Av 0) at 1 s (Tv 0) is Ev 0.
    expect(ev100(1, 1)).toBe(0);
  });
  it('when f/16 at 1/125 s at ISO 100, then about EV 15', () => {
    // APEX: Av 8 + Tv ≈ 7 ≈ Ev 15; the "sunny 16" exposure for ISO 100 is common practice.
    expect(ev100(16, 1 / 125)).toBeCloseTo(15, 1);
  });
  it('when the APEX worked example Bv 2, Sv 7 (ISO 400) gives f/2 at Tv 7, then EV100 is 7', () => {
    // APEX: Ev = Bv + Sv; at ISO 400 (Sv 7) a Bv 2 scene is Ev 9 = f/2 (Av 2) at Tv 7. Referred to
    // ISO 100 (Sv 5) the same scene is Ev 2 + 5 = 7.
    expect(ev100(2, 2 ** -7, 400)).toBeCloseTo(7, 12);
  });
  it('when a 16 cd/m² scene is metered at ISO 100, then the meter settings give EV100 7', () => {
    // ISO 2720 reflected-light exposure equation N²/t = L·S/K with K = 12.5: L = 16 cd/m², S = 100
    // gives N²/t = 128, i.e. f/8 at 1/2 s.
    const nSquaredOverT = (16 * 100) / 12.5;
    expect(nSquaredOverT).toBe(128);
    expect(ev100(8, 0.5)).toBe(Math.log2(nSquaredOverT));
  });
  it('when ISO doubles at the same settings, then EV100 drops by one', () => {
    // ISO 5800 arithmetic scale: twice the speed needs one stop less light.
    expect(ev100(5.6, 1 / 50, 100) - ev100(5.6, 1 / 50, 200)).toBeCloseTo(1, 12);
  });
});

describe('shutter angle ↔ seconds', () => {
  it('when 180° at 24 fps, then 1/48 s', () => {
    // common practice: the 180° rule, t = angle / (360 · fps).
    expect(shutterAngleToSeconds(180, 24)).toBeCloseTo(1 / 48, 15);
  });
  it('when 360° at 25 fps, then one whole frame, 1/25 s', () => {
    // t = angle / (360 · fps) (common practice): a 360° shutter is open the whole frame.
    expect(shutterAngleToSeconds(360, 25)).toBeCloseTo(1 / 25, 15);
  });
  it('when 172.8° at 24 fps, then 1/50 s', () => {
    // common practice: 172.8° at 24 fps matches 50 Hz mains lighting (1/50 s).
    expect(shutterAngleToSeconds(172.8, 24)).toBeCloseTo(1 / 50, 15);
  });
  it('when 180° at 24000/1001 fps, then 1001/48000 s', () => {
    // NTSC-family rate 24000/1001 with t = angle / (360 · fps).
    expect(shutterAngleToSeconds(180, 24000 / 1001)).toBeCloseTo(1001 / 48000, 15);
  });
  it('when 1/50 s at 24 fps, then 172.8°', () => {
    // common practice (inverse of the above): angle = 360 · fps · t.
    expect(secondsToShutterAngle(1 / 50, 24)).toBeCloseTo(172.8, 10);
  });
  it('when 1/60 s at 30000/1001 fps, then 179.82°', () => {
    // NTSC-family rate 30000/1001: 360 · 29.97 / 60 = 179.82°.
    expect(secondsToShutterAngle(1 / 60, 30000 / 1001)).toBeCloseTo(179.82, 2);
  });
  it('when 1/24 s at 24 fps, then exactly 360° (one frame)', () => {
    // t = angle / (360 · fps) at the one-frame limit.
    expect(secondsToShutterAngle(1 / 24, 24)).toBe(360);
  });
  it('round-trips angle → seconds → angle at fractional rates', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 360, noNaN: true }),
        fc.constantFrom(24000 / 1001, 24, 25, 30000 / 1001, 50, 60000 / 1001, 120),
        (angle, fps) => {
          expect(secondsToShutterAngle(shutterAngleToSeconds(angle, fps), fps)).toBeCloseTo(angle, 9);
        },
      ),
    );
  });
});

describe('neutral density', () => {
  it('when ND 0.3, then about one stop', () => {
    // common practice: ND 0.3 ≈ 1 stop; exactly 0.3 / log10(2) = 0.9966 (OD = −log10 T).
    expect(ndStops(0.3)).toBeCloseTo(0.9966, 4);
    expect(ndStops(0.3)).toBeCloseTo(1, 2);
  });
  it('when ND 0.9, then about three stops', () => {
    // Published ND tables: optical density 0.9 = 3 stops, 12.5 % transmittance.
    expect(ndStops(0.9)).toBeCloseTo(3, 1);
  });
  it('when ND 3.0, then about ten stops', () => {
    // Published ND tables: optical density 3.0 ≈ 10 stops (a "1000×" filter, 0.1 %).
    expect(ndStops(3)).toBeCloseTo(9.966, 3);
  });
  it('when clear glass (OD 0), then no stops', () => {
    // OD = −log10 T with T = 1.
    expect(ndStops(0)).toBe(0);
  });
  it('when one stop, then density log10(2) = 0.30103', () => {
    // OD = −log10(T) with T = 1/2.
    expect(ndDensityForStops(1)).toBeCloseTo(0.30103, 5);
  });
  it('when three stops, then density 0.903 (the "0.9" filter)', () => {
    // Published ND tables: 3 stops is sold as ND 0.9.
    expect(ndDensityForStops(3)).toBeCloseTo(0.903, 3);
  });
  it('when ten stops, then density 3.01 (the "3.0" filter)', () => {
    // Published ND tables: 10 stops is sold as ND 3.0.
    expect(ndDensityForStops(10)).toBeCloseTo(3.0103, 4);
  });
  it('when OD 0.3 / 0.6 / 2.0, then transmission 50 % / 25 % / 1 %', () => {
    // Fractional transmittance T = 10^−d (optical density definition); published ND tables list
    // 0.3 → 50 %, 0.6 → 25 %.
    expect(ndTransmission(0.3)).toBeCloseTo(0.501, 3);
    expect(ndTransmission(0.6)).toBeCloseTo(0.251, 3);
    expect(ndTransmission(2)).toBeCloseTo(0.01, 12);
  });
  it('converts stops → density → stops without loss', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 20, noNaN: true }), (stops) => {
        expect(ndStops(ndDensityForStops(stops))).toBeCloseTo(stops, 9);
      }),
    );
  });
});

describe('invalid input', () => {
  const bad = [0, -1, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY];
  it.each(bad)('when a value is %s, then every positive-only function throws InvalidInputError', (v) => {
    expect(() => stopsBetween(v, 100)).toThrow(InvalidInputError);
    expect(() => stopsBetween(100, v)).toThrow(InvalidInputError);
    expect(() => apertureStops(v, 2)).toThrow(InvalidInputError);
    expect(() => ev100(v, 1)).toThrow(InvalidInputError);
    expect(() => ev100(2, v)).toThrow(InvalidInputError);
    expect(() => ev100(2, 1, v)).toThrow(InvalidInputError);
    expect(() => shutterAngleToSeconds(180, v)).toThrow(InvalidInputError);
    expect(() => shutterAngleToSeconds(v, 24)).toThrow(InvalidInputError);
    expect(() => secondsToShutterAngle(v, 24)).toThrow(InvalidInputError);
    expect(() => secondsToShutterAngle(1 / 48, v)).toThrow(InvalidInputError);
  });
  it('when the frame rate is 0, then the message says what a frame rate must be and what came in', () => {
    expect(() => shutterAngleToSeconds(180, 0)).toThrow(
      'Frame rate must be a positive number of frames per second (got 0).',
    );
    try {
      shutterAngleToSeconds(180, 0);
    } catch (error) {
      expect((error as InvalidInputError).field).toBe('fps');
    }
  });
  it('when the shutter angle is above 360° or not above 0°, then it throws', () => {
    expect(() => shutterAngleToSeconds(361, 24)).toThrow(/at most 360°/);
    expect(() => shutterAngleToSeconds(0, 24)).toThrow(InvalidInputError);
    expect(() => shutterAngleToSeconds(-90, 24)).toThrow(InvalidInputError);
  });
  it('when an exposure is longer than one frame, then it throws with the longest usable time', () => {
    expect(() => secondsToShutterAngle(1 / 10, 24)).toThrow(/longer than one frame/);
  });
  it('when an ND density or stop count is negative or not finite, then it throws', () => {
    for (const v of [-0.3, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => ndStops(v)).toThrow(InvalidInputError);
      expect(() => ndTransmission(v)).toThrow(InvalidInputError);
      expect(() => ndDensityForStops(v)).toThrow(InvalidInputError);
    }
  });
});
