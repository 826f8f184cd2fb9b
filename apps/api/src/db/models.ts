import type { Sequelize } from 'sequelize';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';

/** Binds every model to this Sequelize instance. Model names equal the CASL subject names. */
export function initModels(sequelize: Sequelize): void {
  Region.initModel(sequelize);
  Site.initModel(sequelize);
  User.initModel(sequelize);
  UserSite.initModel(sequelize);
  Saw.initModel(sequelize);
}
