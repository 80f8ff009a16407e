import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../errors.ts';
import type { ExposureControl } from '../schemas/plans.ts';
import { exposureDifferenceStops, isoSweepPlan, latitudeBracketPlan, type PlanSettings } from './plans.ts';

// Independent of the code under test: a marked f-number stands for the nearest power of 2^(1/6)
// (standard f-number series: powers of √2 per stop, thirds between); ND stops = OD / log10(2);
// shutter stops = log2 of the angle ratio (t = angle / (360 · fps)).
const exactF = (marked: number) => 2 ** (Math.round(6 * Math.log2(marked)) / 6);
function lightStops(base: Omit<PlanSettings, 'lightChangeStops' | 'fNumberExact' | 'shutterSeconds'>, step: PlanSettings) {
  return (
    2 * Math.log2(exactF(base.fNumber) / exactF(step.fNumber)) +
    Math.log2(step.shutterAngleDeg / base.shutterAngleDeg) -
    (step.ndDensity - base.ndDensity) / Math.log10(2) +
    step.lightChangeStops
  );
}

const ND_KIT = [0, 0.3, 0.6, 0.9, 1.2, 1.5, 1.8, 2.1, 2.4];
const cineBase = { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24000 / 1001, ndDensity: 0.6 } as const;
const cineKit = { minFNumber: 1.4, maxFNumber: 22, ndDensities: ND_KIT, shutterAngles: [180] };

