import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { createApp } from './app.js';
import { databaseUrl, loadEnv } from './config/env.js';
import { createSequelize } from './db/sequelize.js';

const env = loadEnv();
const url = databaseUrl(env);
const sequelize = createSequelize(url);
const sessionPool = new pg.Pool({ connectionString: url, max: 5 });
const here = path.dirname(fileURLToPath(import.meta.url));

const app = createApp({
  sequelize,
  sessionPool,
  sessionSecret: env.SESSION_SECRET,
  trustProxy: env.TRUST_PROXY,
  webDist: env.WEB_DIST ?? path.resolve(here, '../../../dist/web'),
  signInLimit: env.SIGN_IN_LIMIT,
  logLevel: env.LOG_LEVEL,
});

const server = app.listen(env.PORT, env.HOST, () => {
  console.log(`Kerfline is listening on http://${env.HOST}:${env.PORT}`);
});

async function shutdown(signal: string) {
  console.log(`${signal}: closing`);
  server.close();
  await Promise.allSettled([sequelize.close(), sessionPool.end()]);
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
