import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { testDatabaseUrl } from '../../apps/api/src/test-support/test-db.js';

/**
 * Kerfline past one process, as scale-out.sh starts it: a streaming replica of the project's cluster, two API
 * processes reading from it and writing to the primary, nginx in front. Its own database (the demo loaded into
 * it) and ports 3245–3247, so a scale-out started by hand on 3240–3242 may run beside it (they share the
 * replica). Skipped, with the reason printed, only when nginx is missing and cannot be installed.
 */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DATABASE = 'kerfline_scale_out_test';
const BALANCER = 'http://127.0.0.1:3245';
const PROCESSES = ['http://127.0.0.1:3246', 'http://127.0.0.1:3247'];
const REPLICA_PORT = Number(process.env.PGREPLICA_PORT ?? 55459);
const PASSWORD = 'corvane-demo-2026';

const urlOf = (database: string, port?: number) => {
  const url = new URL(testDatabaseUrl());
  url.pathname = `/${database}`;
  if (port) url.port = String(port);
  return url.toString();
};
const env: NodeJS.ProcessEnv = {
  ...process.env,
  PGDATABASE: DATABASE,
  PGPORT: new URL(testDatabaseUrl()).port,
  PGREPLICA_PORT: String(REPLICA_PORT),
  SCALE_OUT_PORT: '3245',
  SCALE_OUT_API_PORTS: PROCESSES.map((p) => new URL(p).port).join(' '),
  SCALE_OUT_FROM_SOURCE: '1',
  // A schedule every minute, looked at every second, so the test sees one fire.
  WEEKLY_DIGEST_CRON: '* * * * *',
  JOBS_CRON_CHECK_SECONDS: '1',
  READ_YOUR_WRITES_SECONDS: '30',
  SESSION_SECRET: 'scale-out-test-secret-not-for-production',
  LOG_LEVEL: 'error',
};
delete env.DATABASE_URL;
const script = (...args: string[]) =>
  spawnSync('bash', [path.join('docker-free-scripts', 'scale-out.sh'), ...args], {
    cwd: root,
    env,
    encoding: 'utf8',
    timeout: 280_000,
  });

let skipped: string | null = null;
let primary: pg.Client;
let replica: pg.Client;

