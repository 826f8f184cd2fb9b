import { QueryTypes, type Sequelize } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { DOWNTIME_CATEGORIES, FAILURE_CATEGORIES, type DowntimeCategory } from '@kerfline/domain/metrics/schema';
import { REMOVAL_REASONS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { MATERIAL_GROUPS, type MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { addMonths, monthStart, monthsOf, type Month } from '@kerfline/domain/fleet/period';
import { SqlParams, scopeFields, scopeSql } from '../../authz/sequelize-scope.js';
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

/** `stops: false` leaves the stops and hours out (all 0), for a caller that sums them from another level. */
export type FigureOptions = {
  stops?: boolean;
  /** `false` reads every month from the records, never the monthly summary (the tests compare the two). */
  summary?: boolean;
  /**
   * Also the median life of blades whose break-in was followed and of those where it was skipped, and how many
   * of each (else null and 0: telling the blades apart costs a fleet-wide saw-level year about 20 ms).
   */
  breakInMedians?: boolean;
};

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
  /**
   * Finished blades with area, split by whether their break-in was followed (false: recorded as skipped); only
   * with `breakInMedians`, else 0 blades and null.
   */
  lifeFollowed: { blades: number; medianMm2: number | null };
  lifeSkipped: { blades: number; medianMm2: number | null };
  removalReasons: Record<RemovalReason, number>;
  /**
   * The one currency every run of the group in the bucket was in (null when several, or none), and the spend and
   * cost of finished blades with area summed in it: with that currency the money needs no month-by-month rows.
   */
  moneyCurrency: string | null;
  spendMinor: number;
  finishedCostMinor: number;
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
 * Whether the per-saw, per-month summary (saw_month_runs, saw_month_stops; migration 20261207-0101) may stand
 * in for the caller's records: only when their rules on runs and stops look at nothing but the site, which is
 * what the summary keeps. Otherwise every month is read from the records.
 */
function rollupServes(ability: AppAbility): boolean {
  const bySiteOnly = (subject: 'BladeRun' | 'Stop') =>
    [...scopeFields(ability, 'read', subject)].every((field) => field === 'siteId');
  return bySiteOnly('BladeRun') && bySiteOnly('Stop');
}

/**
 * Whether the per-site summary (site_month_runs, site_month_stops, site_month_lives; migrations 20261208-0101
 * and -0102) may stand in: for a site's or the fleet's figures, not a saw's or some saws', when the per-saw
 * summary may and the caller's rules on saws also look at nothing but the site (so a site's saws in scope are all
 * its saws).
 */
function siteSummaryServes(scope: FigureScope, level: Level, rollup: boolean): boolean {
  return (
    rollup &&
    level !== 'saw' &&
    !scope.sawIds &&
    [...scopeFields(scope.ability, 'read', 'Saw')].every((field) => field === 'siteId')
  );
}

/**
 * The sites and saws in scope as CTEs (`sites_in`, `saws_in`); the months asked about (`months`), each site's
 * months with whether the summary serves them (`site_months`: a month that ended by the as-of time, in the
 * site's zone) and each saw's windows in service (`saw_months`); with buckets, the months of each bucket
 * (`bucket_months`).
 */
function scopeCtes(
  scope: FigureScope,
  params: SqlParams,
  months: Month[],
  buckets: Bucket[] | null,
  rollup: boolean,
): string {
  const siteScope = scopeSql(scope.ability, 'read', 'Site', Site, 's', params);
  const sawScope = scopeSql(scope.ability, 'read', 'Saw', Saw, 'w', params);
  const siteIds = params.add(scope.siteIds);
  // A list of saws (1 500 for a fleet-wide review) is matched through a hashed set, not scanned per saw.
  const sawFilter = scope.sawIds ? ` AND w.id IN (SELECT unnest(${params.add(scope.sawIds)}::uuid[]))` : '';
  const asOf = params.add(scope.asOf);
  const monthKeys = params.add(months);
  const monthStarts = params.add(months.map((m) => `${monthStart(m)} 00:00:00`));
  const monthEnds = params.add(months.map((m) => `${monthStart(addMonths(m, 1))} 00:00:00`));
  const ctes = [
    `sites_in AS (
      SELECT s.id, s.time_zone FROM sites s WHERE s.id = ANY(${siteIds}::uuid[]) AND ${siteScope}
    )`,
    // Materialized: each saw's start of service is looked up once, however many months read it (and only for a
    // statement that reads the saws' months: money does not).
    `saws_in AS MATERIALIZED (
      SELECT w.id, w.site_id, w.retired_at,
             ${
               buckets
                 ? // A saw created a day or more before the first month began was in service for all of it, in any
                   // zone: its first run and stop cannot move its months' windows, so they are not looked up.
                   `CASE WHEN w.created_at <= ${params.add(`${monthStart(months[0]!)} 00:00:00`)}::timestamp AT TIME ZONE 'UTC' - interval '1 day'
                        THEN w.created_at
                        ELSE LEAST(w.created_at,
                                   (SELECT min(r0.installed_at) FROM blade_runs r0 WHERE r0.saw_id = w.id),
                                   (SELECT min(p0.started_at) FROM stops p0 WHERE p0.saw_id = w.id)) END`
                 : 'NULL::timestamptz'
             } AS in_service_from
        FROM saws w JOIN sites_in s ON s.id = w.site_id
       WHERE ${sawScope}${sawFilter}
    )`,
    `months AS (
      SELECT * FROM unnest(${monthKeys}::text[], ${monthStarts}::timestamp[], ${monthEnds}::timestamp[]) AS m(mkey, m0, m1)
    )`,
    `site_months AS (
      SELECT s.id AS site_id, m.mkey, m.m0::date AS mdate,
             m.m0 AT TIME ZONE s.time_zone AS t0, m.m1 AT TIME ZONE s.time_zone AS t1,
             (${rollup ? 'TRUE' : 'FALSE'} AND m.m1 AT TIME ZONE s.time_zone <= ${asOf}::timestamptz) AS summed
        FROM sites_in s CROSS JOIN months m
    )`,
    `saw_months AS (
      SELECT w.id AS saw_id, w.site_id, sm.mdate, sm.summed,
             GREATEST(sm.t0, w.in_service_from) AS w0,
             LEAST(sm.t1, w.retired_at, ${asOf}::timestamptz) AS w1
        FROM saws_in w JOIN site_months sm ON sm.site_id = w.site_id
    )`,
  ];
  if (buckets) {
    // Buckets by their position (1, 2, …), so the rows sorted for the medians carry a number, not a name.
    const pairs = buckets.flatMap((b, i) => monthsOf(b).map((m) => [i + 1, monthStart(m)] as const));
    const pairBuckets = params.add(pairs.map(([b]) => b));
    const pairMonths = params.add(pairs.map(([, m]) => m));
    ctes.push(
      `bucket_months AS (
        SELECT * FROM unnest(${pairBuckets}::int[], ${pairMonths}::date[]) AS bm(b, mdate)
      )`,
    );
  }
  return ctes.join(',\n');
}

const sqlList = (values: readonly string[]) => values.map((v) => `'${v}'`).join(', ');
const FAILURE_LIST = sqlList(FAILURE_CATEGORIES);

/** The summed columns of a month of runs: one row of saw_month_runs, or one run read from the records. */
const RUN_SUMS = [
  'blades_used',
  'spend_minor',
  'break_in_recorded',
  'break_in_followed',
  ...MATERIAL_GROUPS.map((m) => `material_${m}`),
  'blades_removed',
  'blades_with_area',
  'area_mm2',
  'cuts_sum',
  'cuts_recorded',
  'finished_cost_minor',
  ...REMOVAL_REASONS.map((r) => `reason_${r}`),
] as const;

/** A run read from the records as a row shaped like the summary's; columns not named are 0 (or empty lists). */
function runRow(values: Partial<Record<(typeof RUN_SUMS)[number], string>>): string {
  return RUN_SUMS.map((c) => `${values[c] ?? '0'} AS ${c}`).join(', ');
}

/** The fleet's stand-in id while the statement groups (every group is a uuid, so sorting them stays narrow). */
const FLEET_GROUP = '00000000-0000-0000-0000-000000000000';
/** How a level groups rows: by saw, by site or all together. */
const groupOf = (level: Level, alias: string) =>
  level === 'saw' ? `${alias}.saw_id` : level === 'site' ? `${alias}.site_id` : `'${FLEET_GROUP}'::uuid`;
const groupName = (level: Level, column: string) => (level === 'fleet' ? `'fleet'` : `${column}::text`);

/**
 * `run_months`: the runs of every (group, month, currency) asked about, as rows to be summed: the summary's rows
 * for months it serves, and each run from the records for the rest (the month still running, or every month
 * when the summary may not stand in). Runs put on count by install time, runs taken off by removal time, both up
 * to the as-of time.
 */
function runMonthsCte(
  level: Level,
  scope: FigureScope,
  params: SqlParams,
  months: Month[],
  lives: boolean,
  bySite: boolean,
  split = false,
): string {
  const asOf = params.add(scope.asOf);
  const summaryScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'ru', params);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const sawIds = scope.sawIds && level !== 'saw' ? params.add(scope.sawIds) : null;
  const firstMonth = params.add(monthStart(months[0]!));
  const lastMonth = params.add(monthStart(months[months.length - 1]!));
  // The saw level reads the saws in scope; the others every run of their sites (optionally of some saws only).
  const sawOf = (alias: string) =>
    level === 'saw'
      ? ` AND ${alias}.saw_id IN (SELECT id FROM saws_in)`
      : sawIds
        ? ` AND ${alias}.saw_id IN (SELECT unnest(${sawIds}::uuid[]))`
        : '';
  const materials = Object.fromEntries(
    MATERIAL_GROUPS.map((m) => [`material_${m}`, `(r.material_group = '${m}')::int`]),
  );
  const reasons = Object.fromEntries(REMOVAL_REASONS.map((x) => [`reason_${x}`, `(r.removal_reason = '${x}')::int`]));
  // A lateral subquery per site and month: the index range scan of that month's runs (OFFSET 0 keeps the planner
  // from flattening it into one scan of the whole table).
  const records = (time: 'installed_at' | 'removed_at', extra = '') => `site_months sm CROSS JOIN LATERAL (
        SELECT r.* FROM blade_runs r
         WHERE r.site_id = sm.site_id AND r.${time} >= sm.t0 AND r.${time} < sm.t1
           AND r.${time} <= ${asOf}::timestamptz AND ${runScope}${sawOf('r')}${extra}
        OFFSET 0
      ) r`;
  const summary = `site_months sm
        JOIN ${bySite ? 'site_month_runs' : 'saw_month_runs'} ru ON ru.site_id = sm.site_id AND ru.month = sm.mdate
             AND ru.month >= ${firstMonth}::date AND ru.month <= ${lastMonth}::date`;
  const summaryWhere = `sm.summed AND ${summaryScope}${sawOf('ru')}`;
  const runMonths = `run_months AS (
      SELECT ${groupOf(level, 'ru')} AS gid, sm.mdate, ru.currency, ${RUN_SUMS.map((c) => `ru.${c}`).join(', ')}
        FROM ${summary}
       WHERE ${summaryWhere}
      UNION ALL
      SELECT ${groupOf(level, 'r')}, sm.mdate, r.currency,
             ${runRow({
               blades_used: '1',
               spend_minor: 'r.cost_minor',
               break_in_recorded: '(r.break_in_followed IS NOT NULL)::int',
               break_in_followed: 'coalesce(r.break_in_followed, false)::int',
               ...materials,
             })}
        FROM ${records('installed_at')}
       WHERE NOT sm.summed
      UNION ALL
      SELECT ${groupOf(level, 'r')}, sm.mdate, r.currency,
             ${runRow({
               blades_removed: '1',
               blades_with_area: '(r.area_cut_mm2 IS NOT NULL)::int',
               area_mm2: 'coalesce(r.area_cut_mm2, 0)',
               cuts_sum: 'coalesce(r.cuts, 0)',
               cuts_recorded: '(r.cuts IS NOT NULL)::int',
               finished_cost_minor: 'CASE WHEN r.area_cut_mm2 IS NOT NULL THEN r.cost_minor ELSE 0 END',
               ...reasons,
             })}
        FROM ${records('removed_at')}
       WHERE NOT sm.summed
    )`;
  if (!lives) return runMonths;
  // Each finished blade's area in each bucket its month is in (`bucket_months`), with `split` how its break-in
  // went (1 followed, 2 skipped, 3 not recorded; else 0): from the summary's lists (one unnest of the three end to
  // end, after the month's row met its buckets) and from the records for the month still running. Without `split`
  // no position is counted per blade, which a fleet-wide year of 150 000 blades notices.
  return `${runMonths},
    lives AS (
      SELECT ${groupOf(level, 'ru')} AS gid, bm.b, l.v,
             ${
               split
                 ? `CASE WHEN l.i <= cardinality(ru.life_followed) THEN 1
                  WHEN l.i <= cardinality(ru.life_followed) + cardinality(ru.life_skipped) THEN 2 ELSE 3 END`
                 : '0'
             } AS f
        FROM ${summary}
        JOIN bucket_months bm ON bm.mdate = sm.mdate
        CROSS JOIN LATERAL unnest(ru.life_followed || ru.life_skipped || ru.life_unrecorded)${split ? ' WITH ORDINALITY AS l(v, i)' : ' AS l(v)'}
       WHERE ${summaryWhere}
      UNION ALL
      SELECT ${groupOf(level, 'r')}, bm.b, r.area_cut_mm2,
             ${split ? 'CASE WHEN r.break_in_followed THEN 1 WHEN NOT r.break_in_followed THEN 2 ELSE 3 END' : '0'}
        FROM ${records('removed_at', ' AND r.area_cut_mm2 IS NOT NULL')}
        JOIN bucket_months bm ON bm.mdate = sm.mdate
       WHERE NOT sm.summed
    )`;
}

/**
 * `lives_b`: per group and bucket, the median area of the finished blades (and, with `split`, of those whose
 * break-in was followed and of those where it was skipped, and how many of the latter two there are). This one
 * sorts every finished blade's area (`lives`, from runMonthsCte): for the saw level and for callers the sites'
 * sorted lists cannot serve.
 */
function recordMedianCtes(split: boolean): string {
  const splitMedians = split
    ? `percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) FILTER (WHERE l.f = 1) AS followed_median,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) FILTER (WHERE l.f = 2) AS skipped_median`
    : 'NULL::float8 AS followed_median, NULL::float8 AS skipped_median';
  return `lives_b AS (
      SELECT l.gid, l.b,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) AS median_life,
             ${splitMedians},
             count(*) FILTER (WHERE l.f = 1) AS life_followed_n,
             count(*) FILTER (WHERE l.f = 2) AS life_skipped_n
        FROM lives l
       GROUP BY 1, 2
    )`;
}

/**
 * `lives_b` of each saw: the same figures as `recordMedianCtes`, each saw's and bucket's worked out on its own
 * (a lateral subquery), from its summary rows (read through the primary key) and, for the months the summary does
 * not serve, its runs (through (saw_id, removed_at)). Sorting each saw's hundred-odd blades apart beats sorting a
 * fleet-wide year's 150 000 together by saw: about 40 ms of the outlier review's statement.
 *
 * Which months the summary serves is the site's (`site_buckets`: per site and bucket, the months it serves and the
 * others' windows). A saw's runs are always at its own site (foreign key blade_runs_saw_site), and so are its
 * summary rows, recomputed from them.
 */
function sawMedianCtes(scope: FigureScope, params: SqlParams, months: Month[], split: boolean): string {
  const asOf = params.add(scope.asOf);
  const summaryScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'ru', params);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const firstMonth = params.add(monthStart(months[0]!));
  const lastMonth = params.add(monthStart(months[months.length - 1]!));
  const splitMedians = split
    ? `percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) FILTER (WHERE l.f = 1) AS followed_median,
                 percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) FILTER (WHERE l.f = 2) AS skipped_median`
    : 'NULL::float8 AS followed_median, NULL::float8 AS skipped_median';
  // With `split`, each blade's break-in: 1 followed, 2 skipped, 3 not recorded (else 0, and no counts).
  const summaryKind = split
    ? `CASE WHEN u.i <= cardinality(ru.life_followed) THEN 1
                      WHEN u.i <= cardinality(ru.life_followed) + cardinality(ru.life_skipped) THEN 2 ELSE 3 END`
    : '0';
  const recordKind = split
    ? 'CASE WHEN r.break_in_followed THEN 1 WHEN NOT r.break_in_followed THEN 2 ELSE 3 END'
    : '0';
  return `site_buckets AS (
      SELECT sm.site_id, bm.b,
             coalesce(array_agg(sm.mdate) FILTER (WHERE sm.summed), '{}') AS summed,
             coalesce(array_agg(sm.t0) FILTER (WHERE NOT sm.summed), '{}') AS open_t0,
             coalesce(array_agg(sm.t1) FILTER (WHERE NOT sm.summed), '{}') AS open_t1
        FROM site_months sm JOIN bucket_months bm ON bm.mdate = sm.mdate
       GROUP BY 1, 2
    ),
    open_span AS (
      -- Where any month the summary does not serve lies (none: nothing, and no run is read).
      SELECT min(t0) AS t0, max(t1) AS t1 FROM site_months WHERE NOT summed
    ),
    lives_b AS MATERIALIZED (
      -- Materialized: each saw's subquery runs once, however the planner joins the figures afterwards.
      SELECT w.id AS gid, sb.b, x.median_life, x.followed_median, x.skipped_median,
             x.life_followed_n, x.life_skipped_n
        FROM saws_in w
        JOIN site_buckets sb ON sb.site_id = w.site_id
        CROSS JOIN LATERAL (
          SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY l.v) AS median_life,
                 ${splitMedians},
                 count(*) FILTER (WHERE l.f = 1) AS life_followed_n,
                 count(*) FILTER (WHERE l.f = 2) AS life_skipped_n
            FROM (
              SELECT u.v, ${summaryKind} AS f
                FROM saw_month_runs ru
                CROSS JOIN LATERAL unnest(ru.life_followed || ru.life_skipped || ru.life_unrecorded)${split ? ' WITH ORDINALITY AS u(v, i)' : ' AS u(v)'}
               WHERE ru.saw_id = w.id AND ru.month >= ${firstMonth}::date AND ru.month <= ${lastMonth}::date
                 AND ru.site_id = w.site_id AND ru.month = ANY(sb.summed) AND ${summaryScope}
              UNION ALL
              SELECT r.area_cut_mm2, ${recordKind}
                FROM blade_runs r
               WHERE r.saw_id = w.id AND r.removed_at IS NOT NULL
                 AND r.removed_at >= (SELECT t0 FROM open_span) AND r.removed_at < (SELECT t1 FROM open_span)
                 AND r.removed_at <= ${asOf}::timestamptz AND r.area_cut_mm2 IS NOT NULL AND r.site_id = w.site_id
                 AND ${runScope}
                 AND EXISTS (SELECT 1 FROM unnest(sb.open_t0, sb.open_t1) AS m(t0, t1)
                              WHERE r.removed_at >= m.t0 AND r.removed_at < m.t1)
            ) l
        ) x
    )`;
}

