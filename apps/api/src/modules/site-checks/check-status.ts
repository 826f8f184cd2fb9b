import { QueryTypes, type Transaction } from 'sequelize';
import type { CheckScheduleName, CheckTargetRule, DueListState } from '@kerfline/domain/site-checks/schema';
import type { DueStateName } from '@kerfline/domain/checks/check-due';
import { SiteCheck } from './site-check.model.js';

/**
 * Which checks are due and overdue, per saw and check, in SQL — the rule of `checkDueState` in
 * `packages/domain/src/checks/check-due.ts`, tested against it:
 *
 * - a check applies to every saw of its site that is not retired, while the check is on the list; the head
 *   down-force rule does not apply to a hydraulically fed head, and band tension not to a saw with no blade on it;
 * - at each blade change: pending while a blade is on the saw and the check has not been recorded since it went
 *   on; it falls due at the later of the blade's install and when the check began to apply (the saw's and the
 *   check's creation), and is overdue `grace_hours` after that;
 * - every N days: falls due `interval_days` after the last record (never recorded: when it began to apply), and
 *   is overdue `grace_hours` after that;
 * - due from the moment it falls due, overdue strictly after the grace.
 *
 * Each (saw, check) pair costs one probe of `check_records_saw_check_checked` for its last record (index-only),
 * and the blade on the saw one probe of `blade_runs_one_open_per_saw`; nothing is loaded into the application to
 * be looped over. `apps/api/src/db/bench-checks.ts` times it at 1 500 saws and 300 000 records.
 */
const STATUS_SQL = `
  WITH pairs AS (
    SELECT s.site_id, s.id AS saw_id, s.asset_tag, s.name AS saw_name,
           c.id AS site_check_id, c.name AS check_name, c.target_rule, c.schedule, c.position, c.grace_hours,
           r.id AS blade_run_id, last.id AS last_record_id, last.checked_at AS last_checked_at,
           last.passed AS last_passed,
           CASE
             WHEN c.schedule = 'blade_change' THEN
               CASE WHEN r.id IS NULL OR coalesce(last.checked_at >= r.installed_at, false) THEN NULL
                    ELSE greatest(r.installed_at, s.created_at, c.created_at) END
             ELSE coalesce(last.checked_at + make_interval(days => c.interval_days), greatest(s.created_at, c.created_at))
           END AS falls_due_at
      FROM saws s
      JOIN site_checks c ON c.site_id = s.site_id AND c.retired_at IS NULL
      LEFT JOIN blade_runs r ON r.saw_id = s.id AND r.removed_at IS NULL
      LEFT JOIN LATERAL (
        SELECT cr.id, cr.checked_at, cr.passed FROM check_records cr
         WHERE cr.saw_id = s.id AND cr.site_check_id = c.id
         ORDER BY cr.checked_at DESC, cr.id DESC LIMIT 1
      ) last ON true
     WHERE s.site_id = ANY(:siteIds::uuid[]) AND s.status <> 'retired'
       AND (:sawId::uuid IS NULL OR s.id = :sawId::uuid)
       AND (:siteCheckId::uuid IS NULL OR c.id = :siteCheckId::uuid)
       AND (:schedule::text IS NULL OR c.schedule = :schedule::text)
       AND NOT (c.target_rule = 'feed_pressure' AND s.head_feed = 'hydraulic')
       AND NOT (c.target_rule = 'band_tension' AND r.id IS NULL)
  ), judged AS (
    SELECT p.*, p.falls_due_at + make_interval(secs => p.grace_hours * 3600) AS overdue_at
      FROM pairs p
  )
  SELECT j.*,
         CASE WHEN j.falls_due_at IS NULL THEN 'ok'
              WHEN :asOf::timestamptz > j.overdue_at THEN 'overdue'
              WHEN :asOf::timestamptz >= j.falls_due_at THEN 'due'
              ELSE 'ok' END AS state
    FROM judged j`;

