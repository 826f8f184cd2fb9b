import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import type pg from 'pg';
import type { Sequelize } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { addMonths, type Month } from '@kerfline/domain/fleet/period';
import { signedInAgent, startTestApp, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import { PASSWORD } from '../../apps/api/src/test-support/fixtures.js';
import { FLEET_AS_OF, buildFleetFixture, type FleetFixture } from '../../apps/api/src/test-support/fleet-fixture.js';
import { twoWriters } from '../../apps/api/src/test-support/two-writers.js';
import { abilityFor } from '../../apps/api/src/test-support/abilities.js';
import {
  moneyRows,
  rawFigures,
  type Bucket,
  type Level,
  type RawFigures,
} from '../../apps/api/src/modules/fleet/fleet-figures.js';

/**
 * The per-saw monthly summary (saw_month_runs, saw_month_stops) stands in for the records in every fleet figure
 * of a month that has ended. These tests hold it to the records: after each kind of write (a run put on and
 * taken off, a stop opened, closed and moved, a removal and its putting back, an import and its undo, a site's
 * time zone changed, a saw retired, two writers of one saw at once) the maintained rows equal a rebuild from the
 * records, and every figure read through the summary equals the same figure read from the records alone.
 */
let ctx: TestContext;
let fx: FleetFixture;
let siteAdmin: supertest.Agent;
const abilities: Record<string, AppAbility> = {};

beforeAll(async () => {
  ctx = startTestApp();
  fx = await buildFleetFixture(ctx.sequelize);
  abilities.admin = await abilityFor(fx.world.users.admin.id);
  abilities.siteAdminA = await abilityFor(fx.world.users.siteAdminA.id);
  abilities.leadNorth = await abilityFor(fx.world.users.leadNorth.id);
  siteAdmin = await signedInAgent(ctx.app, 'siteadmin-a@test.example', PASSWORD);
});
afterAll(async () => ctx.close());

/** A float to 6 decimals (a sum's last bits depend on the order PostgreSQL adds in). */
const tidy = (value: unknown): unknown => {
  if (typeof value === 'number') return Math.round(value * 1e6) / 1e6;
  if (Array.isArray(value)) return value.map(tidy);
  if (value && typeof value === 'object')
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, tidy(v)]));
  return value;
};

/**
 * Figures with each number replaced by "within 5e-7 of it": a sum's last bits depend on the order PostgreSQL adds in,
 * and rounding both sides can still split a pair that straddles a rounding boundary.
 */
const near = (value: unknown): unknown => {
  if (typeof value === 'number') return expect.closeTo(value, 6);
  if (Array.isArray(value)) return value.map(near);
  if (value && typeof value === 'object')
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, near(v)]));
  return value;
};

/** Both summary tables, rows in key order and each blade-life list sorted. */
async function summaryRows(sequelize: Sequelize, transaction?: import('sequelize').Transaction) {
  const sorted = (column: string) => `(SELECT coalesce(jsonb_agg(v ORDER BY v), '[]') FROM unnest(u.${column}) v)`;
  const [runs] = await sequelize.query(
    `SELECT to_jsonb(u) - 'life_followed' - 'life_skipped' - 'life_unrecorded'
            || jsonb_build_object('followed', ${sorted('life_followed')}, 'skipped', ${sorted('life_skipped')},
                                  'unrecorded', ${sorted('life_unrecorded')}) AS row
       FROM saw_month_runs u ORDER BY saw_id, month, currency`,
    { transaction },
  );
  const [stops] = await sequelize.query(`SELECT to_jsonb(u) AS row FROM saw_month_stops u ORDER BY saw_id, month`, {
    transaction,
  });
  return tidy({
    runs: runs.map((r) => (r as { row: unknown }).row),
    stops: stops.map((r) => (r as { row: unknown }).row),
  });
}

/**
 * Each site's sorted monthly lists of finished blades (site_month_lives) hold exactly the areas of its saws' months
 * in saw_month_runs, in order. Built here straight from saw_month_runs, not through the triggers' differences.
 */
