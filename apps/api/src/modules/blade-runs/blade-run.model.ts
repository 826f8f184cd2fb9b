import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import type { AreaSource } from '@kerfline/domain/blade-runs/schema';

/** One blade's life on one saw. Tension in MPa, area in mm², cost in minor units of `currency`. */
export class BladeRun extends Model<InferAttributes<BladeRun>, InferCreationAttributes<BladeRun>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare sawId: string;
  declare bladeSpecId: string;
  declare stockReceiptId: string | null;
  declare installedAt: Date;
  declare installedById: string | null;
  declare tensionMpa: number | null;
  declare materialGroup: MaterialGroup | null;
  declare breakInFollowed: boolean | null;
  declare installNotes: string | null;
  declare costMinor: number;
  declare currency: string;
  declare removedAt: CreationOptional<Date | null>;
  declare removedById: CreationOptional<string | null>;
  declare removalReason: CreationOptional<RemovalReason | null>;
  declare areaCutMm2: CreationOptional<number | null>;
  declare cuts: CreationOptional<number | null>;
  declare areaSource: CreationOptional<AreaSource | null>;
  declare removalNotes: CreationOptional<string | null>;
  declare confirmedCause: CreationOptional<string | null>;
  declare confirmedCauseAt: CreationOptional<Date | null>;
  declare confirmedCauseById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const nullable = (type: DataTypes.DataType, field?: string) => ({
      type,
      allowNull: true,
      ...(field ? { field } : {}),
    });
    BladeRun.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: false },
        bladeSpecId: { type: DataTypes.UUID, allowNull: false },
        stockReceiptId: nullable(DataTypes.UUID),
        installedAt: { type: DataTypes.DATE, allowNull: false },
        installedById: nullable(DataTypes.UUID),
        tensionMpa: nullable(DataTypes.DOUBLE, 'tension_mpa'),
        materialGroup: nullable(DataTypes.TEXT),
        breakInFollowed: nullable(DataTypes.BOOLEAN),
        installNotes: nullable(DataTypes.TEXT),
        costMinor: { type: DataTypes.INTEGER, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        removedAt: nullable(DataTypes.DATE),
        removedById: nullable(DataTypes.UUID),
        removalReason: nullable(DataTypes.TEXT),
        areaCutMm2: nullable(DataTypes.DOUBLE, 'area_cut_mm2'),
        cuts: nullable(DataTypes.INTEGER),
        areaSource: nullable(DataTypes.TEXT),
        removalNotes: nullable(DataTypes.TEXT),
        confirmedCause: nullable(DataTypes.TEXT),
        confirmedCauseAt: nullable(DataTypes.DATE),
        confirmedCauseById: nullable(DataTypes.UUID),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'BladeRun', tableName: 'blade_runs' },
    );
  }
}
