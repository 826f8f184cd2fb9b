/**
 * `npm run bench:floor`: what every signed-in request pays before its own work (the per-request floor).
 *
 * Starts the API in this process on `kerfline_floor_test` (any PGDATABASE ending in `_floor_test`; its schema is
 * migrated and its rows replaced by the small authorization world of the tests: 3 sites in 2 regions, 7 people),
 * signs in over real HTTP (keep-alive, as a browser), and times FLOOR_REPEATS (500) sequential requests of:
 *
 *   - `GET /api/health` unauthenticated (the framework's floor: helmet, guards, session cookie absent, one `SELECT 1`);
 *   - `GET /api/me` as a manager of two named sites (session read and touch, person, sites, ability, logging);
 *   - `GET /api/saws?siteId=…` as the same manager (a small list scoped in SQL);
 *   - `GET /api/saws?siteId=…` as a technician of that site.
 *
 * Beside each, the statements the request sent (captured from the pg driver on a separate request) replayed bare
 * on one connection the same number of times, and the endpoint's own statements alone (those `/api/me` does not
 * send). `--layers` also prints where a request's time goes: each middleware's time from being called to calling
 * `next` (the session store's read is in `session`, the person and their sites in `requireSignIn`), and each
 * statement's time as the app waits for it (the session touch, which the answer waits for, among them).
 *
 * The request log runs at `info` (FLOOR_LOG_LEVEL) into /dev/null, as in production but without a terminal's cost. Figures are
 * printed, never asserted; the load average is printed beside them (the machine is shared).
 */
import { loadavg, cpus } from 'node:os';
import { performance } from 'node:perf_hooks';
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import { pino } from 'pino';
import type { Express, NextFunction, Request, Response } from 'express';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';
import { createApp } from '../app.js';
import { Jobs } from '../jobs/jobs.js';
import { buildWorld, PASSWORD } from '../test-support/fixtures.js';

const REPEATS = Number(process.env.FLOOR_REPEATS ?? 500);
const WARMUP = 50;
const showLayers = process.argv.includes('--layers');
const env = loadEnv({
  SESSION_SECRET: 'floor-benchmark-not-a-real-secret',
  ...process.env,
  PGDATABASE: process.env.PGDATABASE?.endsWith('_floor_test') ? process.env.PGDATABASE : 'kerfline_floor_test',
});
const url = databaseUrl(env);

type Stats = { median: number; p95: number };
const round = (n: number) => Math.round(n * 100) / 100;
const stats = (samples: number[]): Stats => {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]!;
  return { median: round(at(0.5)), p95: round(at(0.95)) };
};
// --layers: where a request's time goes, summed over the timed requests.
const layerTotals = new Map<string, number>();
let layerRequests = 0;
let timing = false;
const load = () => loadavg().map((l) => Math.round(l * 10) / 10);

// ---------------------------------------------------------------------------------------------------------------
// The database: migrated, then the tests' small world.
const sequelize = createSequelize(url, { poolMax: 10 });
await createMigrator(sequelize).up();
const world = await buildWorld(sequelize);

// Every statement the pg driver sends while `capturing` is set, except the replaying connection's own.
type Statement = { text: string; values?: unknown[] };
const bare = new pg.Client({ connectionString: url });
await bare.connect();
let capturing: Statement[] | null = null;
const originalQuery = pg.Client.prototype.query as (...a: unknown[]) => unknown;
pg.Client.prototype.query = function (this: pg.Client, ...a: unknown[]) {
  if (capturing && this !== bare) {
    const [first, second] = a as [string | { text: string; values?: unknown[] }, unknown];
    if (typeof first === 'string') capturing.push({ text: first, values: Array.isArray(second) ? second : undefined });
    else if (first && typeof first === 'object' && 'text' in first)
      capturing.push({ text: first.text, values: first.values });
  }
  if (!timing || this === bare) return originalQuery.apply(this, a);
  const t = performance.now();
  const first = a[0] as string | { text: string };
  const name = `SQL ${(typeof first === 'string' ? first : first.text).replace(/\s+/g, ' ').trim().slice(0, 60)}`;
  const done = () => layerTotals.set(name, (layerTotals.get(name) ?? 0) + performance.now() - t);
  const last = a.at(-1);
  if (typeof last === 'function') {
    a[a.length - 1] = (...r: unknown[]) => {
      done();
      return (last as (...x: unknown[]) => unknown)(...r);
    };
    return originalQuery.apply(this, a);
  }
  const result = originalQuery.apply(this, a);
  if (result instanceof Promise) void result.then(done, () => undefined);
  return result;
} as typeof pg.Client.prototype.query;

const sessionPool = new pg.Pool({ connectionString: url, max: 10 });
const app = createApp({
  sequelize,
  sessionPool,
  sessionSecret: env.SESSION_SECRET,
  // Never started: no request measured here queues a job.
  jobs: new Jobs(sequelize, {
    connectionString: url,
    secret: env.SESSION_SECRET,
    publicUrl: 'http://127.0.0.1',
    smtp: { host: '127.0.0.1', port: 9, secure: false, from: 'bench@localhost' },
    retryLimit: 0,
    retryDelaySeconds: 60,
    schedule: { weeklyDigestCron: '0 6 * * 1', monthlySummaryCron: '0 6 1 * *', timeZone: 'UTC' },
  }),
  // FLOOR_LOG_LEVEL=silent measures the request log's own share.
  logLevel: process.env.FLOOR_LOG_LEVEL ?? 'info',
  logDestination: pino.destination({ dest: '/dev/null', sync: false }),
});

