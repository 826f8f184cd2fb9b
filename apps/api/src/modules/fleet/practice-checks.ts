import { QueryTypes, type Sequelize } from 'sequelize';
import { addMonths, monthStart, type MonthPeriod } from '@kerfline/domain/fleet/period';
import { SqlParams, scopeSql } from '../../authz/sequelize-scope.js';
import { Site } from '../sites/site.model.js';
import { Saw } from '../saws/saw.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { SiteCheck } from '../site-checks/site-check.model.js';
import { CheckRecord } from '../site-checks/check-record.model.js';
import type { FigureScope } from './fleet-figures.js';

export type ChecksPractice = {
  due: number;
  onTime: number;
  medianLifeOnTimeMm2: number | null;
  medianLifeLateMm2: number | null;
};

/**
 * Checks done on time per site in a period, in SQL, by the due rule of `checkDueState` (the checks' own domain
 * function; the test compares them). A check falls due on occasions:
 *
 * - every N days: N days after each record (and, the first time, when the check began to apply to the saw); the
 *   next record of that check on that saw fulfils the occasion;
 * - at each blade change: when the blade went on (or the check began to apply, if later); the first record of
 *   that check on that saw while the blade was on fulfils it.
 *
 * An occasion belongs to the period its due time falls in (site-local months, up to the as-of time). It was on
 * time when fulfilled by its due time plus the grace, late when fulfilled after it or not at all once the grace
 * has run out; an occasion still within its grace and not yet done is not judged. Beside it, blade life: the
 * median area of the blades taken off in the period whose checks at their blade change were all done on time, and
 * of those with one late or missed.
 */