/**
 * `lives_b` from the sites' sorted monthly lists (site_month_lives; migration 20261208-0101), the month still
 * running sorted from the records. The median is exact and equals percentile_cont(0.5) over every blade, without
 * sorting them all:
 *
 * - A bucket's blades are the union of its lists. Take lo = the smallest of the lists' lower middles and hi = the
 *   largest of their upper middles (each read from its sorted list). Fewer than half of each list lies below its
 *   lower middle, so fewer than half of the union lies below lo, and likewise above hi: both middle ranks of the
 *   union, r0 = ⌊(N − 1)/2⌋ and r1 = ⌊N/2⌋, hold values in [lo, hi].
 * - In each list, width_bucket(x, list) counts the values ≤ x (a binary search). Let `below` = Σ count(≤ lo).
 *   A middle rank r < below holds lo itself (its value is ≤ lo and ≥ lo); any other holds the (r − below)-th value,
 *   from 0, of the blades in (lo, hi], which are the only ones sorted.
 * - median = v(r0) + (v(r1) − v(r0)) · 0.5, percentile_cont's own interpolation.
 *
 * A month's bucket is one list, so its median is read, not sorted; a year's sorts the blades between its months'
 * medians.
 */
function listMedianCtes(level: Level, scope: FigureScope, params: SqlParams, split: boolean): string {
  const asOf = params.add(scope.asOf);
  const listScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'sl', params);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const sorted = (filter: string) =>
    `coalesce(array_agg(r.area_cut_mm2 ORDER BY r.area_cut_mm2)${filter ? ` FILTER (WHERE ${filter})` : ''}, '{}')`;
  // Lists by kind: 1 every finished blade, 2 break-in followed, 3 skipped (the latter two's medians with `split`).
  const window = (r: string) => `CASE WHEN ${r} < w.below THEN w.lo ELSE w.w[${r} - w.below + 1] END`;
  return `lists AS (
      SELECT ${groupOf(level, 'sm')} AS gid, bm.b, sl.lives, sl.followed, sl.skipped
        FROM site_months sm
        JOIN site_month_lives sl ON sl.site_id = sm.site_id AND sl.month = sm.mdate
        JOIN bucket_months bm ON bm.mdate = sm.mdate
       WHERE sm.summed AND ${listScope}
      UNION ALL
      SELECT ${groupOf(level, 'sm')}, bm.b, cur.lives, cur.followed, cur.skipped
        FROM site_months sm
        JOIN bucket_months bm ON bm.mdate = sm.mdate
        CROSS JOIN LATERAL (
          SELECT ${sorted('')} AS lives, ${sorted('r.break_in_followed')} AS followed,
                 ${sorted('NOT r.break_in_followed')} AS skipped
            FROM blade_runs r
           WHERE r.site_id = sm.site_id AND r.removed_at >= sm.t0 AND r.removed_at < sm.t1
             AND r.removed_at <= ${asOf}::timestamptz AND r.area_cut_mm2 IS NOT NULL AND ${runScope}
        ) cur
       WHERE NOT sm.summed
    ),
    kind_lists AS (
      SELECT l.gid, l.b, x.k, x.a
        FROM lists l CROSS JOIN LATERAL (VALUES (1, l.lives), (2, l.followed), (3, l.skipped)) AS x(k, a)
       WHERE cardinality(x.a) > 0${split ? '' : ' AND x.k = 1'}
    ),
    list_bounds AS (
      SELECT gid, b, k, sum(cardinality(a))::int AS n,
             min(a[(cardinality(a) + 1) / 2]) AS lo, max(a[cardinality(a) / 2 + 1]) AS hi
        FROM kind_lists GROUP BY gid, b, k
    ),
    list_windows AS (
      -- Each list's count up to lo, and its values in (lo, hi]; one row per list even when it has none there.
      -- With the break-in split the inner rows are narrowed first (OFFSET 0 keeps them a step of their own):
      -- sorted with the three lists they came from, practice's 39 000 values had made a 52 MB sort on disk. Without
      -- it the lists are one kind and the sort stays in memory, and the extra step only slowed the overview.
      SELECT x.gid, x.b, x.k, min(x.n) AS n, min(x.lo) AS lo,
             sum(x.below) FILTER (WHERE x.i IS NULL OR x.i = 1)::int AS below,
             array_agg(x.v ORDER BY x.v) FILTER (WHERE x.v IS NOT NULL) AS w
        FROM (SELECT s.gid, s.b, s.k, s.n, s.lo, s.below, u.v, u.i
                FROM (SELECT l.gid, l.b, l.k, d.n, d.lo, width_bucket(d.lo, l.a) AS below,
                             l.a[width_bucket(d.lo, l.a) + 1 : width_bucket(d.hi, l.a)] AS part
                        FROM kind_lists l JOIN list_bounds d ON d.gid = l.gid AND d.b = l.b AND d.k = l.k
                       WHERE ${split ? 'TRUE' : 'l.k = 1'}) s
                LEFT JOIN LATERAL unnest(s.part) WITH ORDINALITY AS u(v, i) ON TRUE
              ${split ? 'OFFSET 0' : ''}) x
       GROUP BY x.gid, x.b, x.k
    ),
    lives_b AS (
      SELECT gid, b,
             max(median) FILTER (WHERE k = 1) AS median_life,
             max(median) FILTER (WHERE k = 2) AS followed_median,
             max(median) FILTER (WHERE k = 3) AS skipped_median,
             coalesce(sum(n) FILTER (WHERE k = 2), 0) AS life_followed_n,
             coalesce(sum(n) FILTER (WHERE k = 3), 0) AS life_skipped_n
        FROM (SELECT gid, b, k, n, NULL::float8 AS median FROM list_bounds
              UNION ALL
              SELECT w.gid, w.b, w.k, NULL, m.v0 + (m.v1 - m.v0) * 0.5
                FROM list_windows w
                CROSS JOIN LATERAL (SELECT ${window('(w.n - 1) / 2')} AS v0, ${window('w.n / 2')} AS v1) m) x
       GROUP BY gid, b
    )`;
}

