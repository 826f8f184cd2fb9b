/**
 * Benchmark of the legacy import: 100 000 blade-run rows from a file to committed records, beside a plain
 * PostgreSQL COPY of the same rows into the same indexed table. Prints figures; asserts nothing.
 *
 *   npm run bench:import            (PGDATABASE defaults to kerfline_bench_import; its schema is rebuilt)
 *
 * Steps, each timed:
 *  1. the wizard's reading in the browser, here run in Node with the same code (streamed decoding, papaparse,
 *     every row built and checked with the records' schemas, repeats and overlaps screened);
 *  2. the server's check (the file read again with the plan, every row settled against the database, rolled back);
 *  3. the server's commit (read, checked, settled and written in one transaction with bulk inserts);
 *  4. COPY of the same 100 000 rows, already in the table's own column format, into blade_runs for another site
 *     with the same saws — the floor any import is measured against.
 * The database holds 100 000 older runs of other sites first, so indexes and constraints work on a table that is
 * not empty.
 */
import { performance } from 'node:perf_hooks';
import { loadavg } from 'node:os';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import pg from 'pg';
import { QueryTypes } from 'sequelize';
import { from as copyFrom } from 'pg-copy-streams';
import { importPlanSchema } from '@kerfline/domain/imports/schema';
import { ImportCollector, bytesSource, readRows, standardDecoders } from '@kerfline/domain/imports/pipeline';
import { suggestColumns } from '@kerfline/domain/imports/suggest';
import { detectDateOrder, detectDecimalMark } from '@kerfline/domain/imports/detect';
import type { Cell } from '@kerfline/domain/imports/values';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { createMigrator } from './umzug.js';
import { initModels } from './models.js';
import { loadSignedIn } from '../modules/auth/auth.service.js';
import { checkImport, commitImport } from '../modules/imports/imports.service.js';

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const SAWS = 50;
const env = loadEnv({
  SESSION_SECRET: 'benchmark-not-a-real-secret',
  PGDATABASE: 'kerfline_bench_import',
  ...process.env,
});
if (!env.PGDATABASE.endsWith('_bench_import'))
  throw new Error('Run against a database whose name ends in _bench_import');

async function ensureDatabase(): Promise<void> {
  const admin = new pg.Client({
    connectionString: databaseUrl({ ...env, PGDATABASE: 'postgres', DATABASE_URL: undefined }),
  });
  await admin.connect();
  const exists = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [env.PGDATABASE]);
  if (exists.rowCount === 0) await admin.query(`CREATE DATABASE "${env.PGDATABASE}"`);
  await admin.end();
}

const seconds = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
const pad = (n: number) => String(n).padStart(2, '0');

await ensureDatabase();
const sequelize = createSequelize(databaseUrl(env), { poolMax: 4 });
initModels(sequelize);
await sequelize.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
await createMigrator(sequelize).up();
await sequelize.query(`
  INSERT INTO regions (name) VALUES ('Bench');
  INSERT INTO sites (region_id, code, name, time_zone, currency, unit_system)
    SELECT (SELECT id FROM regions), code, 'Site ' || code, 'Europe/Amsterdam', 'EUR', 'metric'
      FROM unnest(ARRAY['IMP', 'CPY', 'OLD']) code;
  INSERT INTO saws (site_id, asset_tag, name, kind, wheel_diameter_mm, centre_distance_mm, band_width_mm,
                    band_thickness_mm, band_length_mm, band_speed_min_m_per_min, band_speed_max_m_per_min)
    SELECT s.id, 'SAW-' || lpad(g::text, 2, '0'), 'Bar saw ' || g, 'horizontal', 455, 1343, 34, 1.1, 4115, 18, 110
      FROM sites s CROSS JOIN generate_series(1, ${SAWS}) g;
  INSERT INTO blade_specs (name, width_mm, thickness_mm, length_mm, coarse_tpi, fine_tpi, tooth_form, tooth_set,
                           material, unit_cost_minor, currency)
    VALUES ('34 x 1.1 x 4115 bi-metal 3/4', 34, 1.1, 4115, 3, 4, 'hook', 'raker', 'bimetal', 6000, 'EUR');
  INSERT INTO users (email, name, role, password_hash, site_id)
    SELECT 'admin@bench.example', 'Bench admin', 'site_admin', 'x', id FROM sites WHERE code = 'IMP';
  -- Older history of another site, so the table and its indexes are not empty.
  INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, cost_minor, currency, removed_at, removal_reason)
    SELECT w.site_id, w.id, (SELECT id FROM blade_specs), timestamptz '2000-01-01' + n * interval '1 day', 6000, 'EUR',
           timestamptz '2000-01-01' + n * interval '1 day' + interval '20 hours', 'worn_out'
      FROM saws w JOIN sites s ON s.id = w.site_id AND s.code = 'OLD' CROSS JOIN generate_series(0, 1999) n;
  ANALYZE;
`);

