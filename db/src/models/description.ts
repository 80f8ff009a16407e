import { DataTypes, Model, type Sequelize } from 'sequelize';

/** A chapter as stored: label and start in whole seconds. */
export interface StoredChapter {
  label: string;
  startSeconds: number;
}

/** A link in the description as stored. */
export interface StoredGearLink {
  url: string;
  label: string;
  commission: boolean;
}

/** The parts of an episode's description the team edits; `version` guards concurrent saves. */
export class Description extends Model {
  declare episodeId: string;
  declare summary: string;
  declare chapters: StoredChapter[];
  declare gearLinks: StoredGearLink[];
  declare disclosure: string;
  declare version: number;
  declare updatedById: string | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Description.init(
      {
        episodeId: { type: DataTypes.UUID, primaryKey: true },
        summary: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        chapters: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        gearLinks: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        disclosure: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        updatedById: { type: DataTypes.UUID },
      },
      { sequelize, tableName: 'descriptions', underscored: true },
    );
  }
}

/** A saved version of a description: the full snapshot of the parts, who saved it and when. */
export class DescriptionVersion extends Model {
  declare id: string;
  declare episodeId: string;
  declare version: number;
  declare snapshot: { summary: string; chapters: StoredChapter[]; gearLinks: StoredGearLink[]; disclosure: string };
  declare changedParts: string[];
  declare restoredFrom: number | null;
  declare authorId: string | null;
  declare createdAt: Date;

  static initModel(sequelize: Sequelize) {
    DescriptionVersion.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        episodeId: { type: DataTypes.UUID, allowNull: false },
        version: { type: DataTypes.INTEGER, allowNull: false },
        snapshot: { type: DataTypes.JSONB, allowNull: false },
        changedParts: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        restoredFrom: { type: DataTypes.INTEGER },
        authorId: { type: DataTypes.UUID },
      },
      { sequelize, tableName: 'description_versions', underscored: true, updatedAt: false },
    );
  }
}
