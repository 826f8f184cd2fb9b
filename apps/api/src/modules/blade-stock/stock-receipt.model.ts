import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** Blades of one spec received into a site's stock; cost per blade in minor units of `currency`. */
export class StockReceipt extends Model<InferAttributes<StockReceipt>, InferCreationAttributes<StockReceipt>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare bladeSpecId: string;
  declare quantity: number;
  declare unitCostMinor: number;
  declare currency: string;
  /** A calendar date, `YYYY-MM-DD`. */
  declare receivedOn: string;
  declare reference: string | null;
  declare notes: string | null;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    StockReceipt.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        bladeSpecId: { type: DataTypes.UUID, allowNull: false },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        unitCostMinor: { type: DataTypes.INTEGER, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        receivedOn: { type: DataTypes.DATEONLY, allowNull: false },
        reference: { type: DataTypes.TEXT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'StockReceipt', tableName: 'stock_receipts' },
    );
  }
}

/** Reorder settings of one spec at one site. */
export class StockLevel extends Model<InferAttributes<StockLevel>, InferCreationAttributes<StockLevel>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare bladeSpecId: string;
  declare leadTimeDays: number;
  declare safetyStock: number;
  declare updatedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    StockLevel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        bladeSpecId: { type: DataTypes.UUID, allowNull: false },
        leadTimeDays: { type: DataTypes.INTEGER, allowNull: false },
        safetyStock: { type: DataTypes.INTEGER, allowNull: false },
        updatedById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'StockLevel', tableName: 'stock_levels' },
    );
  }
}