// --layers: each middleware's time from being called to calling next, summed over the timed requests.
function instrument(stack: Array<{ name: string; handle: (...a: unknown[]) => unknown }>, prefix: string) {
  for (const layer of stack) {
    const handle = layer.handle as ((...a: unknown[]) => unknown) & { stack?: typeof stack };
    if (handle.length > 3) continue;
    if (Array.isArray(handle.stack)) {
      instrument(handle.stack, `${prefix}${layer.name}/`);
      continue;
    }
    const name = `${prefix}${layer.name || 'anonymous'}`;
    const timed = function (this: unknown, req: Request, res: Response, next: NextFunction) {
      const t = performance.now();
      return handle.call(this, req, res, (err?: unknown) => {
        if (timing) layerTotals.set(name, (layerTotals.get(name) ?? 0) + performance.now() - t);
        next(err);
      });
    };
    layer.handle = timed as (...a: unknown[]) => unknown;
  }
}
if (showLayers) {
  instrument((app as Express & { router: { stack: never[] } }).router.stack, '');
}

const server = app.listen(0, '127.0.0.1');
await new Promise((r) => server.once('listening', r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

async function signIn(email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
const manager = await signIn(world.users.managerAC.email);
const technician = await signIn(world.users.techA.email);
const siteA = world.sites.A.id;

async function request(path: string, cookie: string | null): Promise<number> {
  const t = performance.now();
  const res = await fetch(`${base}${path}`, cookie ? { headers: { cookie } } : {});
  await res.arrayBuffer();
  if (!res.ok) throw new Error(`${path} answered ${res.status}`);
  return performance.now() - t;
}

async function capture(path: string, cookie: string | null): Promise<Statement[]> {
  capturing = [];
  await request(path, cookie);
  // A store write that finishes after the answer still belongs to this request.
  await new Promise((r) => setTimeout(r, 50));
  const got = capturing;
  capturing = null;
  return got;
}

async function replay(statements: Statement[]): Promise<Stats> {
  const times: number[] = [];
  for (let i = 0; i < REPEATS + WARMUP; i += 1) {
    const t = performance.now();
    for (const s of statements) await bare.query(s.text, s.values as unknown[] | undefined);
    if (i >= WARMUP) times.push(performance.now() - t);
  }
  return stats(times);
}

const key = (s: Statement) =>
  s.text
    .replace(/\s+/g, ' ')
    .replace(/to_timestamp\(\d+\)/g, 'to_timestamp(?)')
    .trim();
// A process's first session read is the library's own (it starts the pruning timer): not the one to measure.
for (const cookie of [manager, technician]) await request('/api/me', cookie);
const floorOf = new Map<string, Set<string>>();
for (const cookie of [manager, technician]) floorOf.set(cookie, new Set((await capture('/api/me', cookie)).map(key)));

const cases: Array<{ name: string; path: string; cookie: string | null }> = [
  { name: 'health, not signed in', path: '/api/health', cookie: null },
  { name: 'me (manager of 2 sites)', path: '/api/me', cookie: manager },
  { name: 'saws of one site (manager)', path: `/api/saws?siteId=${siteA}`, cookie: manager },
  { name: 'saws of one site (technician)', path: `/api/saws?siteId=${siteA}`, cookie: technician },
];

console.log(
  `\nKerfline per-request floor on ${env.PGDATABASE} — ${cpus()[0]?.model} × ${cpus().length}, Node ${process.version}, ` +
    `n = ${REPEATS} sequential requests after ${WARMUP} warm-ups, load average ${load().join(' / ')}\n`,
);
console.log(
  `${'request'.padEnd(32)} ${'HTTP median / p95 ms'.padStart(21)} ${'all its SQL bare'.padStart(17)} ` +
    `${'its own SQL bare'.padStart(17)}  statements (own)`,
);
for (const c of cases) {
  const statements = await capture(c.path, c.cookie);
  const own = statements.filter(
    (s) => c.cookie === null || c.path === '/api/me' || !floorOf.get(c.cookie)!.has(key(s)),
  );
  const times: number[] = [];
  if (showLayers) layerTotals.clear();
  for (let i = 0; i < REPEATS + WARMUP; i += 1) {
    timing = i >= WARMUP;
    const ms = await request(c.path, c.cookie);
    if (timing) times.push(ms);
  }
  timing = false;
  layerRequests = REPEATS;
  const http = stats(times);
  const all = await replay(statements);
  const mine = await replay(own);
  const pair = (s: Stats) => `${s.median.toFixed(2)} / ${s.p95.toFixed(2)}`;
  console.log(
    `${c.name.padEnd(32)} ${pair(http).padStart(21)} ${pair(all).padStart(17)} ${pair(mine).padStart(17)}  ` +
      `${statements.length} (${own.length})`,
  );
  if (showLayers) {
    for (const [name, total] of [...layerTotals].sort((a, b) => b[1] - a[1])) {
      const mean = total / layerRequests;
      if (mean >= 0.01) console.log(`    ${name.padEnd(40)} ${mean.toFixed(2).padStart(7)} ms a request (mean)`);
    }
  }
  if (process.argv.includes('--statements')) for (const s of statements) console.log(`    ${key(s).slice(0, 160)}`);
}
console.log(`\nload average at the end ${load().join(' / ')}`);

server.close();
await Promise.allSettled([sequelize.close(), sessionPool.end(), bare.end()]);
process.exit(0);
