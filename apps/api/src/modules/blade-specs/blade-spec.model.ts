import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { ToothForm, ToothSet } from '@kerfline/domain/blade-specs/schema';
import type { BladeMaterial } from '@kerfline/domain/checks/schema';

/** Lengths in millimetres; pitch in TPI (constant: `fineTpi` null); cost in minor units of `currency`. */
export class BladeSpec extends Model<InferAttributes<BladeSpec>, InferCreationAttributes<BladeSpec>> {
  declare id: CreationOptional<string>;
  declare siteId: string | null;
  declare name: string;
  declare widthMm: number;
  declare thicknessMm: number;
  declare lengthMm: number;
  declare coarseTpi: number;
  declare fineTpi: number | null;
  declare toothForm: ToothForm;
  declare toothSet: ToothSet;
  declare material: BladeMaterial;
  declare unitCostMinor: number;
  declare currency: string;
  declare supplier: string | null;
  declare archived: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const double = { type: DataTypes.DOUBLE, allowNull: false };
    BladeSpec.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        widthMm: { ...double, field: 'width_mm' },
        thicknessMm: { ...double, field: 'thickness_mm' },
        lengthMm: { ...double, field: 'length_mm' },
        coarseTpi: { ...double, field: 'coarse_tpi' },
        fineTpi: { type: DataTypes.DOUBLE, allowNull: true, field: 'fine_tpi' },
        toothForm: { type: DataTypes.TEXT, allowNull: false },
        toothSet: { type: DataTypes.TEXT, allowNull: false },
        material: { type: DataTypes.TEXT, allowNull: false },
        unitCostMinor: { type: DataTypes.INTEGER, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        supplier: { type: DataTypes.TEXT, allowNull: true },
        archived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'BladeSpec', tableName: 'blade_specs' },
    );
  }
}
