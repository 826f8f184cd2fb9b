import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { StopCategory } from '@kerfline/domain/stops/schema';

/** A time a saw was not cutting; `endedAt` null while it lasts (the saw is down). */
export class Stop extends Model<InferAttributes<Stop>, InferCreationAttributes<Stop>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare sawId: string;
  declare startedAt: Date;
  declare endedAt: Date | null;
  declare category: StopCategory;
  declare planned: boolean;
  declare notes: string | null;
  declare createdById: string | null;
  declare endedById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Stop.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: false },
        startedAt: { type: DataTypes.DATE, allowNull: false },
        endedAt: { type: DataTypes.DATE, allowNull: true },
        category: { type: DataTypes.TEXT, allowNull: false },
        planned: { type: DataTypes.BOOLEAN, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdById: { type: DataTypes.UUID, allowNull: true },
        endedById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Stop', tableName: 'stops' },
    );
  }
}
