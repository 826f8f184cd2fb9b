import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { FollowUpEntryKind, FollowUpFlag, FollowUpState } from '@kerfline/domain/follow-ups/schema';

/** Work a lead asks a site to do about one saw; its history is in `FollowUpEntry`. */
export class FollowUp extends Model<InferAttributes<FollowUp>, InferCreationAttributes<FollowUp>> {
  declare id: CreationOptional<string>;
  declare siteId: string;
  declare sawId: string;
  declare title: string;
  declare flag: FollowUpFlag | null;
  declare assigneeId: string;
  /** `YYYY-MM-DD` (DATEONLY), read in the site's time zone. */
  declare dueOn: string;
  declare state: CreationOptional<FollowUpState>;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare doneAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize): void {
    FollowUp.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        siteId: { type: DataTypes.UUID, allowNull: false },
        sawId: { type: DataTypes.UUID, allowNull: false },
        title: { type: DataTypes.TEXT, allowNull: false },
        flag: { type: DataTypes.JSONB, allowNull: true },
        assigneeId: { type: DataTypes.UUID, allowNull: false },
        dueOn: { type: DataTypes.DATEONLY, allowNull: false },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
        createdById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        doneAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, modelName: 'FollowUp', tableName: 'follow_ups' },
    );
  }
}

/** One line of a follow-up's history. */
export class FollowUpEntry extends Model<InferAttributes<FollowUpEntry>, InferCreationAttributes<FollowUpEntry>> {
  declare id: CreationOptional<string>;
  declare followUpId: string;
  declare siteId: string;
  declare kind: FollowUpEntryKind;
  declare text: string;
  declare byId: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    FollowUpEntry.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        followUpId: { type: DataTypes.UUID, allowNull: false },
        siteId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        byId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'FollowUpEntry', tableName: 'follow_up_entries', updatedAt: false },
    );
  }
}