async function expectSiteListsMatchSummary() {
  const [kept] = await ctx.sequelize.query(
    `SELECT site_id, to_char(month, 'YYYY-MM') AS month, lives, followed, skipped
       FROM site_month_lives WHERE cardinality(lives) > 0 ORDER BY site_id, month`,
  );
  const [built] = await ctx.sequelize.query(
    `SELECT site_id, to_char(month, 'YYYY-MM') AS month, array_agg(v ORDER BY v) AS lives,
            coalesce(array_agg(v ORDER BY v) FILTER (WHERE k = 1), '{}') AS followed,
            coalesce(array_agg(v ORDER BY v) FILTER (WHERE k = 2), '{}') AS skipped
       FROM (SELECT site_id, month, unnest(life_followed) AS v, 1 AS k FROM saw_month_runs
             UNION ALL SELECT site_id, month, unnest(life_skipped), 2 FROM saw_month_runs
             UNION ALL SELECT site_id, month, unnest(life_unrecorded), 3 FROM saw_month_runs) x
      GROUP BY site_id, month ORDER BY site_id, month`,
  );
  expect(kept).toEqual(built);
  return kept;
}

/**
 * The per-site sums (site_month_runs, site_month_stops) equal the per-saw summary summed afresh, column by column,
 * leaving out site-months whose rows are all zero (kept once their saws' rows are gone).
 */
async function expectSiteSumsMatchSummary() {
  for (const [site, saw, keys] of [
    ['site_month_runs', 'saw_month_runs', 'site_id, month, currency'],
    ['site_month_stops', 'saw_month_stops', 'site_id, month'],
  ] as const) {
    const [columns] = (await ctx.sequelize.query(
      `SELECT array_agg(column_name::text ORDER BY ordinal_position) AS names FROM information_schema.columns
        WHERE table_name = '${site}' AND column_name NOT IN ('site_id', 'month', 'currency')`,
    )) as [{ names: string[] }[], unknown];
    const names = columns[0]!.names;
    const row = (alias: string) =>
      `jsonb_build_object(${names.map((c) => `'${c}', round(${alias}.${c}::numeric, 6)`).join(', ')})`;
    const [kept] = await ctx.sequelize.query(
      `SELECT ${keys}, ${row('t')} AS sums FROM ${site} t
        WHERE ${names.map((c) => `t.${c} <> 0`).join(' OR ')} ORDER BY ${keys}`,
    );
    const [built] = await ctx.sequelize.query(
      `SELECT ${keys}, ${row('t')} AS sums
         FROM (SELECT ${keys}, ${names.map((c) => `sum(${c}::numeric) AS ${c}`).join(', ')} FROM ${saw} GROUP BY ${keys}) t
        WHERE ${names.map((c) => `t.${c} <> 0`).join(' OR ')} ORDER BY ${keys}`,
    );
    expect(kept, site).toEqual(built);
  }
}

/** The maintained summary equals what `rollup_rebuild()` makes of the records (rebuilt in a rolled-back transaction). */
async function expectSummaryMatchesRecords() {
  await expectSiteListsMatchSummary();
  await expectSiteSumsMatchSummary();
  const maintained = await summaryRows(ctx.sequelize);
  const t = await ctx.sequelize.transaction();
  try {
    await ctx.sequelize.query('SELECT rollup_rebuild()', { transaction: t });
    expect(maintained).toEqual(await summaryRows(ctx.sequelize, t));
  } finally {
    await t.rollback();
  }
  return maintained as { runs: unknown[]; stops: unknown[] };
}

const months = (from: Month, to: Month): Month[] => {
  const out: Month[] = [];
  for (let m = from; m <= to; m = addMonths(m, 1)) out.push(m);
  return out;
};

/** Every figure of every level, month by month and over the whole span, read through the summary and without it. */
async function expectFiguresAgree(who: string, asOf: Date, from: Month = '2025-01', to: Month = '2026-12') {
  const siteIds = Object.values(fx.world.sites).map((s) => s.id);
  const buckets: Bucket[] = [...months(from, to).map((m) => ({ key: m, from: m, to: m })), { key: 'all', from, to }];
  const scope = { ability: abilities[who]!, siteIds, asOf };
  for (const level of ['fleet', 'site', 'saw'] as Level[]) {
    const sortRows = <T extends { groupId: string }>(rows: T[], key: (r: T) => string) =>
      [...rows].sort((a, b) => key(a).localeCompare(key(b)));
    const [viaSummary, fromRecords] = await Promise.all([
      rawFigures(ctx.sequelize, level, scope, buckets, { breakInMedians: true }),
      rawFigures(ctx.sequelize, level, scope, buckets, { summary: false, breakInMedians: true }),
    ]);
    const figureKey = (r: { groupId: string; bucket: string }) => `${r.groupId}|${r.bucket}`;
    expect(sortRows(viaSummary, figureKey), `${who} ${level}`).toEqual(near(sortRows(fromRecords, figureKey)));
    // Without the break-in split (the outlier review's way) every other figure is the same, and the split is empty.
    const unsplit = (r: RawFigures): RawFigures => ({
      ...r,
      lifeFollowed: { blades: 0, medianMm2: null },
      lifeSkipped: { blades: 0, medianMm2: null },
    });
    const plain = await rawFigures(ctx.sequelize, level, scope, buckets);
    expect(sortRows(plain, figureKey), `${who} ${level} without the split`).toEqual(
      near(sortRows(viaSummary.map(unsplit), figureKey)),
    );
    expect(
      viaSummary.some((r) => r.bladesUsed > 0 || r.downtimeHours > 0),
      `${who} ${level} has figures`,
    ).toBe(true);
    const [moneyVia, moneyFrom] = await Promise.all([
      moneyRows(ctx.sequelize, level, scope, from, to),
      moneyRows(ctx.sequelize, level, scope, from, to, { summary: false }),
    ]);
    const moneyKey = (r: { groupId: string; month: string; currency: string; kind: string }) =>
      `${r.groupId}|${r.month}|${r.currency}|${r.kind}`;
    expect(sortRows(moneyVia, moneyKey), `${who} ${level} money`).toEqual(sortRows(moneyFrom, moneyKey));
  }
}

