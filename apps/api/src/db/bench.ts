/**
 * `npm run bench`: Kerfline at the large customer's size, measured and written to bench/results.json.
 *
 *   npm run bench:seed     # once: the fleet in kerfline_bench (bench-generator.ts)
 *   npm run build          # the benchmark runs the built API, as production does
 *   npm run bench [-- --skip-import] [-- --scale-out]
 *
 * (a) Every dashboard and list endpoint through HTTP with a signed-in session, against the API process started
 *     from the build on the benchmark database: median and p95 over repeated requests. Beside each, the same
 *     statements as bare SQL on the same data: the statements the service runs are captured (every query the
 *     pg driver sends while an in-process copy of the app answers the request, less those every signed-in request
 *     sends: the session and the person), then replayed on one connection, timed the same way. Ratio = HTTP ÷ SQL.
 *     Over the 1.5× target, also the bare HTTP server (bench-bare-server.ts): no framework, the session's statement,
 *     then the endpoint's statements all at once, and the API's own answer sent ready made. It is the least any
 *     server that checks the session in the database could take, asked by the same client; on the floor (`/api/me`)
 *     the difference from the API is what the API's stack (Express, the session, passport, CASL) costs a request.
 * (b) The import of 100 000 rows beside COPY (bench-import.ts, run as it is).
 * (c) autocannon on the overview (or the saw list where the overview is absent): 50 connections for 10 s,
 *     requests/s, p99 and errors; with --scale-out also through the nginx of scale-out.sh (two API processes).
 * (d) The web app: gzip size of what index.html loads first, the charts' own chunk, and the time to the first
 *     chart in headless Chromium signed in as the operations manager.
 *
 * Figures are printed and written, never asserted; the load average is printed beside them (the machine is shared).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, totalmem } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import autocannon from 'autocannon';
import { databaseUrl, loadEnv } from '../config/env.js';
import { SESSION_OPTIONS, createSequelize } from './sequelize.js';
import { createApp } from '../app.js';
import { Jobs } from '../jobs/jobs.js';
import { BENCH_PASSWORD, BENCH_USERS, hasBenchFleet, siteId } from './bench-generator.js';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../..');
const REPEATS = Number(process.env.BENCH_REPEATS ?? 20);
const HEAVY_REPEATS = Number(process.env.BENCH_HEAVY_REPEATS ?? 5);
/** A read under 100 ms is timed FAST_REPEATS times after FAST_WARMUPS: at a few milliseconds, twenty requests
 * after one warm-up timed the process still compiling its code (a third slower than it runs all day). */
const FAST_REPEATS = Number(process.env.BENCH_FAST_REPEATS ?? 100);
const FAST_WARMUPS = 10;

/**
 * Run in the page before its own code: notes when the first chart's shapes enter the page (a mutation observer,
 * run as React commits them) and the frame after, in the page's clock (from the navigation's start). Playwright's
 * own wait polls on the page's main thread, so it also waits behind whatever the page draws next (the other
 * charts); both are reported. Also noted: the page's long tasks (over 50 ms, the browser's own measure), so the
 * longest one from the first chart until every chart is drawn (the page cannot answer a tap during it).
 */
/** Cold loads of the chart page timed, after one warm-up. */
const FIRST_CHART_LOADS = 9;
/** How many charts the page draws in all (the overview: four). */
const CHART_COUNT = Number(process.env.BENCH_CHART_COUNT ?? 4);

/**
 * Asks the page for an expression every 50 ms until it is true (or 20 s pass). Playwright's waitForFunction runs a
 * string through the page's eval, which the app's Content-Security-Policy refuses; an evaluate is not refused.
 */
async function pollInPage(tab: import('playwright-core').Page, expression: string): Promise<boolean> {
  const until = performance.now() + 20_000;
  while (performance.now() < until) {
    if (await tab.evaluate(expression)) return true;
    await new Promise((r) => setTimeout(r, 50));
  }
  return false;
}