describe('isoSweepPlan', () => {
  it('when ISO 100 → 51200 in full stops from base 800, then ten steps with ND taking the change', () => {
    // common practice: a full-stop sweep 100 → 51200 has 10 steps; ND 0.3 ≈ 1 stop.
    const plan = isoSweepPlan({ baseIso: 800, minIso: 100, maxIso: 51200, step: 'full', base: cineBase, kit: cineKit });
    expect(plan.steps.map((s) => s.iso)).toEqual([100, 200, 400, 800, 1600, 3200, 6400, 12800, 25600, 51200]);
    expect(plan.steps.map((s) => s.isoStopsFromBase)).toEqual([-3, -2, -1, 0, 1, 2, 3, 4, 5, 6]);
    const at1600 = plan.steps[4]!;
    expect(at1600).toMatchObject({ ndDensity: 0.9, fNumber: 4, shutterAngleDeg: 180, lightChangeStops: 0, held: true });
    // Optical density: one more 0.3 of ND is 0.3 / log10(2) = 0.9966 stop, so 0.0034 stop is left.
    expect(at1600.exposureErrorStops).toBeCloseTo(0.0034, 4);
    expect(plan.steps.every((s) => s.held && s.warning === null)).toBe(true);
  });

  it('when ND runs out at the low end, then the aperture opens by the standard series', () => {
    // ISO 100 from 800 needs 3 stops more light: ND 0.6 → 0 (≈ 2 stops) and f/4 → f/2.8 (1 stop,
    // standard f-number series).
    const plan = isoSweepPlan({ baseIso: 800, minIso: 100, maxIso: 800, step: 'full', base: cineBase, kit: cineKit });
    expect(plan.steps[0]).toMatchObject({ iso: 100, ndDensity: 0, fNumber: 2.8, held: true });
  });

  it('computes the error from exact f-numbers: f/5.6 → f/8 is exactly one stop', () => {
    // APEX Av table: f/5.6 is Av 5 (2^2.5), f/8 is Av 6 (2^3); the markings are rounded labels.
    const plan = isoSweepPlan({
      baseIso: 100,
      minIso: 100,
      maxIso: 200,
      step: 'full',
      base: { fNumber: 5.6, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24 },
      kit: { minFNumber: 1.4, maxFNumber: 22 },
    });
    expect(plan.steps[1]).toMatchObject({ iso: 200, fNumber: 8, exposureErrorStops: 0, held: true });
    expect(plan.steps[1]!.fNumberExact).toBeCloseTo(8, 12);
    expect(plan.base.fNumberExact).toBeCloseTo(5.657, 3);
  });

  it('when the kit cannot take enough light away, then the step warns with the stops it needs', () => {
    // Worked example: lens f/2.8–f/4, no ND, no dimmer. ISO 500 is 2⅓ stops above 100 (ISO 12232
    // third-stop marking); f/4 takes one stop away, 1⅓ ≈ 1.3 stops are left.
    const plan = isoSweepPlan({
      baseIso: 100,
      minIso: 100,
      maxIso: 800,
      step: 'third',
      base: { fNumber: 2.8, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24 },
      kit: { minFNumber: 2.8, maxFNumber: 4 },
    });
    const at500 = plan.steps.find((s) => s.iso === 500)!;
    expect(at500.held).toBe(false);
    expect(at500.exposureErrorStops).toBeCloseTo(4 / 3, 3);
    expect(at500.warning).toBe('Needs 1.3 stops less light than the kit can take away: add ND or dim the lights.');
    const at800 = plan.steps.find((s) => s.iso === 800)!;
    expect(at800.warning).toBe('Needs 2 stops less light than the kit can take away: add ND or dim the lights.');
    expect(plan.steps.find((s) => s.iso === 200)).toMatchObject({ fNumber: 4, held: true, warning: null });
  });

  it('when the sweep goes below base and the lens is wide open, then it asks for more light', () => {
    const plan = isoSweepPlan({
      baseIso: 800,
      minIso: 100,
      maxIso: 800,
      step: 'full',
      base: { fNumber: 2.8, shutter: { kind: 'angle', angleDeg: 180 }, fps: 25 },
      kit: { minFNumber: 2.8, maxFNumber: 16 },
    });
    // Worked example (our own, from the APEX relation EV = log2(N²/t)): ISO 800 → 100 is 3 stops
    // (log2(800/100) = 3) and f/2.8 is the widest the kit allows, so all 3 stops must come from light.
    expect(plan.steps[0]!.warning).toBe('Needs 3 stops more light than the kit can add: add light or use a faster lens.');
    expect(plan.steps[0]!.exposureErrorStops).toBeCloseTo(-3, 9);
  });

  it('when lights dim and come last in priority, then they only take what the rest cannot', () => {
    const plan = isoSweepPlan({
      baseIso: 100,
      minIso: 100,
      maxIso: 1600,
      step: 'full',
      base: { fNumber: 2.8, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24 },
      kit: { minFNumber: 2.8, maxFNumber: 4, lightsDimmable: true, lightDownStops: 2 },
    });
    // Worked example (our own): each full ISO step is 1 stop (ISO 12232 series); f/2.8 → f/4 is one
    // stop (2·log2(4/2.8) ≈ 0.97, the marked series), then the lights give up to 2 stops, then nothing is left.
    expect(plan.steps.map((s) => [s.iso, s.fNumber, s.lightChangeStops])).toEqual([
      [100, 2.8, 0],
      [200, 4, 0],
      [400, 4, -1],
      [800, 4, -2],
      [1600, 4, -2],
    ]);
    expect(plan.steps[4]!.warning).toMatch(/^Needs 1 stop less light/);
  });

  it('follows a configured priority: shutter first moves the angle before any ND', () => {
    const plan = isoSweepPlan({
      baseIso: 100,
      minIso: 100,
      maxIso: 400,
      step: 'full',
      base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24 },
      kit: { ...cineKit, shutterAngles: [45, 90, 180] },
      priority: ['shutter', 'nd', 'aperture'],
    });
    // t = angle / (360 · fps): 90° is half of 180°, 45° a quarter — exactly 1 and 2 stops.
    expect(plan.steps.map((s) => [s.shutterAngleDeg, s.ndDensity, s.exposureErrorStops])).toEqual([
      [180, 0, 0],
      [90, 0, 0],
      [45, 0, 0],
    ]);
  });

  it('keeps controls left out of the priority at the base setting', () => {
    const plan = isoSweepPlan({
      baseIso: 100,
      minIso: 100,
      maxIso: 400,
      step: 'third',
      base: { fNumber: 4, shutter: { kind: 'seconds', seconds: 1 / 50 }, fps: 24 },
      kit: { ...cineKit, shutterAngles: [90, 180] },
      priority: ['nd'],
    });
    expect(new Set(plan.steps.map((s) => s.fNumber))).toEqual(new Set([4]));
    expect(new Set(plan.steps.map((s) => s.shutterAngleDeg)).size).toBe(1);
    // common practice: 1/50 s at 24 fps is a 172.8° shutter.
    expect(plan.base.shutterAngleDeg).toBeCloseTo(172.8, 9);
    // ND alone cannot make third stops: ISO 125 lands a third of a stop off and says why.
    const at125 = plan.steps.find((s) => s.iso === 125)!;
    expect(at125.held).toBe(false);
    expect(at125.warning).toMatch(/^Lands 0\.3 stop too bright: .*too coarse/);
  });
});

