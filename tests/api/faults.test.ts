import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import sharp from 'sharp';
import supertest from 'supertest';
import { QueryTypes, type Transaction } from 'sequelize';
import {
  signedInAgent,
  startTestApp,
  testDatabaseUrl,
  type TestContext,
} from '../../apps/api/src/test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../apps/api/src/test-support/fixtures.js';
import { AuditEntry } from '../../apps/api/src/modules/audit/audit-entry.model.js';
import {
  DatabasePhotoStorage,
  type PhotoStorage,
  type PhotoVariant,
} from '../../apps/api/src/modules/photos/photo-storage.js';

/**
 * What the API does when the things under it fail: the database restarts, the API itself restarts, a
 * connection drops in the middle of a write, the disk fills up. Each answer must be clear, nothing may be
 * half-written, and the API must carry on without being restarted.
 */

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** Runs one of the scripts' functions (lib.sh) on this project's PostgreSQL cluster (PGPORT). */
function cluster(fn: 'pg_stop' | 'pg_start'): void {
  const run = spawnSync('bash', ['-c', `source docker-free-scripts/lib.sh && ${fn}`], {
    cwd: root,
    env: process.env,
    encoding: 'utf8',
  });
  if (run.status !== 0) throw new Error(`${fn} failed:\n${run.stdout}\n${run.stderr}`);
}

let ctx: TestContext;
let world: World;

// A checkpoint first, so that stopping the cluster below waits only for what these tests write. The files before
// this one empty and refill every table for each test, so the cluster's regular checkpoint may have tens of
// thousands of new files to sync; a stop in the middle of it waits for all of them (seen: 227 s on a loaded
// machine, past pg_ctl's 60 s, after which every later test met "the database system is shutting down").
beforeAll(async () => {
  ctx = startTestApp();
  await ctx.sequelize.query('CHECKPOINT');
}, 600_000);
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});
// Whatever happens inside a test (a timeout on a busy machine included), the next test finds the cluster running.
afterEach(() => cluster('pg_start'));

const count = async (sql: string, replacements: Record<string, unknown> = {}) =>
  (await ctx.sequelize.query<{ n: number }>(sql, { replacements, type: QueryTypes.SELECT }))[0]!.n;

describe('PostgreSQL restarted while the API runs', () => {
  it('answers 503 at once while it is down, then serves again by itself once it is back', async () => {
    const agent = await signedInAgent(ctx.app, 'siteadmin-a@test.example', PASSWORD);
    await agent.get('/api/saws').expect(200);
    cluster('pg_stop');
    try {
      for (const request of [
        () => agent.get('/api/saws'),
        () => agent.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ name: 'Renamed while down' }),
        () => supertest(ctx.app).post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }),
        () => supertest(ctx.app).get('/api/health'),
      ]) {
        const started = Date.now();
        const res = await request();
        expect(res.status).toBe(503);
        expect(res.body.error.code).toBe('UNAVAILABLE');
        expect(Date.now() - started).toBeLessThan(5000);
      }
      expect((await agent.get('/api/saws')).body.error.message).toMatch(/database is not reachable/);
    } finally {
      cluster('pg_start');
    }
    // The same process, not restarted: the pools reconnect, and the session (in PostgreSQL) is still there.
    await agent.get('/api/saws').expect(200);
    await agent.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ name: 'Renamed after the restart' }).expect(200);
    await supertest(ctx.app).get('/api/health').expect(200);
    await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
  }, 120_000);

  it('recovers from every connection being cut at once (what a server restart does to open connections)', async () => {
    const agent = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
    await agent.get('/api/saws').expect(200);
    const admin = new pg.Client({ connectionString: testDatabaseUrl() });
    await admin.connect();
    try {
      await admin.query(
        'SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid()',
      );
    } finally {
      await admin.end();
    }
    // A request may meet a connection that was cut; it answers 503, never 500, and the next one is served.
    const statuses: number[] = [];
    for (let i = 0; i < 5; i += 1) statuses.push((await agent.get('/api/saws')).status);
    expect(statuses.every((s) => s === 200 || s === 503)).toBe(true);
    expect(statuses.at(-1)).toBe(200);
  });
});

