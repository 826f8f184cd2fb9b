import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import type { CheckAnswers, CheckQuantity, CheckTargetRule } from '@kerfline/domain/site-checks/schema';

/**
 * A check recorded on a saw: the reading (SI: mm, N, MPa) or a condition's answers, and the target, limits, basis
 * and verdict the server worked out with the domain at the time.
 */
export class CheckRecord extends Model<InferAttributes<CheckRecord>, InferCreationAttributes<CheckRecord>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare sawId: string;
  declare siteCheckId: string;
  declare bladeRunId: string | null;
  declare checkedAt: Date;
  declare checkedById: string | null;
  declare targetRule: CheckTargetRule;
  declare quantity: CheckQuantity;
  declare reading: number | null;
  declare answers: CheckAnswers | null;
  declare target: number | null;
  declare minValue: number | null;
  declare maxValue: number | null;
  declare passed: boolean;
  declare basis: FigureBasis | null;
  declare explanation: string;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const nullable = (type: DataTypes.DataType) => ({ type, allowNull: true });
    CheckRecord.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: false },
        siteCheckId: { type: DataTypes.UUID, allowNull: false },
        bladeRunId: nullable(DataTypes.UUID),
        checkedAt: { type: DataTypes.DATE, allowNull: false },
        checkedById: nullable(DataTypes.UUID),
        targetRule: { type: DataTypes.TEXT, allowNull: false },
        quantity: { type: DataTypes.TEXT, allowNull: false },
        reading: nullable(DataTypes.DOUBLE),
        answers: nullable(DataTypes.JSONB),
        target: nullable(DataTypes.DOUBLE),
        minValue: nullable(DataTypes.DOUBLE),
        maxValue: nullable(DataTypes.DOUBLE),
        passed: { type: DataTypes.BOOLEAN, allowNull: false },
        basis: nullable(DataTypes.JSONB),
        explanation: { type: DataTypes.TEXT, allowNull: false },
        notes: nullable(DataTypes.TEXT),
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'CheckRecord', tableName: 'check_records', updatedAt: false },
    );
  }
}
