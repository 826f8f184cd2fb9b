import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { createApp } from './app.js';
import { closeGracefully, waitUntilIdle } from './http/close-gracefully.js';
import { attemptLimitsOf, databaseUrl, loadEnv, publicUrl, replicaUrl } from './config/env.js';
import { Jobs } from './jobs/jobs.js';
import { createSequelize, sequelizeBusy } from './db/sequelize.js';

const env = loadEnv();
const url = databaseUrl(env);
const replica = replicaUrl(env);
const sequelize = createSequelize(url, { replicaUrl: replica });
// A connection that cannot be made within 10 s fails (503) rather than holding the request.
const sessionPool = new pg.Pool({ connectionString: url, max: 5, connectionTimeoutMillis: 10_000 });
const here = path.dirname(fileURLToPath(import.meta.url));

const jobs = new Jobs(
  sequelize,
  {
    connectionString: url,
    secret: env.SESSION_SECRET,
    publicUrl: publicUrl(env),
    smtp: {
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      user: env.SMTP_USER,
      password: env.SMTP_PASSWORD,
      from: env.MAIL_FROM,
    },
    retryLimit: env.MAIL_RETRY_LIMIT,
    retryDelaySeconds: env.MAIL_RETRY_DELAY_SECONDS,
    ...(env.JOBS_CRON_CHECK_SECONDS
      ? {
          cronMonitorIntervalSeconds: env.JOBS_CRON_CHECK_SECONDS,
          cronWorkerIntervalSeconds: env.JOBS_CRON_CHECK_SECONDS,
        }
      : {}),
    schedule: {
      weeklyDigestCron: env.WEEKLY_DIGEST_CRON,
      monthlySummaryCron: env.MONTHLY_SUMMARY_CRON,
      timeZone: env.SCHEDULE_TIME_ZONE,
    },
    log: (level, message, detail) => console[level](`[jobs] ${message}`, detail ?? ''),
  },
  { workers: env.JOBS_WORKERS },
);

const app = createApp({
  sequelize,
  sessionPool,
  sessionSecret: env.SESSION_SECRET,
  trustProxy: env.TRUST_PROXY,
  webDist: env.WEB_DIST ?? path.resolve(here, '../../../dist/web'),
  attemptLimits: attemptLimitsOf(env),
  sessionIdleMs: env.SESSION_IDLE_HOURS * 60 * 60 * 1000,
  sessionMaxMs: env.SESSION_MAX_DAYS * 24 * 60 * 60 * 1000,
  publicUrl: publicUrl(env),
  importLimits: { maxBytes: env.IMPORT_MAX_BYTES, maxRows: env.IMPORT_MAX_ROWS },
  logLevel: env.LOG_LEVEL,
  jobs,
  mailCatcherDir: env.MAIL_CATCHER_DIR,
  ...(replica ? { readYourWritesMs: env.READ_YOUR_WRITES_SECONDS * 1000 } : {}),
});

if (env.JOBS_WORKERS) await jobs.startWorkers();
else await jobs.start();

const server = app.listen(env.PORT, env.HOST, () => {
  console.log(
    `Kerfline is listening on http://${env.HOST}:${env.PORT}${replica ? ' (reads on the replica ' + new URL(replica).host + ')' : ''}`,
  );
});

/** How long a stopping process waits for the requests in hand (as long as a request may wait for a connection). */
const SHUTDOWN_GRACE_MS = 10_000;

async function shutdown(signal: string) {
  console.log(`${signal}: closing`);
  // The requests in hand are answered and the workers finish the mail in hand before the database connections
  // close: a rolling restart behind the balancer answers no request with an error.
  const deadline = Date.now() + SHUTDOWN_GRACE_MS;
  const [drained] = await Promise.all([
    closeGracefully(server, SHUTDOWN_GRACE_MS),
    jobs.stop().catch((error: unknown) => console.error('[jobs] stop failed', error)),
  ]);
  if (drained === 'cut') console.log(`${signal}: requests still open after ${SHUTDOWN_GRACE_MS / 1000} s were cut`);
  // A request whose client left is no connection to wait for, but its handler may be between two statements.
  const sessionPoolBusy = () => sessionPool.totalCount > sessionPool.idleCount || sessionPool.waitingCount > 0;
  await waitUntilIdle(() => sequelizeBusy(sequelize) || sessionPoolBusy(), {
    settleMs: 200,
    maxMs: Math.max(0, deadline - Date.now()),
  });
  await Promise.allSettled([sequelize.close(), sessionPool.end()]);
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