describe('the API restarted', () => {
  it('keeps people signed in: a session made by one process works in the next', async () => {
    const first = startTestApp();
    const res = await supertest(first.app)
      .post('/api/auth/sign-in')
      .send({ email: 'admin@test.example', password: PASSWORD })
      .expect(200);
    const cookie = res.headers['set-cookie']![0]!.split(';')[0]!;
    await first.close();
    const second = startTestApp();
    try {
      const me = await supertest(second.app).get('/api/me').set('Cookie', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe('admin@test.example');
      const retired = await supertest(second.app)
        .post(`/api/saws/${world.saws.B![0]!.id}/retire`)
        .set('Cookie', cookie);
      expect(retired.status).toBe(200);
    } finally {
      await second.close();
    }
  });
});

describe('a connection dropped in the middle of a write', () => {
  it('rolls the whole write back: no person, no site list, no audit entry, and the API carries on', async () => {
    const agent = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
    const body = {
      email: 'cut-off@test.example',
      name: 'Cut Off',
      password: 'copper-lantern-orbit-7',
      role: 'manager',
      managedSiteIds: [world.sites.A.id, world.sites.C.id],
    };
    const killer = new pg.Client({ connectionString: testDatabaseUrl() });
    await killer.connect();
    // The person and their sites are written; just before the audit entry, the connection is cut.
    AuditEntry.addHook('beforeBulkCreate', 'cut-connection', async (_rows, options) => {
      const transaction = options.transaction as Transaction;
      const [row] = await ctx.sequelize.query<{ pid: number }>('SELECT pg_backend_pid() AS pid', {
        transaction,
        type: QueryTypes.SELECT,
      });
      await killer.query('SELECT pg_terminate_backend($1)', [row!.pid]);
    });
    const auditBefore = await count('SELECT count(*)::int AS n FROM audit_entries');
    try {
      const res = await agent.post('/api/users').send(body);
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('UNAVAILABLE');
    } finally {
      AuditEntry.removeHook('beforeBulkCreate', 'cut-connection');
      await killer.end();
    }
    expect(await count(`SELECT count(*)::int AS n FROM users WHERE email = 'cut-off@test.example'`)).toBe(0);
    expect(await count(`SELECT count(*)::int AS n FROM user_sites WHERE user_id NOT IN (SELECT id FROM users)`)).toBe(
      0,
    );
    expect(await count('SELECT count(*)::int AS n FROM audit_entries')).toBe(auditBefore);
    // Sent again, the same write goes through whole.
    const again = await agent.post('/api/users').send(body);
    expect(again.status).toBe(201);
    expect(again.body.managedSiteIds.sort()).toEqual([world.sites.A.id, world.sites.C.id].sort());
  });
});

/** A photo store on a full disk: every write fails as Node's file system reports it. */
class FullDiskStorage implements PhotoStorage {
  async put(): Promise<void> {
    throw Object.assign(new Error("ENOSPC: no space left on device, write '/var/kerfline/photos/x'"), {
      code: 'ENOSPC',
      errno: -28,
      syscall: 'write',
    });
  }
  async get(_id: string, _variant: PhotoVariant) {
    return null;
  }
  async remove(): Promise<void> {}
  async keep(): Promise<void> {}
  async bringBack(): Promise<void> {}
}

/** The database store, on a database whose disk is full: PostgreSQL refuses the write with SQLSTATE 53100. */
class FullDatabaseStorage extends DatabasePhotoStorage {
  override async put(_id: string, _bytes: unknown, transaction: Transaction): Promise<void> {
    await ctx.sequelize.query(
      `DO $$ BEGIN RAISE EXCEPTION 'could not extend file "base/16384/24601": No space left on device'
         USING ERRCODE = 'disk_full'; END $$`,
      { transaction },
    );
  }
}

describe('a full disk on upload', () => {
  it.each([
    ['a file store (ENOSPC)', () => new FullDiskStorage()],
    ['PostgreSQL (53100 disk_full)', () => new FullDatabaseStorage(ctx.sequelize)],
  ])('answers 507 with a clear message from %s, and keeps no half-stored photo', async (_label, storage) => {
    const full = startTestApp({ photoStorage: storage() });
    try {
      const admin = await signedInAgent(full.app, 'admin@test.example', PASSWORD);
      const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body.id as string;
      const run = (
        await admin
          .post('/api/blade-runs')
          .send({ sawId: world.saws.A![0]!.id, bladeSpecId: spec, installedAt: minutesAgo(60) })
      ).body.run.id as string;
      const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#777' } })
        .png()
        .toBuffer();
      const res = await admin.post(`/api/blade-runs/${run}/photos`).attach('photo', png, 'band.png');
      expect(res.status).toBe(507);
      expect(res.body.error.code).toBe('INSUFFICIENT_STORAGE');
      expect(res.body.error.message).toMatch(/no room left.*nothing was saved.*disk is full/);
      expect(await count('SELECT count(*)::int AS n FROM photos WHERE blade_run_id = :run', { run })).toBe(0);
    } finally {
      await full.close();
    }
  });
});
