/**
 * Benchmark of the maintenance checks' reads at the large customer's size: 60 sites, 1 500 saws, each site's
 * shipped list of six checks plus one of its own, and 300 000 recorded checks (five years). Builds the data with
 * set-based SQL in its own database, then prints how long the due and overdue reads take, and the plan of the
 * per-site overdue list. Figures are printed, never asserted.
 *
 *   PGDATABASE=kerfline_bench_checks npx tsx --conditions=source apps/api/src/db/bench-checks.ts
 */
import { performance } from 'node:perf_hooks';
import { defineAbilityFor, type Principal } from '@kerfline/domain/authz/ability';
import { checkRecordListQuerySchema, dueCheckListQuerySchema } from '@kerfline/domain/site-checks/schema';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';
import { initModels } from './models.js';
import {
  checkCounts,
  listCheckRecords,
  sawChecks,
  siteDueChecks,
} from '../modules/site-checks/check-records.service.js';
import { seedSiteChecks } from '../modules/site-checks/seed-site-checks.js';

const env = loadEnv({
  SESSION_SECRET: 'benchmark-not-a-real-secret',
  PGDATABASE: 'kerfline_bench_checks',
  ...process.env,
});
if (!/_bench/.test(env.PGDATABASE)) throw new Error('Run the benchmark against a database whose name has _bench in it');
const sequelize = createSequelize(databaseUrl(env));
initModels(sequelize);

