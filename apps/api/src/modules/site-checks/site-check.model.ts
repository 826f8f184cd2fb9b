import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { CheckQuantity, CheckScheduleName, CheckTargetRule } from '@kerfline/domain/site-checks/schema';

/**
 * One check on a site's list. Fixed targets in the quantity's SI unit (mm, N, MPa); rule targets read the site's
 * settings and keep no numbers here.
 */
export class SiteCheck extends Model<InferAttributes<SiteCheck>, InferCreationAttributes<SiteCheck>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare name: string;
  declare measures: string | null;
  declare quantity: CheckQuantity;
  declare targetRule: CheckTargetRule;
  declare fixedTarget: number | null;
  declare fixedMin: number | null;
  declare fixedMax: number | null;
  declare schedule: CheckScheduleName;
  declare intervalDays: number | null;
  declare graceHours: number;
  declare position: number;
  declare retiredAt: CreationOptional<Date | null>;
  declare updatedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const nullable = (type: DataTypes.DataType) => ({ type, allowNull: true });
    SiteCheck.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        measures: nullable(DataTypes.TEXT),
        quantity: { type: DataTypes.TEXT, allowNull: false },
        targetRule: { type: DataTypes.TEXT, allowNull: false },
        fixedTarget: nullable(DataTypes.DOUBLE),
        fixedMin: nullable(DataTypes.DOUBLE),
        fixedMax: nullable(DataTypes.DOUBLE),
        schedule: { type: DataTypes.TEXT, allowNull: false },
        intervalDays: nullable(DataTypes.INTEGER),
        graceHours: { type: DataTypes.DOUBLE, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        retiredAt: nullable(DataTypes.DATE),
        updatedById: nullable(DataTypes.UUID),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'SiteCheck', tableName: 'site_checks' },
    );
  }
}
