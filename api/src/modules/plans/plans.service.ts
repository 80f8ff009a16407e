// Test plans: the use cases behind the Plan tab. Every write locks the row it changes, checks the
// version the caller read (stale → 409), recomputes steps with the same shared generator the
// browser previews with (refused input → 422 via InvalidInputError), and records activity in
// the same transaction.
import { Op, QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Episode, LightingCircuit, LightingFixture, SpecSheetLine, Test, TestStep } from '@midgray/db';
import {
  ROLE_VALUES,
  TEST_KIND_LABELS,
  lightingLine,
  planSteps,
  specSheetDraftsFor,
  type CreateSpecLineInput,
  type CreateTestInput,
  type EpisodePlanDto,
  type LightingInput,
  type MarkStepShotInput,
  type Role,
  type SpecSheetLineDto,
  type StepDraft,
  type TestDto,
  type TestKind,
  type TestStepDto,
  type UpdateSpecLineInput,
  type UpdateStepInput,
  type UpdateTestInput,
} from '@midgray/shared';
import { AppError } from '../../errors.ts';
import { recordActivity } from '../../lib/activity.ts';
import { loadTest, loadTests, toSpecLineDto, toStepDto } from './plans.repository.ts';

/** Roles that edit plans, spec sheets and observations (PRODUCT.md: host, producer, admin). */
export const PLAN_EDITORS: readonly Role[] = ['host', 'producer', 'admin'];
/** Every member reads plans. */
export const PLAN_READERS: readonly Role[] = ROLE_VALUES;

/** Who is acting, in which channel. */
export interface Actor {
  channelId: string;
  userId: string;
}

const stale = (what: string, currentVersion: number) =>
  new AppError('stale_version', `Someone changed ${what} meanwhile: reload to see their change, then apply yours again`, { currentVersion });

/** Identity of a step across regenerations: the ISO of a sweep, the offset of a bracket, the position of a custom step. */
function stepKey(kind: TestKind, s: { index: number; iso: number | null; offsetStops: number | null }): string {
  if (kind === 'iso_sweep') return `iso:${s.iso}`;
  if (kind === 'latitude_bracket') return `offset:${Math.round((s.offsetStops ?? 0) * 3)}`;
  return `index:${s.index}`;
}

/** Values of the spec-sheet lines the plan fills in, by key. */
function knownValues(kind: TestKind, inputs: unknown): Map<string, string> {
  try {
    return new Map(specSheetDraftsFor(kind, inputs).map((d) => [d.key, d.value]));
  } catch {
    // Inputs saved before a generator change may no longer parse; then nothing counts as pre-filled.
    return new Map();
  }
}

export class PlansService {
  constructor(private readonly sequelize: Sequelize) {}

  /** Returns the episode's tests with steps, spec sheets and lighting, and whether `role` may edit them. */
  async listForEpisode(episodeId: string, role: Role): Promise<EpisodePlanDto> {
    const episode = await Episode.findByPk(episodeId, { attributes: ['id', 'channelId', 'title', 'stage'] });
    if (!episode) throw new AppError('not_found', 'Episode not found');
    return {
      episode: { id: episode.id, channelId: episode.channelId, title: episode.title, stage: episode.stage },
      canEdit: PLAN_EDITORS.includes(role),
      tests: await loadTests({ episodeId }),
    };
  }

  /** Returns one test. */
  async get(testId: string): Promise<TestDto> {
    const test = await loadTest(testId);
    if (!test) throw new AppError('not_found', 'Test not found');
    return test;
  }

