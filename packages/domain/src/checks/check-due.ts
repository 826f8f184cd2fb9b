import type { CheckSchedule } from './schema.js';

const MS_PER_HOUR = 3_600_000;
const MS_PER_DAY = 24 * MS_PER_HOUR;

/** Default hours after a blade change within which its checks should be done: one shift (our choice). */
export const DEFAULT_BLADE_CHANGE_GRACE_HOURS = 8;
/** Default hours a periodic check may run past its date before it counts as overdue: one day (our choice). */
export const DEFAULT_PERIODIC_GRACE_HOURS = 24;

/** ok: nothing to do now; due: it should be done now; overdue: its grace has run out. */
export const DUE_STATES = ['ok', 'due', 'overdue'] as const;
export type DueStateName = (typeof DUE_STATES)[number];

export interface CheckDueRuleInput {
  schedule: CheckSchedule;
  /** Days between periodic checks; ignored for blade-change checks. */
  intervalDays: number | null;
  /** Hours allowed after the check falls due before it is overdue. */
  graceHours: number;
  /** When the blade now on the saw went on; null when no blade is on it. */
  bladeOnSince: Date | null;
  /** The last time this check was recorded on this saw; null if never. */
  lastCheckedAt: Date | null;
  /**
   * Since when the check applies to the saw: the later of the saw's and the check's creation, so a check added
   * to a site's list (or a saw added to a site) today falls due from today, not from years ago.
   */
  appliesSince: Date;
  asOf: Date;
}

export interface CheckDueState {
  state: DueStateName;
  /** When the check falls (or fell) due; null when nothing is pending (a blade-change check already done). */
  fallsDueAt: Date | null;
  /** `fallsDueAt` + grace: after this moment the check is overdue. */
  overdueAt: Date | null;
}

const later = (a: Date, b: Date) => (a.getTime() >= b.getTime() ? a : b);

/**
 * Whether a check of a site's list is due on a saw: the rule the API's SQL (`check-status.sql.ts`) mirrors, and
 * is tested against.
 *
 * - At each blade change: while a blade is on the saw and the check has not been recorded since it went on, the
 *   check falls due when it went on (or when the check started to apply, if later) and is overdue once
 *   `graceHours` have passed. With no blade on the saw, or the check done since, nothing is due.
 * - Every N days: it falls due `intervalDays` after the last record (never recorded: as soon as it applies) and
 *   is overdue once `graceHours` have passed since then.
 *
 * Due from the moment it falls due (inclusive); overdue strictly after `overdueAt`.
 */
export function checkDueState(input: CheckDueRuleInput): CheckDueState {
  const asOf = input.asOf.getTime();
  let fallsDueAt: Date;
  if (input.schedule === 'blade_change') {
    const since = input.bladeOnSince;
    if (since === null || (input.lastCheckedAt !== null && input.lastCheckedAt.getTime() >= since.getTime()))
      return { state: 'ok', fallsDueAt: null, overdueAt: null };
    fallsDueAt = later(since, input.appliesSince);
  } else {
    if (input.intervalDays === null || !(input.intervalDays > 0))
      throw new RangeError('A periodic check needs an interval of at least 1 day');
    fallsDueAt =
      input.lastCheckedAt === null
        ? input.appliesSince
        : new Date(input.lastCheckedAt.getTime() + input.intervalDays * MS_PER_DAY);
  }
  const overdueAt = new Date(fallsDueAt.getTime() + input.graceHours * MS_PER_HOUR);
  const state: DueStateName = asOf > overdueAt.getTime() ? 'overdue' : asOf >= fallsDueAt.getTime() ? 'due' : 'ok';
  return { state, fallsDueAt, overdueAt };
}
