import pg from 'pg';
import type { Sequelize } from 'sequelize';
import supertest from 'supertest';
import type { Express } from 'express';
import { createApp } from '../app.js';
import { testDatabaseUrl } from './test-database-url.js';
import { createSequelize } from '../db/sequelize.js';
import { Jobs, type JobsOptions } from '../jobs/jobs.js';
import type { AttemptLimitSettings } from '../security/attempt-limits.js';
import type { PhotoStorage } from '../modules/photos/photo-storage.js';

export { testDatabaseUrl };

export type TestContext = {
  sequelize: Sequelize;
  pool: pg.Pool;
  app: Express;
  jobs: Jobs;
  /** Resolves once the job workers run (at once when the app was started without them). */
  ready: Promise<void>;
  close: () => Promise<void>;
};

export const TEST_PUBLIC_URL = 'http://kerfline.test';
export const TEST_SESSION_SECRET = 'test-secret-not-for-production';

/** The job runtime's settings for tests: fast polling, short retry waits, mail to `smtpPort` on loopback. */
export function testJobsOptions(
  url: string,
  mail: { smtpPort?: number; retryLimit?: number; retryDelaySeconds?: number; cron?: string } = {},
): JobsOptions {
  return {
    connectionString: url,
    secret: TEST_SESSION_SECRET,
    publicUrl: TEST_PUBLIC_URL,
    // Nothing listens on port 9 (discard) here: mail queued by a test without a catcher is never delivered.
    smtp: { host: '127.0.0.1', port: mail.smtpPort ?? 9, secure: false, from: 'Kerfline <kerfline@test.example>' },
    retryLimit: mail.retryLimit ?? 2,
    retryDelaySeconds: mail.retryDelaySeconds ?? 1,
    schedule: { weeklyDigestCron: mail.cron ?? '0 6 * * 1', monthlySummaryCron: '0 6 1 * *', timeZone: 'UTC' },
    pollingIntervalSeconds: 0.5,
    cronMonitorIntervalSeconds: 1,
    cronWorkerIntervalSeconds: 1,
  };
}

/**
 * A fresh app on the test database. Call `close` in afterAll. With `mail.workers`, the app's process also
 * runs the job workers and sends to the local catcher on `mail.smtpPort` (await `ready` first).
 */
export function startTestApp(
  options: {
    /** Attempt limits; failed sign-ins per address are 1000 unless given (every test signs in from 127.0.0.1). */
    attemptLimits?: Partial<AttemptLimitSettings>;
    sessionIdleMs?: number;
    sessionMaxMs?: number;
    publicUrl?: string;
    trustProxy?: boolean;
    webDist?: string;
    photoStorage?: PhotoStorage;
    importLimits?: { maxBytes: number; maxRows: number };
    mail?: { smtpPort?: number; workers?: boolean; catcherDir?: string; retryLimit?: number; cron?: string };
  } = {},
): TestContext {
  const url = testDatabaseUrl();
  const sequelize = createSequelize(url, { poolMax: 5 });
  const pool = new pg.Pool({ connectionString: url, max: 3 });
  const workers = options.mail?.workers ?? false;
  const jobs = new Jobs(sequelize, testJobsOptions(url, options.mail), { workers });
  const app = createApp({
    sequelize,
    sessionPool: pool,
    sessionSecret: TEST_SESSION_SECRET,
    attemptLimits: { signInPerAddress: 1000, ...options.attemptLimits },
    sessionIdleMs: options.sessionIdleMs,
    sessionMaxMs: options.sessionMaxMs,
    publicUrl: options.publicUrl,
    trustProxy: options.trustProxy,
    webDist: options.webDist,
    photoStorage: options.photoStorage,
    logLevel: 'silent',
    jobs,
    mailCatcherDir: options.mail?.catcherDir,
    ...(options.importLimits ? { importLimits: options.importLimits } : {}),
  });
  const ready = workers ? jobs.startWorkers() : Promise.resolve();
  return {
    sequelize,
    pool,
    app,
    jobs,
    ready,
    close: async () => {
      await ready.catch(() => undefined);
      await jobs.stop();
      await sequelize.close();
      await pool.end();
    },
  };
}

