import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A site's blade budget for one month, integer minor units of `currency` (the site's when it was set). */
export class Budget extends Model<InferAttributes<Budget>, InferCreationAttributes<Budget>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  /** `YYYY-MM-01` (DATEONLY). */
  declare month: string;
  declare amountMinor: number;
  declare currency: string;
  declare setById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Budget.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        month: { type: DataTypes.DATEONLY, allowNull: false },
        amountMinor: { type: DataTypes.BIGINT, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        setById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Budget', tableName: 'budgets' },
    );
  }
}
