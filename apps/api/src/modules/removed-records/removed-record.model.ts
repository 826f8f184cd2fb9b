import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { RemovableSubject } from '@kerfline/domain/removed-records/schema';

/** The ids of live records that lost their link to a removed run, linked again when it is put back. */
export type Relinks = { cutLogIds?: string[]; checkRecordIds?: string[] };

/**
 * A record removed from the live tables to correct a mistaken entry, kept whole (its row as `to_jsonb` wrote it,
 * the photos removed with it) with who removed it, when and why, until it is put back.
 */
export class RemovedRecord extends Model<InferAttributes<RemovedRecord>, InferCreationAttributes<RemovedRecord>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare subject: RemovableSubject;
  declare recordId: string;
  declare sawId: string | null;
  declare occurredAt: Date;
  declare keptRow: Record<string, unknown>;
  declare keptPhotos: CreationOptional<Record<string, unknown>[]>;
  declare relinks: CreationOptional<Relinks>;
  declare reason: string;
  declare removedById: string | null;
  declare removedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    RemovedRecord.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        subject: { type: DataTypes.TEXT, allowNull: false },
        recordId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: true },
        occurredAt: { type: DataTypes.DATE, allowNull: false },
        keptRow: { type: DataTypes.JSONB, allowNull: false },
        keptPhotos: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        relinks: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        reason: { type: DataTypes.TEXT, allowNull: false },
        removedById: { type: DataTypes.UUID, allowNull: true },
        removedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, modelName: 'RemovedRecord', tableName: 'removed_records', timestamps: false },
    );
  }
}
