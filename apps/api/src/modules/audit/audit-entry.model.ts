import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { AuditAction, AuditValues } from '@kerfline/domain/audit/schema';

/** One change to a record; rows are only ever inserted (see the migration). */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<string>;
  declare at: CreationOptional<Date>;
  declare actorId: string | null;
  declare siteId: string | null;
  declare entity: string;
  declare entityId: string;
  declare action: AuditAction;
  declare before: AuditValues | null;
  declare after: AuditValues | null;

  static initModel(sequelize: Sequelize): void {
    AuditEntry.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        actorId: { type: DataTypes.UUID, allowNull: true },
        siteId: { type: DataTypes.UUID, allowNull: true },
        entity: { type: DataTypes.TEXT, allowNull: false },
        entityId: { type: DataTypes.TEXT, allowNull: false },
        action: { type: DataTypes.TEXT, allowNull: false },
        before: { type: DataTypes.JSONB, allowNull: true },
        after: { type: DataTypes.JSONB, allowNull: true },
      },
      { sequelize, modelName: 'AuditEntry', tableName: 'audit_entries', timestamps: false },
    );
  }
}
