/**
 * Benchmark of the maintenance checks' reads at the large customer's size: 60 sites, 1 500 saws, each site's
 * shipped list of six checks plus one of its own, and 300 000 recorded checks (five years), from the shared
 * generator (bench-generator.ts; built when the database lacks it), then prints how long the due and overdue
 * reads take, and the plan of the per-site overdue list. Figures are printed, never asserted.
 *
 *   npm run bench:seed   # once
 *   PGDATABASE=kerfline_bench npx tsx --conditions=source apps/api/src/db/bench-checks.ts
 */
import { performance } from 'node:perf_hooks';
import { defineAbilityFor, type Principal } from '@kerfline/domain/authz/ability';
import { checkRecordListQuerySchema, dueCheckListQuerySchema } from '@kerfline/domain/site-checks/schema';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { buildBenchFleet, hasBenchFleet } from './bench-generator.js';
import { initModels } from './models.js';
import {
  checkCounts,
  listCheckRecords,
  sawChecks,
  siteDueChecks,
} from '../modules/site-checks/check-records.service.js';

const env = loadEnv({
  SESSION_SECRET: 'benchmark-not-a-real-secret',
  PGDATABASE: 'kerfline_bench',
  ...process.env,
});
if (!env.PGDATABASE.endsWith('_bench'))
  throw new Error('Run the benchmark against a database whose name ends in _bench');
const sequelize = createSequelize(databaseUrl(env));
initModels(sequelize);

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

if (process.argv.includes('--rebuild') || !(await hasBenchFleet(sequelize))) {
  const counts = await buildBenchFleet(sequelize, databaseUrl(env), { log: (line) => console.log(line) });
  console.log(`built the benchmark fleet in ${counts.seconds.toFixed(0)} s`);
}

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
