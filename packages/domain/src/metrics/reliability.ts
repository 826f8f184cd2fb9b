import { IEC_60050_192 } from '../figures/sources.js';
import { MS_PER_HOUR, clipIntervals, mergeIntervals, totalMs, type IntervalMs } from './downtime.js';
import { FAILURE_CATEGORIES, reliabilityInputSchema, type ReliabilityInput } from './schema.js';

/**
 * Terms as defined in IEC 60050-192 (International Electrotechnical Vocabulary, Part 192: Dependability):
 * MTBF = mean operating time between failures, MTTR = mean time to restoration. Time to restoration there runs
 * from the failure to the item being back in service: it includes waiting for people and parts (logistic and
 * administrative delay), not only active repair. Kerfline's downtime records are such times, so the availability
 * computed from them is the operational availability (some texts say achieved) — what the saw delivered — not
 * the inherent availability of the design, which counts active repair time only and is not computed here.
 * Point estimates: MTBF = uptime ÷ failures, MTTR = restoration time ÷ failures (C. E. Ebeling, An Introduction
 * to Reliability and Maintainability Engineering, McGraw-Hill).
 */
export const RELIABILITY_SOURCE = `${IEC_60050_192.citation} (MTBF: mean operating time between failures; MTTR: mean time to restoration, including waiting for people and parts); point estimates as in Ebeling, An Introduction to Reliability and Maintainability Engineering`;

/**
 * What the availability figure measures, in words for the API and the screens.
 */
export const OPERATIONAL_AVAILABILITY_DEFINITION =
  'Operational availability: the share of the scheduled hours the saw was not down for any reason (failures, including waiting for people and parts; planned maintenance; blade changes; no material or operator). It is not the inherent availability of the machine, which would count active repair time only.';

export interface ReliabilityMetrics {
  periodHours: number;
  /** Scheduled hours within the period: the given hours, the shifts' hours inside the period, or the whole period. */
  scheduledHours: number;
  /**
   * Downtime counted against the scheduled time, hours: every stop (planned and unplanned, every category),
   * overlaps counted once, clipped to the period and, when shifts are given, to the shifts.
   */
  downtimeHours: number;
  /** Scheduled hours less the downtime counted against them, never below 0: the operating time of the MTBF. */
  uptimeHours: number;
  /** Unplanned stops of a failure category that started in the period (each failure counts in one period). */
  failureCount: number;
  /**
   * Restoration time of failures clipped to the period, hours: every failure event's own time inside the period
   * (including a failure that began in an earlier period), by the same clipping rule as the downtime.
   */
  failureDowntimeHours: number;
  openFailureCount: number;
  /** Hours; null without failures (no failure observed: MTBF is not estimable). */
  mtbfHours: number | null;
  /** Hours; null without failures. */
  mttrHours: number | null;
  /** Uptime ÷ scheduled hours, 0–1 (see `OPERATIONAL_AVAILABILITY_DEFINITION`); null with no scheduled time. */
  operationalAvailability: number | null;
  notes: string[];
  source: string;
}

/**
 * MTBF, MTTR and operational availability of one saw (or a group, when its events are passed together) over a
 * period [periodStart, periodEnd). All times in hours. The rule, written to be mirrored in SQL per site and month:
 *
 * 1. Each stop is the interval [startAt, endAt), an open stop running to `asOf` (default the period end), clipped
 *    to the period. Failures and downtime are clipped by this same rule.
 * 2. Scheduled time: the shifts inside the period when `scheduledWindows` are given; else `scheduledHours`; else
 *    the whole period.
 * 3. Downtime = the union of the clipped stops (overlaps once), intersected with the shifts when given. Downtime
 *    outside the shifts does not reduce uptime. With `scheduledHours` alone the stops are taken to fall inside
 *    the scheduled time, and downtime beyond it is capped (a note says so).
 * 4. Uptime = scheduled − downtime. Operational availability = uptime ÷ scheduled.
 * 5. Failures = unplanned stops of a failure category whose start lies in the period. Failure downtime = the
 *    clipped time of every failure stop (whenever it started). MTBF = uptime ÷ failures; MTTR = failure downtime ÷
 *    failures. Per-period totals add up: sums of uptime, failures and failure downtime over months give the
 *    figures of the year.
 */
export function reliabilityMetrics(input: ReliabilityInput): ReliabilityMetrics {
  const v = reliabilityInputSchema.parse(input);
  const from = v.periodStart.getTime();
  const to = v.periodEnd.getTime();
  const asOfMs = (v.asOf ?? v.periodEnd).getTime();
  const periodHours = (to - from) / MS_PER_HOUR;
  const notes: string[] = [];

  const clipped = (e: { startAt: Date; endAt: Date | null }): IntervalMs => ({
    startMs: Math.max(e.startAt.getTime(), from),
    endMs: Math.min(e.endAt === null ? Math.max(asOfMs, e.startAt.getTime()) : e.endAt.getTime(), to),
  });
  const stops = mergeIntervals(v.events.map(clipped));

  let scheduledHours: number;
  let downtimeHours: number;
  if (v.scheduledWindows !== undefined) {
    const shifts = mergeIntervals(
      clipIntervals(
        v.scheduledWindows.map((w) => ({ startMs: w.start.getTime(), endMs: w.end.getTime() })),
        from,
        to,
      ),
    );
    scheduledHours = totalMs(shifts) / MS_PER_HOUR;
    downtimeHours = totalMs(shifts.flatMap((shift) => clipIntervals(stops, shift.startMs, shift.endMs))) / MS_PER_HOUR;
  } else {
    scheduledHours = v.scheduledHours ?? periodHours;
    downtimeHours = totalMs(stops) / MS_PER_HOUR;
    if (downtimeHours > scheduledHours) {
      notes.push('Downtime exceeds the scheduled hours: it is counted up to them, and uptime is 0.');
      downtimeHours = scheduledHours;
    }
  }
  const uptimeHours = Math.max(0, scheduledHours - downtimeHours);

  const failureStops = v.events.filter((e) => !e.planned && FAILURE_CATEGORIES.includes(e.category));
  const failures = failureStops.filter((e) => e.startAt.getTime() >= from && e.startAt.getTime() < to);
  const openFailureCount = failures.filter((e) => e.endAt === null).length;
  const failureDowntimeHours =
    failureStops.reduce((t, e) => {
      const i = clipped(e);
      return t + Math.max(0, i.endMs - i.startMs);
    }, 0) / MS_PER_HOUR;
  if (openFailureCount > 0)
    notes.push(`${openFailureCount} failure(s) still open: their time to restoration runs to the as-of time.`);

  const n = failures.length;
  let mtbfHours: number | null = null;
  let mttrHours: number | null = null;
  if (n === 0) {
    notes.push(
      `No failures began in the period: MTBF and MTTR cannot be estimated (${uptimeHours.toFixed(1)} h of operation without a failure).`,
    );
  } else {
    mtbfHours = uptimeHours / n;
    mttrHours = failureDowntimeHours / n;
  }

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
    operationalAvailability: scheduledHours > 0 ? uptimeHours / scheduledHours : null,
    notes,
    source: RELIABILITY_SOURCE,
  };
}
