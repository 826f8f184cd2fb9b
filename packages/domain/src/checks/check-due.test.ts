import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkDueState, type CheckDueRuleInput } from './check-due.js';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const at = (iso: string) => new Date(iso);

// Hand-worked cases: the rule's arithmetic is additions of hours and days to a moment, so each expected time
// below is written out from the inputs.
describe('checkDueState at each blade change', () => {
  const base: CheckDueRuleInput = {
    schedule: 'blade_change',
    intervalDays: null,
    graceHours: 8,
    bladeOnSince: at('2025-03-03T06:00:00Z'),
    lastCheckedAt: null,
    appliesSince: at('2024-01-01T00:00:00Z'),
    asOf: at('2025-03-03T08:00:00Z'),
  };

  it('falls due when the blade goes on and is overdue once the grace has run (06:00 + 8 h = 14:00)', () => {
    expect(checkDueState(base)).toEqual({
      state: 'due',
      fallsDueAt: at('2025-03-03T06:00:00Z'),
      overdueAt: at('2025-03-03T14:00:00Z'),
    });
    expect(checkDueState({ ...base, asOf: at('2025-03-03T14:00:00Z') }).state).toBe('due');
    expect(checkDueState({ ...base, asOf: at('2025-03-03T14:00:01Z') }).state).toBe('overdue');
    // A check recorded before this blade went on does not count for it.
    expect(checkDueState({ ...base, lastCheckedAt: at('2025-03-03T05:59:00Z') }).state).toBe('due');
  });

  it('is not due once recorded since the blade went on, nor with no blade on the saw', () => {
    expect(checkDueState({ ...base, lastCheckedAt: at('2025-03-03T06:00:00Z') })).toEqual({
      state: 'ok',
      fallsDueAt: null,
      overdueAt: null,
    });
    expect(checkDueState({ ...base, bladeOnSince: null }).state).toBe('ok');
  });

  it('falls due from when the check started to apply, if the blade was on before', () => {
    const r = checkDueState({ ...base, appliesSince: at('2025-03-03T07:00:00Z'), asOf: at('2025-03-03T14:30:00Z') });
    // 07:00 + 8 h = 15:00, so at 14:30 it is due, not overdue.
    expect(r).toMatchObject({ state: 'due', overdueAt: at('2025-03-03T15:00:00Z') });
  });
});

describe('checkDueState every N days', () => {
  const base: CheckDueRuleInput = {
    schedule: 'periodic',
    intervalDays: 30,
    graceHours: 24,
    bladeOnSince: null,
    lastCheckedAt: at('2025-01-01T00:00:00Z'),
    appliesSince: at('2024-01-01T00:00:00Z'),
    asOf: at('2025-01-20T00:00:00Z'),
  };

  it('falls due its interval after the last record and is overdue a day later (1 Jan + 30 d = 31 Jan)', () => {
    expect(checkDueState(base)).toEqual({
      state: 'ok',
      fallsDueAt: at('2025-01-31T00:00:00Z'),
      overdueAt: at('2025-02-01T00:00:00Z'),
    });
    expect(checkDueState({ ...base, asOf: at('2025-01-31T00:00:00Z') }).state).toBe('due');
    expect(checkDueState({ ...base, asOf: at('2025-02-01T00:00:01Z') }).state).toBe('overdue');
    expect(checkDueState({ ...base, intervalDays: 90, asOf: at('2025-02-01T00:00:01Z') }).state).toBe('ok');
  });

  it('never recorded: due as soon as it applies, overdue after the grace', () => {
    const never = { ...base, lastCheckedAt: null, appliesSince: at('2025-01-10T00:00:00Z') };
    expect(checkDueState({ ...never, asOf: at('2025-01-10T12:00:00Z') }).state).toBe('due');
    expect(checkDueState({ ...never, asOf: at('2025-01-11T00:00:01Z') }).state).toBe('overdue');
  });

  it('needs an interval', () => {
    expect(() => checkDueState({ ...base, intervalDays: null })).toThrow(/at least 1 day/);
  });
});

describe('checkDueState properties (fast-check)', () => {
  it('overdue never comes before due, and a later moment is never less due', () => {
    const rank = { ok: 0, due: 1, overdue: 2 } as const;
    fc.assert(
      fc.property(
        fc.constantFrom('blade_change' as const, 'periodic' as const),
        fc.integer({ min: 1, max: 400 }),
        fc.integer({ min: 0, max: 720 }),
        fc.option(fc.integer({ min: 0, max: 1000 }), { nil: null }),
        fc.option(fc.integer({ min: 0, max: 1000 }), { nil: null }),
        fc.integer({ min: 0, max: 1000 }),
        fc.integer({ min: 0, max: 1000 }),
        fc.integer({ min: 0, max: 1000 }),
        (schedule, intervalDays, graceHours, on, last, applies, t1, t2) => {
          const origin = Date.UTC(2025, 0, 1);
          const d = (days: number) => new Date(origin + days * DAY);
          const input = {
            schedule,
            intervalDays,
            graceHours,
            bladeOnSince: on === null ? null : d(on),
            lastCheckedAt: last === null ? null : d(last),
            appliesSince: d(applies),
          };
          const a = checkDueState({ ...input, asOf: d(Math.min(t1, t2)) });
          const b = checkDueState({ ...input, asOf: d(Math.max(t1, t2)) });
          expect(rank[b.state]).toBeGreaterThanOrEqual(rank[a.state]);
          if (a.fallsDueAt && a.overdueAt) expect(a.overdueAt.getTime()).toBeGreaterThanOrEqual(a.fallsDueAt.getTime());
        },
      ),
    );
  });
});