  /** Adds a test: its steps from the generator and its standard spec-sheet lines pre-filled from the plan. */
  async create(episodeId: string, actor: Actor, input: CreateTestInput): Promise<TestDto> {
    // Run the generator before opening a transaction: refused input never touches the database.
    const drafts = planSteps(input.kind, input.inputs);
    const lines = specSheetDraftsFor(input.kind, input.inputs);
    return this.sequelize.transaction(async (transaction) => {
      const episode = await Episode.findByPk(episodeId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!episode) throw new AppError('not_found', 'Episode not found');
      const [last] = await this.sequelize.query<{ max: number | null }>('SELECT max(position) AS max FROM tests WHERE episode_id = :episodeId', {
        replacements: { episodeId },
        type: QueryTypes.SELECT,
        transaction,
      });
      const test = await Test.create(
        { episodeId, kind: input.kind, name: input.name, position: (last?.max ?? -1) + 1, inputs: input.inputs, secondsPerStep: input.secondsPerStep },
        { transaction },
      );
      await TestStep.bulkCreate(
        drafts.map((d) => ({ testId: test.id, index: d.index, label: d.label, iso: d.iso, offsetStops: d.offsetStops, planned: d.planned, plannedSeconds: input.secondsPerStep })),
        { transaction },
      );
      await SpecSheetLine.bulkCreate(
        lines.map((l) => ({ testId: test.id, key: l.key, label: l.label, value: l.value, checked: l.checked, inDescription: l.inDescription, required: l.required, position: l.position, custom: false })),
        { transaction },
      );
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: test.id, episodeId, action: 'test.created', toValue: input.name, details: { kind: input.kind, steps: drafts.length } },
        transaction,
      );
      return (await loadTest(test.id, transaction))!;
    });
  }

  /** Renames a test, changes its inputs (steps follow), seconds per step, readout region or position. */
  async update(testId: string, actor: Actor, input: UpdateTestInput): Promise<TestDto> {
    return this.sequelize.transaction(async (transaction) => {
      const test = await this.lockTest(testId, input.version, transaction);
      const fields: string[] = [];
      const before = { inputs: test.inputs, secondsPerStep: test.secondsPerStep };
      if (input.name !== undefined && input.name !== test.name) fields.push('name');
      if (input.readoutRegion !== undefined) fields.push('readoutRegion');
      if (input.position !== undefined && input.position !== test.position) fields.push('position');
      if (input.secondsPerStep !== undefined && input.secondsPerStep !== test.secondsPerStep) {
        fields.push('secondsPerStep');
        // Steps that still follow the test's default move with it; ones set by hand stay.
        await TestStep.update(
          { plannedSeconds: input.secondsPerStep, version: this.sequelize.literal('version + 1') },
          { where: { testId, plannedSeconds: before.secondsPerStep }, transaction },
        );
      }
      let stepsChanged: { added: number; removed: number } | null = null;
      if (input.inputs !== undefined) {
        fields.push('inputs');
        stepsChanged = await this.syncSteps(test, input.inputs, input.secondsPerStep ?? test.secondsPerStep, transaction);
        await this.refreshPlannedLines(test, before.inputs, input.inputs, transaction);
      }
      await test.update(
        {
          name: input.name ?? test.name,
          inputs: input.inputs ?? test.inputs,
          secondsPerStep: input.secondsPerStep ?? test.secondsPerStep,
          readoutRegion: input.readoutRegion === undefined ? test.readoutRegion : input.readoutRegion,
          position: input.position ?? test.position,
          version: test.version + 1,
        },
        { transaction },
      );
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: test.id, episodeId: test.episodeId, action: 'test.updated', details: { fields, ...(stepsChanged ?? {}) } },
        transaction,
      );
      return (await loadTest(test.id, transaction))!;
    });
  }

  /** Runs the generator again on the saved inputs (after a kit or generator change) and updates the steps. */
  async regenerate(testId: string, actor: Actor, version: number): Promise<TestDto> {
    return this.sequelize.transaction(async (transaction) => {
      const test = await this.lockTest(testId, version, transaction);
      const changed = await this.syncSteps(test, test.inputs, test.secondsPerStep, transaction);
      await test.update({ version: test.version + 1 }, { transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: test.id, episodeId: test.episodeId, action: 'test.regenerated', details: changed },
        transaction,
      );
      return (await loadTest(test.id, transaction))!;
    });
  }

  /** Deletes a test with its steps, spec sheet and lighting. */
  async remove(testId: string, actor: Actor, version: number): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      const test = await this.lockTest(testId, version, transaction);
      await test.destroy({ transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: test.id, episodeId: test.episodeId, action: 'test.deleted', fromValue: test.name },
        transaction,
      );
    });
  }

  /**
   * Replaces the test's lighting (circuits and the fixtures on them). The spec sheet's Lighting
   * line follows it while the line is empty or still says what the previous lighting plan wrote;
   * a value someone typed is kept.
   */
  async setLighting(testId: string, actor: Actor, input: LightingInput): Promise<TestDto> {
    return this.sequelize.transaction(async (transaction) => {
      const test = await this.lockTest(testId, input.version, transaction);
      const before = await this.lightingLineOf(testId, transaction);
      await LightingFixture.destroy({ where: { testId }, transaction });
      await LightingCircuit.destroy({ where: { testId }, transaction });
      const idOfKey = new Map<string, string>();
      for (const [position, c] of input.circuits.entries()) {
        const row = await LightingCircuit.create({ testId, label: c.label, volts: c.volts, breakerAmps: c.breakerAmps, position }, { transaction });
        idOfKey.set(c.key, row.id);
      }
      await LightingFixture.bulkCreate(
        input.fixtures.map((f, position) => ({ testId, name: f.name, watts: f.watts, quantity: f.quantity, circuitId: f.circuitKey === null ? null : idOfKey.get(f.circuitKey)!, position })),
        { transaction },
      );
      await test.update({ version: test.version + 1 }, { transaction });
      const line = await SpecSheetLine.findOne({ where: { testId, key: 'lighting' }, transaction, lock: transaction.LOCK.UPDATE });
      if (line && (line.value.trim() === '' || line.value === before)) {
        const value = await this.lightingLineOf(testId, transaction);
        if (value !== line.value) await line.update({ value, version: line.version + 1 }, { transaction });
      }
      const watts = input.fixtures.reduce((sum, f) => sum + f.watts * f.quantity, 0);
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test', subjectId: test.id, episodeId: test.episodeId, action: 'test.lighting_updated', details: { circuits: input.circuits.length, fixtures: input.fixtures.length, watts } },
        transaction,
      );
      return (await loadTest(test.id, transaction))!;
    });
  }

  /** The Lighting line the test's saved fixtures give (see lightingLine), '' without fixtures. */
  private async lightingLineOf(testId: string, transaction: Transaction): Promise<string> {
    const circuits = await LightingCircuit.findAll({ where: { testId }, transaction });
    const fixtures = await LightingFixture.findAll({ where: { testId }, order: [['position', 'ASC']], transaction });
    const label = new Map(circuits.map((c) => [c.id, c.label]));
    return lightingLine(fixtures.map((f) => ({ name: f.name, watts: Number(f.watts), quantity: f.quantity, circuit: f.circuitId ? (label.get(f.circuitId) ?? null) : null })));
  }

  /** Adds a custom spec-sheet line at the end of the sheet. */
  async addSpecLine(testId: string, actor: Actor, input: CreateSpecLineInput): Promise<SpecSheetLineDto> {
    return this.sequelize.transaction(async (transaction) => {
      const test = await Test.findByPk(testId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!test) throw new AppError('not_found', 'Test not found');
      const [last] = await this.sequelize.query<{ max: number | null }>('SELECT max(position) AS max FROM spec_sheet_lines WHERE test_id = :testId', {
        replacements: { testId },
        type: QueryTypes.SELECT,
        transaction,
      });
      const position = (last?.max ?? -1) + 1;
      const line = await SpecSheetLine.create({ testId, key: `custom_${crypto.randomUUID()}`, ...input, position, custom: true }, { transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'spec_line', subjectId: line.id, episodeId: test.episodeId, action: 'spec_line.added', toValue: input.label },
        transaction,
      );
      return toSpecLineDto(line);
    });
  }

  /** Changes a spec-sheet line's value or flags (and the label of a custom line). */
  async updateSpecLine(lineId: string, actor: Actor, input: UpdateSpecLineInput): Promise<SpecSheetLineDto> {
    return this.sequelize.transaction(async (transaction) => {
      const { line, episodeId } = await this.lockLine(lineId, input.version, transaction);
      if (input.label !== undefined && input.label !== line.label && !line.custom) {
        throw new AppError('conflict', `"${line.label}" is a standard line: its label stays; add a custom line for anything else`);
      }
      const from = line.value;
      const { version: _version, ...changes } = input;
      await line.update({ ...changes, version: line.version + 1 }, { transaction });
      await recordActivity(
        {
          channelId: actor.channelId,
          actorId: actor.userId,
          subjectType: 'spec_line',
          subjectId: line.id,
          episodeId,
          action: 'spec_line.updated',
          fromValue: input.value !== undefined ? from : null,
          toValue: input.value !== undefined ? line.value : null,
          details: { label: line.label, fields: Object.keys(changes) },
        },
        transaction,
      );
      return toSpecLineDto(line);
    });
  }

  /** Removes a custom spec-sheet line; standard lines stay (untick "required" instead). */
  async removeSpecLine(lineId: string, actor: Actor, version: number): Promise<void> {
    await this.sequelize.transaction(async (transaction) => {
      const { line, episodeId } = await this.lockLine(lineId, version, transaction);
      if (!line.custom) throw new AppError('conflict', `"${line.label}" is a standard line and cannot be removed; untick "required" if the test does not need it`);
      await line.destroy({ transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'spec_line', subjectId: line.id, episodeId, action: 'spec_line.removed', fromValue: line.label },
        transaction,
      );
    });
  }

  /** Marks a step shot with the settings as shot, an observation and a rating (again: corrects them). */
  async markShot(stepId: string, actor: Actor, input: MarkStepShotInput): Promise<TestStepDto> {
    return this.sequelize.transaction(async (transaction) => {
      const { step, episodeId } = await this.lockStep(stepId, input.version, transaction);
      const first = step.shotAt === null;
      await step.update(
        {
          actual: input.actual,
          observation: input.observation,
          rating: input.rating,
          shotAt: step.shotAt ?? new Date(),
          shotById: step.shotById ?? actor.userId,
          version: step.version + 1,
        },
        { transaction },
      );
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test_step', subjectId: step.id, episodeId, action: first ? 'step.shot' : 'step.shot_corrected', toValue: step.label, details: { rating: input.rating } },
        transaction,
      );
      return this.stepDto(step, transaction);
    });
  }

  /** Takes back a "shot" mark (a mistap on set); the observation and rating stay. */
  async unmarkShot(stepId: string, actor: Actor, version: number): Promise<TestStepDto> {
    return this.sequelize.transaction(async (transaction) => {
      const { step, episodeId } = await this.lockStep(stepId, version, transaction);
      if (step.shotAt === null) throw new AppError('conflict', `${step.label} is not marked shot`);
      await step.update({ actual: null, shotAt: null, shotById: null, version: step.version + 1 }, { transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test_step', subjectId: step.id, episodeId, action: 'step.unshot', fromValue: step.label },
        transaction,
      );
      return this.stepDto(step, transaction);
    });
  }

  /** Changes a step's observation, rating or planned seconds. */
  async updateStep(stepId: string, actor: Actor, input: UpdateStepInput): Promise<TestStepDto> {
    return this.sequelize.transaction(async (transaction) => {
      const { step, episodeId } = await this.lockStep(stepId, input.version, transaction);
      const { version: _version, ...changes } = input;
      await step.update({ ...changes, version: step.version + 1 }, { transaction });
      await recordActivity(
        { channelId: actor.channelId, actorId: actor.userId, subjectType: 'test_step', subjectId: step.id, episodeId, action: 'step.updated', details: { label: step.label, fields: Object.keys(changes) } },
        transaction,
      );
      return this.stepDto(step, transaction);
    });
  }

  // ---- helpers ----

  private async stepDto(step: TestStep, transaction: Transaction): Promise<TestStepDto> {
    if (!step.shotById) return toStepDto(step, null);
    const [row] = await this.sequelize.query<{ name: string }>('SELECT name FROM users WHERE id = :id', { replacements: { id: step.shotById }, type: QueryTypes.SELECT, transaction });
    return toStepDto(step, row?.name ?? null);
  }

  private async lockTest(testId: string, version: number, transaction: Transaction): Promise<Test> {
    const test = await Test.findByPk(testId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!test) throw new AppError('not_found', 'Test not found');
    if (test.version !== version) throw stale(`the test "${test.name}"`, test.version);
    return test;
  }

  private async lockLine(lineId: string, version: number, transaction: Transaction) {
    const line = await SpecSheetLine.findByPk(lineId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!line) throw new AppError('not_found', 'Spec-sheet line not found');
    if (line.version !== version) throw stale(`the spec-sheet line "${line.label}"`, line.version);
    const test = await Test.findByPk(line.testId, { attributes: ['episodeId'], transaction });
    return { line, episodeId: test!.episodeId };
  }

  private async lockStep(stepId: string, version: number, transaction: Transaction) {
    const step = await TestStep.findByPk(stepId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!step) throw new AppError('not_found', 'Step not found');
    if (step.version !== version) throw stale(`step ${step.label}`, step.version);
    const test = await Test.findByPk(step.testId, { attributes: ['episodeId'], transaction });
    return { step, episodeId: test!.episodeId };
  }

  /**
   * Brings the saved steps in line with `inputs`. A step keeps its row (and so its shot data,
   * footage and readouts) while its ISO, offset or custom position stays in the plan; steps that
   * leave the plan are deleted unless already shot, which refuses the change with 409.
   */
  private async syncSteps(test: Test, inputs: Record<string, unknown>, secondsPerStep: number, transaction: Transaction) {
    const drafts = planSteps(test.kind, inputs);
    const existing = await TestStep.findAll({ where: { testId: test.id }, order: [['index', 'ASC']], transaction, lock: transaction.LOCK.UPDATE });
    const byKey = new Map(existing.map((s) => [stepKey(test.kind, s), s]));
    const matched = new Map<StepDraft, TestStep>();
    for (const d of drafts) {
      const row = byKey.get(stepKey(test.kind, d));
      if (row) {
        matched.set(d, row);
        byKey.delete(stepKey(test.kind, d));
      }
    }
    const leaving = [...byKey.values()];
    const shotLeaving = leaving.filter((s) => s.shotAt !== null);
    if (shotLeaving.length) {
      throw new AppError(
        'conflict',
        `These inputs drop ${shotLeaving.length === 1 ? 'a step that is' : 'steps that are'} already shot (${shotLeaving.map((s) => s.label).join(', ')}): keep ${shotLeaving.length === 1 ? 'it' : 'them'} in the plan, or unmark ${shotLeaving.length === 1 ? 'it' : 'them'} first`,
        { shotSteps: shotLeaving.map((s) => s.id) },
      );
    }
    if (leaving.length) await TestStep.destroy({ where: { id: leaving.map((s) => s.id) }, transaction });
    // Move the kept rows out of the way of UNIQUE (test_id, index) before giving them their new places.
    await TestStep.update({ index: this.sequelize.literal('index + 1000000') }, { where: { testId: test.id }, transaction });
    for (const d of drafts) {
      const row = matched.get(d);
      if (row) {
        // A static update: the instance still holds the index from before the shift, so an
        // instance update would see "no change" and leave the row at index + 1000000.
        await TestStep.update({ index: d.index, label: d.label, iso: d.iso, offsetStops: d.offsetStops, planned: d.planned, version: row.version + 1 }, { where: { id: row.id }, transaction });
      } else {
        await TestStep.create({ testId: test.id, index: d.index, label: d.label, iso: d.iso, offsetStops: d.offsetStops, planned: d.planned, plannedSeconds: secondsPerStep }, { transaction });
      }
    }
    return { added: drafts.length - matched.size, removed: leaving.length };
  }

  /** Spec-sheet lines still holding the value the old plan filled in (or empty) take the new plan's value. */
  private async refreshPlannedLines(test: Test, oldInputs: unknown, newInputs: unknown, transaction: Transaction) {
    const before = knownValues(test.kind, oldInputs);
    const after = knownValues(test.kind, newInputs);
    const lines = await SpecSheetLine.findAll({ where: { testId: test.id, custom: false, key: { [Op.in]: [...after.keys()] } }, transaction, lock: transaction.LOCK.UPDATE });
    for (const line of lines) {
      const next = after.get(line.key) ?? '';
      const untouched = line.value.trim() === '' || line.value === (before.get(line.key) ?? '');
      if (untouched && next !== '' && next !== line.value) await line.update({ value: next, version: line.version + 1 }, { transaction });
    }
  }
}

/** How a test reads in messages: its name, or its kind. */
export const testTitle = (t: { name: string; kind: TestKind }) => t.name || TEST_KIND_LABELS[t.kind];
