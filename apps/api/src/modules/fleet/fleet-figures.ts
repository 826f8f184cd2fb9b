import { QueryTypes, type Sequelize } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { DOWNTIME_CATEGORIES, FAILURE_CATEGORIES, type DowntimeCategory } from '@kerfline/domain/metrics/schema';
import { REMOVAL_REASONS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { addMonths, monthStart, monthsOf, type Month } from '@kerfline/domain/fleet/period';
import { SqlParams, scopeSql } from '../../authz/sequelize-scope.js';
import { Site } from '../sites/site.model.js';
import { Saw } from '../saws/saw.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';

/*
 * The fleet figures in SQL: GROUP BY over the records, never a loop over loaded rows. Every statement is built
 * from the caller's CASL rules (`scopeSql`: Site, Saw, BladeRun and Stop, each on its own table) and takes every
 * value as a bound parameter. The rules, written once here and in DEVELOPERS.md ("Fleet figures"):
 *
 * - Months are calendar months in the site's own time zone. A bucket is a run of whole months [t0, t1).
 * - Blades used and spend: runs by install time in the bucket (up to the as-of time); spend is the cost fixed
 *   on the run at install.
 * - Finished blades: runs by removal time in the bucket. Blade life (mean, median area; mean cuts) and cost per
 *   area use those with their area recorded (cuts: those with cuts recorded).
 * - A saw is in service from the earliest of its creation, its first blade run and its first stop, until it was
 *   retired. Its scheduled time in a bucket is [w0, w1) = [max(t0, in service from), min(t1, retired, as of)).
 * - Each stop [start, end) (an open stop runs to the as-of time) is clipped to [w0, w1). A saw's stops never
 *   overlap (the database's exclusion constraint), so the union of its stops is their sum. Downtime = Σ clipped
 *   hours; uptime = scheduled − downtime; operational availability = Σ uptime ÷ Σ scheduled.
 * - Failures = unplanned stops of a failure category that start in [w0, w1); failure downtime = the clipped hours
 *   of every unplanned failure-category stop. MTBF = uptime ÷ failures; MTTR = failure downtime ÷ failures.
 * - A site's and the fleet's hours are sums over their saws (saw-hours), so months add up to the year.
 */

export type Level = 'fleet' | 'site' | 'saw';

/** A run of whole months, both ends included. */
export type Bucket = { key: string; from: Month; to: Month };

export type FigureScope = {
  ability: AppAbility;
  /** The sites asked about (always intersected with the caller's scope). */
  siteIds: string[];
  /** Only these saws (saw level). */
  sawIds?: string[];
  asOf: Date;
};

/** `stops: false` leaves the stops out (all stop figures 0), for a caller that sums them from another level. */
export type FigureOptions = { stops?: boolean };

/** One group's (fleet, site or saw) raw figures in one bucket, as SQL summed them. */
export type RawFigures = {
  groupId: string;
  bucket: string;
  bladesUsed: number;
  breakInRecorded: number;
  breakInFollowed: number;
  mainMaterial: MaterialGroup | null;
  bladesRemoved: number;
  bladesWithArea: number;
  areaCutMm2: number;
  meanLifeMm2: number | null;
  medianLifeMm2: number | null;
  meanCutsPerBlade: number | null;
  /** Finished blades with area, split by whether their break-in was followed (false: recorded as skipped). */
  lifeFollowed: { blades: number; medianMm2: number | null };
  lifeSkipped: { blades: number; medianMm2: number | null };
  removalReasons: Record<RemovalReason, number>;
  scheduledHours: number;
  downtimeHours: number;
  unplannedStopHours: number;
  stopHours: Record<DowntimeCategory, number>;
  failures: number;
  failureDowntimeHours: number;
};

/** Money by the site-local month it falls in and its currency: spend (runs put on), and the cost of finished blades with area. */
export type MoneyRow = {
  groupId: string;
  month: Month;
  currency: string;
  kind: 'spend' | 'finished';
  amountMinor: number;
};

const num = (v: unknown): number => (v === null || v === undefined ? 0 : Number(v));
const numOrNull = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

/**
 * The sites and saws in scope as CTEs (`sites_in`, `saws_in`); with buckets, the site × bucket and saw × bucket
 * bounds (`site_buckets`, `saw_buckets`) and the saw × month windows in service (`saw_months`) with the months of
 * each bucket (`bucket_months`).
 */
function scopeCtes(scope: FigureScope, params: SqlParams, buckets: Bucket[] | null): string {
  const siteScope = scopeSql(scope.ability, 'read', 'Site', Site, 's', params);
  const sawScope = scopeSql(scope.ability, 'read', 'Saw', Saw, 'w', params);
  const siteIds = params.add(scope.siteIds);
  const sawFilter = scope.sawIds ? ` AND w.id = ANY(${params.add(scope.sawIds)}::uuid[])` : '';
  const ctes = [
    `sites_in AS (
      SELECT s.id, s.time_zone FROM sites s WHERE s.id = ANY(${siteIds}::uuid[]) AND ${siteScope}
    )`,
    `saws_in AS (
      SELECT w.id, w.site_id, w.retired_at,
             LEAST(w.created_at,
                   (SELECT min(r0.installed_at) FROM blade_runs r0 WHERE r0.saw_id = w.id),
                   (SELECT min(p0.started_at) FROM stops p0 WHERE p0.saw_id = w.id)) AS in_service_from
        FROM saws w JOIN sites_in s ON s.id = w.site_id
       WHERE ${sawScope}${sawFilter}
    )`,
  ];
  if (buckets) {
    const asOf = params.add(scope.asOf);
    const keys = params.add(buckets.map((b) => b.key));
    const starts = params.add(buckets.map((b) => `${monthStart(b.from)} 00:00:00`));
    const ends = params.add(buckets.map((b) => `${monthStart(addMonths(b.to, 1))} 00:00:00`));
    // Stops and scheduled hours are worked out month by month and summed into the buckets (they add up), so a
    // year and its months read each stop once.
    const months = [...new Set(buckets.flatMap((b) => monthsOf(b)))].sort();
    const pairs = buckets.flatMap((b) => monthsOf(b).map((m) => [b.key, m] as const));
    const monthKeys = params.add(months);
    const monthStarts = params.add(months.map((m) => `${monthStart(m)} 00:00:00`));
    const monthEnds = params.add(months.map((m) => `${monthStart(addMonths(m, 1))} 00:00:00`));
    const pairBuckets = params.add(pairs.map(([b]) => b));
    const pairMonths = params.add(pairs.map(([, m]) => m));
    ctes.push(
      `months AS (
        SELECT * FROM unnest(${monthKeys}::text[], ${monthStarts}::timestamp[], ${monthEnds}::timestamp[]) AS m(mkey, m0, m1)
      )`,
      `bucket_months AS (
        SELECT * FROM unnest(${pairBuckets}::text[], ${pairMonths}::text[]) AS bm(key, mkey)
      )`,
      `saw_months AS (
        SELECT w.id AS saw_id, w.site_id, m.mkey,
               GREATEST(m.m0 AT TIME ZONE s.time_zone, w.in_service_from) AS w0,
               LEAST(m.m1 AT TIME ZONE s.time_zone, w.retired_at, ${asOf}::timestamptz) AS w1
          FROM saws_in w JOIN sites_in s ON s.id = w.site_id CROSS JOIN months m
      )`,
    );
    ctes.push(
      `buckets AS (
        SELECT * FROM unnest(${keys}::text[], ${starts}::timestamp[], ${ends}::timestamp[]) AS b(key, m0, m1)
      )`,
      `site_buckets AS (
        SELECT s.id AS site_id, b.key, b.m0 AT TIME ZONE s.time_zone AS t0, b.m1 AT TIME ZONE s.time_zone AS t1
          FROM sites_in s CROSS JOIN buckets b
      )`,
      `saw_buckets AS (
        SELECT w.id AS saw_id, w.site_id, b.key,
               b.m0 AT TIME ZONE s.time_zone AS t0,
               b.m1 AT TIME ZONE s.time_zone AS t1
          FROM saws_in w JOIN sites_in s ON s.id = w.site_id CROSS JOIN buckets b
      )`,
    );
  }
  return ctes.join(',\n');
}

const GROUP_OF: Record<Level, { runs: string; runJoin: string; runGroup: string; stopGroup: string }> = {
  saw: { runs: 'saw_buckets', runJoin: 'r.saw_id = g.saw_id', runGroup: 'g.saw_id::text', stopGroup: 'g.saw_id::text' },
  site: {
    runs: 'site_buckets',
    runJoin: 'r.site_id = g.site_id',
    runGroup: 'g.site_id::text',
    stopGroup: 'g.site_id::text',
  },
  fleet: { runs: 'site_buckets', runJoin: 'r.site_id = g.site_id', runGroup: "'fleet'", stopGroup: "'fleet'" },
};

const sqlList = (values: readonly string[]) => values.map((v) => `'${v}'`).join(', ');
const FAILURE_LIST = sqlList(FAILURE_CATEGORIES);

/**
 * Every figure of `level` groups (the fleet, each site or each saw) in each bucket, in one statement. The saws
 * and sites come from the caller's scope; runs and stops are read through the indexes named in the migration
 * (a one-month bucket reads that month's rows only).
 */
export async function rawFigures(
  sequelize: Sequelize,
  level: Level,
  scope: FigureScope,
  buckets: Bucket[],
  options: FigureOptions = {},
): Promise<RawFigures[]> {
  if (scope.siteIds.length === 0 || buckets.length === 0) return [];
  const { sql, bind } = figuresStatement(level, scope, buckets, options);
  const rows = await sequelize.query<Record<string, unknown>>(sql, { bind, type: QueryTypes.SELECT });
  return rows.map(toRawFigures);
}

/** The statement `rawFigures` runs, with its bound values (the benchmark prints its plan). */
export function figuresStatement(
  level: Level,
  scope: FigureScope,
  buckets: Bucket[],
  options: FigureOptions = {},
): { sql: string; bind: unknown[] } {
  const params = new SqlParams();
  const ctes = scopeCtes(scope, params, buckets);
  const asOf = params.add(scope.asOf);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const stopScope = scopeSql(scope.ability, 'read', 'Stop', Stop, 'p', params);
  // Without stops the clause is FALSE, so the planner reads none; the scope stays in it for its bound values.
  const stopFilter = options.stops === false ? `FALSE AND ${stopScope}` : stopScope;
  const g = GROUP_OF[level];
  const sawFilter = scope.sawIds && level !== 'saw' ? ` AND r.saw_id = ANY(${params.add(scope.sawIds)}::uuid[])` : '';
  const categoryColumns = DOWNTIME_CATEGORIES.map(
    (c) => `coalesce(sum(hours) FILTER (WHERE category = '${c}'), 0) AS "stop_${c}"`,
  ).join(',\n             ');
  const categorySums = DOWNTIME_CATEGORIES.map((c) => `sum(sm."stop_${c}") AS "stop_${c}"`).join(',\n             ');
  const reasonColumns = REMOVAL_REASONS.map(
    (reason) => `count(*) FILTER (WHERE r.removal_reason = '${reason}') AS "reason_${reason}"`,
  ).join(',\n             ');

  const sql = `
    WITH ${ctes},
    runs_in AS (
      SELECT ${g.runGroup} AS gid, g.key,
             count(*) AS blades_used,
             count(r.break_in_followed) AS bi_recorded,
             count(*) FILTER (WHERE r.break_in_followed) AS bi_followed,
             mode() WITHIN GROUP (ORDER BY r.material_group) AS main_material
        FROM ${g.runs} g
        CROSS JOIN LATERAL (
         -- A lateral subquery per site (or saw) and bucket: the index range scan of that bucket's runs;
         -- OFFSET 0 keeps the planner from flattening it into one scan of the whole table.
         SELECT r.* FROM blade_runs r
          WHERE ${g.runJoin} AND r.installed_at >= g.t0 AND r.installed_at < g.t1
            AND r.installed_at <= ${asOf}::timestamptz AND ${runScope}${sawFilter}
         OFFSET 0
       ) r
       GROUP BY 1, 2
    ),
    runs_out AS (
      SELECT ${g.runGroup} AS gid, g.key,
             count(*) AS blades_removed,
             count(r.area_cut_mm2) AS blades_with_area,
             coalesce(sum(r.area_cut_mm2), 0) AS area_mm2,
             avg(r.area_cut_mm2) AS mean_life,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY r.area_cut_mm2) AS median_life,
             avg(r.cuts) AS mean_cuts,
             count(r.area_cut_mm2) FILTER (WHERE r.break_in_followed) AS followed_blades,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY r.area_cut_mm2) FILTER (WHERE r.break_in_followed) AS followed_median,
             count(r.area_cut_mm2) FILTER (WHERE r.break_in_followed = false) AS skipped_blades,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY r.area_cut_mm2) FILTER (WHERE r.break_in_followed = false) AS skipped_median,
             ${reasonColumns}
        FROM ${g.runs} g
        CROSS JOIN LATERAL (
         -- A lateral subquery per site (or saw) and bucket: the index range scan of that bucket's runs;
         -- OFFSET 0 keeps the planner from flattening it into one scan of the whole table.
         SELECT r.* FROM blade_runs r
          WHERE ${g.runJoin} AND r.removed_at >= g.t0 AND r.removed_at < g.t1
            AND r.removed_at <= ${asOf}::timestamptz AND ${runScope}${sawFilter}
         OFFSET 0
       ) r
       GROUP BY 1, 2
    ),
    scheduled AS (
      SELECT ${g.stopGroup} AS gid, bm.key,
             sum(GREATEST(0, extract(epoch FROM (g.w1 - g.w0)))) / 3600.0 AS scheduled_h
        FROM saw_months g JOIN bucket_months bm ON bm.mkey = g.mkey
       GROUP BY 1, 2
    ),
    stop_months AS (
      -- Each stop clipped to each month of its saw, summed per group and month before the months go into their
      -- buckets (everything here adds up), so a year's buckets sort months, not stops.
      SELECT gid, mkey,
             sum(hours) AS downtime_h,
             coalesce(sum(hours) FILTER (WHERE NOT planned), 0) AS unplanned_h,
             count(*) FILTER (WHERE began AND NOT planned AND category IN (${FAILURE_LIST})) AS failures,
             coalesce(sum(hours) FILTER (WHERE NOT planned AND category IN (${FAILURE_LIST})), 0) AS failure_h,
             ${categoryColumns}
        FROM (
          SELECT ${g.stopGroup} AS gid, g.mkey, p.category, p.planned,
                 extract(epoch FROM (LEAST(coalesce(p.ended_at, 'infinity'::timestamptz), g.w1)
                                     - GREATEST(p.started_at, g.w0))) / 3600.0 AS hours,
                 (p.started_at >= g.w0 AND p.started_at < g.w1) AS began
            FROM saw_months g
            JOIN stops p ON p.saw_id = g.saw_id
                 AND tstzrange(p.started_at, p.ended_at, '[)') && tstzrange(g.w0, GREATEST(g.w0, g.w1), '[)')
           WHERE g.w1 > g.w0 AND ${stopFilter}
        ) clipped
       GROUP BY 1, 2
    ),
    stopped AS (
      SELECT sm.gid, bm.key,
             sum(sm.downtime_h) AS downtime_h,
             sum(sm.unplanned_h) AS unplanned_h,
             sum(sm.failures) AS failures,
             sum(sm.failure_h) AS failure_h,
             ${categorySums}
        FROM stop_months sm JOIN bucket_months bm ON bm.mkey = sm.mkey
       GROUP BY 1, 2
    )
    SELECT ro.*, st.*, ri.blades_used, ri.bi_recorded, ri.bi_followed, ri.main_material, c.scheduled_h,
           c.gid, c.key -- last, so the joined tables' own gid and key (null where they have no row) never win
      FROM scheduled c
      LEFT JOIN runs_in ri ON ri.gid = c.gid AND ri.key = c.key
      LEFT JOIN runs_out ro ON ro.gid = c.gid AND ro.key = c.key
      LEFT JOIN stopped st ON st.gid = c.gid AND st.key = c.key`;
  return { sql, bind: params.values };
}

/**
 * One row of the statement as figures. Rows come from the saws' schedule, so a group without saws in the scope
 * (a site with none, or none the caller may read) gets no row and is reported empty by the caller.
 */
function toRawFigures(r: Record<string, unknown>): RawFigures {
  const stopHours = Object.fromEntries(DOWNTIME_CATEGORIES.map((c) => [c, num(r[`stop_${c}`])])) as Record<
    DowntimeCategory,
    number
  >;
  const removalReasons = Object.fromEntries(REMOVAL_REASONS.map((x) => [x, num(r[`reason_${x}`])])) as Record<
    RemovalReason,
    number
  >;
  return {
    groupId: String(r.gid),
    bucket: String(r.key),
    bladesUsed: num(r.blades_used),
    breakInRecorded: num(r.bi_recorded),
    breakInFollowed: num(r.bi_followed),
    mainMaterial: (r.main_material as MaterialGroup | null) ?? null,
    bladesRemoved: num(r.blades_removed),
    bladesWithArea: num(r.blades_with_area),
    areaCutMm2: num(r.area_mm2),
    meanLifeMm2: numOrNull(r.mean_life),
    medianLifeMm2: numOrNull(r.median_life),
    meanCutsPerBlade: numOrNull(r.mean_cuts),
    lifeFollowed: { blades: num(r.followed_blades), medianMm2: numOrNull(r.followed_median) },
    lifeSkipped: { blades: num(r.skipped_blades), medianMm2: numOrNull(r.skipped_median) },
    removalReasons,
    scheduledHours: num(r.scheduled_h),
    downtimeHours: num(r.downtime_h),
    unplannedStopHours: num(r.unplanned_h),
    stopHours,
    failures: num(r.failures),
    failureDowntimeHours: num(r.failure_h),
  };
}

/**
 * Money by group, site-local month and currency over the months `from`–`to`: what was spent (runs by install
 * time) and what the finished blades with area cost (runs by removal time). Each month is converted at its own
 * rate afterwards, so a period's total is the sum of its months.
 */
export async function moneyRows(
  sequelize: Sequelize,
  level: Level,
  scope: FigureScope,
  from: Month,
  to: Month,
): Promise<MoneyRow[]> {
  if (scope.siteIds.length === 0) return [];
  const params = new SqlParams();
  const ctes = scopeCtes(scope, params, null);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const m0 = params.add(`${monthStart(from)} 00:00:00`);
  const m1 = params.add(`${monthStart(addMonths(to, 1))} 00:00:00`);
  const asOf = params.add(scope.asOf);
  const sawFilter = scope.sawIds ? ` AND r.saw_id = ANY(${params.add(scope.sawIds)}::uuid[])` : '';
  const group = level === 'saw' ? 'r.saw_id::text' : level === 'site' ? 'r.site_id::text' : "'fleet'";
  const sql = `
    WITH ${ctes},
    bounds AS (
      SELECT s.id AS site_id, s.time_zone,
             ${m0}::timestamp AT TIME ZONE s.time_zone AS t0, ${m1}::timestamp AT TIME ZONE s.time_zone AS t1
        FROM sites_in s
    )
    SELECT ${group} AS gid, to_char(r.installed_at AT TIME ZONE b.time_zone, 'YYYY-MM') AS month, r.currency,
           'spend' AS kind, sum(r.cost_minor) AS amount
      FROM bounds b
      CROSS JOIN LATERAL (
       -- A lateral subquery per site (or saw) and bucket: the index range scan of that bucket's runs;
       -- OFFSET 0 keeps the planner from flattening it into one scan of the whole table.
       SELECT r.* FROM blade_runs r
        WHERE r.site_id = b.site_id AND r.installed_at >= b.t0 AND r.installed_at < b.t1
          AND r.installed_at <= ${asOf}::timestamptz AND ${runScope}${sawFilter}
       OFFSET 0
     ) r
     GROUP BY 1, 2, 3
    UNION ALL
    SELECT ${group}, to_char(r.removed_at AT TIME ZONE b.time_zone, 'YYYY-MM'), r.currency,
           'finished', sum(r.cost_minor)
      FROM bounds b
      CROSS JOIN LATERAL (
       -- A lateral subquery per site (or saw) and bucket: the index range scan of that bucket's runs;
       -- OFFSET 0 keeps the planner from flattening it into one scan of the whole table.
       SELECT r.* FROM blade_runs r
        WHERE r.site_id = b.site_id AND r.removed_at >= b.t0 AND r.removed_at < b.t1
          AND r.area_cut_mm2 IS NOT NULL AND r.removed_at <= ${asOf}::timestamptz AND ${runScope}${sawFilter}
       OFFSET 0
     ) r
     GROUP BY 1, 2, 3`;
  const rows = await sequelize.query<{ gid: string; month: string; currency: string; kind: string; amount: unknown }>(
    sql,
    { bind: params.values, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    groupId: r.gid,
    month: r.month,
    currency: r.currency.trim(),
    kind: r.kind as MoneyRow['kind'],
    amountMinor: num(r.amount),
  }));
}
