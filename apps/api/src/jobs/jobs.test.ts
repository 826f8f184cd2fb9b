import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { isoWeekKey } from '@kerfline/domain/mail/schema';
import {
  startTestApp,
  signedInAgent,
  testDatabaseUrl,
  testJobsOptions,
  type TestContext,
} from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { clearJobs, eventually, startTestMail, type TestMail } from '../test-support/mail.js';
import { createSequelize } from '../db/sequelize.js';
import { User } from '../modules/users/user.model.js';
import { Stop } from '../modules/stops/stop.model.js';
import { Jobs } from './jobs.js';
import { queueLowStockNotices } from './low-stock.js';

let mail: TestMail;
let ctx: TestContext;
let world: World;

beforeAll(async () => {
  mail = await startTestMail();
  ctx = startTestApp({ mail: { smtpPort: mail.port, workers: true, catcherDir: mail.dir } });
  await ctx.ready;
});
afterAll(async () => {
  await ctx.close();
  await mail.close();
});
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  await clearJobs(ctx.sequelize);
  await mail.clear();
});

type LogRow = { kind: string; to_address: string; status: string; attempts: number; last_error: string | null };
const mailLog = () =>
  ctx.sequelize.query<LogRow>(
    'SELECT kind, to_address, status, attempts, last_error FROM mail_log ORDER BY to_address',
    {
      type: QueryTypes.SELECT,
    },
  );

