import { databaseUrl, loadEnv } from '../config/env.js';

/** The test database the scripts created (PGDATABASE=kerfline_test); never the demo database. */
export function testDatabaseUrl(): string {
  const env = loadEnv({
    SESSION_SECRET: 'test-secret-not-for-production',
    PGDATABASE: 'kerfline_test',
    ...process.env,
  });
  if (!env.PGDATABASE.endsWith('_test') && !env.DATABASE_URL) {
    throw new Error(`API tests refuse to run against '${env.PGDATABASE}': use a database whose name ends in _test`);
  }
  return databaseUrl(env);
}
