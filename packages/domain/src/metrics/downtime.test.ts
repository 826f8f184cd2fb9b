import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { clipIntervals, downtimeHours, mergeIntervals, totalMs, type IntervalMs } from './downtime.js';

const H = 3_600_000;
const t0 = Date.parse('2025-04-01T00:00:00Z');
const at = (h: number) => new Date(t0 + h * H);

describe('mergeIntervals and clipIntervals', () => {
  it('merges overlapping and touching intervals, drops empty ones', () => {
    expect(
      mergeIntervals([
        { startMs: 5, endMs: 8 },
        { startMs: 0, endMs: 3 },
        { startMs: 2, endMs: 4 },
        { startMs: 4, endMs: 5 },
        { startMs: 10, endMs: 10 },
        { startMs: 12, endMs: 15 },
      ]),
    ).toEqual([
      { startMs: 0, endMs: 8 },
      { startMs: 12, endMs: 15 },
    ]);
  });

  it('clips to a window', () => {
    expect(
      clipIntervals(
        [
          { startMs: 0, endMs: 10 },
          { startMs: 20, endMs: 30 },
          { startMs: 40, endMs: 50 },
        ],
        5,
        25,
      ),
    ).toEqual([
      { startMs: 5, endMs: 10 },
      { startMs: 20, endMs: 25 },
    ]);
  });

  const intervalArb = fc
    .tuple(fc.integer({ min: 0, max: 1000 }), fc.integer({ min: 0, max: 200 }))
    .map(([s, d]): IntervalMs => ({ startMs: s, endMs: s + d }));

  it('property: merged intervals are sorted and disjoint, cover the same points, and merging is idempotent', () => {
    fc.assert(
      fc.property(fc.array(intervalArb, { maxLength: 30 }), (xs) => {
        const m = mergeIntervals(xs);
        for (let i = 1; i < m.length; i++) expect(m[i]!.startMs).toBeGreaterThan(m[i - 1]!.endMs);
        expect(mergeIntervals(m)).toEqual(m);
        // Same covered points: count integer instants covered, brute force.
        const covered = (list: IntervalMs[], p: number) => list.some((i) => p >= i.startMs && p < i.endMs);
        for (let p = 0; p <= 1200; p += 7) expect(covered(m, p)).toBe(covered(xs, p));
        // Total never exceeds the plain sum, and is at least the longest single interval.
        expect(totalMs(m)).toBeLessThanOrEqual(totalMs(xs.filter((i) => i.endMs > i.startMs)));
        expect(totalMs(m)).toBeGreaterThanOrEqual(Math.max(0, ...xs.map((i) => i.endMs - i.startMs)));
      }),
    );
  });

  it('property: the merged total does not depend on the order of the intervals', () => {
    fc.assert(
      fc.property(fc.array(intervalArb, { maxLength: 20 }), (xs) => {
        expect(totalMs(mergeIntervals([...xs].reverse()))).toBe(totalMs(mergeIntervals(xs)));
      }),
    );
  });
});

describe('downtimeHours', () => {
  it('counts overlapping events once and clips to the period (hand-worked)', () => {
    // Period 0–24 h. Events: −2…1 h (1 h inside), 3…5 h, 4…7 h (merges with the last: 3…7 = 4 h), 23…26 h
    // (1 h inside), 30…31 h (outside). Total 1 + 4 + 1 = 6 h.
    const r = downtimeHours({
      periodStart: at(0),
      periodEnd: at(24),
      events: [
        { startAt: at(-2), endAt: at(1) },
        { startAt: at(3), endAt: at(5) },
        { startAt: at(4), endAt: at(7) },
        { startAt: at(23), endAt: at(26) },
        { startAt: at(30), endAt: at(31) },
      ],
    });
    expect(r.hours).toBe(6);
    expect(r.eventCount).toBe(4);
    expect(r.intervals.map((i) => [i.start.toISOString(), i.end.toISOString()])).toEqual([
      [at(0).toISOString(), at(1).toISOString()],
      [at(3).toISOString(), at(7).toISOString()],
      [at(23).toISOString(), at(24).toISOString()],
    ]);
  });

  it('runs open events to asOf, or to the period end', () => {
    const events = [{ startAt: at(20), endAt: null }];
    expect(downtimeHours({ periodStart: at(0), periodEnd: at(24), events }).hours).toBe(4);
    const r = downtimeHours({ periodStart: at(0), periodEnd: at(24), asOf: at(22), events });
    expect(r.hours).toBe(2);
    expect(r.openEventCount).toBe(1);
  });

  it('accepts ISO strings and rejects an event that ends before it starts', () => {
    expect(
      downtimeHours({
        periodStart: '2025-04-01T00:00:00Z',
        periodEnd: '2025-04-02T00:00:00Z',
        events: [{ startAt: '2025-04-01T10:00:00Z', endAt: '2025-04-01T10:30:00Z' }],
      }).hours,
    ).toBe(0.5);
    expect(() =>
      downtimeHours({ periodStart: at(0), periodEnd: at(24), events: [{ startAt: at(5), endAt: at(4) }] }),
    ).toThrow(/End must not be before the start/);
    expect(() => downtimeHours({ periodStart: at(5), periodEnd: at(5), events: [] })).toThrow(
      /Period end must be after its start/,
    );
  });

  it('property: downtime never exceeds the period and never the plain sum of durations', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -48, max: 72 }), fc.integer({ min: 0, max: 30 })), { maxLength: 20 }),
        (pairs) => {
          const events = pairs.map(([s, d]) => ({ startAt: at(s), endAt: at(s + d) }));
          const r = downtimeHours({ periodStart: at(0), periodEnd: at(24), events });
          expect(r.hours).toBeLessThanOrEqual(24);
          expect(r.hours).toBeLessThanOrEqual(pairs.reduce((t, [, d]) => t + d, 0));
          expect(r.hours).toBeGreaterThanOrEqual(0);
        },
      ),
    );
  });
});