async function build(): Promise<void> {
  await sequelize.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
  await createMigrator(sequelize).up();
  const t0 = performance.now();
  await sequelize.query(`
    INSERT INTO regions (name) SELECT 'Region ' || g FROM generate_series(1, 6) g;
    INSERT INTO sites (region_id, code, name, time_zone, currency, unit_system)
      SELECT (SELECT id FROM regions ORDER BY name OFFSET (g % 6) LIMIT 1), 'S' || g, 'Site ' || g, 'UTC', 'EUR', 'metric'
        FROM generate_series(1, 60) g;
    -- A third of the saws have a spring-fed head (the head down-force check applies to them).
    INSERT INTO saws (site_id, asset_tag, name, kind, head_feed, wheel_diameter_mm, centre_distance_mm, band_width_mm,
                      band_thickness_mm, band_length_mm, band_speed_min_m_per_min, band_speed_max_m_per_min, created_at)
      SELECT s.id, 'SAW-' || lpad(g::text, 2, '0'), 'Saw ' || g, 'horizontal',
             CASE WHEN g % 3 = 0 THEN 'gravity_spring' ELSE 'hydraulic' END,
             455, 1343, 34, 1.1, 4115, 18, 110, now() - interval '1826 days'
        FROM sites s CROSS JOIN generate_series(1, 25) g;
    INSERT INTO blade_specs (name, width_mm, thickness_mm, length_mm, coarse_tpi, fine_tpi, tooth_form, tooth_set,
                             material, unit_cost_minor, currency)
      VALUES ('Spec 1', 34, 1.1, 4115, 3, 4, 'hook', 'raker', 'bimetal', 6000, 'EUR');
    -- The blade on each saw now, put on up to 3 days ago.
    INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, cost_minor, currency)
      SELECT w.site_id, w.id, (SELECT id FROM blade_specs LIMIT 1),
             now() - (random() * interval '3 days'), 6000, 'EUR'
        FROM saws w;
  `);
  const siteIds = (await sequelize.query('SELECT id FROM sites', { type: 'SELECT' })) as { id: string }[];
  await sequelize.transaction(async (t) => {
    for (const s of siteIds) await seedSiteChecks(s.id, t);
  });
  await sequelize.query(`
    UPDATE site_checks SET created_at = now() - interval '1826 days';
    INSERT INTO site_checks (site_id, name, quantity, target_rule, fixed_target, fixed_max, schedule, interval_days,
                             grace_hours, position, created_at)
      SELECT id, 'Feed cylinder pressure', 'stress', 'fixed', 4, 4.5, 'periodic', 7, 24, 6, now() - interval '1826 days'
        FROM sites;
    -- 200 checks a saw over five years (300 000 in all), spread over the site's checks, one in ten failed.
    INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading, answers,
                               passed, explanation)
      SELECT w.site_id, w.id, c.id, now() - interval '1826 days' + n * interval '9.1 days' + random() * interval '1 day',
             c.target_rule, c.quantity,
             CASE WHEN c.quantity = 'condition' THEN NULL ELSE 1 END,
             CASE WHEN c.quantity = 'condition' THEN '{"reachesGullets":true,"worn":false}'::jsonb END,
             random() > 0.1, 'bench'
        FROM saws w
        CROSS JOIN generate_series(0, 199) n
        JOIN LATERAL (SELECT id, target_rule, quantity FROM site_checks sc
                       WHERE sc.site_id = w.site_id ORDER BY sc.position OFFSET (n % 7) LIMIT 1) c ON true;
    ANALYZE;
  `);
  const [counts] = (await sequelize.query('SELECT count(*) AS n FROM check_records', { type: 'SELECT' })) as {
    n: number;
  }[];
  console.log(`built ${counts!.n} check records in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
}

async function time(label: string, work: () => Promise<unknown>): Promise<void> {
  await work();
  const runs: number[] = [];
  for (let i = 0; i < 5; i++) {
    const t = performance.now();
    await work();
    runs.push(performance.now() - t);
  }
  runs.sort((a, b) => a - b);
  console.log(
    `${label.padEnd(58)} median ${runs[2]!.toFixed(1).padStart(7)} ms   worst ${runs[4]!.toFixed(1).padStart(7)} ms`,
  );
}

if (
  process.argv.includes('--rebuild') ||
  !(await sequelize.getQueryInterface().tableExists('check_records')) ||
  Number(
    ((await sequelize.query('SELECT count(*) AS n FROM check_records', { type: 'SELECT' })) as { n: number }[])[0]!.n,
  ) < 290_000
)
  await build();

const sites = (await sequelize.query('SELECT id, region_id FROM sites ORDER BY code', { type: 'SELECT' })) as {
  id: string;
  region_id: string;
}[];
const site = sites[0]!;
const regionSites = sites.filter((s) => s.region_id === site.region_id).map((s) => s.id);
const [saw] = (await sequelize.query('SELECT id FROM saws WHERE site_id = :id LIMIT 1', {
  replacements: { id: site.id },
  type: 'SELECT',
})) as { id: string }[];
const who = (p: Partial<Principal>) =>
  defineAbilityFor({
    id: '00000000-0000-4000-8000-000000000001',
    role: 'admin',
    siteId: null,
    regionId: null,
    siteIds: 'all',
    regionIds: 'all',
    ...p,
  });
const manager = who({ role: 'manager' });
const lead = who({
  role: 'regional_lead',
  regionId: site.region_id,
  siteIds: regionSites,
  regionIds: [site.region_id],
});
const technician = who({ role: 'technician', siteId: site.id, siteIds: [site.id], regionIds: [site.region_id] });

console.log(`\nreads (each the median of 5 after a warm-up; ${regionSites.length} sites in the lead's region)`);
await time('technician: one saw’s checks with targets and state', () => sawChecks(technician, saw!.id));
await time('technician: the site’s overdue checks, first 50', () =>
  siteDueChecks(technician, site.id, dueCheckListQuerySchema.parse({})),
);
await time('technician: the site’s due and overdue, page 3 of 50', () =>
  siteDueChecks(technician, site.id, dueCheckListQuerySchema.parse({ state: 'pending', offset: 100 })),
);
await time('lead: due and overdue counts of the region’s sites', () => checkCounts(lead));
await time('manager: due and overdue counts of all 60 sites', () => checkCounts(manager));
await time('technician: checks recorded at the site, newest 100', () =>
  listCheckRecords(technician, checkRecordListQuerySchema.parse({})),
);
await time('manager: failed checks of every site, newest 100', () =>
  listCheckRecords(manager, checkRecordListQuerySchema.parse({ passed: 'false' })),
);

const plan = (await sequelize.query(
  `EXPLAIN (ANALYZE, BUFFERS, COSTS OFF)
   SELECT cr.checked_at FROM saws s JOIN site_checks c ON c.site_id = s.site_id AND c.retired_at IS NULL
     LEFT JOIN LATERAL (SELECT checked_at FROM check_records cr WHERE cr.saw_id = s.id AND cr.site_check_id = c.id
                         ORDER BY checked_at DESC, id DESC LIMIT 1) cr ON true
    WHERE s.site_id = :siteId`,
  { replacements: { siteId: site.id }, type: 'SELECT' },
)) as { 'QUERY PLAN': string }[];
console.log('\nplan of the last-record probe for one site:');
for (const line of plan) console.log(`  ${line['QUERY PLAN']}`);
await sequelize.close();
