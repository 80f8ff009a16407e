import { DataTypes, Model, type Sequelize } from 'sequelize';

/** A person who signs in through the OAuth provider; belongs to channels through memberships. */
export class User extends Model {
  declare id: string;
  declare provider: string;
  declare providerId: string;
  declare login: string;
  declare name: string;
  declare email: string | null;
  declare avatarUrl: string | null;
  declare emailOptOuts: string[];
  /** SHA-256 (hex) of the calendar-feed secret; the secret itself is never stored. */
  declare calendarToken: string | null;
  declare calendarTokenCreatedAt: Date | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        provider: { type: DataTypes.TEXT, allowNull: false },
        providerId: { type: DataTypes.TEXT, allowNull: false },
        login: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        email: { type: DataTypes.TEXT },
        avatarUrl: { type: DataTypes.TEXT },
        emailOptOuts: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        calendarToken: { type: DataTypes.TEXT },
        calendarTokenCreatedAt: { type: DataTypes.DATE },
      },
      { sequelize, tableName: 'users', underscored: true },
    );
  }
}