export async function checksPractice(
  sequelize: Sequelize,
  scope: FigureScope,
  period: MonthPeriod,
): Promise<Map<string, ChecksPractice>> {
  if (scope.siteIds.length === 0) return new Map();
  const p = new SqlParams();
  const siteScope = scopeSql(scope.ability, 'read', 'Site', Site, 's', p);
  const sawScope = scopeSql(scope.ability, 'read', 'Saw', Saw, 'w', p);
  const checkScope = scopeSql(scope.ability, 'read', 'SiteCheck', SiteCheck, 'c', p);
  const recordScope = (alias: string) => scopeSql(scope.ability, 'read', 'CheckRecord', CheckRecord, alias, p);
  const runScope = scopeSql(scope.ability, 'read', 'BladeRun', BladeRun, 'r', p);
  const siteIds = p.add(scope.siteIds);
  const m0 = p.add(`${monthStart(period.from)} 00:00:00`);
  const m1 = p.add(`${monthStart(addMonths(period.to, 1))} 00:00:00`);
  const asOf = p.add(scope.asOf);
  const firstRecord = (alias: string, extra: string) =>
    `(SELECT min(${alias}.checked_at) FROM check_records ${alias}
       WHERE ${alias}.saw_id = pr.saw_id AND ${alias}.site_check_id = pr.check_id ${extra} AND ${recordScope(alias)})`;

  const sql = `
    WITH bounds AS (
      SELECT s.id AS site_id,
             ${m0}::timestamp AT TIME ZONE s.time_zone AS t0,
             LEAST(${m1}::timestamp AT TIME ZONE s.time_zone, ${asOf}::timestamptz) AS t1
        FROM sites s WHERE s.id = ANY(${siteIds}::uuid[]) AND ${siteScope}
    ),
    pairs AS (
      SELECT w.id AS saw_id, w.site_id, c.id AS check_id, c.schedule, c.interval_days, c.grace_hours,
             greatest(w.created_at, c.created_at) AS applies_since,
             LEAST(coalesce(c.retired_at, 'infinity'::timestamptz), coalesce(w.retired_at, 'infinity'::timestamptz)) AS applies_until,
             b.t0, b.t1
        FROM bounds b
        JOIN saws w ON w.site_id = b.site_id
        JOIN site_checks c ON c.site_id = b.site_id
       WHERE b.t1 > b.t0 AND ${sawScope} AND ${checkScope}
         AND NOT (c.target_rule = 'feed_pressure' AND w.head_feed = 'hydraulic')
    ),
    occasions AS (
      -- Every N days: due N days after each record whose next due time falls in the period…
      SELECT pr.saw_id, pr.site_id, pr.grace_hours, pr.applies_until, pr.t0, pr.t1,
             r.checked_at + make_interval(days => pr.interval_days) AS falls_due,
             ${firstRecord('n', 'AND n.checked_at > r.checked_at')} AS done_at
        FROM pairs pr
        JOIN check_records r ON r.saw_id = pr.saw_id AND r.site_check_id = pr.check_id
             AND r.checked_at >= pr.t0 - make_interval(days => pr.interval_days)
             AND r.checked_at < pr.t1 - make_interval(days => pr.interval_days)
       WHERE pr.schedule = 'periodic' AND ${recordScope('r')}
      UNION ALL
      -- …and the first time, when it began to apply.
      SELECT pr.saw_id, pr.site_id, pr.grace_hours, pr.applies_until, pr.t0, pr.t1, pr.applies_since,
             ${firstRecord('f', '')}
        FROM pairs pr
       WHERE pr.schedule = 'periodic' AND pr.applies_since >= pr.t0 AND pr.applies_since < pr.t1
      UNION ALL
      -- At each blade change: due when the blade went on (or the check began to apply), done by the first record
      -- while that blade was on.
      SELECT pr.saw_id, pr.site_id, pr.grace_hours, pr.applies_until, pr.t0, pr.t1,
             greatest(r.installed_at, pr.applies_since),
             ${firstRecord('k', "AND k.checked_at >= r.installed_at AND k.checked_at < coalesce(r.removed_at, 'infinity'::timestamptz)")}
        FROM pairs pr
        JOIN blade_runs r ON r.saw_id = pr.saw_id
             AND tstzrange(r.installed_at, r.removed_at, '[)') && tstzrange(pr.t0, pr.t1, '[)')
       WHERE pr.schedule = 'blade_change' AND ${runScope}
         AND pr.applies_since < coalesce(r.removed_at, 'infinity'::timestamptz)
    ),
    judged AS (
      SELECT o.saw_id, o.site_id,
             o.done_at IS NOT NULL AND o.done_at <= o.falls_due + make_interval(secs => o.grace_hours * 3600) AS on_time
        FROM occasions o
       WHERE o.falls_due >= o.t0 AND o.falls_due < o.t1 AND o.falls_due < o.applies_until
         AND (o.done_at IS NOT NULL OR o.falls_due + make_interval(secs => o.grace_hours * 3600) < ${asOf}::timestamptz)
    ),
    finished AS (
      -- Each blade taken off in the period (area recorded): were its blade-change checks done on time?
      SELECT r.id, r.site_id, r.area_cut_mm2,
             bool_and(k.done_at IS NOT NULL
                      AND k.done_at <= greatest(r.installed_at, pr.applies_since)
                                       + make_interval(secs => pr.grace_hours * 3600)) AS on_time
        FROM bounds b
        JOIN blade_runs r ON r.site_id = b.site_id AND r.removed_at >= b.t0 AND r.removed_at < b.t1
        JOIN pairs pr ON pr.saw_id = r.saw_id AND pr.schedule = 'blade_change' AND pr.applies_since < r.removed_at
             AND r.removed_at >= pr.t0 AND r.removed_at < pr.t1
        CROSS JOIN LATERAL (
          SELECT min(k.checked_at) AS done_at FROM check_records k
           WHERE k.saw_id = r.saw_id AND k.site_check_id = pr.check_id
             AND k.checked_at >= r.installed_at AND k.checked_at < r.removed_at AND ${recordScope('k')}
        ) k
       WHERE r.area_cut_mm2 IS NOT NULL AND ${runScope}
       GROUP BY r.id, r.site_id, r.area_cut_mm2
    ),
    life AS (
      SELECT site_id,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY area_cut_mm2) FILTER (WHERE on_time) AS on_time_median,
             percentile_cont(0.5) WITHIN GROUP (ORDER BY area_cut_mm2) FILTER (WHERE NOT on_time) AS late_median
        FROM finished GROUP BY site_id
    )
    SELECT j.site_id, count(*)::int AS due, count(*) FILTER (WHERE j.on_time)::int AS on_time,
           l.on_time_median, l.late_median
      FROM judged j LEFT JOIN life l ON l.site_id = j.site_id
     GROUP BY j.site_id, l.on_time_median, l.late_median`;

  const rows = await sequelize.query<{
    site_id: string;
    due: number;
    on_time: number;
    on_time_median: number | null;
    late_median: number | null;
  }>(sql, { bind: p.values, type: QueryTypes.SELECT });
  return new Map(
    rows.map((r) => [
      r.site_id,
      {
        due: r.due,
        onTime: r.on_time,
        medianLifeOnTimeMm2: r.on_time_median === null ? null : Number(r.on_time_median),
        medianLifeLateMm2: r.late_median === null ? null : Number(r.late_median),
      },
    ]),
  );
}
