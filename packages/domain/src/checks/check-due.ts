import { CHECK_KINDS, checkDueInputSchema, type CheckDueInput, type CheckKindId } from './schema.js';

const MS_PER_HOUR = 3_600_000;
const MS_PER_DAY = 24 * MS_PER_HOUR;

/** Default hours after a blade change within which its checks should be done: one shift (our choice). */
export const DEFAULT_BLADE_CHANGE_GRACE_HOURS = 8;

export interface CheckDueState {
  kind: CheckKindId;
  /** When the next check is (or was) due; null when nothing is due yet or it was never done (periodic). */
  dueAt: Date | null;
  overdue: boolean;
  reason: string;
}

/**
 * Whether one check kind is overdue on one saw.
 *
 * - Checks due at every blade change are overdue when no check of that kind was recorded since the last
 *   blade change and more than `graceHours` (default 8 h) have passed since it.
 * - Periodic checks fall due `intervalDays` after the last one (the kind's default interval when omitted) and
 *   are overdue from then on; a periodic check never done is overdue.
 */
export function checkDueState(input: CheckDueInput): CheckDueState {
  const v = checkDueInputSchema.parse(input);
  const info = CHECK_KINDS.find((k) => k.kind === v.kind)!;
  const asOfMs = v.asOf.getTime();

  if (info.due === 'blade_change') {
    if (v.lastBladeChangeAt === null) {
      return { kind: v.kind, dueAt: null, overdue: false, reason: 'No blade change recorded: nothing is due yet.' };
    }
    const changeMs = v.lastBladeChangeAt.getTime();
    if (v.lastCheckedAt !== null && v.lastCheckedAt.getTime() >= changeMs) {
      return {
        kind: v.kind,
        dueAt: null,
        overdue: false,
        reason: `${info.label} was checked after the last blade change.`,
      };
    }
    const graceHours = v.graceHours ?? DEFAULT_BLADE_CHANGE_GRACE_HOURS;
    const dueAt = new Date(changeMs + graceHours * MS_PER_HOUR);
    const overdue = asOfMs > dueAt.getTime();
    return {
      kind: v.kind,
      dueAt,
      overdue,
      reason: overdue
        ? `${info.label} has not been checked since the blade change of ${v.lastBladeChangeAt.toISOString()}.`
        : `${info.label} is due with the new blade, within ${graceHours} h of the change.`,
    };
  }

  const intervalDays = v.intervalDays ?? info.defaultIntervalDays!;
  if (v.lastCheckedAt === null) {
    return {
      kind: v.kind,
      dueAt: null,
      overdue: true,
      reason: `${info.label} has never been checked (due every ${intervalDays} days).`,
    };
  }
  const dueAt = new Date(v.lastCheckedAt.getTime() + intervalDays * MS_PER_DAY);
  const overdue = asOfMs > dueAt.getTime();
  return {
    kind: v.kind,
    dueAt,
    overdue,
    reason: overdue
      ? `${info.label} was due on ${dueAt.toISOString()} (every ${intervalDays} days).`
      : `${info.label} is next due on ${dueAt.toISOString()}.`,
  };
}
