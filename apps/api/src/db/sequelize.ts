import { Sequelize } from 'sequelize';
import pg from 'pg';

// DATE columns come back as JS Dates; BIGINT (count(*)) as strings: parse the latter, totals fit in 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));

export function createSequelize(url: string, options: { logging?: boolean; poolMax?: number } = {}): Sequelize {
  return new Sequelize(url, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: options.logging ? console.log : false,
    pool: { max: options.poolMax ?? 10, idle: 10_000 },
    define: { underscored: true, timestamps: true },
  });
}