const firstChartMark = (selector: string) => `
  window.kerflineLongTasks = [];
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) window.kerflineLongTasks.push({ at: e.startTime, ms: e.duration });
  }).observe({ type: 'longtask', buffered: true });
  new MutationObserver((_, observer) => {
    if (window.kerflineFirstChart || !document.querySelector(${JSON.stringify(selector)})) return;
    const mark = { at: performance.now() };
    window.kerflineFirstChart = mark;
    requestAnimationFrame(() => { mark.frame = performance.now(); });
    observer.disconnect();
  }).observe(document, { childList: true, subtree: true });`;
const args = new Set(process.argv.slice(2));
/** --load-only: run the load tests alone and put them into the existing bench/results.json. */
const loadOnly = args.has('--load-only');
/** --web-only: measure the web app alone (sizes, first chart) and put it into the existing bench/results.json. */
const webOnly = args.has('--web-only');
const env = loadEnv({
  SESSION_SECRET: 'benchmark-not-a-real-secret',
  ...process.env,
  PGDATABASE: process.env.PGDATABASE?.endsWith('_bench') ? process.env.PGDATABASE : 'kerfline_bench',
});
const url = databaseUrl(env);
const apiPort = Number(process.env.BENCH_API_PORT ?? env.PORT);
const api = `http://127.0.0.1:${apiPort}`;
const scaleOutUrl = `http://127.0.0.1:${process.env.SCALE_OUT_PORT ?? 3240}`;

type Stats = { medianMs: number; p95Ms: number };
const stats = (samples: number[]): Stats => {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]!;
  return { medianMs: round(at(0.5)), p95Ms: round(at(0.95)) };
};
const round = (n: number) => Math.round(n * 10) / 10;
const load = () => loadavg().map((l) => round(l));

// ---------------------------------------------------------------------------------------------------------------
// The endpoints. `who` signs in; paths are filled in from the fleet. Each is measured when the route exists here.
type Endpoint = {
  name: string;
  who: keyof typeof BENCH_USERS;
  path: string;
  dashboard: boolean;
  /** The floor every signed-in request pays: measured with all its statements (none left out). */
  floor?: true;
};

// The bare SQL runs with the app's own session settings (sequelize.ts), so the two are compared like for like.
const sql = new pg.Client({ connectionString: url, options: SESSION_OPTIONS });
await sql.connect();
const probe = new pg.Client({ connectionString: url });
await probe.connect();
{
  const sequelize = createSequelize(url, { poolMax: 1 });
  if (!(await hasBenchFleet(sequelize))) {
    console.error(`No benchmark fleet in ${env.PGDATABASE}: run npm run bench:seed first.`);
    process.exit(1);
  }
  await sequelize.close();
}
const site1 = siteId(1);
const { rows: sawRows } = await sql.query<{ id: string }>(
  `SELECT id FROM saws WHERE site_id = $1 ORDER BY asset_tag LIMIT 1`,
  [site1],
);
const sawId = sawRows[0]!.id;
const since = new Date(Date.now() - 365 * 86_400_000).toISOString().slice(0, 10);
const endpoints: Endpoint[] = [
  { name: 'floor: who am I (session and person)', who: 'manager', path: '/api/me', dashboard: false, floor: true },
  { name: 'fleet overview', who: 'manager', path: '/api/fleet/overview', dashboard: true },
  { name: 'fleet: one site', who: 'manager', path: `/api/fleet/sites/${site1}`, dashboard: true },
  { name: 'fleet: one saw', who: 'manager', path: `/api/fleet/saws/${sawId}`, dashboard: true },
  { name: 'fleet: one saw’s blades', who: 'manager', path: `/api/fleet/saws/${sawId}/runs`, dashboard: true },
  { name: 'practice (checks and blade life)', who: 'manager', path: '/api/fleet/practice', dashboard: true },
  { name: 'outliers', who: 'manager', path: '/api/outliers', dashboard: true },
  { name: 'outliers of the lead’s region', who: 'regionalLead', path: '/api/outliers', dashboard: true },
  { name: 'budgets', who: 'manager', path: '/api/budgets', dashboard: true },
  { name: 'CSV: fleet overview', who: 'manager', path: '/api/fleet/overview/export?table=sites', dashboard: true },
  { name: 'CSV: one site', who: 'manager', path: `/api/fleet/sites/${site1}/export?table=saws`, dashboard: true },
  { name: 'CSV: one saw', who: 'manager', path: `/api/fleet/saws/${sawId}/export?table=runs`, dashboard: true },
  { name: 'CSV: practice', who: 'manager', path: '/api/fleet/practice/export', dashboard: true },
  { name: 'CSV: outliers', who: 'manager', path: '/api/outliers/export', dashboard: true },
  { name: 'CSV: budgets', who: 'manager', path: '/api/budgets/export', dashboard: true },
  { name: 'site summaries (tiles)', who: 'manager', path: '/api/site-summaries', dashboard: true },
  { name: 'check counts of every site', who: 'manager', path: '/api/check-counts', dashboard: true },
  { name: 'saw timeline', who: 'manager', path: `/api/saws/${sawId}/timeline`, dashboard: true },
  { name: 'saws list (all sites)', who: 'manager', path: '/api/saws?limit=100', dashboard: false },
  { name: 'blade runs list (all sites)', who: 'manager', path: '/api/blade-runs?limit=100', dashboard: false },
  {
    name: 'blade runs list (site, broken, 1 year)',
    who: 'technician',
    path: `/api/blade-runs?reason=broken&from=${since}&limit=100`,
    dashboard: false,
  },
  { name: 'stops list (all sites)', who: 'manager', path: '/api/stops?limit=100', dashboard: false },
  { name: 'stops list (site)', who: 'technician', path: '/api/stops?limit=100', dashboard: false },
  { name: 'overdue checks (site)', who: 'technician', path: `/api/sites/${site1}/checks/overdue`, dashboard: false },
];

