import { downtimeInputSchema, type DowntimeInput } from './schema.js';

export const MS_PER_HOUR = 3_600_000;

/** A half-open time interval [startMs, endMs) in epoch milliseconds. */
export interface IntervalMs {
  startMs: number;
  endMs: number;
}

/**
 * Merges overlapping or touching intervals into disjoint ones, sorted by start. Empty intervals
 * (end ≤ start) are dropped. Invariant: the union of the output equals the union of the input.
 */
export function mergeIntervals(intervals: readonly IntervalMs[]): IntervalMs[] {
  const sorted = intervals
    .filter((i) => i.endMs > i.startMs)
    .sort((a, b) => a.startMs - b.startMs || a.endMs - b.endMs);
  const merged: IntervalMs[] = [];
  for (const i of sorted) {
    const last = merged.at(-1);
    if (last !== undefined && i.startMs <= last.endMs) last.endMs = Math.max(last.endMs, i.endMs);
    else merged.push({ startMs: i.startMs, endMs: i.endMs });
  }
  return merged;
}

/** Clips intervals to [fromMs, toMs), dropping what falls outside. */
export function clipIntervals(intervals: readonly IntervalMs[], fromMs: number, toMs: number): IntervalMs[] {
  return intervals
    .map((i) => ({ startMs: Math.max(i.startMs, fromMs), endMs: Math.min(i.endMs, toMs) }))
    .filter((i) => i.endMs > i.startMs);
}

export const totalMs = (intervals: readonly IntervalMs[]): number =>
  intervals.reduce((t, i) => t + (i.endMs - i.startMs), 0);

export interface DowntimeHours {
  /** Hours the saw was down within the period, overlaps counted once. */
  hours: number;
  /** The merged, clipped down intervals. */
  intervals: { start: Date; end: Date }[];
  /** Events that touch the period. */
  eventCount: number;
  /** Events still open, counted as down until `asOf` (or the period end). */
  openEventCount: number;
}

/**
 * Hours of downtime in a period: events are clipped to [periodStart, periodEnd), overlapping events are
 * merged so no hour is counted twice, and open events (no end yet) run until `asOf` (default the period end).
 */
export function downtimeHours(input: DowntimeInput): DowntimeHours {
  const v = downtimeInputSchema.parse(input);
  const from = v.periodStart.getTime();
  const to = v.periodEnd.getTime();
  const openEnd = Math.min(to, (v.asOf ?? v.periodEnd).getTime());
  const inPeriod = v.events
    .map((e) => ({
      open: e.endAt === null,
      startMs: Math.max(e.startAt.getTime(), from),
      endMs: Math.min(e.endAt === null ? openEnd : e.endAt.getTime(), to),
    }))
    .filter((i) => i.endMs > i.startMs);
  const merged = mergeIntervals(inPeriod);
  return {
    hours: totalMs(merged) / MS_PER_HOUR,
    intervals: merged.map((i) => ({ start: new Date(i.startMs), end: new Date(i.endMs) })),
    eventCount: inPeriod.length,
    openEventCount: inPeriod.filter((i) => i.open).length,
  };
}
