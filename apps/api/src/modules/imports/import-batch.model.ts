import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { ImportKind, ImportState } from '@kerfline/domain/imports/schema';

/** One file brought into one site: who, when, which bytes, the counts and where it stands. */
export class ImportBatch extends Model<InferAttributes<ImportBatch>, InferCreationAttributes<ImportBatch>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare kind: ImportKind;
  declare state: ImportState;
  declare fileName: string;
  declare fileBytes: number;
  declare contentSha256: string;
  declare sheet: string | null;
  declare plan: Record<string, unknown>;
  /** The file's header, for the rejected-rows download. */
  declare columns: CreationOptional<string[]>;
  declare rowsTotal: CreationOptional<number>;
  declare rowsAdded: CreationOptional<number>;
  declare rowsPresent: CreationOptional<number>;
  declare rowsRepeated: CreationOptional<number>;
  declare rowsRejected: CreationOptional<number>;
  declare error: CreationOptional<string | null>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare finishedAt: CreationOptional<Date | null>;
  declare undoneAt: CreationOptional<Date | null>;
  declare undoneById: CreationOptional<string | null>;

  static initModel(sequelize: Sequelize): void {
    ImportBatch.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        state: { type: DataTypes.TEXT, allowNull: false },
        fileName: { type: DataTypes.TEXT, allowNull: false },
        fileBytes: { type: DataTypes.INTEGER, allowNull: false },
        contentSha256: { type: DataTypes.TEXT, allowNull: false, field: 'content_sha256' },
        sheet: { type: DataTypes.TEXT, allowNull: true },
        plan: { type: DataTypes.JSONB, allowNull: false },
        columns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        rowsTotal: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rowsAdded: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rowsPresent: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rowsRepeated: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        rowsRejected: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        error: { type: DataTypes.TEXT, allowNull: true },
        createdById: { type: DataTypes.UUID, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        undoneAt: { type: DataTypes.DATE, allowNull: true },
        undoneById: { type: DataTypes.UUID, allowNull: true },
      },
      { sequelize, modelName: 'ImportBatch', tableName: 'import_batches', underscored: true, timestamps: false },
    );
  }
}

/** What a site mapped last time for one kind of file. */
export class ImportMapping extends Model<InferAttributes<ImportMapping>, InferCreationAttributes<ImportMapping>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare kind: ImportKind;
  declare memory: Record<string, unknown>;
  declare updatedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ImportMapping.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        memory: { type: DataTypes.JSONB, allowNull: false },
        updatedById: { type: DataTypes.UUID, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        updatedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, modelName: 'ImportMapping', tableName: 'import_mappings', underscored: true },
    );
  }
}
