import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Role } from '@kerfline/domain/users/schema';

/** An invitation to set up an account. The link's secret is never stored, only its SHA-256 hash. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string | null;
  declare role: Role;
  declare siteId: string | null;
  declare regionId: string | null;
  declare managedSiteIds: CreationOptional<string[]>;
  declare allSites: CreationOptional<boolean>;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare invitedBy: string;
  declare sentCount: CreationOptional<number>;
  declare lastSentAt: CreationOptional<Date>;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedUserId: CreationOptional<string | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare revokedBy: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: true },
        role: { type: DataTypes.TEXT, allowNull: false },
        siteId: { type: DataTypes.UUID, allowNull: true },
        regionId: { type: DataTypes.UUID, allowNull: true },
        managedSiteIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
        allSites: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        invitedBy: { type: DataTypes.UUID, allowNull: false },
        sentCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        lastSentAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        acceptedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        acceptedUserId: { type: DataTypes.UUID, allowNull: true, defaultValue: null },
        revokedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        revokedBy: { type: DataTypes.UUID, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'Invitation', tableName: 'invitations' },
    );
  }
}
