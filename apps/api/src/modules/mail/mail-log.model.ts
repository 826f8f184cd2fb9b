import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { MailKind, MailStatus } from '@kerfline/domain/mail/schema';

/** One mail Kerfline sends (or decided not to): the record every worker claims and updates. */
export class MailLog extends Model<InferAttributes<MailLog>, InferCreationAttributes<MailLog>> {
  declare id: CreationOptional<string>;
  declare kind: MailKind;
  declare userId: string | null;
  declare invitationId: CreationOptional<string | null>;
  declare toAddress: string;
  declare dedupeKey: string;
  declare payload: CreationOptional<Record<string, unknown>>;
  declare subject: CreationOptional<string | null>;
  declare status: CreationOptional<MailStatus>;
  declare attempts: CreationOptional<number>;
  declare lastError: CreationOptional<string | null>;
  declare messageId: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MailLog.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.TEXT, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: true },
        invitationId: { type: DataTypes.UUID, allowNull: true, defaultValue: null },
        toAddress: { type: DataTypes.TEXT, allowNull: false },
        dedupeKey: { type: DataTypes.TEXT, allowNull: false },
        payload: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        subject: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lastError: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        messageId: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        sentAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'MailLog', tableName: 'mail_log' },
    );
  }
}

/** A person's choice for one optional kind of mail; no row means on. */
export class MailPreference extends Model<InferAttributes<MailPreference>, InferCreationAttributes<MailPreference>> {
  declare userId: string;
  declare kind: MailKind;
  declare enabled: boolean;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MailPreference.init(
      {
        userId: { type: DataTypes.UUID, primaryKey: true },
        kind: { type: DataTypes.TEXT, primaryKey: true },
        enabled: { type: DataTypes.BOOLEAN, allowNull: false },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'MailPreference', tableName: 'mail_preferences', createdAt: false },
    );
  }
}
