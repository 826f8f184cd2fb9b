import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { UnitSystem } from '@kerfline/domain/sites/schema';

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<string>;
  declare regionId: string;
  declare code: string;
  declare name: string;
  declare city: string | null;
  declare timeZone: string;
  declare currency: string;
  declare unitSystem: UnitSystem;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Site.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        regionId: { type: DataTypes.UUID, allowNull: false },
        code: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        city: { type: DataTypes.TEXT, allowNull: true },
        timeZone: { type: DataTypes.TEXT, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        unitSystem: { type: DataTypes.TEXT, allowNull: false },
        retiredAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Site', tableName: 'sites' },
    );
  }
}
