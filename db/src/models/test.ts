import { DataTypes, Model, type ModelAttributeColumnOptions, type Sequelize } from 'sequelize';

/** A `numeric` column read back as a JS number (PostgreSQL returns numeric as text). */
function numeric(name: string, options: Partial<ModelAttributeColumnOptions> = {}): ModelAttributeColumnOptions {
  return {
    type: DataTypes.DECIMAL,
    ...options,
    get(this: Model) {
      const raw = this.getDataValue(name) as string | number | null;
      return raw === null || raw === undefined ? raw : Number(raw);
    },
  };
}

/** Rectangle in fractions of the frame (0…1), where readouts are measured. */
export interface ReadoutRegion {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** One test of an episode: an ISO sweep, a latitude bracket or a custom list of steps. */
export class Test extends Model {
  declare id: string;
  declare episodeId: string;
  declare kind: 'iso_sweep' | 'latitude_bracket' | 'custom';
  declare name: string;
  declare position: number;
  /** The generator input (IsoSweepInput / LatitudeBracketInput); {} for custom tests. */
  declare inputs: Record<string, unknown>;
  declare readoutRegion: ReadoutRegion | null;
  /** Planned seconds of recording per step, for the storage estimate. */
  declare secondsPerStep: number;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Test.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        episodeId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        inputs: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        readoutRegion: { type: DataTypes.JSONB },
        secondsPerStep: numeric('secondsPerStep', { allowNull: false, defaultValue: 10 }),
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'tests', underscored: true },
    );
  }
}

/** One step of a test: planned settings, and once shot the actual settings, note and rating. */
export class TestStep extends Model {
  declare id: string;
  declare testId: string;
  declare index: number;
  declare label: string;
  declare iso: number | null;
  declare offsetStops: number | null;
  declare planned: Record<string, unknown>;
  declare actual: Record<string, unknown> | null;
  declare shotAt: Date | null;
  declare shotById: string | null;
  declare observation: string;
  declare rating: number | null;
  declare plannedSeconds: number;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    TestStep.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        testId: { type: DataTypes.UUID, allowNull: false },
        index: { type: DataTypes.INTEGER, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        iso: { type: DataTypes.INTEGER },
        offsetStops: numeric('offsetStops'),
        planned: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        actual: { type: DataTypes.JSONB },
        shotAt: { type: DataTypes.DATE },
        shotById: { type: DataTypes.UUID },
        observation: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        rating: { type: DataTypes.SMALLINT },
        plannedSeconds: numeric('plannedSeconds', { allowNull: false, defaultValue: 10 }),
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'test_steps', underscored: true },
    );
  }
}

/** One line of a test's spec sheet: a standard line (by key) or a custom one. */
export class SpecSheetLine extends Model {
  declare id: string;
  declare testId: string;
  declare key: string;
  declare label: string;
  declare value: string;
  declare checked: boolean;
  declare inDescription: boolean;
  declare required: boolean;
  declare position: number;
  declare custom: boolean;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    SpecSheetLine.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        testId: { type: DataTypes.UUID, allowNull: false },
        key: { type: DataTypes.TEXT, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false },
        value: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        checked: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        inDescription: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        required: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        custom: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'spec_sheet_lines', underscored: true },
    );
  }
}

/** A circuit on set for a test's lighting: nominal volts and breaker rating. */
export class LightingCircuit extends Model {
  declare id: string;
  declare testId: string;
  declare label: string;
  declare volts: number;
  declare breakerAmps: number;
  declare position: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    LightingCircuit.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        testId: { type: DataTypes.UUID, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false },
        volts: numeric('volts', { allowNull: false }),
        breakerAmps: numeric('breakerAmps', { allowNull: false }),
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      },
      { sequelize, tableName: 'lighting_circuits', underscored: true },
    );
  }
}

/** A light on a test's plan: rated watts, how many, and the circuit it is plugged into. */
export class LightingFixture extends Model {
  declare id: string;
  declare testId: string;
  declare circuitId: string | null;
  declare name: string;
  declare watts: number;
  declare quantity: number;
  declare position: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    LightingFixture.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        testId: { type: DataTypes.UUID, allowNull: false },
        circuitId: { type: DataTypes.UUID },
        name: { type: DataTypes.TEXT, allowNull: false },
        watts: numeric('watts', { allowNull: false }),
        quantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      },
      { sequelize, tableName: 'lighting_fixtures', underscored: true },
    );
  }
}
