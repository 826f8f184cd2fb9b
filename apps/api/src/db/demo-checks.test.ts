import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestApp, resetData, type TestContext } from '../test-support/test-db.js';
import { initModels } from './models.js';
import { loadDemoScenario } from './demo-scenario.js';
import { DEMO_REFERENCE_DATE } from './demo-history.js';
import { statusRows } from '../modules/site-checks/check-status.js';

let ctx: TestContext;
const rows = <T extends object>(sql: string) => ctx.sequelize.query<T>(sql, { type: QueryTypes.SELECT });

beforeAll(async () => {
  ctx = startTestApp();
  initModels(ctx.sequelize);
  await resetData(ctx.sequelize);
  await loadDemoScenario(ctx.sequelize);
}, 120_000);
afterAll(async () => ctx.close());

describe('the demo’s maintenance checks', () => {
  it('spans two years before the reference date, mostly passing, every check inside its saw’s records', async () => {
    const [span] = await rows<{ n: number; first: Date; last: Date; passed: number; outside: number }>(
      `SELECT count(*)::int AS n, min(checked_at) AS first, max(checked_at) AS last,
              avg(CASE WHEN passed THEN 1.0 ELSE 0 END)::float AS passed,
              count(*) FILTER (WHERE r.id IS NOT NULL AND (cr.checked_at < r.installed_at
                               OR (r.removed_at IS NOT NULL AND cr.checked_at >= r.removed_at)))::int AS outside
         FROM check_records cr LEFT JOIN blade_runs r ON r.id = cr.blade_run_id`,
    );
    expect(span!.n).toBeGreaterThan(10000);
    expect((DEMO_REFERENCE_DATE.getTime() - span!.first.getTime()) / 86_400_000).toBeGreaterThan(700);
    expect(span!.last.getTime()).toBeLessThan(DEMO_REFERENCE_DATE.getTime());
    expect(span!.passed).toBeGreaterThan(0.9);
    expect(span!.outside).toBe(0);
    // Hammerfield's own fixed check is on its list and recorded.
    const [own] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM check_records cr JOIN site_checks c ON c.id = cr.site_check_id
        WHERE c.target_rule = 'fixed' AND c.name = 'Feed cylinder pressure'`,
    );
    expect(own!.n).toBeGreaterThan(50);
  });

  it('has Riverbend late with its blade-change checks, and the blade eaters failing guide checks', async () => {
    const late = await rows<{ code: string; late: number }>(
      `SELECT t.code, avg(CASE WHEN cr.checked_at > r.installed_at + interval '8 hours' THEN 1.0 ELSE 0 END)::float AS late
         FROM check_records cr JOIN blade_runs r ON r.id = cr.blade_run_id JOIN sites t ON t.id = cr.site_id
         JOIN site_checks c ON c.id = cr.site_check_id
        WHERE c.schedule = 'blade_change' GROUP BY t.code`,
    );
    for (const { code, late: share } of late) {
      if (code === 'CV-DBN') expect(share, code).toBeGreaterThan(0.25);
      else expect(share, code).toBeLessThan(0.08);
    }
    const guide = await rows<{ asset_tag: string; failed: number }>(
      `SELECT s.asset_tag, count(*) FILTER (WHERE NOT cr.passed)::int AS failed
         FROM check_records cr JOIN saws s ON s.id = cr.saw_id
        WHERE cr.target_rule = 'guide_clearance' GROUP BY s.asset_tag`,
    );
    const failedOf = (tag: string) => guide.find((g) => g.asset_tag === tag)?.failed ?? 0;
    const others = guide.filter((g) => !['RTM-S02', 'MTY-S01', 'HOU-S04'].includes(g.asset_tag)).map((g) => g.failed);
    for (const eater of ['RTM-S02', 'MTY-S01', 'HOU-S04'])
      expect(failedOf(eater), eater).toBeGreaterThan(Math.max(...others));
    // The over-tensioned saw's tension readings fail the bi-metal range.
    const [tension] = await rows<{ failed: number }>(
      `SELECT avg(CASE WHEN cr.passed THEN 0 ELSE 1.0 END)::float AS failed FROM check_records cr
         JOIN saws s ON s.id = cr.saw_id WHERE s.asset_tag = 'HOU-S04' AND cr.target_rule = 'band_tension'`,
    );
    expect(tension!.failed).toBeGreaterThan(0.9);
  });

  it('leaves a few checks due and a few overdue at the reference date, the most overdue at Riverbend', async () => {
    const sites = await rows<{ id: string; code: string }>('SELECT id, code FROM sites');
    const status = await statusRows({ siteIds: sites.map((s) => s.id), asOf: DEMO_REFERENCE_DATE });
    const due = status.filter((s) => s.state === 'due');
    const overdue = status.filter((s) => s.state === 'overdue');
    expect(due.length).toBeGreaterThan(0);
    expect(overdue.length).toBeGreaterThan(0);
    expect(overdue.length).toBeLessThan(status.length / 4);
    const code = new Map(sites.map((s) => [s.id, s.code]));
    const bySite = new Map<string, number>();
    for (const o of overdue) bySite.set(code.get(o.site_id)!, (bySite.get(code.get(o.site_id)!) ?? 0) + 1);
    const worst = [...bySite.entries()].sort((a, b) => b[1] - a[1])[0]![0];
    expect(worst).toBe('CV-DBN');
  });
});
