import pg from 'pg';
import type { Sequelize } from 'sequelize';
import supertest from 'supertest';
import type { Express } from 'express';
import { createApp } from '../app.js';
import { testDatabaseUrl } from './test-database-url.js';
import { createSequelize } from '../db/sequelize.js';

export { testDatabaseUrl };

export type TestContext = { sequelize: Sequelize; pool: pg.Pool; app: Express; close: () => Promise<void> };

/** A fresh app on the test database. Call `close` in afterAll. */
export function startTestApp(options: { signInLimit?: number } = {}): TestContext {
  const url = testDatabaseUrl();
  const sequelize = createSequelize(url, { poolMax: 5 });
  const pool = new pg.Pool({ connectionString: url, max: 3 });
  const app = createApp({
    sequelize,
    sessionPool: pool,
    sessionSecret: 'test-secret-not-for-production',
    signInLimit: options.signInLimit ?? 1000,
    logLevel: 'silent',
  });
  return {
    sequelize,
    pool,
    app,
    close: async () => {
      await sequelize.close();
      await pool.end();
    },
  };
}

/** Empties every table (keeps the schema and the migration record). */
export async function resetData(sequelize: Sequelize): Promise<void> {
  await sequelize.query(
    `TRUNCATE photo_blobs, photos, cut_logs, stops, blade_runs, stock_levels, stock_receipts, blade_specs,
       audit_entries, saws, user_sites, users, sites, regions, sessions, rate_limit_hits RESTART IDENTITY CASCADE`,
  );
}

/** A supertest agent that keeps cookies, signed in as `email`. */
export async function signedInAgent(app: Express, email: string, password: string): Promise<supertest.Agent> {
  const agent = supertest.agent(app);
  const res = await agent.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}
