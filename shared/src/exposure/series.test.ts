import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../errors.ts';
import {
  exactFNumber,
  isoAtThirdsFrom100,
  isoThirdsFrom100,
  nominalApertureSeries,
  nominalIsoSeries,
  nominalShutterSeries,
} from './series.ts';

/** ISO 5800 logarithmic speed from the arithmetic one: S° = 10·log10(S) + 1, rounded. */
const logarithmicSpeed = (iso: number) => Math.round(10 * Math.log10(iso) + 1);

describe('nominalIsoSeries', () => {
  it('when thirds from 100 to 400, then the marked values 100 125 160 200 250 320 400', () => {
    // ISO 12232 / ISO 5800 marked speed table (third-stop arithmetic values).
    expect(nominalIsoSeries(100, 400, 'third')).toEqual([100, 125, 160, 200, 250, 320, 400]);
  });
  it('when full stops from 100 to 51200, then ten steps', () => {
    // common practice: an ISO sweep 100 → 51200 in full stops has 10 steps.
    expect(nominalIsoSeries(100, 51200, 'full')).toEqual([100, 200, 400, 800, 1600, 3200, 6400, 12800, 25600, 51200]);
  });
  it('when thirds from 6 to 100, then the low marked values 6 8 10 12 16 20 25 32 40 50 64 80 100', () => {
    // ISO 5800 arithmetic/logarithmic pairs, as in published ASA/DIN conversion tables
    // (6/9°, 8/10°, 10/11°, 12/12°, 16/13°, 20/14°, 25/15° … 80/20°, 100/21°).
    const low = nominalIsoSeries(6, 100, 'third');
    expect(low).toEqual([6, 8, 10, 12, 16, 20, 25, 32, 40, 50, 64, 80, 100]);
    expect(low.map(logarithmicSpeed)).toEqual([9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 21]);
  });
  it('when 800 to 6400 in thirds, then 1000 1250 2000 2500 5000 sit between the full stops', () => {
    // ISO 5800 pairs from published conversion tables: 1000/31°, 1600/33°, 3200/36°, 6400/39°.
    const mid = nominalIsoSeries(800, 6400, 'third');
    expect(mid).toEqual([800, 1000, 1250, 1600, 2000, 2500, 3200, 4000, 5000, 6400]);
    expect(logarithmicSpeed(1000)).toBe(31);
    expect(logarithmicSpeed(1600)).toBe(33);
    expect(logarithmicSpeed(6400)).toBe(39);
  });
  it('covers ISO 6 to ISO 409600, each third one logarithmic degree above the last', () => {
    // ISO 5800: S° = 10·log10(S) + 1 and one third of a stop is one degree; the run
    // 12800 … 409600 is how digital cameras mark their speeds (common practice); 409600/57° from memory.
    const all = nominalIsoSeries(6, 409600, 'third');
    expect(all[0]).toBe(6);
    expect(all.at(-1)).toBe(409600);
    expect(all).toContain(102400);
    expect(all).toContain(204800);
    const degrees = all.map(logarithmicSpeed);
    degrees.slice(1).forEach((d, i) => expect(d - degrees[i]!).toBe(1));
    expect(logarithmicSpeed(409600)).toBe(57);
  });
  it('keeps each marked value within a tenth of a stop of 100·2^(k/3)', () => {
    // Definition of the third-stop series: exact values are powers of 2^(1/3) from ISO 100.
    for (const iso of nominalIsoSeries(3, 409600, 'third')) {
      const k = isoThirdsFrom100(iso)!;
      expect(Math.abs(Math.log2(iso / (100 * 2 ** (k / 3))))).toBeLessThan(0.1);
    }
  });
  it('finds marked values by third-stop position and back', () => {
    expect(isoThirdsFrom100(125)).toBe(1);
    expect(isoThirdsFrom100(130)).toBeNull();
    expect(isoAtThirdsFrom100(-3)).toBe(50);
    expect(isoAtThirdsFrom100(99)).toBeNull();
  });
});

describe('nominalApertureSeries', () => {
  it('when full stops from f/1 to f/22, then the powers of √2 as marked', () => {
    // Standard f-number series (APEX Av 0 … 9): 1, 1.4, 2, 2.8, 4, 5.6, 8, 11, 16, 22.
    expect(nominalApertureSeries(1, 22, 'full')).toEqual([1, 1.4, 2, 2.8, 4, 5.6, 8, 11, 16, 22]);
  });
  it('when thirds from f/2.8 to f/8, then 3.2 3.5 4 4.5 5 5.6 6.3 7.1 between', () => {
    // Published third-stop f-number sequence: a third smaller than f/2.8 is f/3.2, two thirds
    // f/3.5, a whole stop f/4, then f/4.5, f/5, f/5.6, f/6.3, f/7.1, f/8.
    expect(nominalApertureSeries(2.8, 8, 'third')).toEqual([2.8, 3.2, 3.5, 4, 4.5, 5, 5.6, 6.3, 7.1, 8]);
  });
  it('when thirds from f/8 to f/22, then the uneven-looking 9 10 11 13 14 16 18 20 22', () => {
    // Published third-stop f-number table (precise 8.98, 10.08, 11.31, 12.7, 14.25 … rounded by convention).
    expect(nominalApertureSeries(8, 22, 'third')).toEqual([8, 9, 10, 11, 13, 14, 16, 18, 20, 22]);
  });
  it('when thirds from f/1 to f/2, then 1.1 1.2 1.4 1.6 1.8', () => {
    // Published third-stop f-number table: 1.0, 1.1, 1.2, 1.4, 1.6, 1.8, 2.
    expect(nominalApertureSeries(1, 2, 'third')).toEqual([1, 1.1, 1.2, 1.4, 1.6, 1.8, 2]);
  });
  it('maps markings to exact f-numbers', () => {
    // Standard f-number series: f/5.6 is 2^2.5 = 5.657; third-stop precise values 8.98, 12.70, 11.31.
    expect(exactFNumber(5.6)).toBeCloseTo(5.657, 3);
    expect(exactFNumber(9)).toBeCloseTo(8.98, 2);
    expect(exactFNumber(13)).toBeCloseTo(12.7, 2);
    expect(exactFNumber(11)).toBeCloseTo(11.31, 2);
    expect(exactFNumber(4.8)).toBe(4.8); // not a marking: unchanged
  });
});