describe('latitudeBracketPlan', () => {
  const base = { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24, ndDensity: 1.2 } as const;

  it('when ±3 in full stops, then seven steps with ND giving light and the grade taking it back', () => {
    const plan = latitudeBracketPlan({ baseIso: 800, base, maxOffsetStops: 3, step: 'full', kit: cineKit });
    expect(plan.steps.map((s) => s.offsetStops)).toEqual([-3, -2, -1, 0, 1, 2, 3]);
    // common practice: ND 0.3 ≈ 1 stop, so +1 (over) is ND 1.2 → 0.9 and −1 (under) is ND 1.5.
    expect(plan.steps.map((s) => s.ndDensity)).toEqual([2.1, 1.8, 1.5, 1.2, 0.9, 0.6, 0.3]);
    expect(plan.steps.map((s) => s.gradeCorrectionLabel)).toEqual([
      '+3 stops in the grade',
      '+2 stops in the grade',
      '+1 stop in the grade',
      'none (reference)',
      '−1 stop in the grade',
      '−2 stops in the grade',
      '−3 stops in the grade',
    ]);
    expect(plan.steps.map((s) => s.gradeCorrectionStops)).toEqual([3, 2, 1, 0, -1, -2, -3]);
    expect(plan.steps.every((s) => s.held)).toBe(true);
  });

  it('when ±2 in thirds, then 13 steps labelled in thirds', () => {
    const plan = latitudeBracketPlan({ baseIso: 800, base, maxOffsetStops: 2, step: 'third', kit: cineKit });
    expect(plan.steps).toHaveLength(13);
    const plus4thirds = plan.steps.find((s) => s.offsetLabel === '+1⅓')!;
    expect(plus4thirds.gradeCorrectionLabel).toBe('−1⅓ stops in the grade');
    expect(plan.steps.find((s) => s.offsetLabel === '−⅓')!.gradeCorrectionLabel).toBe('+⅓ stop in the grade');
    // Thirds need the aperture (third-stop f-number series) on top of ND: +1⅓ = ND −0.3 and f/4 → f/3.5.
    expect(plus4thirds).toMatchObject({ ndDensity: 0.9, fNumber: 3.5, held: true });
    expect(plus4thirds.achievedOffsetStops).toBeCloseTo(4 / 3, 2);
  });

  // Worked example (our own, APEX stops as above): f/4 with ND 0.6 at ISO 800 leaves the kit a few
  // stops each way, so ±6 must run out at both ends and say so.
  it('when the kit runs out at ±6, then the far steps warn and say which way', () => {
    const plan = latitudeBracketPlan({
      baseIso: 800,
      base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24, ndDensity: 0.6 },
      maxOffsetStops: 6,
      step: 'full',
      kit: { minFNumber: 2.8, maxFNumber: 5.6, ndDensities: [0, 0.3, 0.6, 0.9, 1.2] },
    });
    const over6 = plan.steps.at(-1)!;
    // ND 0.6 → 0 gives ≈ 2 stops and f/4 → f/2.8 one more: ≈ 3 of 6 stops.
    expect(over6.warning).toMatch(/^Needs 3 stops more light than the kit can add/);
    expect(plan.steps[0]!.warning).toMatch(/^Needs 3 stops less light than the kit can take away/);
  });
});

