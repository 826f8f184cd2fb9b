import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { OPERATIONAL_AVAILABILITY_DEFINITION, reliabilityMetrics } from './reliability.js';
import { DOWNTIME_CATEGORIES, FAILURE_CATEGORIES } from './schema.js';

const H = 3_600_000;
const t0 = Date.parse('2025-06-01T00:00:00Z');
const at = (h: number) => new Date(t0 + h * H);

describe('reliabilityMetrics (IEC 60050-192 terms; estimates as in Ebeling)', () => {
  it('worked example: 30 days, three failures of 2, 3 and 1 h and 4 h planned maintenance', () => {
    // By hand: period 720 h; downtime 2 + 3 + 1 + 4 = 10 h; uptime 710 h.
    // MTBF = 710 / 3 = 236.667 h; MTTR = (2 + 3 + 1) / 3 = 2 h; operational A = 710 / 720 = 0.986111.
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
    expect(r.operationalAvailability).toBeCloseTo(0.986111, 6);
    expect(r.source).toContain('IEC 60050-192');
    expect(r.source).toContain('waiting for people and parts');
    expect(r).not.toHaveProperty('inherentAvailability');
    expect(OPERATIONAL_AVAILABILITY_DEFINITION).toMatch(/^Operational availability: .*not the inherent availability/);
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
    expect(r.downtimeHours).toBe(3);
    expect(r.operationalAvailability).toBeCloseTo(0.97, 12);
    expect(r.notes.join(' ')).toContain('No failures began in the period');
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
    expect(r.operationalAvailability).toBeCloseTo(0.95, 12);
  });

  describe('edges of the period and of the shifts', () => {
    // One day with one shift 06:00–14:00 (8 h scheduled).
    const day = { periodStart: at(0), periodEnd: at(24), scheduledWindows: [{ start: at(6), end: at(14) }] };

    it('downtime wholly outside the shift does not reduce the uptime used for MTBF', () => {
      const r = reliabilityMetrics({
        ...day,
        events: [
          { startAt: at(16), endAt: at(20), category: 'mechanical', planned: false },
          { startAt: at(8), endAt: at(9), category: 'electrical', planned: false },
        ],
      });
      expect(r.scheduledHours).toBe(8);
      expect(r.downtimeHours).toBe(1);
      expect(r.uptimeHours).toBe(7);
      expect(r.failureCount).toBe(2);
      // MTBF = 7 / 2; the night repair is still restoration time: MTTR = (4 + 1) / 2.
      expect(r.mtbfHours).toBe(3.5);
      expect(r.mttrHours).toBe(2.5);
      expect(r.operationalAvailability).toBeCloseTo(7 / 8, 12);
    });

    it('downtime across a shift edge counts only its part inside the shift', () => {
      const r = reliabilityMetrics({
        ...day,
        events: [{ startAt: at(4), endAt: at(7), category: 'hydraulic', planned: false }],
      });
      expect(r.downtimeHours).toBe(1);
      expect(r.uptimeHours).toBe(7);
      expect(r.failureDowntimeHours).toBe(3);
    });

    it('shifts outside the period, or overlapping each other, count once and only inside the period', () => {
      const r = reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(24),
        scheduledWindows: [
          { start: at(-4), end: at(2) },
          { start: at(1), end: at(3) },
          { start: at(22), end: at(30) },
        ],
        events: [],
      });
      expect(r.scheduledHours).toBe(3 + 2);
      expect(r.operationalAvailability).toBe(1);
    });

    it('a failure begun before the period: its time inside the period is downtime and restoration time, but not a failure of this period', () => {
      const r = reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(100),
        events: [
          { startAt: at(-5), endAt: at(5), category: 'mechanical', planned: false },
          { startAt: at(50), endAt: at(53), category: 'mechanical', planned: false },
        ],
      });
      expect(r.failureCount).toBe(1);
      expect(r.downtimeHours).toBe(5 + 3);
      expect(r.failureDowntimeHours).toBe(5 + 3);
      expect(r.mttrHours).toBe(8);
    });

    it('a failure running past the period end: a failure of this period, its time clipped at the end', () => {
      const r = reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(100),
        events: [{ startAt: at(95), endAt: at(110), category: 'mechanical', planned: false }],
      });
      expect(r.failureCount).toBe(1);
      expect(r.failureDowntimeHours).toBe(5);
      expect(r.downtimeHours).toBe(5);
    });

    it('the months add up: sums of uptime, failures and failure downtime over two periods give the whole', () => {
      const events = [
        { startAt: at(40), endAt: at(60), category: 'mechanical' as const, planned: false },
        { startAt: at(70), endAt: at(72), category: 'electrical' as const, planned: false },
        { startAt: at(10), endAt: at(12), category: 'blade_change' as const, planned: false },
      ];
      const whole = reliabilityMetrics({ periodStart: at(0), periodEnd: at(100), events });
      const first = reliabilityMetrics({ periodStart: at(0), periodEnd: at(50), events });
      const second = reliabilityMetrics({ periodStart: at(50), periodEnd: at(100), events });
      expect(first.uptimeHours + second.uptimeHours).toBeCloseTo(whole.uptimeHours, 12);
      expect(first.failureCount + second.failureCount).toBe(whole.failureCount);
      expect(first.failureDowntimeHours + second.failureDowntimeHours).toBeCloseTo(whole.failureDowntimeHours, 12);
      expect(first.downtimeHours + second.downtimeHours).toBeCloseTo(whole.downtimeHours, 12);
    });

    it('open failures run to asOf', () => {
      const r = reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(100),
        asOf: at(99),
        events: [{ startAt: at(97), endAt: null, category: 'hydraulic', planned: false }],
      });
      expect(r.openFailureCount).toBe(1);
      expect(r.failureDowntimeHours).toBe(2);
      expect(r.downtimeHours).toBe(2);
      expect(r.notes.join(' ')).toContain('still open');
    });
  });

  it('caps downtime at the scheduled hours when only their total is known', () => {
    const r = reliabilityMetrics({
      periodStart: at(0),
      periodEnd: at(48),
      scheduledHours: 10,
      events: [{ startAt: at(0), endAt: at(20), category: 'mechanical', planned: false }],
    });
    expect(r.downtimeHours).toBe(10);
    expect(r.uptimeHours).toBe(0);
    expect(r.operationalAvailability).toBe(0);
    expect(r.mtbfHours).toBe(0);
    expect(r.notes.join(' ')).toContain('exceeds the scheduled hours');
  });

  it('rejects bad input with messages', () => {
    expect(() => reliabilityMetrics({ periodStart: at(0), periodEnd: at(10), scheduledHours: 11, events: [] })).toThrow(
      /must not exceed the hours in the period/,
    );
    expect(() =>
      reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(10),
        scheduledHours: 5,
        scheduledWindows: [{ start: at(1), end: at(2) }],
        events: [],
      }),
    ).toThrow(/not both/);
    expect(() =>
      reliabilityMetrics({
        periodStart: at(0),
        periodEnd: at(10),
        events: [{ startAt: at(1), endAt: at(2), category: 'lunch' as never, planned: false }],
      }),
    ).toThrow(/Category must be one of/);
  });

  it('property: availability lies in [0, 1], MTBF × failures = uptime, uptime + downtime = scheduled', () => {
    const ev = fc.record({
      s: fc.integer({ min: -20, max: 200 }),
      d: fc.integer({ min: 0, max: 40 }),
      category: fc.constantFrom(...DOWNTIME_CATEGORIES),
      planned: fc.boolean(),
    });
    const shift = fc.record({ s: fc.integer({ min: -10, max: 170 }), d: fc.integer({ min: 1, max: 30 }) });
    fc.assert(
      fc.property(fc.array(ev, { maxLength: 15 }), fc.array(shift, { minLength: 1, maxLength: 6 }), (evs, shifts) => {
        const events = evs.map((e) => ({
          startAt: at(e.s),
          endAt: at(e.s + e.d),
          category: e.category,
          planned: e.planned,
        }));
        for (const r of [
          reliabilityMetrics({ periodStart: at(0), periodEnd: at(168), events }),
          reliabilityMetrics({
            periodStart: at(0),
            periodEnd: at(168),
            events,
            scheduledWindows: shifts.map((w) => ({ start: at(w.s), end: at(w.s + w.d) })),
          }),
        ]) {
          if (r.operationalAvailability !== null) {
            expect(r.operationalAvailability).toBeGreaterThanOrEqual(0);
            expect(r.operationalAvailability).toBeLessThanOrEqual(1);
          }
          if (r.failureCount > 0) expect(r.mtbfHours! * r.failureCount).toBeCloseTo(r.uptimeHours, 9);
          expect(r.uptimeHours + r.downtimeHours).toBeCloseTo(r.scheduledHours, 9);
        }
      }),
    );
  });
});
