import { DataTypes, Model, type Sequelize } from 'sequelize';

/** A proposed publish date-time (instant + the IANA zone it was entered in) and its approval. */
export class PublishSlot extends Model {
  declare id: string;
  declare episodeId: string;
  declare startsAt: Date;
  declare zone: string;
  declare status: 'proposed' | 'approved' | 'rejected' | 'superseded';
  declare proposalNote: string | null;
  declare proposedById: string | null;
  declare decidedById: string | null;
  declare decidedAt: Date | null;
  declare comment: string | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    PublishSlot.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        episodeId: { type: DataTypes.UUID, allowNull: false },
        startsAt: { type: DataTypes.DATE, allowNull: false },
        zone: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'proposed' },
        proposalNote: { type: DataTypes.TEXT },
        proposedById: { type: DataTypes.UUID },
        decidedById: { type: DataTypes.UUID },
        decidedAt: { type: DataTypes.DATE },
        comment: { type: DataTypes.TEXT },
      },
      { sequelize, tableName: 'publish_slots', underscored: true },
    );
  }
}