/**
 * Every figure of `level` groups (the fleet, each site or each saw) in each bucket, in one statement. The saws
 * and sites come from the caller's scope; months that have ended come from the per-saw monthly summary, the
 * month still running (and open stops) from the records.
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
  const months = [...new Set(buckets.flatMap((b) => monthsOf(b)))].sort();
  const rollup = options.summary !== false && rollupServes(scope.ability);
  const ctes = scopeCtes(scope, params, months, buckets, rollup);
  // A site's or the fleet's sums and medians come from the per-site summary where it serves.
  const bySite = siteSummaryServes(scope, level, rollup);
  const split = Boolean(options.breakInMedians);
  const runMonths = runMonthsCte(level, scope, params, months, !bySite && level !== 'saw', bySite, split);
  const lives =
    level === 'saw'
      ? sawMedianCtes(scope, params, months, split)
      : bySite
        ? listMedianCtes(level, scope, params, split)
        : recordMedianCtes(split);
  const summaryScope = scopeSql(scope.ability, 'read', 'Stop', Stop, 'rs', params);
  const stopScope = scopeSql(scope.ability, 'read', 'Stop', Stop, 'p', params);
  // Without stops the clauses are FALSE, so the planner reads none; the scope stays in them for its bound values.
  const noStops = options.stops === false ? 'FALSE AND ' : '';
  const stopGroup = groupOf(level, 'g');
  // Rows by group and month: summed first where a group has many (`grouped`), as they are where it has one (`own`).
  const perMonth = (grouped: string, own: string) => (level === 'saw' ? own : `(${grouped})`);
  const sum = (c: string) => `sum(rm.${c}) AS ${c}`;
  // The lowest and highest currency of a group's rows with money (a month's summary row can hold none, once its
  // runs were removed): a saw's straight from its rows, a site's or the fleet's from its months'.
  const withMoney = (alias: string) => `${alias}blades_used > 0 OR ${alias}blades_with_area > 0`;
  const [currencyLo, currencyHi] =
    level === 'saw'
      ? ['min', 'max'].map((f) => `${f}(rm.currency) FILTER (WHERE ${withMoney('rm.')})`)
      : ['min(rm.currency_lo)', 'max(rm.currency_hi)'];
  const categoryColumns = DOWNTIME_CATEGORIES.map(
    (c) => `coalesce(sum(hours) FILTER (WHERE category = '${c}'), 0) AS "stop_${c}"`,
  ).join(',\n             ');
  const summaryCategories = DOWNTIME_CATEGORIES.map((c) => `rs.stop_${c} AS "stop_${c}"`).join(', ');
  const categorySums = DOWNTIME_CATEGORIES.map((c) => `sum(sm."stop_${c}") AS "stop_${c}"`).join(',\n             ');
  // A saw's stop rows (one per saw and month) meet their buckets in `stop_months` itself, beside the sites' months:
  // joined afterwards, the planner misjudged their number and matched 18 000 saw-months to the buckets in a nested
  // loop (a fleet-wide year, about 35 ms of the statement). A site's or the fleet's are summed by month first.
  const sawBuckets = level === 'saw';
  const stopKey = sawBuckets ? 'bm.b' : 'sm.mdate';
  // Each stop clipped to each month of its saw: [w0, w1) (an open stop runs to the as-of time).
  const clipped = (which: string) => `
          SELECT ${stopGroup} AS gid, g.mdate, p.category, p.planned,
                 extract(epoch FROM (LEAST(coalesce(p.ended_at, 'infinity'::timestamptz), g.w1)
                                     - GREATEST(p.started_at, g.w0))) / 3600.0 AS hours,
                 (p.started_at >= g.w0 AND p.started_at < g.w1) AS began
            FROM saw_months g
            JOIN stops p ON p.saw_id = g.saw_id
                 AND tstzrange(p.started_at, p.ended_at, '[)') && tstzrange(g.w0, GREATEST(g.w0, g.w1), '[)')
           WHERE g.w1 > g.w0 AND ${noStops}${stopScope} AND ${which}`;

  const sql = `
    WITH ${ctes},
    ${runMonths},
    runs_b AS (
      -- A site's or the fleet's rows summed by group and month first, then the few month rows into their buckets (a
      -- month is in more than one); a saw's rows are one per month already.
      -- With the one currency all its runs were in (null when several), so money in that currency is whole as summed.
      SELECT rm.gid, bm.b, ${RUN_SUMS.map(sum).join(', ')},
             CASE WHEN ${currencyLo} = ${currencyHi} THEN ${currencyLo} END AS money_currency
        FROM ${perMonth(`SELECT gid, mdate, ${RUN_SUMS.map((c) => `sum(${c}) AS ${c}`).join(', ')}, min(currency) FILTER (WHERE ${withMoney('')}) AS currency_lo, max(currency) FILTER (WHERE ${withMoney('')}) AS currency_hi FROM run_months GROUP BY gid, mdate`, 'run_months')} rm
        JOIN bucket_months bm ON bm.mdate = rm.mdate
       GROUP BY 1, 2
    ),
    ${lives},
    scheduled AS (${
      options.stops === false
        ? `
      -- Without stops, no hours either: one row per group with saws and bucket.
      SELECT g.gid, b.b, 0 AS scheduled_h
        FROM (SELECT DISTINCT ${level === 'saw' ? 'w.id' : groupOf(level, 'w')} AS gid FROM saws_in w) g
        CROSS JOIN (SELECT DISTINCT b FROM bucket_months) b`
        : `
      SELECT g.gid, bm.b, sum(g.seconds) / 3600.0 AS scheduled_h
        FROM ${perMonth(
          `SELECT ${stopGroup} AS gid, g.mdate, sum(GREATEST(0, extract(epoch FROM (g.w1 - g.w0)))) AS seconds FROM saw_months g GROUP BY 1, 2`,
          `(SELECT ${stopGroup} AS gid, g.mdate, GREATEST(0, extract(epoch FROM (g.w1 - g.w0))) AS seconds FROM saw_months g)`,
        )} g
        JOIN bucket_months bm ON bm.mdate = g.mdate
       GROUP BY 1, 2`
    }
    ),
    stop_months AS (
      -- Finished stops of the months the summary serves, already clipped and summed per saw (or site) and month.
      SELECT ${groupOf(level, 'rs')} AS gid, ${stopKey},
             rs.downtime_h, rs.unplanned_h, rs.failures, rs.failure_h, ${summaryCategories}
        FROM site_months sm${sawBuckets ? '\n        JOIN bucket_months bm ON bm.mdate = sm.mdate' : ''}
        JOIN ${bySite ? 'site_month_stops' : 'saw_month_stops'} rs ON rs.site_id = sm.site_id AND rs.month = sm.mdate
             AND rs.month >= ${params.add(monthStart(months[0]!))}::date
             AND rs.month <= ${params.add(monthStart(months[months.length - 1]!))}::date
       WHERE sm.summed AND ${noStops}${summaryScope} ${bySite ? '' : 'AND rs.saw_id IN (SELECT id FROM saws_in)'}
      UNION ALL
      -- The rest from the records: every stop of a month the summary does not serve, and open stops.
      SELECT gid, ${sawBuckets ? 'bm.b' : 'mdate'},
             sum(hours) AS downtime_h,
             coalesce(sum(hours) FILTER (WHERE NOT planned), 0) AS unplanned_h,
             count(*) FILTER (WHERE began AND NOT planned AND category IN (${FAILURE_LIST})) AS failures,
             coalesce(sum(hours) FILTER (WHERE NOT planned AND category IN (${FAILURE_LIST})), 0) AS failure_h,
             ${categoryColumns}
        FROM (${clipped('NOT g.summed')}
          UNION ALL${clipped('g.summed AND p.ended_at IS NULL')}
        ) clipped${sawBuckets ? '\n        JOIN bucket_months bm ON bm.mdate = clipped.mdate' : ''}
       GROUP BY 1, 2
    ),
    stopped AS (
      SELECT sm.gid, ${sawBuckets ? 'sm.b' : 'bm.b'},
             sum(sm.downtime_h) AS downtime_h,
             sum(sm.unplanned_h) AS unplanned_h,
             sum(sm.failures) AS failures,
             sum(sm.failure_h) AS failure_h,
             ${categorySums}
        FROM ${perMonth(
          `SELECT gid, mdate, sum(downtime_h) AS downtime_h, sum(unplanned_h) AS unplanned_h,
                     sum(failures) AS failures, sum(failure_h) AS failure_h,
                     ${DOWNTIME_CATEGORIES.map((c) => `sum("stop_${c}") AS "stop_${c}"`).join(', ')}
                FROM stop_months GROUP BY gid, mdate`,
          'stop_months',
        )} sm${sawBuckets ? '' : '\n        JOIN bucket_months bm ON bm.mdate = sm.mdate'}
       GROUP BY 1, 2
    )
    SELECT ro.*, lb.median_life, lb.followed_median, lb.skipped_median, lb.life_followed_n, lb.life_skipped_n, st.*, c.scheduled_h,
           -- last, so the joined tables' own gid and key (null where they have no row) never win
           ${groupName(level, 'c.gid')} AS gid, (${params.add(buckets.map((b) => b.key))}::text[])[c.b] AS key
      FROM scheduled c
      LEFT JOIN runs_b ro ON ro.gid = c.gid AND ro.b = c.b
      LEFT JOIN lives_b lb ON lb.gid = c.gid AND lb.b = c.b
      LEFT JOIN stopped st ON st.gid = c.gid AND st.b = c.b`;
  return { sql, bind: params.values };
}

/** The material most blades were put on for (ties: the first in alphabetical order), or null with none. */
function mainMaterialOf(r: Record<string, unknown>): MaterialGroup | null {
  let best: MaterialGroup | null = null;
  let most = 0;
  for (const m of [...MATERIAL_GROUPS].sort()) {
    const n = num(r[`material_${m}`]);
    if (n > most) [best, most] = [m, n];
  }
  return best;
}

