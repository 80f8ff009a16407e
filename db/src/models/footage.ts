import { DataTypes, Model, type Sequelize } from 'sequelize';

export type FootageKind = 'camera_original' | 'graded_render' | 'frame_grab';
export type FootageStatus = 'receiving' | 'received' | 'verified' | 'flagged';

/**
 * One uploaded file of an episode, optionally tied to a test step. `status` moves
 * received → verified (checksums match, probe matches the spec sheet) or flagged.
 * BIGINT columns arrive from pg as strings; the repository turns them into numbers.
 */
export class Footage extends Model {
  declare id: string;
  declare channelId: string;
  declare episodeId: string;
  declare stepId: string | null;
  declare uploadId: string | null;
  declare kind: FootageKind;
  declare status: FootageStatus;
  declare uploaderId: string | null;
  declare originalName: string;
  declare format: string;
  declare sizeBytes: string | number;
  declare storageKey: string;
  declare clientSha256: string | null;
  declare serverSha256: string | null;
  declare probe: Record<string, unknown> | null;
  declare probeError: string | null;
  declare specMismatches: unknown[] | null;
  declare thumbnailKey: string | null;
  declare heldById: string | null;
  declare heldSince: Date | null;
  declare checkedAt: Date | null;
  declare version: number;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Footage.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        channelId: { type: DataTypes.UUID, allowNull: false },
        episodeId: { type: DataTypes.UUID, allowNull: false },
        stepId: { type: DataTypes.UUID },
        uploadId: { type: DataTypes.TEXT },
        kind: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'received' },
        uploaderId: { type: DataTypes.UUID },
        originalName: { type: DataTypes.TEXT, allowNull: false },
        format: { type: DataTypes.TEXT, allowNull: false },
        sizeBytes: { type: DataTypes.BIGINT, allowNull: false },
        storageKey: { type: DataTypes.TEXT, allowNull: false },
        clientSha256: { type: DataTypes.TEXT, field: 'client_sha256' },
        serverSha256: { type: DataTypes.TEXT, field: 'server_sha256' },
        probe: { type: DataTypes.JSONB },
        probeError: { type: DataTypes.TEXT },
        specMismatches: { type: DataTypes.JSONB },
        thumbnailKey: { type: DataTypes.TEXT },
        heldById: { type: DataTypes.UUID },
        heldSince: { type: DataTypes.DATE },
        checkedAt: { type: DataTypes.DATE },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      },
      { sequelize, tableName: 'footage', underscored: true },
    );
  }
}

/** One resumable (tus) upload: who started it, for which episode, how far it got and when it expires. */
export class UploadRecord extends Model {
  declare id: string;
  declare ownerId: string;
  declare channelId: string;
  declare episodeId: string;
  declare stepId: string | null;
  declare kind: FootageKind;
  declare originalName: string;
  declare offset: string | number;
  declare length: string | number;
  declare metadata: Record<string, string | null>;
  declare format: string | null;
  declare clientSha256: string | null;
  declare createdAt: Date;
  declare updatedAt: Date;
  declare expiresAt: Date;
  declare completedAt: Date | null;
  declare footageId: string | null;

  static initModel(sequelize: Sequelize) {
    UploadRecord.init(
      {
        id: { type: DataTypes.TEXT, primaryKey: true },
        ownerId: { type: DataTypes.UUID, allowNull: false },
        channelId: { type: DataTypes.UUID, allowNull: false },
        episodeId: { type: DataTypes.UUID, allowNull: false },
        stepId: { type: DataTypes.UUID },
        kind: { type: DataTypes.TEXT, allowNull: false },
        originalName: { type: DataTypes.TEXT, allowNull: false },
        offset: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
        length: { type: DataTypes.BIGINT, allowNull: false },
        metadata: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        format: { type: DataTypes.TEXT },
        clientSha256: { type: DataTypes.TEXT, field: 'client_sha256' },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        completedAt: { type: DataTypes.DATE },
        footageId: { type: DataTypes.UUID },
      },
      { sequelize, tableName: 'uploads', underscored: true },
    );
  }
}
