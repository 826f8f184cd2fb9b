import { Umzug, SequelizeStorage } from 'umzug';
import type { Sequelize, QueryInterface } from 'sequelize';
import { migrations } from './migrations/index.js';

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize };

/**
 * Migrations are listed in code (migrations/index.ts) rather than globbed: umzug then never loads files
 * itself, and a migration keeps the same name (no extension) whether it runs from TypeScript or compiled JS.
 */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: () => m.up({ queryInterface: sequelize.getQueryInterface(), sequelize }),
      down: () => m.down({ queryInterface: sequelize.getQueryInterface(), sequelize }),
    })),
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}
