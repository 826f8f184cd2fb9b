import type { DiagnosisEvidenceInput } from '@kerfline/domain/diagnosis/schema';
import type { CheckKindId } from '@kerfline/domain/checks/schema';
import type { CheckScheduleName } from '@kerfline/domain/site-checks/schema';
import { checkDueState } from '@kerfline/domain/checks/check-due';
import { select } from '../records/record-support.js';

/**
 * What a saw's checks say for the diagnosis of a blade run: for each rule check on the site's list that applies
 * to the saw, the verdict of its last record up to `asOf` (the removal, or now) and whether it was overdue then,
 * by the domain's due rule with the run's install as the blade change. One query; at most one row per check.
 */
export async function checksEvidence(
  sawId: string,
  run: { installedAt: Date },
  asOf: Date,
): Promise<NonNullable<DiagnosisEvidenceInput['checks']>> {
  const rows = await select<{
    target_rule: CheckKindId;
    schedule: CheckScheduleName;
    interval_days: number | null;
    grace_hours: number;
    applies_since: Date;
    last_checked_at: Date | null;
    last_passed: boolean | null;
  }>(
    `SELECT c.target_rule, c.schedule, c.interval_days, c.grace_hours,
            greatest(s.created_at, c.created_at) AS applies_since,
            last.checked_at AS last_checked_at, last.passed AS last_passed
       FROM saws s
       JOIN site_checks c ON c.site_id = s.site_id AND c.retired_at IS NULL AND c.target_rule <> 'fixed'
       LEFT JOIN LATERAL (
         SELECT cr.checked_at, cr.passed FROM check_records cr
          WHERE cr.saw_id = s.id AND cr.site_check_id = c.id AND cr.checked_at <= :asOf
          ORDER BY cr.checked_at DESC, cr.id DESC LIMIT 1
       ) last ON true
      WHERE s.id = :sawId AND NOT (c.target_rule = 'feed_pressure' AND s.head_feed = 'hydraulic')`,
    { sawId, asOf },
  );
  return rows.map((r) => {
    const due = checkDueState({
      schedule: r.schedule,
      intervalDays: r.interval_days,
      graceHours: r.grace_hours,
      bladeOnSince: run.installedAt,
      lastCheckedAt: r.last_checked_at,
      appliesSince: r.applies_since,
      asOf,
    });
    // A blade-change check recorded before this blade went on says nothing about this blade.
    const current = r.schedule === 'periodic' || (r.last_checked_at !== null && r.last_checked_at >= run.installedAt);
    return { kind: r.target_rule, passed: current ? r.last_passed : null, overdue: due.state === 'overdue' };
  });
}