// ---------------------------------------------------------------------------------------------------------------
// Capture: an in-process copy of the app on the same database, with every query the pg driver sends recorded.
type Statement = { text: string; values?: unknown[] };
let capturing: Statement[] | null = null;
const originalQuery = pg.Client.prototype.query as (...a: unknown[]) => unknown;
pg.Client.prototype.query = function (this: pg.Client, ...a: unknown[]) {
  if (capturing && this !== sql && this !== probe) {
    const [first, second] = a as [string | { text: string; values?: unknown[] }, unknown];
    if (typeof first === 'string') capturing.push({ text: first, values: Array.isArray(second) ? second : undefined });
    else if (first && typeof first === 'object' && 'text' in first)
      capturing.push({ text: first.text, values: first.values });
  }
  return originalQuery.apply(this, a);
} as typeof pg.Client.prototype.query;

const captureSequelize = createSequelize(url, { poolMax: 2 });
const capturePool = new pg.Pool({ connectionString: url, max: 2 });
const captureApp = createApp({
  sequelize: captureSequelize,
  sessionPool: capturePool,
  sessionSecret: env.SESSION_SECRET,
  // Never started: no request measured here queues a job.
  jobs: new Jobs(captureSequelize, {
    connectionString: url,
    secret: env.SESSION_SECRET,
    publicUrl: api,
    smtp: { host: '127.0.0.1', port: 9, secure: false, from: 'bench@localhost' },
    retryLimit: 0,
    retryDelaySeconds: 60,
    schedule: { weeklyDigestCron: '0 6 * * 1', monthlySummaryCron: '0 6 1 * *', timeZone: 'UTC' },
  }),
  logLevel: 'silent',
});
const captureServer = captureApp.listen(0, '127.0.0.1');
await new Promise((r) => captureServer.once('listening', r));
const captureBase = `http://127.0.0.1:${(captureServer.address() as AddressInfo).port}`;

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: BENCH_PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} at ${base} answered ${res.status}: ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

type Captured = { status: number; statements: Statement[]; body: Buffer; contentType: string };
async function captured(base: string, cookie: string, p: string): Promise<Captured> {
  capturing = [];
  const res = await fetch(`${base}${p}`, { headers: { cookie } });
  const body = Buffer.from(await res.arrayBuffer());
  // The session store writes after the answer: let it finish so it is not counted with the next request.
  await new Promise((r) => setTimeout(r, 50));
  const statements = capturing;
  capturing = null;
  return { status: res.status, statements, body, contentType: res.headers.get('content-type') ?? 'application/json' };
}