describe('the weekly digest', () => {
  it('holds the lead’s own region’s sites and saws, and nothing from another region', async () => {
    // A second lead, for the other region, and a saw down in each region.
    await User.create({
      email: 'lead-south@test.example',
      name: 'lead-south',
      role: 'regional_lead',
      passwordHash: world.users.admin.passwordHash,
      siteId: null,
      regionId: world.regions.south.id,
    });
    // Down means an open stop.
    for (const saw of [world.saws.A![0]!, world.saws.C![1]!]) {
      await Stop.create({
        siteId: saw.siteId,
        sawId: saw.id,
        startedAt: new Date(Date.now() - 3_600_000),
        endedAt: null,
        category: 'hydraulic',
        planned: false,
        notes: null,
        createdById: null,
        endedById: null,
      });
    }

    await ctx.jobs.fire('mail-weekly-digest');
    const north = await mail.waitFor('lead-north@test.example');
    const south = await mail.waitFor('lead-south@test.example');

    const week = isoWeekKey(new Date());
    expect(north.subject).toBe(`Kerfline weekly digest: North, week ${week.slice(-2)}`);
    for (const part of [north.text, north.html!]) {
      expect(part).toContain('Site A');
      expect(part).toContain('Site B');
      expect(part).toContain('A-1');
      // Nothing of region South: not its site, its code in the table, or its saws.
      expect(part).not.toContain('Site C');
      expect(part).not.toMatch(/\bC-[12]\b/);
      expect(part).not.toContain('South');
    }
    expect(north.text).toContain('== Saws down now ==');
    expect(north.text).toContain('- A-1 · Test bar saw · Site A');
    expect(north.text).toContain('http://kerfline.test/account');
    expect(south.text).toContain('Site C');
    expect(south.text).toContain('C-2');
    expect(south.text).not.toMatch(/Site [AB]\b/);
    expect(south.text).not.toContain('A-1');
    // The retired saw at A is history, not counted as in service.
    expect(north.text).toContain('- Site A · A · 1 · 1 down');

    // The catcher has both messages; the worker marks each sent once its SMTP exchange has closed.
    const digests = async () => (await mailLog()).filter((r) => r.kind === 'weekly_digest');
    await eventually(async () => (await digests()).every((r) => r.status !== 'sending'), 'both digests are logged');
    const rows = await digests();
    expect(rows).toEqual([
      { kind: 'weekly_digest', to_address: 'lead-north@test.example', status: 'sent', attempts: 1, last_error: null },
      { kind: 'weekly_digest', to_address: 'lead-south@test.example', status: 'sent', attempts: 1, last_error: null },
    ]);
  });

  it('is not sent to a lead who turned it off on their account page; the skip is recorded', async () => {
    const lead = await signedInAgent(ctx.app, 'lead-north@test.example', PASSWORD);
    const prefs = await lead.get('/api/me/mail-preferences');
    expect(prefs.body).toEqual([
      expect.objectContaining({ kind: 'weekly_digest', label: 'Weekly region digest', enabled: true }),
    ]);
    const off = await lead.patch('/api/me/mail-preferences').send({ kind: 'weekly_digest', enabled: false });
    expect(off.body[0].enabled).toBe(false);
    const notMine = await lead.patch('/api/me/mail-preferences').send({ kind: 'monthly_summary', enabled: false });
    expect(notMine.status).toBe(400);
    expect(notMine.body.error.message).toMatch(/not sent to your role/);
    const required = await lead.patch('/api/me/mail-preferences').send({ kind: 'password_reset', enabled: false });
    expect(required.body.error.message).toMatch(/cannot be turned off/);

    await ctx.jobs.fanOut('weekly_digest', new Date());
    expect(await mailLog()).toEqual([
      {
        kind: 'weekly_digest',
        to_address: 'lead-north@test.example',
        status: 'skipped',
        attempts: 0,
        last_error: 'turned off by the person',
      },
    ]);
    await new Promise((r) => setTimeout(r, 1500));
    expect(await mail.to('lead-north@test.example')).toEqual([]);
  });

  it('is sent exactly once when two worker processes run the same schedule', async () => {
    const url = testDatabaseUrl();
    // Two more processes' worth of job runtime, each with its own connections, both watching a schedule due
    // every minute: whichever sees it first hands it out, and each digest is claimed by one worker only.
    const processes = [0, 1].map(() => {
      const sequelize = createSequelize(url, { poolMax: 3 });
      return {
        sequelize,
        jobs: new Jobs(sequelize, testJobsOptions(url, { smtpPort: mail.port, cron: '* * * * *' }), { workers: true }),
      };
    });
    try {
      await Promise.all(processes.map((p) => p.jobs.startWorkers()));
      await mail.waitFor('lead-north@test.example', undefined, 30_000);
      // Give every worker time to pick up anything left, then count.
      await new Promise((r) => setTimeout(r, 4000));
      expect(await mail.to('lead-north@test.example')).toHaveLength(1);
      // The same schedule handled again by both processes at once (a retry, a second slot): nothing new.
      const queued = await Promise.all(processes.map((p) => p.jobs.fanOut('weekly_digest', new Date())));
      expect(queued).toEqual([0, 0]);
      await new Promise((r) => setTimeout(r, 1500));
      expect(await mail.to('lead-north@test.example')).toHaveLength(1);
      const rows = await mailLog();
      expect(rows.filter((r) => r.to_address === 'lead-north@test.example')).toEqual([
        { kind: 'weekly_digest', to_address: 'lead-north@test.example', status: 'sent', attempts: 1, last_error: null },
      ]);
    } finally {
      for (const p of processes) {
        await p.jobs.boss.unschedule('mail-weekly-digest').catch(() => undefined);
        await p.jobs.stop();
        await p.sequelize.close();
      }
    }
  });
});

