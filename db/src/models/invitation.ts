import { DataTypes, Model, type Sequelize } from 'sequelize';

/** An open, accepted or revoked invitation of an e-mail address to a channel with a role. */
export class Invitation extends Model {
  declare id: string;
  declare channelId: string;
  declare email: string;
  declare role: 'host' | 'editor' | 'producer' | 'admin';
  declare invitedById: string | null;
  declare acceptedById: string | null;
  declare acceptedAt: Date | null;
  declare revokedAt: Date | null;
  declare expiresAt: Date;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        email: { type: DataTypes.TEXT, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        invitedById: { type: DataTypes.UUID },
        acceptedById: { type: DataTypes.UUID },
        acceptedAt: { type: DataTypes.DATE },
        revokedAt: { type: DataTypes.DATE },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'invitations', underscored: true },
    );
  }
}