// ---------------------------------------------------------------------------------------------------------------
// The API process from the build.
function startApi(): ChildProcess {
  if (!existsSync(path.join(ROOT, 'apps/api/dist/server.js')))
    throw new Error('The API is not built: run npm run build first');
  const child = spawn(process.execPath, ['--enable-source-maps', 'apps/api/dist/server.js'], {
    cwd: ROOT,
    env: {
      ...process.env,
      PORT: String(apiPort),
      PGDATABASE: env.PGDATABASE,
      SESSION_SECRET: env.SESSION_SECRET,
      LOG_LEVEL: 'warn',
      NODE_ENV: 'production',
      JOBS_WORKERS: 'false',
      WEB_DIST: path.join(ROOT, 'dist/web'),
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  return child;
}
async function waitUp(base: string): Promise<void> {
  for (let i = 0; i < 200; i += 1) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${base} did not answer /api/health`);
}

const apiProcess = startApi();
const stopApi = () => apiProcess.kill('SIGTERM');
process.on('exit', stopApi);
await waitUp(api);

// The bare HTTP server (bench-bare-server.ts), its own process as the API is: for a read over the ratio target,
// the least any server that checks the session in the database could take for the same statements.
const barePort = Number(process.env.BENCH_BARE_PORT ?? 3236);
const bareServerUrl = `http://127.0.0.1:${barePort}`;
const bareServer =
  loadOnly || webOnly
    ? null
    : spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'apps/api/src/db/bench-bare-server.ts')], {
        cwd: ROOT,
        env: { ...process.env, DATABASE_URL: url, BENCH_BARE_PORT: String(barePort) },
        stdio: ['ignore', 'pipe', 'inherit'],
      });
if (bareServer) {
  process.on('exit', () => bareServer.kill('SIGTERM'));
  await new Promise<void>((resolve, reject) => {
    bareServer.stdout!.on('data', (d: Buffer) => d.toString().includes('listening') && resolve());
    bareServer.once('exit', (code) => reject(new Error(`the bare HTTP server ended (${code})`)));
  });
}

const startLoad = load();
console.log(
  `\nKerfline benchmark on ${env.PGDATABASE} — ${cpus()[0]?.model} × ${cpus().length}, load average ${startLoad.join(' / ')}`,
);

// ---------------------------------------------------------------------------------------------------------------
// (a) endpoints
const cookies: Record<string, string> = {};
const captureCookies: Record<string, string> = {};
for (const who of new Set(endpoints.map((e) => e.who))) {
  cookies[who] = await signIn(api, BENCH_USERS[who]);
  captureCookies[who] = await signIn(captureBase, BENCH_USERS[who]);
}

type EndpointResult = Endpoint & {
  status: number;
  http?: Stats;
  sql?: Stats & { statements: number };
  repeats?: number;
  ratio?: number;
  meetsP95?: boolean;
  meetsRatio?: boolean;
  /** Over the ratio target: the bare HTTP server's time for the same statements, and its ratio to the bare SQL. */
  bareServer?: Stats & { ratio: number };
};
const results: EndpointResult[] = [];
const statementsOf = new Map<string, Statement[]>();
const key = (s: Statement) => s.text.replace(/\s+/g, ' ').trim();

/** BENCH_ONLY (a pattern on the names) measures those endpoints alone and puts them into the existing results. */
const only = process.env.BENCH_ONLY ? new RegExp(process.env.BENCH_ONLY, 'i') : null;
for (const endpoint of loadOnly || webOnly ? [] : endpoints.filter((e) => !only || only.test(e.name))) {
  // Statements every signed-in request of this person sends (session, person, ability), to leave out.
  const baseline = await captured(captureBase, captureCookies[endpoint.who]!, '/api/me');
  const common = new Set(endpoint.floor ? [] : baseline.statements.map(key));
  const got = await captured(captureBase, captureCookies[endpoint.who]!, endpoint.path);
  if (got.status === 404 && !endpoint.path.includes(site1) && !endpoint.path.includes(sawId)) {
    results.push({ ...endpoint, status: 404 });
    console.log(`${endpoint.name.padEnd(42)} not on this branch (404)`);
    continue;
  }
  if (got.status !== 200) {
    results.push({ ...endpoint, status: got.status });
    console.log(`${endpoint.name.padEnd(42)} answered ${got.status}; not measured`);
    continue;
  }
  const statements = got.statements.filter((s) => !common.has(key(s)));
  statementsOf.set(endpoint.path, statements);

  // An endpoint slower than a second gets HEAVY_REPEATS requests after one warm-up (the run stays in minutes); one
  // under 100 ms gets FAST_REPEATS after FAST_WARMUPS. The bare SQL is warmed and repeated alike.
  const timedGet = async (base: string) => {
    const t = performance.now();
    const res = await fetch(`${base}${endpoint.path}`, { headers: { cookie: cookies[endpoint.who]! } });
    await res.arrayBuffer();
    if (!res.ok) throw new Error(`${endpoint.path} answered ${res.status} from ${base}`);
    return performance.now() - t;
  };
  const request = () => timedGet(api);
  const first = await request();
  const fast = first < 100;
  const repeats = first > 1000 ? HEAVY_REPEATS : fast ? FAST_REPEATS : REPEATS;
  const warmups = first > 1000 ? 0 : fast ? FAST_WARMUPS : 1;
  for (let i = 0; i < warmups; i += 1) await request();
  const httpTimes: number[] = [];
  for (let i = 0; i < repeats; i += 1) httpTimes.push(await request());
  const sqlTimes: number[] = [];
  for (let i = 0; i < warmups + 1 + repeats; i += 1) {
    const t = performance.now();
    for (const s of statements) await sql.query(s.text, s.values as unknown[] | undefined);
    if (i > warmups) sqlTimes.push(performance.now() - t);
  }
  const http = stats(httpTimes);
  const bare = stats(sqlTimes);
  const ratio = bare.medianMs > 0 ? round(http.medianMs / bare.medianMs) : 0;
  // Over the target: the same client asks the bare HTTP server for the same statements, timed the same way. On the
  // floor itself (whose statements are the session's), the difference is what the API's stack costs a request.
  let bareServerStats: EndpointResult['bareServer'];
  if (ratio > 1.5 && bareServer) {
    const given = await fetch(bareServerUrl, {
      method: 'POST',
      body: JSON.stringify({
        session: endpoint.floor ? [] : baseline.statements,
        own: statements,
        answer: got.body.toString('base64'),
        contentType: got.contentType,
      }),
    });
    if (!given.ok) throw new Error(`the bare HTTP server refused the statements of ${endpoint.path}`);
    for (let i = 0; i < warmups + 1; i += 1) await timedGet(bareServerUrl);
    const times: number[] = [];
    for (let i = 0; i < repeats; i += 1) times.push(await timedGet(bareServerUrl));
    const s = stats(times);
    bareServerStats = { ...s, ratio: bare.medianMs > 0 ? round(s.medianMs / bare.medianMs) : 0 };
  }
  results.push({
    ...endpoint,
    status: 200,
    http,
    sql: { ...bare, statements: statements.length },
    repeats,
    ratio,
    meetsP95: http.p95Ms <= 300,
    meetsRatio: ratio <= 1.5,
    ...(bareServerStats ? { bareServer: bareServerStats } : {}),
  });
  console.log(
    `${endpoint.name.padEnd(42)} HTTP ${String(http.medianMs).padStart(7)} / ${String(http.p95Ms).padStart(7)} ms` +
      `   SQL ${String(bare.medianMs).padStart(7)} / ${String(bare.p95Ms).padStart(7)} ms (${statements.length})` +
      `   ×${ratio.toFixed(1)}   load ${load()[0]}`,
  );
  if (bareServerStats)
    console.log(
      `${''.padEnd(42)} bare HTTP server ${bareServerStats.medianMs} / ${bareServerStats.p95Ms} ms` +
        `   ×${bareServerStats.ratio.toFixed(1)} (the least any server checking the session in the database takes)`,
    );
}
bareServer?.kill('SIGTERM');
captureServer.close();
await Promise.allSettled([captureSequelize.close(), capturePool.end()]);

// The plan of the heaviest statement of the heaviest endpoint (by bare SQL), for the write-up.
const heaviestPlan = await (async () => {
  const heaviest = [...results].filter((r) => r.sql).sort((a, b) => b.sql!.medianMs - a.sql!.medianMs)[0];
  if (!heaviest) return null;
  const statements = statementsOf.get(heaviest.path) ?? [];
  let worst: { text: string; ms: number; plan: string[] } | null = null;
  for (const s of statements) {
    if (!/^\s*(select|with)\b/i.test(s.text)) continue;
    const { rows } = await sql.query<{ 'QUERY PLAN': string }>(
      `EXPLAIN (ANALYZE, BUFFERS, COSTS OFF) ${s.text}`,
      s.values as unknown[] | undefined,
    );
    const plan = rows.map((r) => r['QUERY PLAN']);
    const ms = Number(/Execution Time: ([\d.]+) ms/.exec(plan.at(-1) ?? '')?.[1] ?? 0);
    if (!worst || ms > worst.ms) worst = { text: s.text, ms, plan };
  }
  if (!worst) return null;
  console.log(`\nplan of the heaviest statement (${heaviest.name}, ${worst.ms} ms):`);
  for (const line of worst.plan) console.log(`  ${line}`);
  return { endpoint: heaviest.name, path: heaviest.path, statement: worst.text, plan: worst.plan };
})();

// ---------------------------------------------------------------------------------------------------------------
// (c) load test
const loadPath =
  loadOnly || results.find((r) => r.path === '/api/fleet/overview' && r.status === 200)
    ? '/api/fleet/overview'
    : '/api/saws?limit=100';
async function loadTest(base: string, label: string) {
  const cookie = await signIn(base, BENCH_USERS.manager);
  const before = load();
  const r = await autocannon({
    url: `${base}${loadPath}`,
    connections: 50,
    duration: Number(process.env.BENCH_LOAD_SECONDS ?? 10),
    headers: { cookie },
  });
  const out = {
    target: label,
    path: loadPath,
    connections: 50,
    seconds: r.duration,
    requestsPerSecond: round(r.requests.average),
    p50Ms: r.latency.p50,
    p99Ms: r.latency.p99,
    errors: r.errors + r.timeouts + r.non2xx,
    loadAverage: before,
  };
  console.log(
    `load test, ${label}: ${out.requestsPerSecond} requests/s, p50 ${out.p50Ms} ms, p99 ${out.p99Ms} ms, ` +
      `${out.errors} errors (50 connections, ${out.seconds} s on ${loadPath}; load ${before.join(' / ')})`,
  );
  return out;
}
console.log('');
const loadResults = only || webOnly ? [] : [await loadTest(api, 'one API process')];
// Let the answers still on their way finish before the process stops.
await new Promise((r) => setTimeout(r, 2000));
stopApi();
if (args.has('--scale-out') && !only && !webOnly) {
  try {
    await waitUp(scaleOutUrl);
    loadResults.push(await loadTest(scaleOutUrl, 'scale-out: nginx, two API processes, reads on the replica'));
  } catch (error) {
    console.log(
      `scale-out not measured: ${(error as Error).message} (start it: bash docker-free-scripts/scale-out.sh)`,
    );
  }
}

// ---------------------------------------------------------------------------------------------------------------
// (b) import beside COPY: bench-import.ts as it is, its figures read from its output.
let importResult: Record<string, unknown> | null = null;
if (!args.has('--skip-import') && !loadOnly && !only && !webOnly) {
  console.log('\nimport of 100 000 rows (npm run bench:import):');
  const run = spawnSync('npx', ['tsx', '--conditions=source', 'apps/api/src/db/bench-import.ts'], {
    cwd: ROOT,
    env: { ...process.env, PGDATABASE: 'kerfline_bench_import' },
    encoding: 'utf8',
  });
  const out = run.stdout ?? '';
  const seconds = (re: RegExp) => Number(re.exec(out)?.[1] ?? NaN);
  const commit = seconds(/3\. server commit[^:]*:\s*([\d.]+) s/);
  const copy = seconds(/4\. plain COPY[^:]*:\s*([\d.]+) s/);
  importResult = {
    rows: 100_000,
    wizardReadS: seconds(/1\. wizard reading[^:]*:\s*([\d.]+) s/),
    serverCheckS: seconds(/2\. server check[^:]*:\s*([\d.]+) s/),
    serverCommitS: commit,
    copyS: copy,
    ratio: round(commit / copy),
    meets: commit / copy <= 5,
    loadAverage: load(),
  };
  if (run.status !== 0) console.log(run.stderr);
  console.log(
    `  commit ${commit} s beside COPY ${copy} s: ×${importResult.ratio} (target ≤ 5×; load ${load().join(' / ')})`,
  );
}

// ---------------------------------------------------------------------------------------------------------------
// (d) the web app
const web = loadOnly || only ? null : await measureWeb();

async function measureWeb() {
  const dist = path.join(ROOT, 'dist/web');
  const indexHtml = readFileSync(path.join(dist, 'index.html'), 'utf8');
  const refs = [
    ...indexHtml.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"/g),
    ...indexHtml.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g),
    ...indexHtml.matchAll(/<link[^>]*rel="stylesheet"[^>]*href="([^"]+)"/g),
  ].map((m) => m[1]!);
  const gz = (file: string) => gzipSync(readFileSync(path.join(dist, file))).length;
  const initial = [...new Set(refs)].map((ref) => ({ file: ref, gzipBytes: gz(ref.replace(/^\//, '')) }));
  const initialJs = initial.filter((f) => f.file.endsWith('.js')).reduce((n, f) => n + f.gzipBytes, 0);
  const initialCss = initial.filter((f) => f.file.endsWith('.css')).reduce((n, f) => n + f.gzipBytes, 0);
  // What a browser that accepts brotli is sent: the build's .br beside each file (the file itself when none).
  const served = (ref: string) => {
    const file = path.join(dist, ref.replace(/^\//, ''));
    return readFileSync(existsSync(`${file}.br`) ? `${file}.br` : file).length;
  };
  const servedJs = initial.filter((f) => f.file.endsWith('.js')).reduce((n, f) => n + served(f.file), 0);
  // The chart library's own chunk: a JS file that is not loaded first and holds the charts' code.
  const assets = readdirSync(path.join(dist, 'assets')).filter((f) => f.endsWith('.js'));
  const chartChunks = assets.filter((f) => {
    const text = readFileSync(path.join(dist, 'assets', f), 'utf8');
    return /nivo/.test(text);
  });
  const chartsInInitial = chartChunks.filter((f) => initial.some((i) => i.file.endsWith(f)));
  const firstChart = await timeFirstChart();
  const out = {
    initial,
    initialJsGzipKb: round(initialJs / 1024),
    initialCssGzipKb: round(initialCss / 1024),
    initialJsServedBrotliKb: round(servedJs / 1024),
    chartChunks: chartChunks.map((f) => ({ file: f, gzipKb: round(gz(`assets/${f}`) / 1024) })),
    chartsInOwnChunk: chartChunks.length > 0 && chartsInInitial.length === 0,
    firstChart,
    meetsJs: initialJs / 1024 <= 200,
  };
  console.log(
    `\nweb: initial JS ${out.initialJsGzipKb} kB gzip (sent as ${out.initialJsServedBrotliKb} kB of brotli), ` +
      `CSS ${out.initialCssGzipKb} kB gzip (target JS ≤ 200 kB); ` +
      `charts in their own chunk: ${out.chartsInOwnChunk ? 'yes' : 'no'} (${chartChunks.join(', ') || 'no chart chunk'})`,
  );
  return out;
}

async function timeFirstChart(): Promise<Record<string, unknown> | null> {
  const page = process.env.BENCH_CHART_PAGE ?? '/fleet';
  let chromium: typeof import('playwright-core').chromium;
  try {
    ({ chromium } = await import('playwright-core'));
  } catch {
    return null;
  }
  const child = startApi();
  try {
    await waitUp(api);
    const browser = await chromium.launch({
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      headless: true,
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    });
    const selector = process.env.BENCH_CHART_SELECTOR ?? 'figure svg path';
    const times: number[] = [];
    const waits: number[] = [];
    const longest: number[] = [];
    try {
      for (let i = 0; i < 1 + FIRST_CHART_LOADS; i += 1) {
        const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, baseURL: api });
        const tab = await context.newPage();
        // Sign in through the API in the page's context (the cookie lands in the browser), then open the page cold.
        const cookie = await signIn(api, BENCH_USERS.manager);
        const [name, value] = cookie.split('=') as [string, string];
        await context.addCookies([{ name, value, url: api }]);
        await tab.addInitScript({ content: firstChartMark(selector) });
        const t = performance.now();
        await tab.goto(page);
        const found = await tab
          .waitForSelector(selector, { timeout: 20_000 })
          .then(() => true)
          .catch(() => false);
        const waited = performance.now() - t;
        const mark = (await tab.evaluate('window.kerflineFirstChart')) as { at: number; frame?: number } | undefined;
        // Every chart of the page drawn (a figure with its drawing), then a moment for the last task to be noted.
        const all = await pollInPage(
          tab,
          `new Set([...document.querySelectorAll('figure svg')].map((e) => e.closest('figure'))).size >= ${CHART_COUNT}`,
        );
        await tab.waitForTimeout(300);
        const tasks = (await tab.evaluate('window.kerflineLongTasks')) as { at: number; ms: number }[];
        if (i > 0 && found && mark) {
          times.push(mark.frame ?? mark.at);
          waits.push(waited);
          if (all) longest.push(Math.max(0, ...tasks.filter((x) => x.at > mark.at).map((x) => x.ms)));
        }
        if (!found) {
          await context.close();
          return { page, found: false };
        }
        await context.close();
      }
    } finally {
      await browser.close();
    }
    const s = stats(times);
    const w = stats(waits);
    const l = longest.length ? stats(longest) : null;
    console.log(
      `first chart on ${page}: median ${s.medianMs} ms, worst ${s.p95Ms} ms (target ≤ 1,500 ms); ` +
        `Playwright's wait for it: median ${w.medianMs} ms, worst ${w.p95Ms} ms; ` +
        `longest task begun after it until every chart is drawn: ${l ? `median ${l.medianMs} ms, worst ${l.p95Ms} ms` : 'not seen'}`,
    );
    return {
      page,
      found: true,
      ...s,
      meets: s.p95Ms <= 1500,
      playwrightWait: w,
      longestTaskAfterFirstChart: l,
      loadAverage: load(),
    };
  } finally {
    child.kill('SIGTERM');
  }
}

// ---------------------------------------------------------------------------------------------------------------
const { rows: versionRows } = await sql.query<{ v: string }>("SELECT current_setting('server_version') AS v");
const { rows: countRows } = await sql.query(
  `SELECT (SELECT count(*) FROM sites)::int AS sites, (SELECT count(*) FROM saws)::int AS saws,
          (SELECT count(*) FROM blade_runs)::int AS "bladeRuns", (SELECT count(*) FROM stops)::int AS stops,
          (SELECT count(*) FROM check_records)::int AS "checkRecords", (SELECT count(*) FROM cut_logs)::int AS "cutLogs"`,
);
await sql.end();
await probe.end();

const report = {
  date: new Date().toISOString(),
  machine: {
    cpu: cpus()[0]?.model ?? 'unknown',
    cores: cpus().length,
    ramGb: round(totalmem() / 1024 ** 3),
    node: process.version,
    postgres: versionRows[0]!.v,
  },
  loadAverage: { start: startLoad, end: load() },
  data: countRows[0],
  repeats: { slow: REPEATS, fast: FAST_REPEATS, heavy: HEAVY_REPEATS },
  targets: {
    dashboardP95Ms: 300,
    dashboardRatio: 1.5,
    importRatio: 5,
    loadErrors: 0,
    initialJsGzipKb: 200,
    firstChartMs: 1500,
  },
  endpoints: results,
  heaviestPlan,
  import: importResult,
  load: loadResults,
  web,
};
mkdirSync(path.join(ROOT, 'bench'), { recursive: true });
const resultsFile = path.join(ROOT, 'bench/results.json');
const previous = () => JSON.parse(readFileSync(resultsFile, 'utf8')) as typeof report;
const written = loadOnly
  ? { ...previous(), load: loadResults, loadMeasuredAt: report.date }
  : webOnly
    ? { ...previous(), web, webMeasuredAt: report.date }
    : only
      ? {
          ...previous(),
          endpoints: previous().endpoints.map((e) => results.find((r) => r.name === e.name) ?? e),
          endpointsRemeasuredAt: report.date,
        }
      : report;
writeFileSync(resultsFile, JSON.stringify(written, null, 2) + '\n');
console.log(`\nwritten to bench/results.json (load average at the end ${load().join(' / ')})`);
process.exit(0);
