import { DataTypes, Model, type Sequelize } from 'sequelize';

/** One video, in one stage, at one position of its board column; `version` guards concurrent writes. */
export class Episode extends Model {
  declare id: string;
  declare channelId: string;
  declare title: string;
  declare stage: 'plan' | 'shoot' | 'grade' | 'approval' | 'scheduled' | 'live';
  declare position: number;
  declare version: number;
  declare hostId: string | null;
  declare editorId: string | null;
  declare targetPublishWeek: string | null;
  declare shootDate: string | null;
  declare publicUrl: string | null;
  declare archivedAt: Date | null;
  declare createdById: string | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Episode.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        title: { type: DataTypes.TEXT, allowNull: false },
        stage: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'plan' },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        hostId: { type: DataTypes.UUID },
        editorId: { type: DataTypes.UUID },
        targetPublishWeek: { type: DataTypes.DATEONLY },
        shootDate: { type: DataTypes.DATEONLY },
        publicUrl: { type: DataTypes.TEXT },
        archivedAt: { type: DataTypes.DATE },
        createdById: { type: DataTypes.UUID },
      },
      { sequelize, tableName: 'episodes', underscored: true },
    );
  }
}

/** Join row: which gear an episode tests. */
export class EpisodeGear extends Model {
  declare episodeId: string;
  declare gearId: string;

  static initModel(sequelize: Sequelize) {
    EpisodeGear.init(
      {
        episodeId: { type: DataTypes.UUID, primaryKey: true },
        gearId: { type: DataTypes.UUID, primaryKey: true },
      },
      { sequelize, tableName: 'episode_gear', underscored: true, timestamps: false },
    );
  }
}
