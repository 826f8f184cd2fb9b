import { createSequelize } from '../db/sequelize.js';
import { createMigrator } from '../db/umzug.js';
import { testDatabaseUrl } from './test-database-url.js';

// Imports nothing from packages/domain: vitest loads global setups without the 'source' condition.

/** Rebuilds the test database's schema from the migrations once per run, so tests see what production sees. */
export default async function setup(): Promise<void> {
  const sequelize = createSequelize(testDatabaseUrl());
  try {
    await sequelize.query('DROP SCHEMA IF EXISTS pgboss CASCADE; DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
    await createMigrator(sequelize).up();
  } finally {
    await sequelize.close();
  }
}
