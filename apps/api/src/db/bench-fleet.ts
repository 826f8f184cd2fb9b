/**
 * Benchmark of the fleet figures at the large customer's size, on the database `bench-records.ts` builds (60 sites,
 * 1 500 saws, 750 000 blade runs, 1 000 000 stops over five years; run that first). Applies any newer migrations,
 * then prints how long each fleet screen's request takes, and the plan of the heaviest statement for one month
 * (every site's figures), to show it reads that month's rows through the indexes. Figures are printed, never asserted.
 *
 *   PGDATABASE=kerfline_bench npx tsx --conditions=source apps/api/src/db/bench-records.ts   # once, builds the data
 *   PGDATABASE=kerfline_bench npx tsx --conditions=source apps/api/src/db/bench-fleet.ts
 */
import { performance } from 'node:perf_hooks';
import { defineAbilityFor, type Principal } from '@kerfline/domain/authz/ability';
import { addMonths, monthOf } from '@kerfline/domain/fleet/period';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';
import { initModels } from './models.js';
import { getOverview, getPractice, getSawFigures, getSiteFigures } from '../modules/fleet/fleet.service.js';
import { figuresStatement } from '../modules/fleet/fleet-figures.js';
import { getOutlierReview } from '../modules/outliers/outliers.service.js';
import { getBudgetStatus } from '../modules/budgets/budgets.service.js';

const env = loadEnv({ SESSION_SECRET: 'benchmark-not-a-real-secret', PGDATABASE: 'kerfline_bench', ...process.env });
if (!env.PGDATABASE.endsWith('_bench'))
  throw new Error('Run the benchmark against a database whose name ends in _bench');
const sequelize = createSequelize(databaseUrl(env));
initModels(sequelize);
await createMigrator(sequelize).up();

const n = (
  (await sequelize.query('SELECT count(*)::int AS n FROM blade_runs', { type: 'SELECT' })) as { n: number }[]
)[0]!.n;
if (n < 700_000) throw new Error('Build the data first: run bench-records.ts against this database');

async function time(label: string, work: () => Promise<unknown>): Promise<void> {
  await work();
  const runs: number[] = [];
  for (let i = 0; i < 3; i++) {
    const t = performance.now();
    await work();
    runs.push(performance.now() - t);
  }
  runs.sort((a, b) => a - b);
  console.log(
    `${label.padEnd(64)} median ${runs[1]!.toFixed(0).padStart(6)} ms   worst ${runs[2]!.toFixed(0).padStart(6)} ms`,
  );
}

const sites = (await sequelize.query('SELECT id, region_id FROM sites ORDER BY code', { type: 'SELECT' })) as {
  id: string;
  region_id: string;
}[];
const site = sites[0]!;
const [saw] = (await sequelize.query('SELECT id FROM saws WHERE site_id = :site ORDER BY asset_tag LIMIT 1', {
  type: 'SELECT',
  replacements: { site: site.id },
})) as { id: string }[];
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
const last = addMonths(monthOf(new Date()), -1);
const month = { from: last, to: last };
const year = { from: addMonths(last, -11), to: last };

console.log(
  `\nfleet reads at ${n} blade runs (median of 3 after a warm-up; ${regionSites.length} sites in the region)`,
);
await time('manager: overview, 60 sites, one month (and the month before)', () => getOverview(manager, month));
await time('manager: overview, 60 sites, 12 months by month (and the 12 before)', () => getOverview(manager, year));
await time('lead: overview of the region, 12 months', () => getOverview(lead, year));
await time('manager: one site, 25 saws, 12 months', () => getSiteFigures(manager, site.id, year));
await time('manager: one saw, 12 months by month', () => getSawFigures(manager, saw!.id, year));
await time('lead: outliers of the region, 6 months', () =>
  getOutlierReview(lead, { from: addMonths(last, -5), to: last }),
);
await time('manager: outliers of the fleet (1 500 saws), 6 months', () =>
  getOutlierReview(manager, { from: addMonths(last, -5), to: last }),
);
await time('manager: practice compared, 60 sites, 12 months', () => getPractice(manager, year));
await time('manager: budgets, 60 sites, 6 months', () =>
  getBudgetStatus(manager, { from: addMonths(last, -5), to: last }),
);

// The plan of the heaviest statement for one month: every site's figures, read through the indexes.
const statement = figuresStatement('site', { ability: manager, siteIds: sites.map((s) => s.id), asOf: new Date() }, [
  { key: last, from: last, to: last },
]);
const plan = (await sequelize.query(`EXPLAIN (ANALYZE, BUFFERS, COSTS OFF, TIMING OFF) ${statement.sql}`, {
  bind: statement.bind,
  type: 'SELECT',
})) as { 'QUERY PLAN': string }[];
// The sites' ids are bound as one array: the plan shows how many, not the ids.
const line = (text: string) => text.replace(/'\{[0-9a-f,-]{80,}\}'/g, (ids) => `'{${ids.split(',').length} ids}'`);
console.log(`\nplan of every site's figures for ${last}:\n${plan.map((r) => line(r['QUERY PLAN'])).join('\n')}`);
await sequelize.close();
