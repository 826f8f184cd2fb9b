import { Sequelize } from 'sequelize';
import pg from 'pg';
import { routeReadsByRequest } from './read-routing.js';

// DATE columns come back as JS Dates; BIGINT (count(*)) as strings: parse the latter, totals fit in 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));

/**
 * What every connection of the app sets for its session. JIT compilation off: the dashboards' statements are
 * estimated dear (their branches over the records cost much, though most months come from the monthly summary),
 * so PostgreSQL compiled them on every run, about 100 ms of a 500 ms statement, and won nothing back at this size.
 * work_mem 16 MB: a year of the fleet's blade lives (150 000 rows) is sorted in memory rather than on disk; at ten
 * connections and a few sorts each that stays well under a small server's memory. The benchmark's bare SQL runs
 * with the same settings.
 */
export const SESSION_OPTIONS = '-c jit=off -c work_mem=16MB';

/**
 * The app's Sequelize. With `replicaUrl` (a PostgreSQL streaming replica of the same cluster), plain reads go to
 * the replica and writes, transactions and reads marked `useMaster` to `url` (Sequelize's `replication`); see
 * read-routing.ts for which requests read the primary.
 */
export function createSequelize(
  url: string,
  options: { logging?: boolean; poolMax?: number; replicaUrl?: string | undefined } = {},
): Sequelize {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: options.logging ? console.log : false,
    pool: { max: options.poolMax ?? 10, idle: 10_000 },
    dialectOptions: { options: SESSION_OPTIONS },
    define: { underscored: true, timestamps: true },
    ...(options.replicaUrl
      ? { replication: { read: [connectionOf(options.replicaUrl)], write: connectionOf(url) } }
      : {}),
  });
  if (options.replicaUrl) routeReadsByRequest(sequelize);
  return sequelize;
}

/** Whether any statement is running on, or waiting for, one of the instance's connections (primary or replica). */
export function sequelizeBusy(sequelize: Sequelize): boolean {
  type Counts = { using: number; waiting: number };
  const pool = (sequelize.connectionManager as unknown as { pool: Counts & { read?: Counts; write?: Counts } }).pool;
  const pools = pool.read && pool.write ? [pool.read, pool.write] : [pool];
  return pools.some((p) => p.using > 0 || p.waiting > 0);
}

function connectionOf(url: string) {
  const u = new URL(url);
  return {
    host: decodeURIComponent(u.hostname),
    port: u.port || '5432',
    username: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    database: decodeURIComponent(u.pathname.slice(1)),
  };
}
