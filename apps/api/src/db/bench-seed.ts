/**
 * `npm run bench:seed`: builds the large customer's fleet (bench-generator.ts) into the benchmark database of the
 * project's cluster, `kerfline_bench` unless PGDATABASE names another ending in _bench. Creates the database when
 * missing and replaces its schema. Prints the counts and how long each part took.
 */
import { loadavg } from 'node:os';
import { databaseUrl, loadEnv } from '../config/env.js';
import { createSequelize } from './sequelize.js';
import { initModels } from './models.js';
import { BENCH_PASSWORD, BENCH_USERS, buildBenchFleet, ensureBenchDatabase } from './bench-generator.js';

const env = loadEnv({
  SESSION_SECRET: 'benchmark-not-a-real-secret',
  ...process.env,
  PGDATABASE: process.env.PGDATABASE?.endsWith('_bench') ? process.env.PGDATABASE : 'kerfline_bench',
});
const url = databaseUrl(env);

await ensureBenchDatabase(databaseUrl({ ...env, PGDATABASE: 'postgres', DATABASE_URL: undefined }), env.PGDATABASE);
const sequelize = createSequelize(url, { poolMax: 2 });
initModels(sequelize);
console.log(`building the benchmark fleet in ${env.PGDATABASE} (load average ${loadavg()[0]!.toFixed(1)})`);
const counts = await buildBenchFleet(sequelize, url, { log: (line) => console.log(line) });
await sequelize.close();
console.log(
  `${counts.sites} sites, ${counts.saws} saws, ${counts.bladeRuns.toLocaleString('en-US')} blade runs, ` +
    `${counts.stops.toLocaleString('en-US')} stops, ${counts.checkRecords.toLocaleString('en-US')} checks, ` +
    `${counts.cutLogs.toLocaleString('en-US')} cut logs in ${counts.seconds.toFixed(0)} s`,
);
console.log(`sign in with any of ${Object.values(BENCH_USERS).join(', ')} and the password ${BENCH_PASSWORD}`);
