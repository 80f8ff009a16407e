import { DataTypes, Model, type Sequelize } from 'sequelize';

/** An item under test with where it came from, when it must go back and its embargo (instant + IANA zone). */
export class Gear extends Model {
  declare id: string;
  declare channelId: string;
  declare kind: 'body' | 'lens' | 'light' | 'recorder' | 'other';
  declare make: string;
  declare model: string;
  declare serial: string | null;
  declare source: 'loaner' | 'rental' | 'owned' | 'purchased';
  declare sponsored: boolean;
  declare receivedOn: string | null;
  declare dueBackOn: string | null;
  declare embargoAt: Date | null;
  declare embargoZone: string | null;
  declare notes: string;
  declare archivedAt: Date | null;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Gear.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        make: { type: DataTypes.TEXT, allowNull: false },
        model: { type: DataTypes.TEXT, allowNull: false },
        serial: { type: DataTypes.TEXT },
        source: { type: DataTypes.TEXT, allowNull: false },
        sponsored: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        receivedOn: { type: DataTypes.DATEONLY },
        dueBackOn: { type: DataTypes.DATEONLY },
        embargoAt: { type: DataTypes.DATE },
        embargoZone: { type: DataTypes.TEXT },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        archivedAt: { type: DataTypes.DATE },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'gear', underscored: true },
    );
  }
}
