import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { initModels } from './models.js';
import { loadDemoScenario } from './demo-scenario.js';

/** Loads the demo scenario into an empty database; leaves a database with data untouched. */
const sequelize = createSequelize(databaseUrl(loadEnv({ SESSION_SECRET: 'not-used-by-the-seed', ...process.env })));
try {
  initModels(sequelize);
  const loaded = await loadDemoScenario(sequelize);
  console.log(loaded ? 'demo scenario loaded' : 'database already has data; demo scenario not loaded');
} finally {
  await sequelize.close();
}
