import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';

// Starts the built app (what start.sh runs) on its own database with the demo scenario, for the browser
// journeys. Imports nothing from the workspaces: vitest loads global setups without the 'source' condition.

const root = path.resolve(import.meta.dirname, '../..');
export const BROWSER_PORT = Number(process.env.BROWSER_TEST_PORT ?? 3210);
// One database per port, so two journeys on different ports never share data.
const database = BROWSER_PORT === 3210 ? 'kerfline_test_browser' : `kerfline_test_browser_${BROWSER_PORT}`;

let server: ChildProcess | undefined;
let catcher: ChildProcess | undefined;

/** The local mail catcher's folder: test.sh's, or one this setup starts beside the browser database. */
export const MAIL_DIR = process.env.MAIL_CATCHER_DIR ?? path.join(root, '.data', `mail-browser-${BROWSER_PORT}`);

async function recreateDatabase(): Promise<void> {
  const client = new pg.Client({
    host: process.env.PGHOST ?? '127.0.0.1',
    port: Number(process.env.PGPORT ?? 55432),
    user: process.env.PGUSER ?? 'postgres',
    database: 'postgres',
  });
  await client.connect();
  try {
    await client.query(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`);
    await client.query(`CREATE DATABASE ${database}`);
  } finally {
    await client.end();
  }
}

async function waitForHealth(url: string, seconds: number): Promise<void> {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the app did not answer ${url} within ${seconds} s`);
}

export default async function setup(): Promise<() => Promise<void>> {
  for (const built of ['apps/api/dist/server.js', 'apps/api/dist/mail/catcher-cli.js', 'dist/web/index.html']) {
    if (!existsSync(path.join(root, built)))
      throw new Error(`${built} is missing: run "npm run build" before the browser journeys`);
  }
  await recreateDatabase();
  // test.sh starts the mail catcher and says where it keeps mail; run alone, the journeys start their own.
  const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
  if (!process.env.MAIL_CATCHER_DIR) {
    rmSync(MAIL_DIR, { recursive: true, force: true });
    catcher = spawn(process.execPath, ['apps/api/dist/mail/catcher-cli.js'], {
      cwd: root,
      env: { ...process.env, SMTP_PORT: String(smtpPort), MAIL_CATCHER_DIR: MAIL_DIR },
      stdio: ['ignore', 'inherit', 'inherit'],
    });
  }
  const env = {
    ...process.env,
    PGDATABASE: database,
    PORT: String(BROWSER_PORT),
    SESSION_SECRET: 'browser-test-secret-only',
    LOG_LEVEL: 'warn',
    NODE_ENV: 'production',
    // Every journey signs in from 127.0.0.1; the limit itself is tested in the API tests.
    SIGN_IN_LIMIT: '1000',
    PUBLIC_URL: `http://127.0.0.1:${BROWSER_PORT}`,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtpPort),
    MAIL_CATCHER_DIR: MAIL_DIR,
    // Schedules stay at their defaults; the journeys send mail as people do, not on a timer.
  };
  for (const script of ['apps/api/dist/db/migrate-cli.js', 'apps/api/dist/db/seed-cli.js']) {
    const run = spawnSync(process.execPath, [script], { cwd: root, env, encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`${script} failed:\n${run.stdout}\n${run.stderr}`);
  }
  server = spawn(process.execPath, ['apps/api/dist/server.js'], {
    cwd: root,
    env,
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  await waitForHealth(`http://127.0.0.1:${BROWSER_PORT}/api/health`, 30);
  return async () => {
    server?.kill('SIGTERM');
    catcher?.kill('SIGTERM');
  };
}