const ratio = (total: unknown, count: unknown): number | null => (num(count) > 0 ? num(total) / num(count) : null);

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
  const followed = num(r.life_followed_n);
  return {
    groupId: String(r.gid),
    bucket: String(r.key),
    bladesUsed: num(r.blades_used),
    breakInRecorded: num(r.break_in_recorded),
    breakInFollowed: num(r.break_in_followed),
    mainMaterial: mainMaterialOf(r),
    bladesRemoved: num(r.blades_removed),
    bladesWithArea: num(r.blades_with_area),
    areaCutMm2: num(r.area_mm2),
    meanLifeMm2: ratio(r.area_mm2, r.blades_with_area),
    medianLifeMm2: numOrNull(r.median_life),
    meanCutsPerBlade: ratio(r.cuts_sum, r.cuts_recorded),
    lifeFollowed: { blades: followed, medianMm2: numOrNull(r.followed_median) },
    lifeSkipped: { blades: num(r.life_skipped_n), medianMm2: numOrNull(r.skipped_median) },
    removalReasons,
    moneyCurrency: r.money_currency === null || r.money_currency === undefined ? null : String(r.money_currency).trim(),
    spendMinor: num(r.spend_minor),
    finishedCostMinor: num(r.finished_cost_minor),
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
  options: Pick<FigureOptions, 'summary'> = {},
): Promise<MoneyRow[]> {
  if (scope.siteIds.length === 0) return [];
  const params = new SqlParams();
  const rollup = options.summary !== false && rollupServes(scope.ability);
  const ctes = scopeCtes(scope, params, monthsOf({ from, to }), null, rollup);
  const sql = `
    WITH ${ctes},
    ${runMonthsCte(level, scope, params, monthsOf({ from, to }), false, siteSummaryServes(scope, level, rollup))}
    SELECT ${groupName(level, 'gid')} AS gid, to_char(mdate, 'YYYY-MM') AS month, currency,
           sum(spend_minor) AS spend, sum(blades_used) AS used,
           sum(finished_cost_minor) AS finished, sum(blades_with_area) AS with_area
      FROM run_months
     GROUP BY 1, 2, 3`;
  type Row = {
    gid: string;
    month: string;
    currency: string;
    spend: unknown;
    used: unknown;
    finished: unknown;
    with_area: unknown;
  };
  const rows = await sequelize.query<Row>(sql, { bind: params.values, type: QueryTypes.SELECT });
  // A plain loop of literals: a fleet-wide year is 18 000 rows, and spreading each into arrays was a good share
  // of the review's garbage.
  const out: MoneyRow[] = [];
  for (const r of rows) {
    const currency = r.currency.trim();
    if (num(r.used) > 0)
      out.push({ groupId: r.gid, month: r.month, currency, kind: 'spend', amountMinor: num(r.spend) });
    if (num(r.with_area) > 0)
      out.push({ groupId: r.gid, month: r.month, currency, kind: 'finished', amountMinor: num(r.finished) });
  }
  return out;
}
