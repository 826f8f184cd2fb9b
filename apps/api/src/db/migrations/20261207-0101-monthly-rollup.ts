import type { MigrationContext } from '../umzug.js';

/**
 * A per-saw, per-month summary of the blade runs and stops, so a year of the fleet's figures reads 18 000 small
 * rows instead of 150 000 runs and 200 000 stops. Months are calendar months in the site's own time zone, as the
 * figures are.
 *
 * It is never a cache: every statement that writes blade_runs or stops (a technician's entry, a correction, a
 * removal and its putting back, an import and its undo) refreshes the saw-months it touched in the same
 * transaction, through the statement-level triggers below, by recomputing those saw-months from the records.
 * Changing a site's time zone or a saw's retirement recomputes what they move. Two writers of one saw take turns
 * (a transaction-scoped advisory lock per saw, taken in saw order), and each recompute is a fresh statement, so
 * under READ COMMITTED it sees what the other committed. `rollup_rebuild()` recomputes everything (after a bulk
 * load with the triggers off); the API's tests compare the maintained rows with a rebuild.
 *
 * What the rollup holds and what stays with the records:
 * - saw_month_runs, per saw, month and currency: runs put on in the month (count, spend, break-in recorded and
 *   followed, counts per material) and runs taken off in the month (count, with area, area, cuts, cost of those
 *   with area, counts per reason, and each finished blade's area in one of three lists — break-in followed,
 *   skipped, not recorded — so medians stay exact).
 * - saw_month_stops, per saw and month: the finished stops' hours clipped to the month (and to the saw's
 *   retirement), by category, planned or not, failures that began in the month.
 * - Not here: open stops (they grow by the minute) and the month still running; the figures read those from the
 *   records. Scheduled hours come from the saws.
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
const FAILURES = ['blade_failure', 'mechanical', 'hydraulic', 'electrical', 'other'];
const list = (values: string[]) => values.map((v) => `'${v}'`).join(', ');

const RUN_COLUMNS = [
  'blades_used',
  'spend_minor',
  'break_in_recorded',
  'break_in_followed',
  ...MATERIALS.map((m) => `material_${m}`),
  'blades_removed',
  'blades_with_area',
  'area_mm2',
  'cuts_sum',
  'cuts_recorded',
  'finished_cost_minor',
  ...REASONS.map((r) => `reason_${r}`),
  'life_followed',
  'life_skipped',
  'life_unrecorded',
];
const STOP_COLUMNS = ['downtime_h', 'unplanned_h', 'failures', 'failure_h', ...CATEGORIES.map((c) => `stop_${c}`)];

export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE saw_month_runs (
      saw_id uuid NOT NULL REFERENCES saws(id) ON DELETE CASCADE,
      site_id uuid NOT NULL,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      currency char(3) NOT NULL,
      blades_used integer NOT NULL,
      spend_minor bigint NOT NULL,
      break_in_recorded integer NOT NULL,
      break_in_followed integer NOT NULL,
      ${MATERIALS.map((m) => `material_${m} integer NOT NULL,`).join('\n      ')}
      blades_removed integer NOT NULL,
      blades_with_area integer NOT NULL,
      area_mm2 double precision NOT NULL,
      cuts_sum bigint NOT NULL,
      cuts_recorded integer NOT NULL,
      finished_cost_minor bigint NOT NULL,
      ${REASONS.map((r) => `reason_${r} integer NOT NULL,`).join('\n      ')}
      life_followed double precision[] NOT NULL,
      life_skipped double precision[] NOT NULL,
      life_unrecorded double precision[] NOT NULL,
      PRIMARY KEY (saw_id, month, currency)
    );
    CREATE INDEX saw_month_runs_site_month ON saw_month_runs (site_id, month);

    CREATE TABLE saw_month_stops (
      saw_id uuid NOT NULL REFERENCES saws(id) ON DELETE CASCADE,
      site_id uuid NOT NULL,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      downtime_h double precision NOT NULL,
      unplanned_h double precision NOT NULL,
      failures integer NOT NULL,
      failure_h double precision NOT NULL,
      ${CATEGORIES.map((c) => `stop_${c} double precision NOT NULL`).join(',\n      ')},
      PRIMARY KEY (saw_id, month)
    );
    CREATE INDEX saw_month_stops_site_month ON saw_month_stops (site_id, month);

    -- Recomputes the given saw-months of runs from blade_runs (delete, then insert what the records say).
    CREATE FUNCTION rollup_refresh_runs(saw_ids uuid[], months date[]) RETURNS void LANGUAGE plpgsql AS $fn$
    BEGIN
      DELETE FROM saw_month_runs u USING unnest(saw_ids, months) AS k(saw_id, month)
       WHERE u.saw_id = k.saw_id AND u.month = k.month;
      INSERT INTO saw_month_runs (saw_id, site_id, month, currency, ${RUN_COLUMNS.join(', ')})
      WITH k AS (
        SELECT DISTINCT k.saw_id, w.site_id, k.month,
               k.month::timestamp AT TIME ZONE s.time_zone AS t0,
               (k.month + interval '1 month')::timestamp AT TIME ZONE s.time_zone AS t1
          FROM unnest(saw_ids, months) AS k(saw_id, month)
          JOIN saws w ON w.id = k.saw_id JOIN sites s ON s.id = w.site_id
      ),
      put_on AS (
        SELECT k.saw_id, k.site_id, k.month, r.currency,
               count(*) AS blades_used, sum(r.cost_minor) AS spend_minor,
               count(r.break_in_followed) AS break_in_recorded,
               count(*) FILTER (WHERE r.break_in_followed) AS break_in_followed,
               ${MATERIALS.map((m) => `count(*) FILTER (WHERE r.material_group = '${m}') AS material_${m}`).join(',\n               ')}
          FROM k JOIN blade_runs r ON r.saw_id = k.saw_id AND r.installed_at >= k.t0 AND r.installed_at < k.t1
         GROUP BY 1, 2, 3, 4
      ),
      taken_off AS (
        SELECT k.saw_id, k.site_id, k.month, r.currency,
               count(*) AS blades_removed, count(r.area_cut_mm2) AS blades_with_area,
               coalesce(sum(r.area_cut_mm2), 0) AS area_mm2,
               coalesce(sum(r.cuts), 0) AS cuts_sum, count(r.cuts) AS cuts_recorded,
               coalesce(sum(r.cost_minor) FILTER (WHERE r.area_cut_mm2 IS NOT NULL), 0) AS finished_cost_minor,
               ${REASONS.map((x) => `count(*) FILTER (WHERE r.removal_reason = '${x}') AS reason_${x}`).join(',\n               ')},
               coalesce(array_agg(r.area_cut_mm2) FILTER (WHERE r.area_cut_mm2 IS NOT NULL AND r.break_in_followed), '{}') AS life_followed,
               coalesce(array_agg(r.area_cut_mm2) FILTER (WHERE r.area_cut_mm2 IS NOT NULL AND NOT r.break_in_followed), '{}') AS life_skipped,
               coalesce(array_agg(r.area_cut_mm2) FILTER (WHERE r.area_cut_mm2 IS NOT NULL AND r.break_in_followed IS NULL), '{}') AS life_unrecorded
          FROM k JOIN blade_runs r ON r.saw_id = k.saw_id AND r.removed_at >= k.t0 AND r.removed_at < k.t1
         GROUP BY 1, 2, 3, 4
      )
      SELECT coalesce(a.saw_id, b.saw_id), coalesce(a.site_id, b.site_id), coalesce(a.month, b.month),
             coalesce(a.currency, b.currency),
             coalesce(a.blades_used, 0), coalesce(a.spend_minor, 0), coalesce(a.break_in_recorded, 0),
             coalesce(a.break_in_followed, 0),
             ${MATERIALS.map((m) => `coalesce(a.material_${m}, 0)`).join(', ')},
             coalesce(b.blades_removed, 0), coalesce(b.blades_with_area, 0), coalesce(b.area_mm2, 0),
             coalesce(b.cuts_sum, 0), coalesce(b.cuts_recorded, 0), coalesce(b.finished_cost_minor, 0),
             ${REASONS.map((x) => `coalesce(b.reason_${x}, 0)`).join(', ')},
             coalesce(b.life_followed, '{}'), coalesce(b.life_skipped, '{}'), coalesce(b.life_unrecorded, '{}')
        FROM put_on a
        FULL JOIN taken_off b ON b.saw_id = a.saw_id AND b.month = a.month AND b.currency = a.currency;
    END
    $fn$;

    -- Recomputes the given saw-months of stops from the finished stops, clipped to the month and to the saw's
    -- retirement (an open stop is left to the figures, which run it to the time asked about).
    CREATE FUNCTION rollup_refresh_stops(saw_ids uuid[], months date[]) RETURNS void LANGUAGE plpgsql AS $fn$
    BEGIN
      DELETE FROM saw_month_stops u USING unnest(saw_ids, months) AS k(saw_id, month)
       WHERE u.saw_id = k.saw_id AND u.month = k.month;
      INSERT INTO saw_month_stops (saw_id, site_id, month, ${STOP_COLUMNS.join(', ')})
      WITH k AS (
        SELECT DISTINCT k.saw_id, w.site_id, k.month,
               k.month::timestamp AT TIME ZONE s.time_zone AS t0,
               LEAST((k.month + interval '1 month')::timestamp AT TIME ZONE s.time_zone, w.retired_at) AS t1
          FROM unnest(saw_ids, months) AS k(saw_id, month)
          JOIN saws w ON w.id = k.saw_id JOIN sites s ON s.id = w.site_id
      ),
      clipped AS (
        SELECT k.saw_id, k.site_id, k.month, p.category, p.planned,
               extract(epoch FROM (LEAST(p.ended_at, k.t1) - GREATEST(p.started_at, k.t0))) / 3600.0 AS hours,
               (p.started_at >= k.t0 AND p.started_at < k.t1) AS began
          FROM k
          JOIN stops p ON p.saw_id = k.saw_id AND p.ended_at IS NOT NULL
               AND tstzrange(p.started_at, p.ended_at, '[)') && tstzrange(k.t0, GREATEST(k.t0, k.t1), '[)')
         WHERE k.t1 > k.t0
      )
      SELECT saw_id, site_id, month,
             sum(hours),
             coalesce(sum(hours) FILTER (WHERE NOT planned), 0),
             count(*) FILTER (WHERE began AND NOT planned AND category IN (${list(FAILURES)})),
             coalesce(sum(hours) FILTER (WHERE NOT planned AND category IN (${list(FAILURES)})), 0),
             ${CATEGORIES.map((c) => `coalesce(sum(hours) FILTER (WHERE category = '${c}'), 0)`).join(',\n             ')}
        FROM clipped
       GROUP BY 1, 2, 3;
    END
    $fn$;

    -- Writers of one saw take turns on its saw-months until they commit (saw order, so two never wait on each other).
    CREATE FUNCTION rollup_lock_saws(saw_ids uuid[]) RETURNS void LANGUAGE plpgsql AS $fn$
    DECLARE
      saw uuid;
    BEGIN
      FOR saw IN SELECT DISTINCT id FROM unnest(saw_ids) AS id ORDER BY id LOOP
        PERFORM pg_advisory_xact_lock(20261207, hashtext(saw::text));
      END LOOP;
    END
    $fn$;

    -- The saw-months a set of runs falls in: the months they were put on and taken off.
    CREATE FUNCTION rollup_runs_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      saw_ids uuid[];
      months date[];
    BEGIN
      IF TG_OP = 'INSERT' THEN
        SELECT array_agg(saw_id), array_agg(month) INTO saw_ids, months FROM (
          SELECT DISTINCT c.saw_id, date_trunc('month', t.at AT TIME ZONE s.time_zone)::date AS month
            FROM new_rows c JOIN sites s ON s.id = c.site_id
            CROSS JOIN LATERAL (VALUES (c.installed_at), (c.removed_at)) AS t(at) WHERE t.at IS NOT NULL) x;
      ELSIF TG_OP = 'DELETE' THEN
        SELECT array_agg(saw_id), array_agg(month) INTO saw_ids, months FROM (
          SELECT DISTINCT c.saw_id, date_trunc('month', t.at AT TIME ZONE s.time_zone)::date AS month
            FROM old_rows c JOIN sites s ON s.id = c.site_id
            CROSS JOIN LATERAL (VALUES (c.installed_at), (c.removed_at)) AS t(at) WHERE t.at IS NOT NULL) x;
      ELSE
        SELECT array_agg(saw_id), array_agg(month) INTO saw_ids, months FROM (
          SELECT DISTINCT c.saw_id, date_trunc('month', t.at AT TIME ZONE s.time_zone)::date AS month
            FROM (SELECT saw_id, site_id, installed_at, removed_at FROM old_rows
                  UNION ALL SELECT saw_id, site_id, installed_at, removed_at FROM new_rows) c
            JOIN sites s ON s.id = c.site_id
            CROSS JOIN LATERAL (VALUES (c.installed_at), (c.removed_at)) AS t(at) WHERE t.at IS NOT NULL) x;
      END IF;
      IF saw_ids IS NOT NULL THEN
        PERFORM rollup_lock_saws(saw_ids);
        PERFORM rollup_refresh_runs(saw_ids, months);
      END IF;
      RETURN NULL;
    END
    $fn$;

    -- The saw-months a set of stops covers, from the month it began to the month it ended.
    CREATE FUNCTION rollup_stop_months(stop_saw uuid, tz text, began timestamptz, ended timestamptz)
      RETURNS TABLE (saw_id uuid, month date) LANGUAGE sql STABLE AS $fn$
      SELECT $1, m::date FROM generate_series(date_trunc('month', $3 AT TIME ZONE $2),
                                             date_trunc('month', $4 AT TIME ZONE $2), interval '1 month') AS m
       WHERE $4 IS NOT NULL
    $fn$;

    CREATE FUNCTION rollup_stops_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      saw_ids uuid[];
      months date[];
    BEGIN
      IF TG_OP = 'INSERT' THEN
        SELECT array_agg(m.saw_id), array_agg(m.month) INTO saw_ids, months FROM (
          SELECT DISTINCT m.saw_id, m.month FROM new_rows c JOIN sites s ON s.id = c.site_id
           CROSS JOIN LATERAL rollup_stop_months(c.saw_id, s.time_zone, c.started_at, c.ended_at) m) m;
      ELSIF TG_OP = 'DELETE' THEN
        SELECT array_agg(m.saw_id), array_agg(m.month) INTO saw_ids, months FROM (
          SELECT DISTINCT m.saw_id, m.month FROM old_rows c JOIN sites s ON s.id = c.site_id
           CROSS JOIN LATERAL rollup_stop_months(c.saw_id, s.time_zone, c.started_at, c.ended_at) m) m;
      ELSE
        SELECT array_agg(m.saw_id), array_agg(m.month) INTO saw_ids, months FROM (
          SELECT DISTINCT m.saw_id, m.month
            FROM (SELECT saw_id, site_id, started_at, ended_at FROM old_rows
                  UNION ALL SELECT saw_id, site_id, started_at, ended_at FROM new_rows) c
            JOIN sites s ON s.id = c.site_id
           CROSS JOIN LATERAL rollup_stop_months(c.saw_id, s.time_zone, c.started_at, c.ended_at) m) m;
      END IF;
      IF saw_ids IS NOT NULL THEN
        PERFORM rollup_lock_saws(saw_ids);
        PERFORM rollup_refresh_stops(saw_ids, months);
      END IF;
      RETURN NULL;
    END
    $fn$;

    -- Everything a site's records say, again (its time zone moved the month boundaries), or the whole fleet's.
    CREATE FUNCTION rollup_rebuild(only_site uuid DEFAULT NULL) RETURNS void LANGUAGE plpgsql AS $fn$
    DECLARE
      saw_ids uuid[];
      months date[];
    BEGIN
      DELETE FROM saw_month_runs WHERE only_site IS NULL OR site_id = only_site;
      DELETE FROM saw_month_stops WHERE only_site IS NULL OR site_id = only_site;
      SELECT array_agg(saw_id), array_agg(month) INTO saw_ids, months FROM (
        SELECT DISTINCT c.saw_id, date_trunc('month', t.at AT TIME ZONE s.time_zone)::date AS month
          FROM blade_runs c JOIN sites s ON s.id = c.site_id
          CROSS JOIN LATERAL (VALUES (c.installed_at), (c.removed_at)) AS t(at)
         WHERE t.at IS NOT NULL AND (only_site IS NULL OR c.site_id = only_site)) x;
      IF saw_ids IS NOT NULL THEN
        PERFORM rollup_refresh_runs(saw_ids, months);
      END IF;
      SELECT array_agg(m.saw_id), array_agg(m.month) INTO saw_ids, months FROM (
        SELECT DISTINCT m.saw_id, m.month FROM stops c JOIN sites s ON s.id = c.site_id
         CROSS JOIN LATERAL rollup_stop_months(c.saw_id, s.time_zone, c.started_at, c.ended_at) m
         WHERE only_site IS NULL OR c.site_id = only_site) m;
      IF saw_ids IS NOT NULL THEN
        PERFORM rollup_refresh_stops(saw_ids, months);
      END IF;
    END
    $fn$;

    CREATE FUNCTION rollup_site_zone_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      moved uuid;
    BEGIN
      FOR moved IN SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
                    WHERE n.time_zone IS DISTINCT FROM o.time_zone ORDER BY n.id LOOP
        PERFORM rollup_lock_saws(ARRAY(SELECT id FROM saws WHERE site_id = moved));
        PERFORM rollup_rebuild(moved);
      END LOOP;
      RETURN NULL;
    END
    $fn$;

    -- A saw retired (or brought back): its finished stops from the earlier of the two dates on are clipped anew.
    CREATE FUNCTION rollup_saw_retired() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      saw_ids uuid[];
      months date[];
    BEGIN
      SELECT array_agg(m.saw_id), array_agg(m.month) INTO saw_ids, months FROM (
        SELECT DISTINCT m.saw_id, m.month
          FROM new_rows n JOIN old_rows o ON o.id = n.id JOIN sites s ON s.id = n.site_id
          JOIN stops c ON c.saw_id = n.id
               AND c.ended_at > LEAST(coalesce(n.retired_at, 'infinity'), coalesce(o.retired_at, 'infinity'))
         CROSS JOIN LATERAL rollup_stop_months(c.saw_id, s.time_zone, c.started_at, c.ended_at) m
         WHERE n.retired_at IS DISTINCT FROM o.retired_at) m;
      IF saw_ids IS NOT NULL THEN
        PERFORM rollup_lock_saws(saw_ids);
        PERFORM rollup_refresh_stops(saw_ids, months);
      END IF;
      RETURN NULL;
    END
    $fn$;

    CREATE TRIGGER blade_runs_rollup_insert AFTER INSERT ON blade_runs
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_runs_changed();
    CREATE TRIGGER blade_runs_rollup_update AFTER UPDATE ON blade_runs
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_runs_changed();
    CREATE TRIGGER blade_runs_rollup_delete AFTER DELETE ON blade_runs
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_runs_changed();
    CREATE TRIGGER stops_rollup_insert AFTER INSERT ON stops
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_stops_changed();
    CREATE TRIGGER stops_rollup_update AFTER UPDATE ON stops
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_stops_changed();
    CREATE TRIGGER stops_rollup_delete AFTER DELETE ON stops
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_stops_changed();
    CREATE TRIGGER sites_rollup_zone AFTER UPDATE ON sites
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_site_zone_changed();
    CREATE TRIGGER saws_rollup_retired AFTER UPDATE ON saws
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION rollup_saw_retired();

    SELECT rollup_rebuild();
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP TRIGGER blade_runs_rollup_insert ON blade_runs;
    DROP TRIGGER blade_runs_rollup_update ON blade_runs;
    DROP TRIGGER blade_runs_rollup_delete ON blade_runs;
    DROP TRIGGER stops_rollup_insert ON stops;
    DROP TRIGGER stops_rollup_update ON stops;
    DROP TRIGGER stops_rollup_delete ON stops;
    DROP TRIGGER sites_rollup_zone ON sites;
    DROP TRIGGER saws_rollup_retired ON saws;
    DROP FUNCTION rollup_runs_changed(), rollup_stops_changed(), rollup_site_zone_changed(), rollup_saw_retired(),
      rollup_rebuild(uuid), rollup_refresh_runs(uuid[], date[]), rollup_refresh_stops(uuid[], date[]),
      rollup_lock_saws(uuid[]), rollup_stop_months(uuid, text, timestamptz, timestamptz);
    DROP TABLE saw_month_runs, saw_month_stops;
  `);
}
