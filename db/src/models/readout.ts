import { DataTypes, Model, type Sequelize } from 'sequelize';

export type ReadoutKindValue = 'noise' | 'recovery';
export type ReadoutStatus = 'queued' | 'running' | 'done' | 'failed';

/**
 * One measurement of a test step's frame. Rows are only ever added (a re-run is a new row) and
 * move queued → running → done | failed; `results` holds the figures once done.
 */
export class Readout extends Model {
  declare id: string;
  declare channelId: string;
  declare testId: string;
  declare stepId: string;
  declare footageId: string | null;
  declare referenceFootageId: string | null;
  declare kind: ReadoutKindValue;
  declare status: ReadoutStatus;
  declare params: Record<string, unknown>;
  declare softwareVersion: string;
  declare results: Record<string, unknown> | null;
  declare differenceMapKey: string | null;
  declare frameKey: string | null;
  declare referenceFrameKey: string | null;
  declare error: string | null;
  declare requestedBy: string | null;
  declare createdAt: Date;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;

  static initModel(sequelize: Sequelize) {
    Readout.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        testId: { type: DataTypes.UUID, allowNull: false },
        stepId: { type: DataTypes.UUID, allowNull: false },
        footageId: { type: DataTypes.UUID },
        referenceFootageId: { type: DataTypes.UUID },
        kind: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        params: { type: DataTypes.JSONB, allowNull: false },
        softwareVersion: { type: DataTypes.TEXT, allowNull: false },
        results: { type: DataTypes.JSONB },
        differenceMapKey: { type: DataTypes.TEXT },
        frameKey: { type: DataTypes.TEXT },
        referenceFrameKey: { type: DataTypes.TEXT },
        error: { type: DataTypes.TEXT },
        requestedBy: { type: DataTypes.UUID },
        startedAt: { type: DataTypes.DATE },
        finishedAt: { type: DataTypes.DATE },
      },
      { sequelize, tableName: 'readouts', underscored: true, updatedAt: false },
    );
  }
}
