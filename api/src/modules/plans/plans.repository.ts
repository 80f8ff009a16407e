// Reads of the test-plan tables, returned as shared DTOs (models never leave the API), and the
// plan facts the board's plan → shoot rule needs.
import { QueryTypes, type Transaction } from 'sequelize';
import { LightingCircuit, LightingFixture, SpecSheetLine, Test, TestStep, User } from '@midgray/db';
import { TEST_KIND_LABELS, type ActualSettings, type LightingCircuitDto, type LightingFixtureDto, type PlannedSettings, type SpecSheetLineDto, type TestDto, type TestKind, type TestStepDto } from '@midgray/shared';

/** Returns a step row as the API sends it. */
export function toStepDto(s: TestStep, shotByName: string | null): TestStepDto {
  return {
    id: s.id,
    index: s.index,
    label: s.label,
    iso: s.iso,
    offsetStops: s.offsetStops,
    planned: s.planned as unknown as PlannedSettings,
    actual: (s.actual as unknown as ActualSettings | null) ?? null,
    shotAt: s.shotAt ? new Date(s.shotAt).toISOString() : null,
    shotBy: s.shotById ? { id: s.shotById, name: shotByName ?? 'Former member' } : null,
    observation: s.observation,
    rating: s.rating,
    plannedSeconds: s.plannedSeconds,
    version: s.version,
  };
}

/** Returns a spec-sheet line as the API sends it. */
export function toSpecLineDto(l: SpecSheetLine): SpecSheetLineDto {
  return { id: l.id, key: l.key, label: l.label, value: l.value, checked: l.checked, inDescription: l.inDescription, required: l.required, position: l.position, custom: l.custom, version: l.version };
}

const toCircuitDto = (c: LightingCircuit): LightingCircuitDto => ({ id: c.id, label: c.label, volts: c.volts, breakerAmps: c.breakerAmps });
const toFixtureDto = (f: LightingFixture): LightingFixtureDto => ({ id: f.id, name: f.name, watts: f.watts, quantity: f.quantity, circuitId: f.circuitId });

/** Loads tests with their steps, spec lines and lighting, in position order. */
export async function loadTests(where: { episodeId: string } | { id: string }, transaction?: Transaction): Promise<TestDto[]> {
  const tests = await Test.findAll({ where, order: [['position', 'ASC'], ['createdAt', 'ASC']], transaction });
  if (tests.length === 0) return [];
  const testIds = tests.map((t) => t.id);
  // One after the other: inside a transaction all four share one connection.
  const steps = await TestStep.findAll({ where: { testId: testIds }, order: [['index', 'ASC']], transaction });
  const lines = await SpecSheetLine.findAll({ where: { testId: testIds }, order: [['position', 'ASC'], ['createdAt', 'ASC']], transaction });
  const circuits = await LightingCircuit.findAll({ where: { testId: testIds }, order: [['position', 'ASC']], transaction });
  const fixtures = await LightingFixture.findAll({ where: { testId: testIds }, order: [['position', 'ASC']], transaction });
  const shooterIds = [...new Set(steps.map((s) => s.shotById).filter((id): id is string => !!id))];
  const shooters = shooterIds.length ? await User.findAll({ where: { id: shooterIds }, attributes: ['id', 'name'], transaction }) : [];
  const nameOf = new Map(shooters.map((u) => [u.id, u.name]));
  return tests.map((t) => ({
    id: t.id,
    episodeId: t.episodeId,
    kind: t.kind,
    name: t.name,
    position: t.position,
    inputs: t.inputs,
    readoutRegion: t.readoutRegion,
    secondsPerStep: t.secondsPerStep,
    version: t.version,
    createdAt: new Date(t.createdAt).toISOString(),
    updatedAt: new Date(t.updatedAt).toISOString(),
    steps: steps.filter((s) => s.testId === t.id).map((s) => toStepDto(s, s.shotById ? (nameOf.get(s.shotById) ?? null) : null)),
    specLines: lines.filter((l) => l.testId === t.id).map(toSpecLineDto),
    lighting: {
      circuits: circuits.filter((c) => c.testId === t.id).map(toCircuitDto),
      fixtures: fixtures.filter((f) => f.testId === t.id).map(toFixtureDto),
    },
  }));
}

/** Returns one test with everything under it, or null. */
export async function loadTest(id: string, transaction?: Transaction): Promise<TestDto | null> {
  return (await loadTests({ id }, transaction))[0] ?? null;
}

/** What the plan → shoot move checks about an episode's plan. */
export interface PlanFacts {
  /** Number of tests in the episode. */
  testCount: number;
  /** Required spec-sheet lines with an empty value, as "<test name>: <line label>". */
  requiredSpecLinesEmpty: string[];
}

/**
 * Returns the test count and the required spec-sheet lines still empty, for the plan → shoot
 * rule (PRODUCT.md: at least one test; every required spec-sheet line filled). Runs inside the
 * caller's transaction so the move sees the same rows it commits against.
 */
export async function planFacts(episodeId: string, transaction?: Transaction): Promise<PlanFacts> {
  const sequelize = Test.sequelize!;
  const [count] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM tests WHERE episode_id = :episodeId', {
    replacements: { episodeId },
    type: QueryTypes.SELECT,
    transaction,
  });
  const empty = await sequelize.query<{ test_name: string; kind: TestKind; label: string }>(
    `SELECT t.name AS test_name, t.kind, l.label
       FROM spec_sheet_lines l JOIN tests t ON t.id = l.test_id
      WHERE t.episode_id = :episodeId AND l.required AND btrim(l.value) = ''
      ORDER BY t.position, t.created_at, l.position, l.created_at`,
    { replacements: { episodeId }, type: QueryTypes.SELECT, transaction },
  );
  return { testCount: Number(count?.n ?? 0), requiredSpecLinesEmpty: empty.map((r) => `${r.test_name || TEST_KIND_LABELS[r.kind]}: ${r.label}`) };
}
