// Lighting load per circuit. Continuous loads (three hours or more, which a shoot day is) may
// use at most 80 % of the breaker rating under the NFPA 70 (US National Electrical Code)
// continuous-load rule; other places have their own rules, so the result always carries a
// note to follow local electrical codes and a licensed electrician.
import { InvalidInputError } from '../errors.ts';
import { gotText, requirePositive } from './guards.ts';

/** Share of a breaker's rating a continuous load may use (NFPA 70 continuous-load rule). */
export const CONTINUOUS_LOAD_FRACTION = 0.8;

/** The note shown with every lighting-load check. */
export const ELECTRICAL_SAFETY_NOTE =
  'This is a planning estimate, not an electrical design. Follow your local electrical codes, and have a licensed electrician check circuits, distribution and cabling before the shoot.';

/** A light on the plan. */
export interface LightingFixture {
  id: string;
  name: string;
  /** Rated input power in watts. */
  watts: number;
  /** How many of this fixture; default 1. */
  quantity?: number;
  /** Power factor (0 < pf ≤ 1) when known; below 1 the fixture draws more current than watts/volts. Default 1. */
  powerFactor?: number;
  /** The circuit it is plugged into, or null when not yet assigned. */
  circuitId: string | null;
}

/** A circuit on set. */
export interface LightingCircuit {
  id: string;
  name: string;
  /** Nominal voltage in volts (120, 230 …). */
  volts: number;
  /** Breaker rating in amperes. */
  breakerAmps: number;
}

/** The load of one circuit. */
export interface CircuitLoad {
  circuitId: string;
  name: string;
  /** Sum of fixture watts on the circuit. */
  watts: number;
  /** Current drawn in amperes: Σ watts / (volts · power factor). */
  amps: number;
  breakerAmps: number;
  /** 80 % of the breaker rating, in amperes. */
  continuousLimitAmps: number;
  /** amps / breakerAmps (0.8 = 80 %). */
  loadFraction: number;
  /** True when the continuous load passes 80 % of the breaker rating. */
  overContinuousLimit: boolean;
  /** True when the load passes the breaker rating itself. */
  overBreaker: boolean;
  warning: string | null;
}

/** Result of a lighting-load check. */
export interface CircuitLoadReport {
  circuits: CircuitLoad[];
  /** Fixtures not yet assigned to a circuit. */
  unassignedFixtureIds: string[];
  /** Follow local codes and a licensed electrician; always present. */
  note: string;
}

/** Returns per-circuit watts, amps and a warning when a continuous load passes 80 % of the breaker rating. */
export function circuitLoads(fixtures: LightingFixture[], circuits: LightingCircuit[]): CircuitLoadReport {
  const byId = new Map<string, { circuit: LightingCircuit; watts: number; voltAmps: number }>();
  circuits.forEach((circuit, i) => {
    requirePositive(circuit.volts, `circuits.${i}.volts`, `Voltage of circuit "${circuit.name}" must be a positive number of volts`);
    requirePositive(
      circuit.breakerAmps,
      `circuits.${i}.breakerAmps`,
      `Breaker rating of circuit "${circuit.name}" must be a positive number of amperes`,
    );
    if (byId.has(circuit.id)) {
      throw new InvalidInputError(`Two circuits share the id "${circuit.id}"; give each circuit its own id.`, `circuits.${i}.id`);
    }
    byId.set(circuit.id, { circuit, watts: 0, voltAmps: 0 });
  });

  const unassignedFixtureIds: string[] = [];
  fixtures.forEach((fixture, i) => {
    const watts = requirePositive(fixture.watts, `fixtures.${i}.watts`, `Power of "${fixture.name}" must be a positive number of watts`);
    const quantity = fixture.quantity ?? 1;
    if (!Number.isInteger(quantity) || quantity < 1) {
      throw new InvalidInputError(`Quantity of "${fixture.name}" must be a whole number from 1 ${gotText(quantity)}.`, `fixtures.${i}.quantity`);
    }
    const pf = fixture.powerFactor ?? 1;
    if (typeof pf !== 'number' || !(pf > 0 && pf <= 1)) {
      throw new InvalidInputError(`Power factor of "${fixture.name}" must be above 0 and at most 1 ${gotText(pf)}.`, `fixtures.${i}.powerFactor`);
    }
    if (fixture.circuitId === null) {
      unassignedFixtureIds.push(fixture.id);
      return;
    }
    const entry = byId.get(fixture.circuitId);
    if (!entry) {
      throw new InvalidInputError(
        `"${fixture.name}" is on circuit "${fixture.circuitId}", which is not in the circuit list; add the circuit or pick another.`,
        `fixtures.${i}.circuitId`,
      );
    }
    entry.watts += watts * quantity;
    entry.voltAmps += (watts * quantity) / pf;
  });

  const loads = [...byId.values()].map(({ circuit, watts, voltAmps }): CircuitLoad => {
    const amps = voltAmps / circuit.volts;
    const continuousLimitAmps = circuit.breakerAmps * CONTINUOUS_LOAD_FRACTION;
    // A hair of tolerance so exactly 80 % (e.g. 1920 W on 20 A at 120 V) is not flagged by float noise.
    const overContinuousLimit = amps > continuousLimitAmps * (1 + 1e-9);
    const overBreaker = amps > circuit.breakerAmps * (1 + 1e-9);
    const percent = Math.round((amps / circuit.breakerAmps) * 100);
    const warning = overBreaker
      ? `Circuit "${circuit.name}" draws ${amps.toFixed(1)} A, more than its ${circuit.breakerAmps} A breaker: move fixtures to another circuit before powering up. ${ELECTRICAL_SAFETY_NOTE}`
      : overContinuousLimit
        ? `Circuit "${circuit.name}" draws ${amps.toFixed(1)} A (${percent} % of its ${circuit.breakerAmps} A breaker), above the ${continuousLimitAmps.toFixed(1)} A allowed for a continuous load: move fixtures to another circuit. ${ELECTRICAL_SAFETY_NOTE}`
        : null;
    return {
      circuitId: circuit.id,
      name: circuit.name,
      watts,
      amps,
      breakerAmps: circuit.breakerAmps,
      continuousLimitAmps,
      loadFraction: amps / circuit.breakerAmps,
      overContinuousLimit,
      overBreaker,
      warning,
    };
  });
  return { circuits: loads, unassignedFixtureIds, note: ELECTRICAL_SAFETY_NOTE };
}

/**
 * The spec sheet's Lighting line written from the lighting plan: each fixture with its count,
 * watts and circuit, then the total, e.g. "2 × Fresnel 650 W (circuit A); LED panel 200 W
 * (circuit B) · 1.5 kW in all". Empty when there are no fixtures.
 */
export function lightingLine(fixtures: readonly { name: string; watts: number; quantity?: number; circuit: string | null }[]): string {
  if (fixtures.length === 0) return '';
  const watts = (w: number) => (w >= 1000 ? `${Number((w / 1000).toFixed(2))} kW` : `${Number(w.toFixed(1))} W`);
  const parts = fixtures.map((f) => {
    const n = f.quantity ?? 1;
    return `${n > 1 ? `${n} × ` : ''}${f.name} ${watts(f.watts)} (${f.circuit === null ? 'no circuit yet' : `circuit ${f.circuit}`})`;
  });
  const total = fixtures.reduce((sum, f) => sum + f.watts * (f.quantity ?? 1), 0);
  return `${parts.join('; ')} · ${watts(total)} in all`;
}
