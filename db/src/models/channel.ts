import { DataTypes, Model, type Sequelize } from 'sequelize';

/** A team and its episodes; `settings` holds thresholds, limits and texts (see shared ChannelSettingsSchema). */
export class Channel extends Model {
  declare id: string;
  declare name: string;
  declare timeZone: string;
  declare settings: Record<string, unknown>;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Channel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: false },
        timeZone: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'UTC' },
        settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'channels', underscored: true },
    );
  }
}