describe('exposureDifferenceStops', () => {
  const planned = { iso: 800, fNumber: 4, shutterSeconds: 1 / 48, ndDensity: 0.6 };
  it('when shot one full f-stop narrower, then one stop darker', () => {
    // Standard f-number series: f/4 → f/5.6 is one stop less light.
    expect(exposureDifferenceStops(planned, { ...planned, fNumber: 5.6 })).toBeCloseTo(-1, 9);
  });
  it('when shot at double the ISO, then one stop brighter', () => {
    // ISO 5800 arithmetic scale: doubling the speed is one stop.
    expect(exposureDifferenceStops(planned, { ...planned, iso: 1600 })).toBeCloseTo(1, 9);
  });
  it('when shot with half the time, then one stop darker', () => {
    // APEX Tv: halving t is +1 Tv, one stop less exposure.
    expect(exposureDifferenceStops(planned, { ...planned, shutterSeconds: 1 / 96 })).toBeCloseTo(-1, 9);
  });
  it('when shot with 0.3 more ND, then about one stop darker', () => {
    // common practice: ND 0.3 ≈ 1 stop (0.9966 by OD / log10 2).
    expect(exposureDifferenceStops(planned, { ...planned, ndDensity: 0.9 })).toBeCloseTo(-0.9966, 4);
  });
});

// --- properties -------------------------------------------------------------------------------

const CONTROLS: ExposureControl[] = ['nd', 'aperture', 'shutter', 'light'];
const priorityArb = fc
  .shuffledSubarray(CONTROLS, { minLength: 1 })
  .chain((subset) => fc.shuffledSubarray(subset, { minLength: subset.length, maxLength: subset.length }));
const kitArb = fc.record({
  minFNumber: fc.constantFrom(1.4, 2, 2.8),
  maxFNumber: fc.constantFrom(8, 11, 16, 22),
  ndDensities: fc.subarray(ND_KIT),
  shutterAngles: fc.subarray([45, 90, 172.8, 180, 270, 360]),
  lightsDimmable: fc.boolean(),
  lightDownStops: fc.integer({ min: 0, max: 4 }),
  lightUpStops: fc.integer({ min: 0, max: 2 }),
});
const baseArb = fc.record({
  fNumber: fc.constantFrom(2.8, 4, 5.6, 8),
  shutter: fc.constantFrom({ kind: 'angle' as const, angleDeg: 180 }, { kind: 'angle' as const, angleDeg: 90 }),
  fps: fc.constantFrom(24000 / 1001, 24, 25, 30000 / 1001, 50),
  ndDensity: fc.constantFrom(0, 0.3, 0.6, 1.2),
});
const sweepArb = fc.record({
  baseIso: fc.constantFrom(100, 250, 400, 640, 800, 3200),
  minIso: fc.constantFrom(50, 100, 160),
  maxIso: fc.constantFrom(800, 6400, 51200),
  step: fc.constantFrom('full' as const, 'third' as const),
  base: baseArb,
  kit: kitArb,
  priority: priorityArb,
});