export type StatusRow = {
  site_id: string;
  saw_id: string;
  asset_tag: string;
  saw_name: string;
  site_check_id: string;
  check_name: string;
  target_rule: CheckTargetRule;
  schedule: CheckScheduleName;
  position: number;
  grace_hours: number;
  blade_run_id: string | null;
  last_record_id: string | null;
  last_checked_at: Date | null;
  last_passed: boolean | null;
  falls_due_at: Date | null;
  overdue_at: Date | null;
  state: DueStateName;
};

export type StatusFilter = {
  siteIds: string[];
  sawId?: string;
  siteCheckId?: string;
  schedule?: CheckScheduleName;
  asOf?: Date;
};

function replacements(f: StatusFilter) {
  return {
    // An empty list would render as ARRAY[] of unknown type: a never-matching id keeps the query typed.
    siteIds: f.siteIds.length > 0 ? f.siteIds : ['00000000-0000-0000-0000-000000000000'],
    sawId: f.sawId ?? null,
    siteCheckId: f.siteCheckId ?? null,
    schedule: f.schedule ?? null,
    asOf: f.asOf ?? new Date(),
  };
}

const arrayLiteral = (ids: string[]) => `{${ids.join(',')}}`;

async function query<T>(sql: string, f: StatusFilter, extra: Record<string, unknown> = {}, transaction?: Transaction) {
  const r = replacements(f);
  return (await SiteCheck.sequelize!.query(sql, {
    replacements: { ...r, siteIds: arrayLiteral(r.siteIds), ...extra },
    type: QueryTypes.SELECT,
    transaction,
  })) as T[];
}

/** Every applicable (saw, check) pair with its state, e.g. for one saw's page. */
export function statusRows(f: StatusFilter, transaction?: Transaction): Promise<StatusRow[]> {
  return query<StatusRow>(`${STATUS_SQL} ORDER BY j.asset_tag, j.position, j.check_name`, f, {}, transaction);
}

const STATES_OF: Record<DueListState, DueStateName[]> = {
  overdue: ['overdue'],
  due: ['due'],
  pending: ['due', 'overdue'],
};

/** A page of pending checks, the longest overdue first, with the total of the whole list. */
export async function pendingPage(
  f: StatusFilter,
  state: DueListState,
  page: { limit: number; offset: number },
): Promise<{ rows: StatusRow[]; total: number }> {
  const rows = await query<StatusRow & { total: number }>(
    `SELECT t.*, count(*) OVER () AS total FROM (${STATUS_SQL}) t
      WHERE t.state = ANY(:states::text[])
      ORDER BY t.overdue_at, t.asset_tag, t.position, t.site_check_id
      LIMIT :limit OFFSET :offset`,
    f,
    { states: arrayLiteral(STATES_OF[state]), limit: page.limit, offset: page.offset },
  );
  if (rows.length === 0 && page.offset > 0) {
    const [counted] = await query<{ total: number }>(
      `SELECT count(*) AS total FROM (${STATUS_SQL}) t WHERE t.state = ANY(:states::text[])`,
      f,
      { states: arrayLiteral(STATES_OF[state]) },
    );
    return { rows: [], total: Number(counted?.total ?? 0) };
  }
  return { rows, total: Number(rows[0]?.total ?? 0) };
}

/** Checks due and overdue per site, for the sites given (sites with none are left out). */
export async function countsBySite(f: StatusFilter): Promise<Map<string, { due: number; overdue: number }>> {
  const rows = await query<{ site_id: string; due: number; overdue: number }>(
    `SELECT t.site_id, count(*) FILTER (WHERE t.state = 'due') AS due,
            count(*) FILTER (WHERE t.state = 'overdue') AS overdue
       FROM (${STATUS_SQL}) t WHERE t.state <> 'ok' GROUP BY t.site_id`,
    f,
  );
  return new Map(rows.map((r) => [r.site_id, { due: Number(r.due), overdue: Number(r.overdue) }]));
}