async function expectAllAgree() {
  await expectSummaryMatchesRecords();
  // Mid-June 2026: June is read from the records, the months before from the summary; and today, all summed.
  for (const asOf of [FLEET_AS_OF, new Date()]) {
    await expectFiguresAgree('admin', asOf);
    await expectFiguresAgree('siteAdminA', asOf);
    await expectFiguresAgree('leadNorth', asOf);
  }
}

const sql = (text: string, bind: unknown[] = []) => ctx.sequelize.query(text, { bind });

describe('the monthly summary stays equal to the records', () => {
  it('holds on the fixture as built, and every figure read through it equals the records', async () => {
    const summary = await expectSummaryMatchesRecords();
    expect(summary.runs.length).toBeGreaterThan(3);
    expect(summary.stops.length).toBeGreaterThan(3);
    await expectAllAgree();
  });

  it('follows runs and stops written, changed and deleted, in ended and running months', async () => {
    const a1 = fx.saws.a1;
    // A run over a month end with its area, one still on, one whose removal is corrected into the next month.
    await sql(
      `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, area_cut_mm2,
                               cuts, cost_minor, currency, break_in_followed, material_group)
       SELECT site_id, saw_id, blade_spec_id, t.a, t.b, t.reason, t.area, 100, 4200, currency, t.bi, 'stainless_steel'
         FROM (SELECT * FROM blade_runs WHERE saw_id = $1 LIMIT 1) r,
              (VALUES ('2025-05-30T10:00:00Z'::timestamptz, '2025-06-02T10:00:00Z'::timestamptz, 'broken', 777.5::float8, true),
                      ('2025-07-01T10:00:00Z', '2025-07-03T10:00:00Z', 'worn_out', NULL, false)) AS t(a, b, reason, area, bi)`,
      [a1.id],
    );
    await expectSummaryMatchesRecords();
    await sql(
      `UPDATE blade_runs SET removed_at = '2025-08-01T10:00:00Z', area_cut_mm2 = 50 WHERE saw_id = $1
                AND installed_at = '2025-07-01T10:00:00Z'`,
      [a1.id],
    );
    await expectSummaryMatchesRecords();
    // A stop over three month ends, then shortened; an open stop; another closed; one deleted.
    await sql(
      `INSERT INTO stops (site_id, saw_id, started_at, ended_at, category, planned)
       VALUES ($1, $2, '2025-09-28T00:00:00Z', '2025-12-02T00:00:00Z', 'mechanical', false)`,
      [a1.siteId, a1.id],
    );
    await expectSummaryMatchesRecords();
    await sql(
      `UPDATE stops SET ended_at = '2025-10-15T00:00:00Z' WHERE saw_id = $1 AND started_at = '2025-09-28T00:00:00Z'`,
      [a1.id],
    );
    await sql(`DELETE FROM stops WHERE saw_id = $1 AND ended_at IS NULL`, [fx.saws.c1.id]);
    await sql(
      `INSERT INTO stops (site_id, saw_id, started_at, ended_at, category, planned)
       VALUES ($1, $2, '2025-11-20T00:00:00Z', NULL, 'hydraulic', false)`,
      [fx.saws.c1.siteId, fx.saws.c1.id],
    );
    await expectAllAgree();
    await sql(`UPDATE stops SET ended_at = '2026-01-04T06:00:00Z' WHERE saw_id = $1 AND ended_at IS NULL`, [
      fx.saws.c1.id,
    ]);
    await sql(`DELETE FROM blade_runs WHERE saw_id = $1 AND installed_at = '2025-05-30T10:00:00Z'`, [a1.id]);
    await expectAllAgree();
  });

  it('reads medians from the sorted lists exactly as from every blade, with ties and even counts', async () => {
    // Two months of one site where a middle value repeats across months and each count is even, so the middle
    // ranks land on the bounds themselves and between lists.
    const areas: [string, number][] = [
      ['2024-09-03T08:00:00Z', 500],
      ['2024-09-10T08:00:00Z', 500],
      ['2024-09-17T08:00:00Z', 500],
      ['2024-09-24T08:00:00Z', 700],
      ['2024-10-02T08:00:00Z', 300],
      ['2024-10-09T08:00:00Z', 500],
      ['2024-10-16T08:00:00Z', 900],
      ['2024-10-23T08:00:00Z', 900],
      ['2024-11-05T08:00:00Z', 1],
    ];
    for (const [at, area] of areas)
      await sql(
        `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, area_cut_mm2,
                                 cost_minor, currency, break_in_followed)
         SELECT site_id, saw_id, blade_spec_id, $2::timestamptz - interval '2 days', $2::timestamptz, 'worn_out', $3::float8, 100,
                currency, $3::float8 > 400
           FROM blade_runs WHERE saw_id = $1 LIMIT 1`,
        [fx.saws.c1.id, at, area],
      );
    await expectSummaryMatchesRecords();
    await expectFiguresAgree('admin', new Date(), '2024-09', '2024-11');
    // By hand: September 500, 500, 500, 700 → 500; October 300, 500, 900, 900 → 700; the three months together
    // 1, 300, 500, 500, 500, 500, 700, 900, 900 → 500; break-in followed (areas over 400) in October 500, 900, 900 → 900.
    const site = fx.world.sites.C!.id;
    const figures = await rawFigures(
      ctx.sequelize,
      'site',
      { ability: abilities.admin!, siteIds: [site], asOf: new Date() },
      [
        { key: 'sep', from: '2024-09', to: '2024-09' },
        { key: 'oct', from: '2024-10', to: '2024-10' },
        { key: 'all', from: '2024-09', to: '2024-11' },
      ],
      { breakInMedians: true },
    );
    const of = (key: string) => figures.find((f) => f.bucket === key)!;
    expect([of('sep').medianLifeMm2, of('oct').medianLifeMm2, of('all').medianLifeMm2]).toEqual([500, 700, 500]);
    expect(of('oct').lifeFollowed).toEqual({ blades: 3, medianMm2: 900 });
  });

  it('follows a removal and its putting back, and an import and its undo', async () => {
    const before = await expectSummaryMatchesRecords();
    await siteAdmin.delete(`/api/blade-runs/${fx.runs.R2.id}`).send({ reason: 'Entered on the wrong saw' }).expect(204);
    await siteAdmin.delete(`/api/stops/${fx.stops.S2.id}`).send({ reason: 'Logged twice' }).expect(204);
    expect(await expectSummaryMatchesRecords()).not.toEqual(before);
    await expectFiguresAgree('admin', new Date());
    const kept = (await siteAdmin.get('/api/removed-records').expect(200)).body.items as { id: string }[];
    for (const record of kept) await siteAdmin.post(`/api/removed-records/${record.id}/restore`).send({}).expect(200);
    expect(await expectSummaryMatchesRecords()).toEqual(before);

    const log = [
      'Saw,Blade,Put on,Taken off,Why,Area (mm2),Cuts',
      'A-1,Fixture 34x1.1 3/4,2024-02-03 07:00,2024-03-10 15:00,worn,912000,702',
      'A-1,Fixture 34x1.1 3/4,2024-03-10 15:30,2024-04-13 11:00,cracked,523050,410',
      'A-2,Fixture 34x1.1 3/4,2024-01-04 06:00,2024-03-05 14:00,snapped,880000,655',
    ].join('\r\n');
    const plan = {
      siteId: fx.world.sites.A.id,
      kind: 'blade_runs',
      format: 'csv',
      encoding: null,
      delimiter: null,
      sheet: null,
      columns: [
        { header: 'Saw', field: 'saw', unit: null },
        { header: 'Blade', field: 'spec', unit: null },
        { header: 'Put on', field: 'installedAt', unit: null },
        { header: 'Taken off', field: 'removedAt', unit: null },
        { header: 'Why', field: 'reason', unit: null },
        { header: 'Area (mm2)', field: 'areaCutMm2', unit: 'mm2' },
        { header: 'Cuts', field: 'cuts', unit: null },
      ],
      decimalMark: '.',
      dateOrder: 'ymd',
      values: { reason: { snapped: 'broken', cracked: 'fatigue_crack' } },
    };
    const imported = await siteAdmin
      .post('/api/imports')
      .field('plan', JSON.stringify(plan))
      .attach('file', Buffer.from(log), { filename: 'log.csv', contentType: 'text/csv' });
    expect(imported.status, JSON.stringify(imported.body)).toBe(201);
    expect(imported.body.batch.rowsAdded).toBe(3);
    const withImport = await expectSummaryMatchesRecords();
    expect(withImport.runs.length).toBeGreaterThan(before.runs.length);
    await expectFiguresAgree('admin', new Date(), '2024-01', '2026-12');
    await siteAdmin.post(`/api/imports/${imported.body.batch.id}/undo`).expect(200);
    expect(await expectSummaryMatchesRecords()).toEqual(before);
  });

  it('moves the month boundaries with a site’s time zone, and clips stops at a saw’s retirement', async () => {
    await sql(`UPDATE sites SET time_zone = 'America/Chicago' WHERE id = $1`, [fx.world.sites.A.id]);
    await expectAllAgree();
    await sql(`UPDATE sites SET time_zone = 'Europe/Berlin' WHERE id = $1`, [fx.world.sites.A.id]);
    // Retired mid-way through its blade-failure stop of 10 March: the stop's hours end at the retirement.
    await sql(`UPDATE saws SET status = 'retired', retired_at = '2026-03-10T09:00:00Z' WHERE id = $1`, [fx.saws.a1.id]);
    await expectAllAgree();
    await sql(`UPDATE saws SET status = 'in_service', retired_at = NULL WHERE id = $1`, [fx.saws.a1.id]);
    await expectAllAgree();
  });

  it('two writers of one saw in one month at once: the second waits, and the summary counts both', async () => {
    const a2 = fx.saws.a2;
    const [before] = (await ctx.sequelize.query(
      `SELECT coalesce(sum(blades_used), 0)::int AS n FROM saw_month_runs WHERE saw_id = $1 AND month = '2023-05-01'`,
      { bind: [a2.id], type: 'SELECT' as never },
    )) as unknown as { n: number }[];
    const insert = (client: pg.Client, at: string) =>
      client.query(
        `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, area_cut_mm2,
                                 cost_minor, currency)
         SELECT site_id, saw_id, blade_spec_id, $2::timestamptz, $2::timestamptz + interval '1 day', 'worn_out', 1000,
                100, currency
           FROM blade_runs WHERE saw_id = $1 LIMIT 1`,
        [a2.id, at],
      );
    const { secondWaited } = await twoWriters(
      (one) => insert(one, '2023-05-03T08:00:00Z'),
      (two) => insert(two, '2023-05-20T08:00:00Z'),
    );
    expect(secondWaited).toBe(true);
    const [after] = (await ctx.sequelize.query(
      `SELECT sum(blades_used)::int AS n FROM saw_month_runs WHERE saw_id = $1 AND month = '2023-05-01'`,
      { bind: [a2.id], type: 'SELECT' as never },
    )) as unknown as { n: number }[];
    expect(after!.n).toBe(before!.n + 2);
    await expectSummaryMatchesRecords();
  });

  it('two writers at one site in one month, on different saws: both blades are in the site’s sorted list', async () => {
    const listOf = async () => {
      const [row] = (await ctx.sequelize.query(
        `SELECT coalesce((SELECT lives FROM site_month_lives WHERE site_id = $1 AND month = '2023-06-01'), '{}') AS lives`,
        { bind: [fx.world.sites.A.id], type: 'SELECT' as never },
      )) as unknown as { lives: number[] }[];
      return row!.lives;
    };
    const before = await listOf();
    const insert = (client: pg.Client, sawId: string, at: string, area: number) =>
      client.query(
        `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, area_cut_mm2,
                                 cost_minor, currency)
         SELECT site_id, saw_id, blade_spec_id, $2::timestamptz, $2::timestamptz + interval '1 day', 'worn_out', $3,
                100, currency
           FROM blade_runs WHERE saw_id = $1 LIMIT 1`,
        [sawId, at, area],
      );
    // The second saw's own summary row is free; the site's list for June waits for the first writer.
    await twoWriters(
      (one) => insert(one, fx.saws.a1.id, '2023-06-05T08:00:00Z', 4321),
      (two) => insert(two, fx.saws.a2.id, '2023-06-12T08:00:00Z', 1234),
    );
    expect(await listOf()).toEqual([...before, 1234, 4321].sort((a, b) => a - b));
    await expectSummaryMatchesRecords();
  });
});
