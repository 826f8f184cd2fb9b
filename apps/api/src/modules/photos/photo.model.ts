import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { PhotoType } from '@kerfline/domain/photos/schema';

/** A photo's description; its bytes are kept by the photo storage (see photo-storage.ts). */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  /** The photo's one parent: a blade run or a recorded check. */
  declare bladeRunId: string | null;
  declare checkRecordId: CreationOptional<string | null>;
  declare contentType: PhotoType;
  declare byteSize: number;
  declare widthPx: number;
  declare heightPx: number;
  declare caption: string | null;
  declare uploadedById: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Photo.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        bladeRunId: { type: DataTypes.UUID, allowNull: true },
        checkRecordId: { type: DataTypes.UUID, allowNull: true },
        contentType: { type: DataTypes.TEXT, allowNull: false },
        byteSize: { type: DataTypes.INTEGER, allowNull: false },
        widthPx: { type: DataTypes.INTEGER, allowNull: false, field: 'width_px' },
        heightPx: { type: DataTypes.INTEGER, allowNull: false, field: 'height_px' },
        caption: { type: DataTypes.TEXT, allowNull: true },
        uploadedById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Photo', tableName: 'photos', updatedAt: false },
    );
  }
}
