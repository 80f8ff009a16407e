import { DataTypes, Model, type Sequelize } from 'sequelize';

/** One line of the activity log: who did what to which record, when, from → to, and why. */
export class Activity extends Model {
  declare id: string;
  declare channelId: string;
  declare actorId: string | null;
  declare subjectType: string;
  declare subjectId: string;
  declare episodeId: string | null;
  declare action: string;
  declare fromValue: string | null;
  declare toValue: string | null;
  declare reason: string | null;
  declare details: Record<string, unknown>;
  declare createdAt: Date;

  static initModel(sequelize: Sequelize) {
    Activity.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        channelId: { type: DataTypes.UUID, allowNull: false },
        actorId: { type: DataTypes.UUID },
        subjectType: { type: DataTypes.TEXT, allowNull: false },
        subjectId: { type: DataTypes.TEXT, allowNull: false },
        episodeId: { type: DataTypes.UUID },
        action: { type: DataTypes.TEXT, allowNull: false },
        fromValue: { type: DataTypes.TEXT },
        toValue: { type: DataTypes.TEXT },
        reason: { type: DataTypes.TEXT },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      },
      { sequelize, tableName: 'activities', underscored: true, updatedAt: false },
    );
  }
}
