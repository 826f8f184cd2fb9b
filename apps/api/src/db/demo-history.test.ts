import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestApp, resetData, type TestContext } from '../test-support/test-db.js';
import { initModels } from './models.js';
import { loadDemoScenario } from './demo-scenario.js';
import { DEMO_REFERENCE_DATE } from './demo-history.js';

let ctx: TestContext;
const rows = <T extends object>(sql: string) => ctx.sequelize.query<T>(sql, { type: QueryTypes.SELECT });
const one = async <T extends object>(sql: string) => (await rows<T>(sql))[0]!;

/** A fingerprint of the whole history, to show two loads give the same records. */
const FINGERPRINT = `SELECT md5(string_agg(x, ',' ORDER BY x)) AS f FROM (
  SELECT concat_ws('|', s.asset_tag, r.installed_at, r.removed_at, r.removal_reason, r.cost_minor) AS x
    FROM blade_runs r JOIN saws s ON s.id = r.saw_id
  UNION ALL SELECT concat_ws('|', s.asset_tag, st.started_at, st.ended_at, st.category) FROM stops st JOIN saws s ON s.id = st.saw_id
  UNION ALL SELECT concat_ws('|', c.cut_at, c.area_cut_mm2, c.teeth_in_work_min) FROM cut_logs c
  UNION ALL SELECT concat_ws('|', r.received_on, r.quantity, r.unit_cost_minor) FROM stock_receipts r
  UNION ALL SELECT concat_ws('|', s.asset_tag, k.checked_at, k.reading, k.passed) FROM check_records k
    JOIN saws s ON s.id = k.saw_id) all_rows`;

beforeAll(async () => {
  ctx = startTestApp();
  initModels(ctx.sequelize);
  await resetData(ctx.sequelize);
  await loadDemoScenario(ctx.sequelize);
}, 120_000);
afterAll(async () => ctx.close());