describe('sending', () => {
  let failing: { jobs: Jobs; close: () => Promise<void> } | undefined;
  afterEach(async () => failing?.close());

  it('retries with growing waits when the mail server is unreachable, then records the failure', async () => {
    const url = testDatabaseUrl();
    const sequelize = createSequelize(url, { poolMax: 3 });
    // Port 9 has no mail server: every attempt fails. One retry after a 1 s wait.
    const jobs = new Jobs(sequelize, testJobsOptions(url, { smtpPort: 9, retryLimit: 1, retryDelaySeconds: 1 }), {
      workers: true,
    });
    failing = { jobs, close: async () => (await jobs.stop(), await sequelize.close()) };
    // Only the failing runtime works the queue: stop the app's own workers for this test.
    await ctx.jobs.boss.offWork('mail-send');
    try {
      await jobs.startWorkers();
      await jobs.fanOut('weekly_digest', new Date());
      await eventually(async () => (await mailLog())[0]?.status === 'failed', 'the digest is marked failed', 30_000);
      const [row] = await mailLog();
      expect(row).toMatchObject({ status: 'failed', attempts: 2 });
      expect(row!.last_error).toMatch(/ECONNREFUSED|connect/i);
      // pg-boss ran the job twice, the wait doubling on each retry (retry_backoff); after the last attempt the
      // job ends quietly and the failure lives in mail_log, where the administrators' mail page shows it.
      const [job] = await ctx.sequelize.query<{ state: string; retry_count: number; retry_backoff: boolean }>(
        "SELECT state, retry_count, retry_backoff FROM pgboss.job WHERE name = 'mail-send'",
        { type: QueryTypes.SELECT },
      );
      expect(job).toEqual({ state: 'completed', retry_count: 1, retry_backoff: true });
    } finally {
      await ctx.jobs.boss.work('mail-send', { pollingIntervalSeconds: 0.5, includeMetadata: true }, async ([job]) => {
        if (job) await ctx.jobs.deliver((job.data as { mailId: string }).mailId, job.retryCount, job.retryLimit);
      });
    }
  });
});

describe('the monthly summary and the low-stock notice', () => {
  it('sends each manager a summary of their own sites only', async () => {
    await ctx.jobs.fanOut('monthly_summary', new Date('2026-12-01T06:00:00Z'));
    const scoped = await mail.waitFor('manager-ac@test.example');
    expect(scoped.subject).toBe('Kerfline monthly summary for 2026-11');
    expect(scoped.text).toContain('Site A');
    expect(scoped.text).toContain('Site C');
    expect(scoped.text).not.toContain('Site B');
    const all = await mail.waitFor('manager-all@test.example');
    expect(all.text).toContain('Site B');
  });

  it('are wired to the same pipeline; a low-stock notice with nothing to report is recorded as skipped, not sent', async () => {
    await ctx.sequelize.transaction((transaction) =>
      queueLowStockNotices(ctx.jobs, transaction, world.sites.A.id, '2026-12-02'),
    );
    await eventually(async () => (await mailLog())[0]?.status === 'skipped', 'the notice is handled');
    expect(await mailLog()).toEqual([
      {
        kind: 'low_stock',
        to_address: 'siteadmin-a@test.example',
        status: 'skipped',
        attempts: 1,
        last_error: 'nothing is below its reorder point',
      },
    ]);
  });
});

describe('the record of mail and the outbox', () => {
  it('shows administrators what was sent and caught, and nobody else', async () => {
    await ctx.jobs.fire('mail-weekly-digest');
    await mail.waitFor('lead-north@test.example');
    await eventually(async () => (await mailLog())[0]?.status === 'sent', 'the log says sent');
    const admin = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
    const log = await admin.get('/api/mail-log');
    expect(log.body.items).toEqual([
      expect.objectContaining({ kind: 'weekly_digest', userName: 'lead-north', status: 'sent', attempts: 1 }),
    ]);
    const outbox = await admin.get('/api/outbox');
    expect(outbox.body.enabled).toBe(true);
    expect(outbox.body.items[0]).toMatchObject({ to: ['lead-north@test.example'] });
    for (const email of ['siteadmin-a@test.example', 'manager-all@test.example', 'lead-north@test.example']) {
      const agent = await signedInAgent(ctx.app, email, PASSWORD);
      expect((await agent.get('/api/outbox')).status, email).toBe(403);
      expect((await agent.get('/api/mail-log')).body.total, email).toBe(0);
      expect((await agent.post('/api/mail/schedules/weekly-digest/run')).status, email).toBe(403);
    }
  });
});
