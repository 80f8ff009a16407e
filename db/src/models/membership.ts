import { DataTypes, Model, type Sequelize } from 'sequelize';
import type { User } from './user.ts';

/** One user's role in one channel. */
export class Membership extends Model {
  declare id: string;
  declare channelId: string;
  declare userId: string;
  declare role: 'host' | 'editor' | 'producer' | 'admin';
  declare createdAt: Date;
  declare updatedAt: Date;
  declare user?: User;

  static initModel(sequelize: Sequelize) {
    Membership.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
      },
      { sequelize, tableName: 'memberships', underscored: true },
    );
  }
}
