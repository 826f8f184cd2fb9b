import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { StockShape } from '@kerfline/domain/stock-area/schema';
import type { RecordWarning } from '@kerfline/domain/records/schema';

/** What a saw cut: shape in mm, band speed in m/min, feed in mm/min, cut time in s, areas in mm². */
export class CutLog extends Model<InferAttributes<CutLog>, InferCreationAttributes<CutLog>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare sawId: string;
  declare bladeRunId: string | null;
  declare cutAt: Date;
  declare shape: StockShape;
  declare pieceCount: number;
  declare piecesAcross: number;
  declare materialGroup: MaterialGroup;
  declare quantity: number;
  declare bandSpeedMPerMin: number | null;
  declare feedMmPerMin: number | null;
  declare cutTimeS: number | null;
  declare areaPerCutMm2: number;
  declare areaCutMm2: number;
  declare teethInWorkMin: number | null;
  declare teethInWorkMax: number | null;
  declare warnings: RecordWarning[];
  declare notes: string | null;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const double = (field: string, allowNull = true) => ({ type: DataTypes.DOUBLE, allowNull, field });
    CutLog.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: false },
        bladeRunId: { type: DataTypes.UUID, allowNull: true },
        cutAt: { type: DataTypes.DATE, allowNull: false },
        shape: { type: DataTypes.JSONB, allowNull: false },
        pieceCount: { type: DataTypes.INTEGER, allowNull: false },
        piecesAcross: { type: DataTypes.INTEGER, allowNull: false },
        materialGroup: { type: DataTypes.TEXT, allowNull: false },
        quantity: { type: DataTypes.INTEGER, allowNull: false },
        bandSpeedMPerMin: double('band_speed_m_per_min'),
        feedMmPerMin: double('feed_mm_per_min'),
        cutTimeS: double('cut_time_s'),
        areaPerCutMm2: double('area_per_cut_mm2', false),
        areaCutMm2: double('area_cut_mm2', false),
        teethInWorkMin: double('teeth_in_work_min'),
        teethInWorkMax: double('teeth_in_work_max'),
        warnings: { type: DataTypes.JSONB, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'CutLog', tableName: 'cut_logs', updatedAt: false },
    );
  }
}
