import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';

/** Applies pending migrations; prints each one it runs. */
const sequelize = createSequelize(databaseUrl(loadEnv({ SESSION_SECRET: 'not-used-by-migrations', ...process.env })));
try {
  const applied = await createMigrator(sequelize).up();
  console.log(applied.length ? `applied: ${applied.map((m) => m.name).join(', ')}` : 'database schema is up to date');
} finally {
  await sequelize.close();
}
