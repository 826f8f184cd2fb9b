import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { signedInAgent, startTestApp, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import { twoWriters } from '../../apps/api/src/test-support/two-writers.js';
import { buildWorld, PASSWORD, specBody, type World } from '../../apps/api/src/test-support/fixtures.js';

/**
 * blade_check_firsts keeps, per blade run and check, the first record of the check while the blade was on. Practice
 * compared reads it instead of finding the blade on at each record. These tests hold it to the records after each
 * kind of write (a blade put on, corrected, taken off, removed and put back; a check recorded, moved, removed and
 * put back; a check sheet imported and undone; two writers of one saw at once), against a definition written here
 * apart from the migration's: each record goes to the latest blade put on by its time if that blade was still on.
 */
let ctx: TestContext;
let world: World;
let siteAdmin: supertest.Agent;
let technician: supertest.Agent;
let sawId: string;
let checkIds: { guide: string; brush: string };

const rows = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  ctx.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
const iso = (daysAgo: number, hour = 8) => {
  const d = new Date(Date.now() - daysAgo * 86_400_000);
  d.setUTCHours(hour, 0, 0, 0);
  return d.toISOString();
};

type Kept = { blade_run_id: string; site_check_id: string; first_at: string; installed_at: string; removed_at: string };
const keptRows = (transaction?: import('sequelize').Transaction) =>
  ctx.sequelize.query<Kept>(
    `SELECT blade_run_id, site_check_id, first_at, installed_at, removed_at FROM blade_check_firsts
      ORDER BY blade_run_id, site_check_id`,
    { type: QueryTypes.SELECT, transaction },
  );

/** The kept rows equal the records read afresh, here and by the rebuild (in a rolled-back transaction). */
async function expectKept(): Promise<Kept[]> {
  const kept = await keptRows();
  const fromRecords = await rows<Kept>(
    `SELECT on_then.id AS blade_run_id, k.site_check_id, min(k.checked_at) AS first_at,
            on_then.installed_at, on_then.removed_at
       FROM check_records k
      CROSS JOIN LATERAL (
        SELECT b.id, b.installed_at, b.removed_at FROM blade_runs b
         WHERE b.saw_id = k.saw_id AND b.installed_at <= k.checked_at AND b.removed_at IS DISTINCT FROM b.installed_at
         ORDER BY b.installed_at DESC LIMIT 1) on_then
      WHERE k.checked_at < coalesce(on_then.removed_at, 'infinity'::timestamptz)
      GROUP BY on_then.id, k.site_check_id, on_then.installed_at, on_then.removed_at
      ORDER BY 1, 2`,
  );
  expect(kept).toEqual(fromRecords);
  const t = await ctx.sequelize.transaction();
  try {
    await ctx.sequelize.query('SELECT blade_check_firsts_rebuild()', { transaction: t });
    expect(await keptRows(t)).toEqual(kept);
  } finally {
    await t.rollback();
  }
  return kept;
}

const firstOf = async (runId: string, checkId: string) =>
  (
    await rows<{ first_at: Date }>(
      `SELECT first_at FROM blade_check_firsts WHERE blade_run_id = :runId AND site_check_id = :checkId`,
      { runId, checkId },
    )
  )[0]?.first_at.toISOString() ?? null;

async function record(checkId: string, checkedAt: string, body: Record<string, unknown>): Promise<string> {
  const res = await technician.post('/api/check-records').send({ sawId, siteCheckId: checkId, checkedAt, ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  siteAdmin = await signedInAgent(ctx.app, 'siteadmin-a@test.example', PASSWORD);
  technician = await signedInAgent(ctx.app, 'tech-a@test.example', PASSWORD);
  sawId = world.saws.A![0]!.id;
  const checks = (await siteAdmin.get(`/api/sites/${world.sites.A.id}/checks`)).body.items as {
    id: string;
    targetRule: string;
    name: string;
  }[];
  checkIds = {
    guide: checks.find((c) => c.targetRule === 'guide_clearance')!.id,
    brush: checks.find((c) => c.name === 'Chip brush')!.id,
  };
});
afterAll(async () => ctx.close());

describe('each blade’s first record of each check stays equal to the records', () => {
  it('follows blades put on, corrected, taken off, removed and put back, and checks recorded and removed', async () => {
    const spec = (await siteAdmin.post('/api/blade-specs').send(specBody(world.sites.A.id))).body.id as string;
    const on = await technician.post('/api/blade-runs').send({ sawId, bladeSpecId: spec, installedAt: iso(20) });
    expect(on.status, JSON.stringify(on.body)).toBe(201);
    const first = on.body.run.id as string;
    expect(await expectKept()).toEqual([]);

    // Two guide readings and a brush check while the first blade is on: the earlier guide reading is its first.
    await record(checkIds.guide, iso(18), { reading: 1.12 });
    const early = await record(checkIds.guide, iso(19), { reading: 1.13 });
    await record(checkIds.brush, iso(17), { answers: { reachesGullets: true, worn: false } });
    expect(await firstOf(first, checkIds.guide)).toBe(iso(19));
    expect(await firstOf(first, checkIds.brush)).toBe(iso(17));
    await expectKept();

    // The blade's put-on time corrected to after the earlier reading: that reading is no longer the blade's.
    const moved = await siteAdmin.patch(`/api/blade-runs/${first}`).send({ installedAt: iso(18, 6) });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    expect(await firstOf(first, checkIds.guide)).toBe(iso(18));
    await expectKept();

    // Taken off, and a second blade put on: a reading after the change belongs to the second.
    const off = await technician
      .post(`/api/blade-runs/${first}/remove`)
      .send({ removedAt: iso(10), reason: 'worn_out', areaCutMm2: 900_000, cuts: 300 });
    expect(off.status, JSON.stringify(off.body)).toBe(200);
    const second = (await technician.post('/api/blade-runs').send({ sawId, bladeSpecId: spec, installedAt: iso(9) }))
      .body.run.id as string;
    await record(checkIds.guide, iso(8), { reading: 1.14 });
    expect(await firstOf(second, checkIds.guide)).toBe(iso(8));
    expect(await firstOf(first, checkIds.guide)).toBe(iso(18));
    await expectKept();

    // A reading removed (kept for putting back) and put back; the first blade removed and put back.
    const before = await expectKept();
    expect((await siteAdmin.delete(`/api/check-records/${early}`).send({ reason: 'Wrong saw' })).status).toBe(204);
    await expectKept();
    expect((await siteAdmin.delete(`/api/blade-runs/${first}`).send({ reason: 'Entered twice' })).status).toBe(204);
    expect((await keptRows()).some((r) => r.blade_run_id === first)).toBe(false);
    await expectKept();
    const removed = (await siteAdmin.get('/api/removed-records').expect(200)).body.items as { id: string }[];
    for (const r of removed) await siteAdmin.post(`/api/removed-records/${r.id}/restore`).send({}).expect(200);
    expect(await expectKept()).toEqual(before);

    // A record's time moved by hand from the first blade into the second's.
    await ctx.sequelize.query(
      `UPDATE check_records SET checked_at = :to WHERE saw_id = :saw AND site_check_id = :check AND checked_at = :from`,
      { replacements: { to: iso(7), saw: sawId, check: checkIds.brush, from: iso(17) } },
    );
    expect(await firstOf(first, checkIds.brush)).toBeNull();
    expect(await firstOf(second, checkIds.brush)).toBe(iso(7));
    await expectKept();
  });

  it('follows a check sheet imported and undone', async () => {
    const before = await expectKept();
    const sheet = [
      'Saw,Check,Date,Reading',
      `A-1,Guide bearing clearance,${iso(9, 12).slice(0, 16).replace('T', ' ')},1.12`,
    ];
    const plan = {
      siteId: world.sites.A.id,
      kind: 'checks',
      format: 'csv',
      columns: [
        { header: 'Saw', field: 'saw', unit: null },
        { header: 'Check', field: 'check', unit: null },
        { header: 'Date', field: 'checkedAt', unit: null },
        { header: 'Reading', field: 'reading', unit: 'mm' },
      ],
      decimalMark: '.',
      dateOrder: 'ymd',
    };
    const imported = await siteAdmin
      .post('/api/imports')
      .field('plan', JSON.stringify(plan))
      .attach('file', Buffer.from(sheet.join('\n')), { filename: 'checks.csv', contentType: 'text/csv' });
    expect(imported.status, JSON.stringify(imported.body)).toBe(201);
    expect(imported.body.batch.rowsAdded).toBe(1);
    const withImport = await expectKept();
    expect(withImport).not.toEqual(before);
    await siteAdmin.post(`/api/imports/${imported.body.batch.id}/undo`).expect(200);
    expect(await expectKept()).toEqual(before);
  });

  it('two writers of one saw at once (a blade put on, a check recorded in its time): the second waits, both count', async () => {
    const other = world.saws.A![1]!;
    const at = iso(40);
    const { secondWaited } = await twoWriters(
      (one) =>
        one.query(
          `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, cost_minor, currency)
           SELECT $1, $2, id, $3::timestamptz - interval '1 day', $3::timestamptz + interval '1 day', 'worn_out', 100, 'EUR'
             FROM blade_specs LIMIT 1`,
          [other.siteId, other.id, at],
        ),
      (two) =>
        two.query(
          `INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading,
                                      passed, explanation)
           VALUES ($1, $2, $3, $4, 'guide_clearance', 'length', 1.1, true, 'concurrent writer')`,
          [other.siteId, other.id, checkIds.guide, at],
        ),
    );
    expect(secondWaited).toBe(true);
    await expectKept();
    const [run] = await rows<{ id: string }>(`SELECT id FROM blade_runs WHERE saw_id = :saw`, { saw: other.id });
    expect(await firstOf(run!.id, checkIds.guide)).toBe(at);
  });
});
