import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../errors.ts';
import { circuitLoads, ELECTRICAL_SAFETY_NOTE, lightingLine, type LightingCircuit, type LightingFixture } from './lighting-load.ts';

const circuit = (id: string, volts: number, breakerAmps: number): LightingCircuit => ({ id, name: `Circuit ${id}`, volts, breakerAmps });
const fixture = (id: string, watts: number, circuitId: string | null, extra: Partial<LightingFixture> = {}): LightingFixture => ({
  id,
  name: `Fixture ${id}`,
  watts,
  circuitId,
  ...extra,
});

describe('circuitLoads', () => {
  it('when 1920 W sit on a 20 A circuit at 120 V, then it is exactly at the continuous limit and not flagged', () => {
    // NFPA 70 continuous-load rule: at most 80 % of 20 A = 16 A; 16 A × 120 V = 1920 W.
    const [load] = circuitLoads([fixture('a', 1000, 'c1'), fixture('b', 920, 'c1')], [circuit('c1', 120, 20)]).circuits;
    expect(load).toMatchObject({ watts: 1920, amps: 16, continuousLimitAmps: 16, overContinuousLimit: false, warning: null });
  });
  it('when 1921 W sit on the same circuit, then it warns and names the limit', () => {
    // NFPA 70 continuous-load rule: above 16 A on a 20 A breaker.
    const [load] = circuitLoads([fixture('a', 1921, 'c1')], [circuit('c1', 120, 20)]).circuits;
    expect(load!.overContinuousLimit).toBe(true);
    expect(load!.overBreaker).toBe(false);
    expect(load!.warning).toMatch(/above the 16\.0 A allowed for a continuous load/);
    expect(load!.warning).toMatch(/licensed electrician/);
  });
  it('when a 15 A circuit at 120 V carries 1500 W, then it passes the 1440 W continuous limit', () => {
    // NFPA 70 continuous-load rule: 80 % of 15 A = 12 A = 1440 W at 120 V; 1500 W is 12.5 A.
    const [load] = circuitLoads([fixture('a', 1500, 'c1')], [circuit('c1', 120, 15)]).circuits;
    expect(load!.amps).toBe(12.5);
    expect(load!.continuousLimitAmps).toBe(12);
    expect(load!.overContinuousLimit).toBe(true);
  });
  it('when a 16 A circuit at 230 V carries 2944 W, then it is at 80 %; 3000 W passes it', () => {
    // NFPA 70 continuous-load rule applied to a 16 A, 230 V circuit: 12.8 A × 230 V = 2944 W.
    const report = circuitLoads(
      [fixture('a', 2944, 'c1'), fixture('b', 3000, 'c2')],
      [circuit('c1', 230, 16), circuit('c2', 230, 16)],
    );
    expect(report.circuits[0]!.loadFraction).toBeCloseTo(0.8, 12);
    expect(report.circuits[0]!.warning).toBeNull();
    expect(report.circuits[1]!.overContinuousLimit).toBe(true);
  });
  it('when the load passes the breaker itself, then the warning says to move fixtures before powering up', () => {
    // Power P = V · I: 2000 W at 120 V draws 16.7 A, more than a 15 A breaker.
    const [load] = circuitLoads([fixture('a', 2000, 'c1')], [circuit('c1', 120, 15)]).circuits;
    expect(load!.amps).toBeCloseTo(16.67, 2);
    expect(load!.overBreaker).toBe(true);
    expect(load!.warning).toMatch(/more than its 15 A breaker: move fixtures/);
  });
  it('sums quantities and counts power factor as extra current', () => {
    // Apparent power S = P / pf, I = S / V: 4 × 250 W at pf 0.8 on 120 V is 1250 VA = 10.4 A.
    const [load] = circuitLoads([fixture('a', 250, 'c1', { quantity: 4, powerFactor: 0.8 })], [circuit('c1', 120, 20)]).circuits;
    expect(load!.watts).toBe(1000);
    expect(load!.amps).toBeCloseTo(10.4167, 4);
  });
  it('always carries the note to follow local codes and a licensed electrician, and lists unassigned fixtures', () => {
    const report = circuitLoads([fixture('a', 100, null)], [circuit('c1', 230, 10)]);
    expect(report.note).toBe(ELECTRICAL_SAFETY_NOTE);
    expect(report.note).toMatch(/local electrical codes/);
    expect(report.note).toMatch(/licensed electrician/);
    expect(report.unassignedFixtureIds).toEqual(['a']);
    expect(report.circuits[0]!.watts).toBe(0);
  });
  it('when input makes no sense, then InvalidInputError', () => {
    expect(() => circuitLoads([fixture('a', 100, 'nope')], [circuit('c1', 120, 20)])).toThrow(/not in the circuit list/);
    expect(() => circuitLoads([fixture('a', 0, 'c1')], [circuit('c1', 120, 20)])).toThrow(InvalidInputError);
    expect(() => circuitLoads([fixture('a', Number.NaN, 'c1')], [circuit('c1', 120, 20)])).toThrow(InvalidInputError);
    expect(() => circuitLoads([], [circuit('c1', 0, 20)])).toThrow(InvalidInputError);
    expect(() => circuitLoads([], [circuit('c1', 120, -20)])).toThrow(InvalidInputError);
    expect(() => circuitLoads([], [circuit('c1', 120, 20), circuit('c1', 120, 20)])).toThrow(/share the id/);
    expect(() => circuitLoads([fixture('a', 100, 'c1', { powerFactor: 1.2 })], [circuit('c1', 120, 20)])).toThrow(/Power factor/);
    expect(() => circuitLoads([fixture('a', 100, 'c1', { quantity: 0 })], [circuit('c1', 120, 20)])).toThrow(/Quantity/);
  });
});

describe('lightingLine', () => {
  it('writes each fixture with count, watts and circuit, and the total (SI Brochure, BIPM: 1 kW = 1000 W)', () => {
    expect(lightingLine([{ name: 'Fresnel', watts: 650, quantity: 2, circuit: 'A' }, { name: 'LED panel', watts: 200, circuit: 'B' }])).toBe('2 × Fresnel 650 W (circuit A); LED panel 200 W (circuit B) · 1.5 kW in all');
    expect(lightingLine([{ name: 'Tube', watts: 72.5, circuit: null }])).toBe('Tube 72.5 W (no circuit yet) · 72.5 W in all');
    expect(lightingLine([])).toBe('');
  });
});