/** The tables every test starts without rows; with them goes every table that refers to them (the summaries). */
const EMPTIED = [
  'removed_photo_blobs',
  'removed_records',
  'follow_up_entries',
  'follow_ups',
  'budgets',
  'exchange_rates',
  'reporting_currency',
  'import_rejects',
  'import_mappings',
  'import_batches',
  'photo_blobs',
  'photos',
  'check_records',
  'site_checks',
  'cut_logs',
  'stops',
  'blade_runs',
  'stock_levels',
  'stock_receipts',
  'blade_specs',
  'site_settings',
  'mail_preferences',
  'mail_log',
  'password_resets',
  'invitations',
  'audit_entries',
  'saws',
  'user_sites',
  'users',
  'sites',
  'regions',
  'sessions',
  'rate_limit_hits',
];

/**
 * Empties every table (keeps the schema and the migration record), as TRUNCATE … RESTART IDENTITY CASCADE would,
 * but with DELETE. TRUNCATE gives each table and index new files, and the suite empties some 160 of them for every
 * test: the cluster's next checkpoint then has tens of thousands of files to sync, and whatever waits for a
 * checkpoint (stopping the cluster, DROP DATABASE, a base backup) waited minutes on a loaded machine. The rows are
 * few, so DELETE is as quick; triggers and foreign-key checks are skipped (replica role), since every table that
 * refers to another is emptied with it. The tables are locked first, as TRUNCATE locks them, so a background writer
 * of the last test cannot commit a row behind the DELETE (seen once: a digest queued for a person no longer there).
 * One statement (its own transaction: a failure leaves nothing half emptied, and no transaction open on the
 * pooled connection), one round trip.
 */
export async function resetData(sequelize: Sequelize): Promise<void> {
  const named = EMPTIED.map((t) => `'${t}'`).join(', ');
  await sequelize.query(`
    DO $$
    DECLARE
      tables regclass[];
      t regclass;
    BEGIN
      -- For this statement's transaction only: no triggers, no foreign-key checks.
      PERFORM set_config('session_replication_role', 'replica', true);
      WITH RECURSIVE emptied(oid) AS (
        SELECT unnest(ARRAY[${named}]::regclass[])::oid
        UNION
        SELECT c.conrelid FROM pg_constraint c JOIN emptied e ON c.confrelid = e.oid WHERE c.contype = 'f'
      )
      SELECT array_agg(oid::regclass) INTO tables FROM emptied;
      -- As TRUNCATE does: a writer still at work (a job worker of the last test) finishes first and is emptied too,
      -- and one that starts now waits. DELETE alone would let a row it commits later outlive the reset.
      EXECUTE format('LOCK TABLE %s IN ACCESS EXCLUSIVE MODE', array_to_string(tables::text[], ', '));
      FOREACH t IN ARRAY tables LOOP
        EXECUTE format('DELETE FROM %s', t);
      END LOOP;
      -- RESTART IDENTITY: the sequences the emptied tables own.
      FOR t IN
        SELECT DISTINCT d.objid::regclass FROM pg_depend d JOIN pg_class s ON s.oid = d.objid
         WHERE s.relkind = 'S' AND d.deptype IN ('a', 'i') AND d.refobjid = ANY(tables)
      LOOP
        EXECUTE format('ALTER SEQUENCE %s RESTART', t);
      END LOOP;
    END $$`);
}

/** A supertest agent that keeps cookies, signed in as `email`. */
export async function signedInAgent(app: Express, email: string, password: string): Promise<supertest.Agent> {
  const agent = supertest.agent(app);
  const res = await agent.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}
