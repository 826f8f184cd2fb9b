import type { MigrationContext } from '../umzug.js';
import { fromRows } from './20261208-0101-site-month-lives.js';

/**
 * The per-saw monthly summary summed per site: site_month_runs (per site, site-local month and currency) and
 * site_month_stops (per site and month), so a site's or the fleet's year reads 1 440 rows instead of 36 000.
 *
 * Kept from saw_month_runs and saw_month_stops (themselves kept from the records in the writer's transaction) by
 * statement-level triggers that add what a statement put into the per-saw summary and subtract what it took out,
 * on each site-month row as it stands when the row is locked; so two writers at one site in the same month each
 * apply their own change and neither's is lost, and the rows are locked in key order so two writers never wait on
 * each other in a circle. Areas and hours are kept as numeric: a value taken out is exactly the value once put
 * in, so adding and subtracting never drifts. A site-month whose saws' rows are all gone keeps a row of zeros.
 *
 * site_month_lives' keeper is replaced here by one that locks its rows in the same key order.
 *
 * Reads: fleet-figures.ts, where the callers' rules look at nothing but the site (as for site_month_lives); the
 * API's tests compare both tables with the per-saw summary summed afresh after writes, imports and undo.
 */
const MATERIALS = [
  'carbon_steel',
  'alloy_steel',
  'stainless_steel',
  'tool_steel',
  'aluminium',
  'copper_alloy',
  'cast_iron',
];
const REASONS = ['worn_out', 'tooth_strippage', 'fatigue_crack', 'broken', 'crooked_cutting', 'other'];
const CATEGORIES = [
  'blade_change',
  'blade_failure',
  'mechanical',
  'hydraulic',
  'electrical',
  'no_material_operator',
  'planned_maintenance',
  'other',
];

const RUN_COLUMNS: [string, string][] = [
  ['blades_used', 'bigint'],
  ['spend_minor', 'bigint'],
  ['break_in_recorded', 'bigint'],
  ['break_in_followed', 'bigint'],
  ...MATERIALS.map((m): [string, string] => [`material_${m}`, 'bigint']),
  ['blades_removed', 'bigint'],
  ['blades_with_area', 'bigint'],
  ['area_mm2', 'numeric'],
  ['cuts_sum', 'bigint'],
  ['cuts_recorded', 'bigint'],
  ['finished_cost_minor', 'bigint'],
  ...REASONS.map((r): [string, string] => [`reason_${r}`, 'bigint']),
];
const STOP_COLUMNS: [string, string][] = [
  ['downtime_h', 'numeric'],
  ['unplanned_h', 'numeric'],
  ['failures', 'bigint'],
  ['failure_h', 'numeric'],
  ...CATEGORIES.map((c): [string, string] => [`stop_${c}`, 'numeric']),
];

/** The trigger function that keeps `table` (keyed by `keys`) from the per-saw `source`'s transition tables. */
function keeper(name: string, table: string, keys: string[], columns: [string, string][]): string {
  const cast = ([c, type]: [string, string]) => `sum(r.${c}::${type}) AS ${c}`;
  const delta = (rows: string) =>
    `SELECT ${keys.map((k) => `r.${k}`).join(', ')}, ${columns.map(cast).join(', ')}
       FROM ${rows} r GROUP BY ${keys.map((k) => `r.${k}`).join(', ')}`;
  const on = keys.map((k) => `t.${k} = d.${k}`).join(' AND ');
  // Lock the rows a statement will change, in key order, before changing them.
  const lock = (rows: string) => `
        PERFORM 1 FROM ${table} t JOIN (SELECT DISTINCT ${keys.join(', ')} FROM ${rows}) d ON ${on}
         ORDER BY ${keys.map((k) => `t.${k}`).join(', ')} FOR UPDATE OF t;`;
  const takeOut = `
        ${lock('old_rows')}
        UPDATE ${table} t SET ${columns.map(([c]) => `${c} = t.${c} - d.${c}`).join(', ')}
          FROM (${delta('old_rows')}) d WHERE ${on};`;
  const putIn = `
        ${lock('new_rows')}
        INSERT INTO ${table} AS t (${keys.join(', ')}, ${columns.map(([c]) => c).join(', ')})
        SELECT * FROM (${delta('new_rows')}) d ORDER BY ${keys.join(', ')}
        ON CONFLICT (${keys.join(', ')}) DO UPDATE
           SET ${columns.map(([c]) => `${c} = t.${c} + excluded.${c}`).join(', ')};`;
  return `
    CREATE FUNCTION ${name}() RETURNS trigger LANGUAGE plpgsql AS $fn$
    BEGIN
      IF TG_OP = 'INSERT' THEN ${putIn}
      ELSIF TG_OP = 'DELETE' THEN ${takeOut}
      ELSE ${takeOut} ${putIn}
      END IF;
      RETURN NULL;
    END
    $fn$;`;
}

