import { MS_PER_HOUR, mergeIntervals, totalMs } from './downtime.js';
import { FAILURE_CATEGORIES, reliabilityInputSchema, type ReliabilityInput } from './schema.js';

/**
 * Terms as defined in IEC 60050-192 (International Electrotechnical Vocabulary, Part 192: Dependability):
 * MTBF = mean operating time between failures, MTTR = mean time to restoration. The point estimates
 * MTBF = operating time ÷ failures, MTTR = total restoration (down) time of the failures ÷ failures and the
 * inherent availability A = MTBF ÷ (MTBF + MTTR) are the textbook forms, e.g. in C. E. Ebeling,
 * "An Introduction to Reliability and Maintainability Engineering" (McGraw-Hill).
 */
export const RELIABILITY_SOURCE =
  'IEC 60050-192 (MTBF: mean operating time between failures; MTTR: mean time to restoration); estimates and inherent availability as in Ebeling, An Introduction to Reliability and Maintainability Engineering';

export interface ReliabilityMetrics {
  periodHours: number;
  scheduledHours: number;
  /** All downtime in the period (planned and unplanned, every category), overlaps counted once, hours. */
  downtimeHours: number;
  /** Scheduled hours less downtime, never below 0: the operating time of the MTBF. */
  uptimeHours: number;
  /** Unplanned stops of a failure category that started in the period. */
  failureCount: number;
  /** Sum of the failures' own durations (start to end, or to `asOf` while open), hours. */
  failureDowntimeHours: number;
  openFailureCount: number;
  /** Hours; null without failures (no failure observed: MTBF is not estimable). */
  mtbfHours: number | null;
  /** Hours; null without failures. */
  mttrHours: number | null;
  /** MTBF ÷ (MTBF + MTTR), 0–1; null without failures. */
  inherentAvailability: number | null;
  /** Uptime ÷ (uptime + downtime) over the scheduled time, 0–1. */
  operationalAvailability: number;
  notes: string[];
  source: string;
}

/**
 * MTBF, MTTR and availability of one saw (or a group, when its events are passed together) over a period.
 *
 * - A failure is an unplanned event of a category in `FAILURE_CATEGORIES` that starts in
 *   [periodStart, periodEnd); a failure is counted in the period it starts in, with its whole duration.
 * - Downtime for availability is the union of all events clipped to the period; open events run to `asOf`
 *   (default the period end).
 * - Scheduled time is `scheduledHours` or the whole period; downtime is taken to fall inside it.
 *
 * All times in hours.
 */
export function reliabilityMetrics(input: ReliabilityInput): ReliabilityMetrics {
  const v = reliabilityInputSchema.parse(input);
  const from = v.periodStart.getTime();
  const to = v.periodEnd.getTime();
  const asOfMs = (v.asOf ?? v.periodEnd).getTime();
  const openEnd = Math.min(to, asOfMs);
  const periodHours = (to - from) / MS_PER_HOUR;
  const scheduledHours = v.scheduledHours ?? periodHours;
  const notes: string[] = [];

  const down = mergeIntervals(
    v.events.map((e) => ({
      startMs: Math.max(e.startAt.getTime(), from),
      endMs: Math.min(e.endAt === null ? openEnd : e.endAt.getTime(), to),
    })),
  );
  const downtimeHours = totalMs(down) / MS_PER_HOUR;
  if (downtimeHours > scheduledHours) notes.push('Downtime exceeds the scheduled hours: uptime is taken as 0.');
  const uptimeHours = Math.max(0, scheduledHours - downtimeHours);

  const failures = v.events.filter(
    (e) =>
      !e.planned && FAILURE_CATEGORIES.includes(e.category) && e.startAt.getTime() >= from && e.startAt.getTime() < to,
  );
  const openFailureCount = failures.filter((e) => e.endAt === null).length;
  const failureDowntimeHours =
    failures.reduce(
      (t, e) =>
        t +
        Math.max(
          0,
          (e.endAt === null ? Math.max(asOfMs, e.startAt.getTime()) : e.endAt.getTime()) - e.startAt.getTime(),
        ),
      0,
    ) / MS_PER_HOUR;
  if (openFailureCount > 0)
    notes.push(`${openFailureCount} failure(s) still open: their time to restoration runs to the as-of time.`);

  const n = failures.length;
  let mtbfHours: number | null = null;
  let mttrHours: number | null = null;
  let inherentAvailability: number | null = null;
  if (n === 0) {
    notes.push(
      `No failures in the period: MTBF and MTTR cannot be estimated (${uptimeHours.toFixed(1)} h of operation without a failure).`,
    );
  } else {
    mtbfHours = uptimeHours / n;
    mttrHours = failureDowntimeHours / n;
    inherentAvailability = mtbfHours + mttrHours === 0 ? null : mtbfHours / (mtbfHours + mttrHours);
  }
  // Downtime is counted inside the scheduled time, so uptime + downtime = scheduled (capped at 0 uptime).
  const operationalAvailability = uptimeHours / (uptimeHours + Math.min(downtimeHours, scheduledHours));

  return {
    periodHours,
    scheduledHours,
    downtimeHours,
    uptimeHours,
    failureCount: n,
    failureDowntimeHours,
    openFailureCount,
    mtbfHours,
    mttrHours,
    inherentAvailability,
    operationalAvailability,
    notes,
    source: RELIABILITY_SOURCE,
  };
}
