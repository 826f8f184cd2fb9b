import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Role } from '@kerfline/domain/users/schema';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare siteId: string | null;
  declare regionId: string | null;
  declare allSites: CreationOptional<boolean>;
  declare active: CreationOptional<boolean>;
  declare passwordChangedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        passwordHash: { type: DataTypes.TEXT, allowNull: false },
        siteId: { type: DataTypes.UUID, allowNull: true },
        regionId: { type: DataTypes.UUID, allowNull: true },
        allSites: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        passwordChangedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: 'User', tableName: 'users' },
    );
  }
}

/** A manager's assigned site. */
export class UserSite extends Model<InferAttributes<UserSite>, InferCreationAttributes<UserSite>> {
  declare userId: string;
  declare siteId: string;

  static initModel(sequelize: Sequelize): void {
    UserSite.init(
      {
        userId: { type: DataTypes.UUID, primaryKey: true },
        siteId: { type: DataTypes.UUID, primaryKey: true },
      },
      { sequelize, modelName: 'UserSite', tableName: 'user_sites', timestamps: false },
    );
  }
}
