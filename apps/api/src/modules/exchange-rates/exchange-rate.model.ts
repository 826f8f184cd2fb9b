import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** Units of the reporting currency one unit of `currency` bought in `month` (stored as its first day). */
export class ExchangeRate extends Model<InferAttributes<ExchangeRate>, InferCreationAttributes<ExchangeRate>> {
  declare id: CreationOptional<string>;
  /** `YYYY-MM-01` (DATEONLY). */
  declare month: string;
  declare currency: string;
  declare reportingCurrency: string;
  /** NUMERIC(24,12): pg returns it as text, so it is read with `Number()`. */
  declare rate: string | number;
  declare setById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ExchangeRate.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        month: { type: DataTypes.DATEONLY, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        reportingCurrency: { type: DataTypes.CHAR(3), allowNull: false },
        rate: { type: DataTypes.DECIMAL(24, 12), allowNull: false },
        setById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'ExchangeRate', tableName: 'exchange_rates' },
    );
  }
}

/** The one row naming the reporting currency. */
export class ReportingCurrency extends Model<
  InferAttributes<ReportingCurrency>,
  InferCreationAttributes<ReportingCurrency>
> {
  declare id: CreationOptional<boolean>;
  declare currency: string;
  declare setById: string | null;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ReportingCurrency.init(
      {
        id: { type: DataTypes.BOOLEAN, primaryKey: true, defaultValue: true },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        setById: { type: DataTypes.UUID, allowNull: true },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'ReportingCurrency', tableName: 'reporting_currency', createdAt: false },
    );
  }
}