// The file: a semicolon file with day-first dates, decimal commas and areas in cm², ROWS runs over SAWS saws,
// each saw's runs one after another (a run every 1.5 days, off after 1.25 days) from 2015.
const reasons = ['worn', 'cracked', 'teeth stripped', 'broken', 'crooked'];
const lines = ['Saw;Blade;On;Off;Why;Area (cm2);Cuts;Notes'];
const perSaw = Math.ceil(ROWS / SAWS);
const start = Date.UTC(2015, 0, 1, 6, 0);
const dmy = (ms: number) => {
  const d = new Date(ms);
  return `${pad(d.getUTCDate())}.${pad(d.getUTCMonth() + 1)}.${d.getUTCFullYear()} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
};
for (let i = 0; i < ROWS; i += 1) {
  const saw = (i % SAWS) + 1;
  const n = Math.floor(i / SAWS);
  const on = start + n * 36 * 3600_000;
  const off = on + 30 * 3600_000;
  lines.push(
    `SAW-${pad(saw)};34 x 1.1 x 4115 bi-metal 3/4;${dmy(on)};${dmy(off)};${reasons[i % 5]};${(4000 + (i % 997)) / 10 + 0.5}`.replace(
      '.',
      ',',
    ) + `;${200 + (i % 300)};${i % 50 === 0 ? 'checked guides' : ''}`,
  );
}
const file = Buffer.from(lines.join('\r\n') + '\r\n', 'utf8');
console.log(
  `file: ${ROWS.toLocaleString('en-US')} rows, ${(file.length / 1024 / 1024).toFixed(1)} MB, ${perSaw} runs on each of ${SAWS} saws`,
);

// 1. The wizard's reading (what the Web Worker does with the dropped file).
let t = performance.now();
let cpu = process.cpuUsage();
/** CPU seconds this Node process spent since `cpu` (the database's own work is not in it): load-independent. */
const cpuSince = () => {
  const d = process.cpuUsage(cpu);
  cpu = process.cpuUsage();
  return `${((d.user + d.system) / 1e6).toFixed(2)} s CPU here`;
};
const sample: Cell[][] = [];
const opened = await readRows(
  bytesSource(new Uint8Array(file), 'bench.csv'),
  { format: null, encoding: null, delimiter: null, sheet: null },
  standardDecoders,
  { maxRows: 1_000_000 },
  { row: (cells) => (sample.length < 500 ? sample.push(cells) : 0), reset: () => sample.splice(0) },
);
const [site] = await sequelize.query<{ id: string; user_id: string }>(
  `SELECT s.id, u.id AS user_id FROM sites s JOIN users u ON u.site_id = s.id WHERE s.code = 'IMP'`,
  { type: QueryTypes.SELECT },
);
const order = detectDateOrder(sample.flat());
const plan = importPlanSchema.parse({
  siteId: site!.id,
  kind: 'blade_runs',
  format: 'csv',
  encoding: opened.encoding,
  delimiter: opened.delimiter,
  sheet: null,
  columns: suggestColumns('blade_runs', opened.header, 'metric'),
  decimalMark: detectDecimalMark(sample.flat()),
  dateOrder: order.kind === 'known' ? order.order : 'dmy',
});
const target = {
  siteId: site!.id,
  timeZone: 'Europe/Amsterdam',
  currency: 'EUR',
  saws: (
    await sequelize.query<{ id: string; asset_tag: string; name: string }>(
      `SELECT id, asset_tag, name FROM saws WHERE site_id = :site`,
      { type: QueryTypes.SELECT, replacements: { site: site!.id } },
    )
  ).map((s) => ({ id: s.id, assetTag: s.asset_tag, name: s.name, retired: false })),
  specs: (
    await sequelize.query<{ id: string; name: string }>(`SELECT id, name FROM blade_specs`, { type: QueryTypes.SELECT })
  ).map((s) => ({
    ...s,
    unitCostMinor: 6000,
    currency: 'EUR',
    archived: false,
  })),
};
const preview = new ImportCollector('blade_runs', plan, target, {
  previewRows: 20,
  maxProblems: 200,
  keepCells: false,
});
await readRows(
  bytesSource(new Uint8Array(file), 'bench.csv'),
  { ...plan },
  standardDecoders,
  { maxRows: 1_000_000 },
  preview.consumer,
);
preview.finish();
const wizardRead = performance.now() - t;
const previewSummary = preview.summary();
console.log(
  `1. wizard reading (detect, stream, build and check every row):   ${seconds(wizardRead)}  (${cpuSince()}; ${previewSummary.rowsValid} valid, ${previewSummary.rowsRejected} rejected)`,
);

const signedIn = (await loadSignedIn(site!.user_id))!;
const limits = { maxBytes: 200 * 1024 * 1024, maxRows: 1_000_000 };
const received = { bytes: file, fileName: 'bench.csv' };

t = performance.now();
cpu = process.cpuUsage();
const checked = await checkImport(signedIn.ability, received, plan, limits);
const check = performance.now() - t;
console.log(
  `2. server check (read again, settle against the database):        ${seconds(check)}  (${cpuSince()}; ${checked.rowsValid} to add)`,
);

t = performance.now();
cpu = process.cpuUsage();
const committed = await commitImport({ ability: signedIn.ability, userId: site!.user_id }, received, plan, limits);
const commit = performance.now() - t;
console.log(
  `3. server commit (read, check, settle, write in one transaction): ${seconds(commit)}  (${cpuSince()}; ${committed.batch.rowsAdded} added)`,
);

// 4. COPY of the same rows for the other site's saws (same numbers, same indexes and constraints).
const copyRows = await sequelize.query<Record<string, unknown>>(
  `SELECT (SELECT id FROM sites WHERE code = 'CPY') AS site_id,
          (SELECT c.id FROM saws c WHERE c.site_id = (SELECT id FROM sites WHERE code = 'CPY') AND c.asset_tag = w.asset_tag) AS saw_id,
          r.blade_spec_id, r.installed_at, r.removed_at, r.removal_reason, r.area_cut_mm2, r.cuts, r.install_notes,
          r.cost_minor, r.currency, r.area_source
     FROM blade_runs r JOIN saws w ON w.id = r.saw_id WHERE r.import_batch_id = :batch`,
  { type: QueryTypes.SELECT, replacements: { batch: committed.batch.id } },
);
const tsv = copyRows
  .map((r) =>
    [
      r.site_id,
      r.saw_id,
      r.blade_spec_id,
      (r.installed_at as Date).toISOString(),
      (r.removed_at as Date).toISOString(),
      r.removal_reason,
      r.area_cut_mm2,
      r.cuts,
      r.install_notes ?? '\\N',
      r.cost_minor,
      r.currency,
      r.area_source,
    ].join('\t'),
  )
  .join('\n');
const client = new pg.Client({ connectionString: databaseUrl(env) });
await client.connect();
t = performance.now();
cpu = process.cpuUsage();
await client.query('BEGIN');
await pipeline(
  Readable.from([tsv + '\n']),
  client.query(
    copyFrom(
      'COPY blade_runs (site_id, saw_id, blade_spec_id, installed_at, removed_at, removal_reason, area_cut_mm2, cuts, install_notes, cost_minor, currency, area_source) FROM STDIN',
    ),
  ),
);
await client.query('COMMIT');
const copy = performance.now() - t;
await client.end();
console.log(`4. plain COPY of the same rows into blade_runs:                   ${seconds(copy)}`);

console.log('');
console.log(`whole wizard, file to committed (1 + 2 + 3):  ${seconds(wizardRead + check + commit)}   target ≤ 20 s`);
console.log(
  `load average while measuring: ${loadavg()
    .map((l) => l.toFixed(1))
    .join(' / ')} on this machine's cores (figures grow with it)`,
);
console.log(`commit ÷ COPY:                                 ${(commit / copy).toFixed(1)}×        target ≤ 5×`);
await sequelize.close();