const triggers = (source: string, fn: string) => `
    CREATE TRIGGER ${source}_site_insert AFTER INSERT ON ${source}
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION ${fn}();
    CREATE TRIGGER ${source}_site_update AFTER UPDATE ON ${source}
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION ${fn}();
    CREATE TRIGGER ${source}_site_delete AFTER DELETE ON ${source}
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION ${fn}();`;

const fill = (table: string, source: string, keys: string[], columns: [string, string][]) => `
    INSERT INTO ${table} (${keys.join(', ')}, ${columns.map(([c]) => c).join(', ')})
    SELECT ${keys.join(', ')}, ${columns.map(([c, type]) => `sum(${c}::${type})`).join(', ')}
      FROM ${source} GROUP BY ${keys.join(', ')};`;

/** site_month_lives' keeper (20261208-0101) again, now locking its rows in key order first, as the sums do. */
const livesLock = (rows: string) => `
        PERFORM 1 FROM site_month_lives l JOIN (SELECT DISTINCT site_id, month FROM ${rows}) d
                ON l.site_id = d.site_id AND l.month = d.month
         ORDER BY l.site_id, l.month FOR UPDATE OF l;`;
const livesOut = `${livesLock('old_rows')}
        UPDATE site_month_lives l
           SET lives = lives_without(l.lives, d.lives), followed = lives_without(l.followed, d.followed),
               skipped = lives_without(l.skipped, d.skipped)
          FROM (${fromRows('old_rows')}) d
         WHERE l.site_id = d.site_id AND l.month = d.month;`;
const livesIn = `${livesLock('new_rows')}
        INSERT INTO site_month_lives AS l (site_id, month, lives, followed, skipped)
        SELECT * FROM (${fromRows('new_rows')}) d ORDER BY site_id, month
        ON CONFLICT (site_id, month) DO UPDATE
           SET lives = lives_with(l.lives, excluded.lives), followed = lives_with(l.followed, excluded.followed),
               skipped = lives_with(l.skipped, excluded.skipped);`;
const livesKeeper = `
    CREATE OR REPLACE FUNCTION site_lives_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    BEGIN
      IF TG_OP = 'INSERT' THEN ${livesIn}
      ELSIF TG_OP = 'DELETE' THEN ${livesOut}
      ELSE ${livesOut} ${livesIn}
      END IF;
      RETURN NULL;
    END
    $fn$;`;

export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE site_month_runs (
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      currency char(3) NOT NULL,
      ${RUN_COLUMNS.map(([c, type]) => `${c} ${type} NOT NULL`).join(',\n      ')},
      PRIMARY KEY (site_id, month, currency)
    );
    CREATE TABLE site_month_stops (
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      ${STOP_COLUMNS.map(([c, type]) => `${c} ${type} NOT NULL`).join(',\n      ')},
      PRIMARY KEY (site_id, month)
    );
    ${keeper('site_runs_changed', 'site_month_runs', ['site_id', 'month', 'currency'], RUN_COLUMNS)}
    ${keeper('site_stops_changed', 'site_month_stops', ['site_id', 'month'], STOP_COLUMNS)}
    ${triggers('saw_month_runs', 'site_runs_changed')}
    ${triggers('saw_month_stops', 'site_stops_changed')}
    ${livesKeeper}
    ${fill('site_month_runs', 'saw_month_runs', ['site_id', 'month', 'currency'], RUN_COLUMNS)}
    ${fill('site_month_stops', 'saw_month_stops', ['site_id', 'month'], STOP_COLUMNS)}
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ${['insert', 'update', 'delete']
      .map(
        (op) =>
          `DROP TRIGGER saw_month_runs_site_${op} ON saw_month_runs; DROP TRIGGER saw_month_stops_site_${op} ON saw_month_stops;`,
      )
      .join('\n    ')}
    DROP FUNCTION site_runs_changed(), site_stops_changed();
    DROP TABLE site_month_runs, site_month_stops;
  `);
}