describe('the demo history', () => {
  it('covers about two years for every saw, all before the reference date, with a blade on every working saw', async () => {
    const span = await one<{ first: Date; last: Date; runs: number; stops: number; logs: number; receipts: number }>(
      `SELECT min(installed_at) AS first, greatest(max(installed_at), max(removed_at)) AS last, count(*)::int AS runs,
              (SELECT count(*)::int FROM stops) AS stops, (SELECT count(*)::int FROM cut_logs) AS logs,
              (SELECT count(*)::int FROM stock_receipts) AS receipts FROM blade_runs`,
    );
    expect((DEMO_REFERENCE_DATE.getTime() - span.first.getTime()) / 86_400_000).toBeGreaterThan(725);
    expect(span.last.getTime()).toBeLessThanOrEqual(DEMO_REFERENCE_DATE.getTime());
    expect(span.runs).toBeGreaterThan(3000);
    expect(span.stops).toBeGreaterThan(3000);
    expect(span.logs).toBeGreaterThan(2000);
    expect(span.receipts).toBeGreaterThan(100);
    const open = await one<{ working: number; withBlade: number; retiredWithBlade: number }>(
      `SELECT count(*) FILTER (WHERE s.status = 'in_service')::int AS working,
              count(*) FILTER (WHERE s.status = 'in_service' AND r.id IS NOT NULL)::int AS "withBlade",
              count(*) FILTER (WHERE s.status = 'retired' AND r.id IS NOT NULL)::int AS "retiredWithBlade"
         FROM saws s LEFT JOIN blade_runs r ON r.saw_id = s.id AND r.removed_at IS NULL`,
    );
    expect(open.withBlade).toBe(open.working);
    expect(open.retiredWithBlade).toBe(0);
  });

  it('has two saws down now, through open stops', async () => {
    const down = await rows<{ asset_tag: string; category: string }>(
      `SELECT s.asset_tag, st.category FROM stops st JOIN saws s ON s.id = st.saw_id WHERE st.ended_at IS NULL ORDER BY 1`,
    );
    expect(down).toEqual([
      { asset_tag: 'HAM-S03', category: 'hydraulic' },
      { asset_tag: 'RTM-S04', category: 'mechanical' },
    ]);
  });

  it('has saws that eat blades: each uses more than 1.5 times the blades of any other saw of its size at its site', async () => {
    const counts = await rows<{ asset_tag: string; width: number; runs: number }>(
      `SELECT s.asset_tag, s.band_width_mm AS width, count(*)::int AS runs FROM blade_runs r JOIN saws s ON s.id = r.saw_id
        WHERE s.status = 'in_service' GROUP BY s.asset_tag, s.band_width_mm`,
    );
    for (const eater of ['RTM-S02', 'MTY-S01', 'HOU-S04']) {
      const me = counts.find((c) => c.asset_tag === eater)!;
      const peers = counts
        .filter((c) => c.asset_tag.slice(0, 3) === eater.slice(0, 3) && c.width === me.width && c.asset_tag !== eater)
        .map((c) => c.runs);
      expect(peers.length, eater).toBeGreaterThan(0);
      expect(me.runs / Math.max(...peers), eater).toBeGreaterThan(1.5);
    }
  });

  it('has one site that skips break-in and one whose breakdowns last long', async () => {
    const breakIn = await rows<{ code: string; share: number }>(
      `SELECT t.code, avg(CASE WHEN r.break_in_followed THEN 1.0 ELSE 0 END)::float AS share
         FROM blade_runs r JOIN sites t ON t.id = r.site_id WHERE r.break_in_followed IS NOT NULL GROUP BY t.code`,
    );
    for (const { code, share } of breakIn) {
      if (code === 'CV-DBN') expect(share).toBeLessThan(0.5);
      else expect(share, code).toBeGreaterThan(0.85);
    }
    const hours = await rows<{ code: string; hours: number }>(
      `SELECT t.code, avg(extract(epoch FROM (st.ended_at - st.started_at)) / 3600)::float AS hours
         FROM stops st JOIN sites t ON t.id = st.site_id
        WHERE st.category IN ('mechanical', 'hydraulic', 'electrical') AND st.ended_at IS NOT NULL GROUP BY t.code`,
    );
    const hou = hours.find((h) => h.code === 'CV-HOU')!.hours;
    for (const h of hours.filter((x) => x.code !== 'CV-HOU')) expect(hou / h.hours, h.code).toBeGreaterThan(3);
  });

  it('keeps the records consistent: stock never over-drawn, cut logs inside their runs, logs only where a site keeps them', async () => {
    const overdrawn = await one<{ n: number }>(
      `SELECT count(*)::int AS n FROM stock_receipts r
        WHERE r.quantity < (SELECT count(*) FROM blade_runs b WHERE b.stock_receipt_id = r.id)`,
    );
    expect(overdrawn.n).toBe(0);
    const outside = await one<{ n: number }>(
      `SELECT count(*)::int AS n FROM cut_logs c JOIN blade_runs r ON r.id = c.blade_run_id
        WHERE c.cut_at < r.installed_at OR (r.removed_at IS NOT NULL AND c.cut_at >= r.removed_at)`,
    );
    expect(outside.n).toBe(0);
    const sites = await rows<{ code: string }>(
      `SELECT DISTINCT t.code FROM cut_logs c JOIN sites t ON t.id = c.site_id ORDER BY 1`,
    );
    expect(sites.map((s) => s.code)).toEqual(['CV-MTY', 'CV-RTM']);
  });

  it('loads the same history every time (seeded generator, fixed reference date)', async () => {
    const first = await one<{ f: string }>(FINGERPRINT);
    await resetData(ctx.sequelize);
    await loadDemoScenario(ctx.sequelize);
    expect((await one<{ f: string }>(FINGERPRINT)).f).toBe(first.f);
  }, 60_000);
});
