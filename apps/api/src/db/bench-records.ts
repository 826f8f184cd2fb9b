/**
 * Benchmark of the records' reads at the large customer's size: 60 sites, 1 500 saws, 750 000 blade runs and
 * 1 000 000 stops (five years). Builds the data with set-based SQL in its own database, then prints how long
 * the API's list, saw and stock reads take for each kind of user. Figures are printed, never asserted.
 *
 *   PGDATABASE=kerfline_bench npx tsx --conditions=source apps/api/src/db/bench-records.ts
 */
import { performance } from 'node:perf_hooks';
import { defineAbilityFor, type Principal } from '@kerfline/domain/authz/ability';
import { bladeRunListQuerySchema } from '@kerfline/domain/blade-runs/schema';
import { stopListQuerySchema } from '@kerfline/domain/stops/schema';
import { sawListQuerySchema } from '@kerfline/domain/saws/schema';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';
import { initModels } from './models.js';
import { listBladeRuns } from '../modules/blade-runs/blade-runs.service.js';
import { listStops } from '../modules/stops/stops.service.js';
import { listSaws } from '../modules/saws/saws.service.js';
import { getSiteStock } from '../modules/blade-stock/blade-stock.service.js';
import { listSiteSummaries } from '../modules/site-summaries/site-summaries.service.js';
import { getSawTimeline } from '../modules/saw-timeline/saw-timeline.service.js';
import { sawTimelineQuerySchema } from '@kerfline/domain/saw-timeline/schema';

const env = loadEnv({ SESSION_SECRET: 'benchmark-not-a-real-secret', PGDATABASE: 'kerfline_bench', ...process.env });
if (!env.PGDATABASE.endsWith('_bench'))
  throw new Error('Run the benchmark against a database whose name ends in _bench');
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
    INSERT INTO saws (site_id, asset_tag, name, kind, wheel_diameter_mm, centre_distance_mm, band_width_mm,
                      band_thickness_mm, band_length_mm, band_speed_min_m_per_min, band_speed_max_m_per_min)
      SELECT s.id, 'SAW-' || g, 'Saw ' || g, 'horizontal', 455, 1343, 34, 1.1, 4115, 18, 110
        FROM sites s CROSS JOIN generate_series(1, 25) g;
    INSERT INTO blade_specs (name, width_mm, thickness_mm, length_mm, coarse_tpi, fine_tpi, tooth_form, tooth_set,
                             material, unit_cost_minor, currency)
      SELECT 'Spec ' || g, 34, 1.1, 4115, 3, 4, 'hook', 'raker', 'bimetal', 6000, 'EUR' FROM generate_series(1, 4) g;
  `);
  // 500 runs a saw, 3.5 days apart over five years, the last one still on; 667 one-hour stops a saw.
  await sequelize.query(`
    INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, cost_minor, currency, removed_at,
                            removal_reason, area_cut_mm2)
      SELECT w.site_id, w.id, (SELECT id FROM blade_specs ORDER BY name OFFSET (n % 4) LIMIT 1),
             now() - interval '1750 days' + n * interval '3.5 days', 6000, 'EUR',
             CASE WHEN n < 499 THEN now() - interval '1750 days' + n * interval '3.5 days' + interval '3.4 days' END,
             CASE WHEN n < 499 THEN (ARRAY['worn_out', 'broken', 'tooth_strippage'])[1 + n % 3] END, 3.5e6
        FROM saws w CROSS JOIN generate_series(0, 499) n;
    INSERT INTO stops (site_id, saw_id, started_at, ended_at, category, planned)
      SELECT w.site_id, w.id, now() - interval '1825 days' + n * interval '65 hours' + interval '1 hour',
             now() - interval '1825 days' + n * interval '65 hours' + interval '2 hours',
             (ARRAY['mechanical', 'hydraulic', 'blade_change', 'other'])[1 + n % 4], n % 4 = 2
        FROM saws w CROSS JOIN generate_series(0, 666) n;
    ANALYZE;
  `);
  const [counts] = (await sequelize.query(
    `SELECT (SELECT count(*) FROM blade_runs) AS runs, (SELECT count(*) FROM stops) AS stops`,
    { type: 'SELECT' },
  )) as { runs: number; stops: number }[];
  console.log(
    `built ${counts!.runs} blade runs and ${counts!.stops} stops in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
  );
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
  !(await sequelize.getQueryInterface().tableExists('blade_runs')) ||
  Number(
    ((await sequelize.query('SELECT count(*) AS n FROM blade_runs', { type: 'SELECT' })) as { n: number }[])[0]!.n,
  ) < 700_000
)
  await build();

const sites = (await sequelize.query('SELECT id, region_id FROM sites ORDER BY code', { type: 'SELECT' })) as {
  id: string;
  region_id: string;
}[];
const site = sites[0]!;
const regionSites = sites.filter((s) => s.region_id === site.region_id).map((s) => s.id);
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
await time('technician: blade runs of the site, newest 100', () =>
  listBladeRuns(technician, bladeRunListQuerySchema.parse({})),
);
await time('technician: blade runs, page 50 of 100', () =>
  listBladeRuns(technician, bladeRunListQuerySchema.parse({ offset: 4900 })),
);
await time('lead: blade runs of the region, broken, newest 100', () =>
  listBladeRuns(lead, bladeRunListQuerySchema.parse({ reason: 'broken' })),
);
await time('manager: blade runs of every site, last 30 days', () =>
  listBladeRuns(manager, bladeRunListQuerySchema.parse({ from: new Date(Date.now() - 30 * 86_400_000).toISOString() })),
);
await time('technician: stops of the site, newest 100', () => listStops(technician, stopListQuerySchema.parse({})));
await time('lead: mechanical stops of the region, newest 100', () =>
  listStops(lead, stopListQuerySchema.parse({ category: 'mechanical' })),
);
await time('manager: saws of every site with down and blade on, 100', () =>
  listSaws(manager, sawListQuerySchema.parse({})),
);
await time('manager: saws down now', () => listSaws(manager, sawListQuerySchema.parse({ status: 'down' })));
await time('technician: the site’s blade stock', () => getSiteStock(technician, site.id, { windowDays: 90 }));
await time('manager: tiles of every site (saws down, stock left)', () =>
  listSiteSummaries(manager, { includeRetired: false }),
);
const [busySaw] = (await sequelize.query(
  'SELECT saw_id AS id FROM blade_runs WHERE site_id = :siteId GROUP BY saw_id ORDER BY count(*) DESC LIMIT 1',
  { type: 'SELECT', replacements: { siteId: site.id } },
)) as { id: string }[];
await time('technician: a saw’s timeline, first page of 15', () =>
  getSawTimeline(technician, busySaw!.id, sawTimelineQuerySchema.parse({ limit: 15 })),
);
await time('technician: a saw’s timeline, a page four years back', () =>
  getSawTimeline(
    technician,
    busySaw!.id,
    sawTimelineQuerySchema.parse({
      limit: 15,
      before: `${new Date(Date.now() - 4 * 365 * 86_400_000).toISOString()}_ffffffff-ffff-4fff-bfff-ffffffffffff`,
    }),
  ),
);
await sequelize.close();
