import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { reliabilityMetrics } from './reliability.js';
import { DOWNTIME_CATEGORIES, FAILURE_CATEGORIES } from './schema.js';

const H = 3_600_000;
const t0 = Date.parse('2025-06-01T00:00:00Z');
const at = (h: number) => new Date(t0 + h * H);

describe('reliabilityMetrics (IEC 60050-192 terms; estimates as in Ebeling)', () => {
  it('worked example: 30 days, three failures of 2, 3 and 1 h and 4 h planned maintenance', () => {
    // By hand: period 720 h; downtime 2 + 3 + 1 + 4 = 10 h; uptime 710 h.
    // MTBF = 710 / 3 = 236.667 h; MTTR = (2 + 3 + 1) / 3 = 2 h;
    // inherent A = 236.667 / 238.667 = 0.991620; operational A = 710 / 720 = 0.986111.
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(720),
      events: [
        { startAt: at(100), endAt: at(102), category: 'mechanical', planned: false },
        { startAt: at(300), endAt: at(303), category: 'hydraulic', planned: false },
        { startAt: at(500), endAt: at(501), category: 'blade_failure', planned: false },
        { startAt: at(600), endAt: at(604), category: 'planned_maintenance', planned: true },
      ],
    });
    expect(r.periodHours).toBe(720);
    expect(r.downtimeHours).toBe(10);
    expect(r.uptimeHours).toBe(710);
    expect(r.failureCount).toBe(3);
    expect(r.mtbfHours).toBeCloseTo(236.6667, 4);
    expect(r.mttrHours).toBe(2);
    expect(r.inherentAvailability).toBeCloseTo(0.99162, 5);
    expect(r.operationalAvailability).toBeCloseTo(0.986111, 6);
    expect(r.source).toContain('IEC 60050-192');
  });

  it('planned stops, routine blade changes and waiting for material are not failures', () => {
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(100),
      events: [
        { startAt: at(1), endAt: at(2), category: 'blade_change', planned: false },
        { startAt: at(3), endAt: at(4), category: 'no_material_operator', planned: false },
        { startAt: at(5), endAt: at(6), category: 'mechanical', planned: true },
      ],
    });
    expect(r.failureCount).toBe(0);
    expect(r.mtbfHours).toBeNull();
    expect(r.mttrHours).toBeNull();
    expect(r.inherentAvailability).toBeNull();
    expect(r.downtimeHours).toBe(3);
    expect(r.operationalAvailability).toBeCloseTo(0.97, 12);
    expect(r.notes.join(' ')).toContain('No failures in the period');
    expect(FAILURE_CATEGORIES).not.toContain('planned_maintenance');
  });

  it('uses scheduled hours when given (two 8 h shifts, 5 days = 80 h)', () => {
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(168),
      scheduledHours: 80,
      events: [{ startAt: at(10), endAt: at(14), category: 'electrical', planned: false }],
    });
    expect(r.uptimeHours).toBe(76);
    expect(r.mtbfHours).toBe(76);
    expect(r.mttrHours).toBe(4);
    expect(r.inherentAvailability).toBeCloseTo(76 / 80, 12);
    expect(r.operationalAvailability).toBeCloseTo(0.95, 12);
  });

  it('counts a failure in the period it starts in, with its whole time to restoration; open failures run to asOf', () => {
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(100),
      asOf: at(99),
      events: [
        { startAt: at(-5), endAt: at(5), category: 'mechanical', planned: false },
        { startAt: at(95), endAt: at(110), category: 'mechanical', planned: false },
        { startAt: at(97), endAt: null, category: 'hydraulic', planned: false },
      ],
    });
    expect(r.failureCount).toBe(2);
    expect(r.failureDowntimeHours).toBe(15 + 2);
    expect(r.openFailureCount).toBe(1);
    expect(r.downtimeHours).toBe(5 + 5);
    expect(r.notes.join(' ')).toContain('still open');
  });

  it('caps uptime at 0 when downtime exceeds the scheduled hours', () => {
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(48),
      scheduledHours: 10,
      events: [{ startAt: at(0), endAt: at(20), category: 'mechanical', planned: false }],
    });
    expect(r.uptimeHours).toBe(0);
    expect(r.operationalAvailability).toBe(0);
    expect(r.mtbfHours).toBe(0);
    expect(r.inherentAvailability).toBe(0);
  });

  it('leaves inherent availability undefined when MTBF and MTTR are both 0', () => {
    // A zero-length failure logged inside a stop that used up all the scheduled time.
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(24),
      scheduledHours: 8,
      events: [
        { startAt: at(0), endAt: at(10), category: 'no_material_operator', planned: false },
        { startAt: at(5), endAt: at(5), category: 'electrical', planned: false },
      ],
    });
    expect(r).toMatchObject({
      failureCount: 1,
      mtbfHours: 0,
      mttrHours: 0,
      inherentAvailability: null,
      operationalAvailability: 0,
    });
  });

  it('rejects bad input with messages', () => {
    expect(() => reliabilityMetrics({ periodStart: at(0), periodEnd: at(10), scheduledHours: 11, events: [] })).toThrow(
      /must not exceed the hours in the period/,
    );
    expect(() =>
      reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(10),
        events: [{ startAt: at(1), endAt: at(2), category: 'lunch' as never, planned: false }],
      }),
    ).toThrow(/Category must be one of/);
  });

  it('property: availabilities lie in [0, 1] and MTBF × failures = uptime', () => {
    const ev = fc.record({
      s: fc.integer({ min: -20, max: 200 }),
      d: fc.integer({ min: 0, max: 40 }),
      category: fc.constantFrom(...DOWNTIME_CATEGORIES),
      planned: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(ev, { maxLength: 15 }), (evs) => {
        const r = reliabilityMetrics({
          periodStart: at(0),
          periodEnd: at(168),
          events: evs.map((e) => ({
            startAt: at(e.s),
            endAt: at(e.s + e.d),
            category: e.category,
            planned: e.planned,
          })),
        });
        expect(r.operationalAvailability).toBeGreaterThanOrEqual(0);
        expect(r.operationalAvailability).toBeLessThanOrEqual(1);
        if (r.failureCount > 0) {
          expect(r.mtbfHours! * r.failureCount).toBeCloseTo(r.uptimeHours, 9);
          if (r.inherentAvailability !== null) {
            expect(r.inherentAvailability).toBeGreaterThanOrEqual(0);
            expect(r.inherentAvailability).toBeLessThanOrEqual(1);
          }
        }
        expect(r.uptimeHours + r.downtimeHours).toBeCloseTo(168, 9);
      }),
    );
  });
});