beforeAll(async () => {
  const admin = new pg.Client({ connectionString: urlOf('postgres') });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${DATABASE} WITH (FORCE)`);
  await admin.end();
  const started = script();
  if (started.status === 3) {
    skipped = started.stderr.trim();
    console.log(`scale-out tests skipped: ${skipped}`);
    return;
  }
  if (started.status !== 0) throw new Error(`scale-out.sh failed:\n${started.stdout}\n${started.stderr}`);
  primary = new pg.Client({ connectionString: urlOf(DATABASE) });
  replica = new pg.Client({ connectionString: urlOf(DATABASE, REPLICA_PORT) });
  await primary.connect();
  await replica.connect();
}, 300_000);

afterAll(async () => {
  await replica?.query('SELECT pg_wal_replay_resume()').catch(() => undefined);
  await Promise.allSettled([primary?.end(), replica?.end()]);
  script('stop');
}, 60_000);

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  expect(res.status).toBe(200);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
const get = (base: string, p: string, cookie: string) => fetch(`${base}${p}`, { headers: { cookie } });

describe('scale-out: nginx, two API processes, a streaming replica', () => {
  it('keeps a person signed in whichever process answers', async (ctx) => {
    if (skipped) ctx.skip();
    const cookie = await signIn(BALANCER, 'grace.okafor@corvane.example');
    for (const base of [...PROCESSES, BALANCER, BALANCER]) {
      const res = await get(base, '/api/me', cookie);
      expect(res.status).toBe(200);
      expect(((await res.json()) as { user: { email: string } }).user.email).toBe('grace.okafor@corvane.example');
    }
  });

  it('compresses the API’s answers at the balancer, not in the API processes', async (ctx) => {
    if (skipped) ctx.skip();
    const cookie = await signIn(BALANCER, 'grace.okafor@corvane.example');
    const headers = { cookie, 'accept-encoding': 'gzip' };
    const balanced = await fetch(`${BALANCER}/api/fleet/overview`, { headers });
    expect(balanced.status).toBe(200);
    expect(balanced.headers.get('content-encoding')).toBe('gzip');
    expect(((await balanced.json()) as { sites: unknown[] }).sites.length).toBeGreaterThan(0);
    const direct = await fetch(`${PROCESSES[0]}/api/fleet/overview`, { headers });
    expect(direct.status).toBe(200);
    expect(direct.headers.get('content-encoding')).toBeNull();
    await direct.arrayBuffer();
  });

  it('reads others’ pages from the replica, and a person’s own write back from the primary at once', async (ctx) => {
    if (skipped) ctx.skip();
    const technician = await signIn(BALANCER, 'dale.pruitt@corvane.example');
    const manager = await signIn(BALANCER, 'grace.okafor@corvane.example');
    const saws = (await (await get(BALANCER, '/api/saws?limit=100', technician)).json()) as {
      items: { id: string; down: unknown; status: string }[];
    };
    const saw = saws.items.find((s) => s.status === 'in_service' && !s.down)!;
    expect(saw).toBeDefined();

    // Hold the replica where it is: what is written now reaches only the primary.
    await replica.query('SELECT pg_wal_replay_pause()');
    try {
      const startedAt = new Date(Date.now() - 20 * 60_000).toISOString();
      const endedAt = new Date(Date.now() - 10 * 60_000).toISOString();
      const created = await fetch(`${BALANCER}/api/stops`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', origin: BALANCER, cookie: technician },
        body: JSON.stringify({ sawId: saw.id, startedAt, endedAt, category: 'other', notes: 'scale-out test' }),
      });
      expect(created.status).toBe(201);
      const stop = (await created.json()) as { id: string };

      // The writer sees it through either process, by id and in the list, although the replica has not got it.
      for (const base of PROCESSES) {
        expect((await get(base, `/api/stops/${stop.id}`, technician)).status).toBe(200);
        const list = (await (await get(base, `/api/stops?sawId=${saw.id}`, technician)).json()) as {
          items: { id: string }[];
        };
        expect(list.items.map((s) => s.id)).toContain(stop.id);
      }
      // Someone else reads the replica, which does not have it yet: the reads really go there.
      expect((await replica.query('SELECT 1 FROM stops WHERE id = $1', [stop.id])).rowCount).toBe(0);
      for (const base of PROCESSES) expect((await get(base, `/api/stops/${stop.id}`, manager)).status).toBe(404);

      await replica.query('SELECT pg_wal_replay_resume()');
      let seen = 0;
      for (let i = 0; i < 50 && seen !== 200; i += 1) {
        seen = (await get(BALANCER, `/api/stops/${stop.id}`, manager)).status;
        if (seen !== 200) await new Promise((r) => setTimeout(r, 100));
      }
      expect(seen).toBe(200);
    } finally {
      await replica.query('SELECT pg_wal_replay_resume()');
    }
  });

  it('runs a scheduled job once although both processes watch the schedule', async (ctx) => {
    if (skipped) ctx.skip();
    // Both processes registered the schedule; it is one schedule in the shared queue tables.
    const schedules = await primary.query(`SELECT count(*)::int AS n FROM pgboss.schedule WHERE name = $1`, [
      'mail-weekly-digest',
    ]);
    expect(schedules.rows[0].n).toBe(1);
    // Wait for the schedule's first fire to be done (it fires at the start of each minute).
    const deadline = Date.now() + 80_000;
    let done = 0;
    while (Date.now() < deadline && done === 0) {
      const { rows } = await primary.query(
        `SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'mail-weekly-digest' AND state = 'completed'`,
      );
      done = rows[0].n;
      if (done === 0) await new Promise((r) => setTimeout(r, 500));
    }
    expect(done).toBeGreaterThan(0);
    await new Promise((r) => setTimeout(r, 3000));
    // One job per minute's slot, whichever process saw it first; each done once.
    const { rows: slots } = await primary.query<{ slot: Date; jobs: number; runs: number }>(
      `SELECT date_trunc('minute', created_on) AS slot, count(*)::int AS jobs, sum(retry_count)::int AS runs
         FROM pgboss.job WHERE name = 'mail-weekly-digest' GROUP BY 1 ORDER BY 1`,
    );
    expect(slots.length).toBeGreaterThan(0);
    for (const slot of slots) expect(slot).toMatchObject({ jobs: 1, runs: 0 });
    // The digest went to each regional lead once for the week.
    const { rows: mails } = await primary.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM mail_log WHERE kind = 'weekly_digest' GROUP BY user_id`,
    );
    expect(mails.length).toBeGreaterThan(0);
    expect(mails.every((m) => m.n === 1)).toBe(true);
  }, 100_000);
});