describe('nominalShutterSeries', () => {
  it('when full stops from 1/1000 to 1 s, then the standard series', () => {
    // Standard shutter-speed series: 1, 1/2, 1/4, 1/8, 1/15, 1/30, 1/60, 1/125, 1/250, 1/500, 1/1000.
    expect(nominalShutterSeries(1 / 1000, 1, 'full').map((s) => s.label)).toEqual([
      '1/1000', '1/500', '1/250', '1/125', '1/60', '1/30', '1/15', '1/8', '1/4', '1/2', '1 s',
    ]);
  });
  it('when thirds from 1/500 to 1/60, then 1/400 1/320 1/200 1/160 1/100 1/80 between', () => {
    // Published third-stop shutter table: …1/500, 1/400, 1/320, 1/250, 1/200, 1/160, 1/125, 1/100, 1/80, 1/60.
    expect(nominalShutterSeries(1 / 500, 1 / 60, 'third').map((s) => s.label)).toEqual([
      '1/500', '1/400', '1/320', '1/250', '1/200', '1/160', '1/125', '1/100', '1/80', '1/60',
    ]);
  });
  it('when the whole range, then 1/8000 to 30 s with 19 full stops', () => {
    // Standard shutter-speed series (common practice for current bodies): 30, 15, 8, 4, 2, 1 s … 1/8000.
    const full = nominalShutterSeries(1 / 8000, 30, 'full');
    expect(full[0]!.label).toBe('1/8000');
    expect(full.at(-1)!.label).toBe('30 s');
    expect(full.map((s) => s.label).slice(-6)).toEqual(['1 s', '2 s', '4 s', '8 s', '15 s', '30 s']);
    expect(full).toHaveLength(19);
  });
  it('gives the marked seconds and the exact APEX time', () => {
    // APEX: Tv 7 is 1/128 s, marked 1/125.
    const [speed] = nominalShutterSeries(1 / 125, 1 / 125, 'full');
    expect(speed).toEqual({ seconds: 1 / 125, exactSeconds: 1 / 128, label: '1/125', thirdsFromOneSecond: 21 });
  });
  it('marks long thirds as decimals: 0.8 s, 0.6 s, 1.3 s, 1.6 s', () => {
    // Published third-stop shutter table (from memory for the decimal spelling of 0.8 and 0.6).
    expect(nominalShutterSeries(0.5, 2, 'third').map((s) => s.label)).toEqual(['1/2', '0.6 s', '0.8 s', '1 s', '1.3 s', '1.6 s', '2 s']);
  });
});

describe('ladders', () => {
  const range = fc
    .tuple(fc.double({ min: 0.5, max: 600000, noNaN: true }), fc.double({ min: 0.5, max: 600000, noNaN: true }))
    .map(([a, b]) => [Math.min(a, b), Math.max(a, b)] as const);
  const step = fc.constantFrom('full' as const, 'third' as const);
  it('are strictly increasing', () => {
    fc.assert(
      fc.property(range, step, ([min, max], s) => {
        const iso = nominalIsoSeries(min, max, s);
        iso.slice(1).forEach((v, i) => expect(v).toBeGreaterThan(iso[i]!));
        const f = nominalApertureSeries(min / 5000, max / 5000, s);
        f.slice(1).forEach((v, i) => expect(v).toBeGreaterThan(f[i]!));
        const t = nominalShutterSeries(min / 10000, max / 10000, s);
        t.slice(1).forEach((v, i) => {
          expect(v.seconds).toBeGreaterThan(t[i]!.seconds);
          expect(v.exactSeconds).toBeGreaterThan(t[i]!.exactSeconds);
        });
      }),
    );
  });
  it('full stops are every third entry of the thirds ladder', () => {
    fc.assert(
      fc.property(range, ([min, max]) => {
        const full = nominalIsoSeries(min, max, 'full');
        const third = nominalIsoSeries(min, max, 'third');
        expect(third).toEqual(expect.arrayContaining(full));
        for (const iso of full) expect(Math.abs(isoThirdsFrom100(iso)! % 3)).toBe(0);
      }),
    );
  });
});

describe('invalid input', () => {
  it('when min > max, 0, negative, NaN or Infinity, or an unknown step, then InvalidInputError', () => {
    for (const series of [nominalIsoSeries, nominalApertureSeries, nominalShutterSeries] as const) {
      expect(() => series(400, 100, 'full')).toThrow(/swap them/);
      expect(() => series(0, 100, 'full')).toThrow(InvalidInputError);
      expect(() => series(-1, 100, 'full')).toThrow(InvalidInputError);
      expect(() => series(Number.NaN, 100, 'full')).toThrow(InvalidInputError);
      expect(() => series(1, Number.POSITIVE_INFINITY, 'full')).toThrow(InvalidInputError);
      expect(() => series(1, 100, 'half' as 'full')).toThrow('Step must be "full" or "third" (got "half").');
    }
  });
  it('when the range holds no marked value, then the ladder is empty (not an error)', () => {
    expect(nominalIsoSeries(101, 120, 'third')).toEqual([]);
  });
});