describe('plan properties', () => {
  it('an ISO sweep holds the base exposure within 1/6 stop at every step, or warns', () => {
    fc.assert(
      fc.property(sweepArb, (input) => {
        const plan = isoSweepPlan(input);
        for (const step of plan.steps) {
          // Image exposure versus base = light at the sensor + ISO stops (raising ISO by k stops
          // must be paid by k stops less light).
          const error = lightStops(plan.base, step) + step.isoStopsFromBase;
          expect(error).toBeCloseTo(step.exposureErrorStops, 3);
          if (Math.abs(error) > 1 / 6 + 1e-9) expect(step.warning).not.toBeNull();
          else expect(step.warning).toBeNull();
          expect(step.held).toBe(step.warning === null);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('a latitude bracket gives the requested offsets within 1/6 stop, or warns', () => {
    fc.assert(
      fc.property(
        baseArb,
        kitArb,
        priorityArb,
        fc.integer({ min: 1, max: 6 }),
        fc.constantFrom('full' as const, 'third' as const),
        (base, kit, priority, maxOffsetStops, step) => {
          const plan = latitudeBracketPlan({ baseIso: 800, base, kit, priority, maxOffsetStops, step });
          expect(plan.steps).toHaveLength(step === 'full' ? 2 * maxOffsetStops + 1 : 6 * maxOffsetStops + 1);
          for (const s of plan.steps) {
            const achieved = lightStops(plan.base, s);
            expect(achieved).toBeCloseTo(s.achievedOffsetStops, 3);
            if (Math.abs(achieved - s.offsetStops) > 1 / 6 + 1e-9) expect(s.warning).not.toBeNull();
            else expect(s.warning).toBeNull();
            expect(s.gradeCorrectionStops).toBeCloseTo(-s.offsetStops, 12);
          }
          expect(plan.steps.find((s) => s.offsetStops === 0)).toMatchObject({
            fNumber: base.fNumber,
            ndDensity: base.ndDensity,
            lightChangeStops: 0,
            gradeCorrectionLabel: 'none (reference)',
          });
        },
      ),
      { numRuns: 60 },
    );
  });

  it('sweeping up to a step and back down returns the base exposure', () => {
    fc.assert(
      fc.property(sweepArb, fc.nat(), (input, pick) => {
        const up = isoSweepPlan(input);
        const held = up.steps.filter((s) => s.held && s.lightChangeStops === 0);
        fc.pre(held.length > 0);
        const top = held[pick % held.length]!;
        // Reverse: start from the step's settings at its ISO and sweep back over the base ISO. The
        // original base settings are on set too, so they join the kit.
        const down = isoSweepPlan({
          ...input,
          kit: {
            ...input.kit,
            ndDensities: [...input.kit.ndDensities, input.base.ndDensity],
            shutterAngles: [...input.kit.shutterAngles, input.base.shutter.angleDeg],
          },
          baseIso: top.iso,
          minIso: Math.min(input.baseIso, top.iso),
          maxIso: Math.max(input.baseIso, top.iso),
          step: 'third',
          base: {
            fNumber: top.fNumber,
            shutter: { kind: 'angle', angleDeg: top.shutterAngleDeg },
            fps: input.base.fps,
            ndDensity: top.ndDensity,
          },
        });
        const back = down.steps.find((s) => s.iso === input.baseIso)!;
        expect(back.held).toBe(true);
        // Light at the sensor: up is −k stops + e_up, back is +k stops + e_back, so the sum is the
        // image exposure left versus the base; both legs are held, so it is within 1/3 stop.
        const roundTrip = lightStops(up.base, top) + lightStops(down.base, back);
        expect(Math.abs(roundTrip)).toBeLessThanOrEqual(1 / 3 + 1e-9);
      }),
      { numRuns: 60 },
    );
  });

  it('with exact third-stop controls (aperture, 2× shutter angles), the round trip is exact', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(100, 200, 400, 800),
        fc.integer({ min: 1, max: 9 }),
        (baseIso, thirdsUp) => {
          const kit = { minFNumber: 1, maxFNumber: 22, shutterAngles: [45, 90, 180, 360] };
          const base = { fNumber: 2, shutter: { kind: 'angle' as const, angleDeg: 180 }, fps: 24 };
          const up = isoSweepPlan({ baseIso, minIso: baseIso, maxIso: 409600, step: 'third', base, kit });
          const top = up.steps[thirdsUp]!;
          const down = isoSweepPlan({
            baseIso: top.iso,
            minIso: baseIso,
            maxIso: top.iso,
            step: 'third',
            base: { ...base, fNumber: top.fNumber, shutter: { kind: 'angle', angleDeg: top.shutterAngleDeg } },
            kit,
          });
          const back = down.steps[0]!;
          expect(back).toMatchObject({ iso: baseIso, fNumber: 2, shutterAngleDeg: 180, exposureErrorStops: 0 });
        },
      ),
    );
  });
});

describe('invalid input', () => {
  const good = { baseIso: 800, minIso: 100, maxIso: 51200, step: 'full', base: cineBase, kit: cineKit } as const;
  const refuses = (patch: Record<string, unknown>, message: string | RegExp, field?: string) => {
    let thrown: unknown;
    try {
      isoSweepPlan({ ...good, ...patch } as Parameters<typeof isoSweepPlan>[0]);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(InvalidInputError);
    expect((thrown as Error).message).toMatch(message);
    if (field) expect((thrown as InvalidInputError).field).toBe(field);
  };

  it('when the frame rate is 0, then the error says so and names the field', () => {
    refuses({ base: { ...cineBase, fps: 0 } }, 'Frame rate must be a positive number of frames per second (got 0).', 'base.fps');
  });
  it('when a number is NaN, Infinity, negative or zero, then InvalidInputError', () => {
    refuses({ baseIso: Number.NaN }, /Base ISO must be a number from 3 to 409600 \(got NaN\)/, 'baseIso');
    refuses({ maxIso: Number.POSITIVE_INFINITY }, /Highest ISO/, 'maxIso');
    refuses({ base: { ...cineBase, fNumber: -2 } }, /Base aperture must be an f-number/, 'base.fNumber');
    refuses({ base: { ...cineBase, ndDensity: -0.3 } }, /Base ND density/, 'base.ndDensity');
  });
  it('when min ISO is above max ISO, then it asks to swap them', () => {
    refuses({ minIso: 6400, maxIso: 100 }, /swap them/, 'minIso');
  });
  it('when a shutter angle is above 360° or not above 0°, then InvalidInputError', () => {
    refuses({ base: { ...cineBase, shutter: { kind: 'angle', angleDeg: 400 } } }, /Shutter angle must be a number of degrees above 0 and at most 360 \(got 400\)/);
    refuses({ kit: { ...cineKit, shutterAngles: [180, 0] } }, /Each allowed shutter angle/, 'kit.shutterAngles.1');
  });
  it('when the shutter time is longer than a frame, then it says the longest usable time', () => {
    refuses({ base: { ...cineBase, fps: 24, shutter: { kind: 'seconds', seconds: 1 / 10 } } }, /longer than one frame at 24 fps/);
  });
  it('when the step is unknown, then InvalidInputError', () => {
    refuses({ step: 'half' }, 'Step must be "full" or "third" (got "half").', 'step');
  });
  it('when the base ISO is not a marked speed, then it suggests the neighbours', () => {
    refuses({ baseIso: 720 }, 'Base ISO 720 is not a marked ISO speed; use 640 or 800.', 'baseIso');
  });
  it('when the base aperture is outside the lens, then InvalidInputError', () => {
    refuses({ base: { ...cineBase, fNumber: 1.2 } }, /outside the lens range f\/1\.4–f\/22/);
  });
  it('when the priority names a control twice, then InvalidInputError', () => {
    refuses({ priority: ['nd', 'nd'] }, /at most once/);
  });
  it('when no marked ISO lies in the range, then InvalidInputError', () => {
    refuses({ baseIso: 100, minIso: 101, maxIso: 120 }, /No marked ISO speed/);
  });
  it('when the bracket range is 0, 7 or not whole, then InvalidInputError', () => {
    for (const n of [0, 7, 2.5]) {
      expect(() =>
        latitudeBracketPlan({ baseIso: 800, base: cineBase, maxOffsetStops: n, step: 'full', kit: cineKit }),
      ).toThrow(/Bracket range must be a whole number of stops from 1 to 6/);
    }
  });
});
