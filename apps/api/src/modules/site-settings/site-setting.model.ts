import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A site's own value of one setting (see the registry in the domain); no row means the shipped value. */
export class SiteSetting extends Model<InferAttributes<SiteSetting>, InferCreationAttributes<SiteSetting>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare key: string;
  /** The setting's numbers, in the units their names say. */
  declare value: Record<string, unknown>;
  declare changedBy: string;
  declare changedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    SiteSetting.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        key: { type: DataTypes.TEXT, allowNull: false },
        value: { type: DataTypes.JSONB, allowNull: false },
        changedBy: { type: DataTypes.UUID, allowNull: false },
        changedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, modelName: 'SiteSetting', tableName: 'site_settings', timestamps: false },
    );
  }
}
