import { describe, expect, it } from 'vitest';
import { checkDueState } from './check-due.js';

const day = 24 * 3_600_000;

describe('checkDueState', () => {
  const change = new Date('2025-03-03T06:00:00Z');

  it('a blade-change check is due within 8 h of the change and overdue after', () => {
    const within = checkDueState({
      kind: 'guide_clearance',
      lastCheckedAt: null,
      lastBladeChangeAt: change,
      asOf: new Date(change.getTime() + 2 * 3_600_000),
    });
    expect(within.overdue).toBe(false);
    expect(within.dueAt?.toISOString()).toBe('2025-03-03T14:00:00.000Z');
    const late = checkDueState({
      kind: 'guide_clearance',
      lastCheckedAt: '2025-02-01T00:00:00Z',
      lastBladeChangeAt: change,
      asOf: '2025-03-04T00:00:00Z',
    });
    expect(late.overdue).toBe(true);
    expect(late.reason).toContain('not been checked since the blade change');
    const grace = checkDueState({
      kind: 'tracking',
      lastCheckedAt: null,
      lastBladeChangeAt: change,
      asOf: '2025-03-04T00:00:00Z',
      graceHours: 24,
    });
    expect(grace.overdue).toBe(false);
  });

  it('a blade-change check done after the change is not due; with no blade change nothing is due', () => {
    const done = checkDueState({
      kind: 'band_tension',
      lastCheckedAt: '2025-03-03T07:00:00Z',
      lastBladeChangeAt: change,
      asOf: '2025-05-01T00:00:00Z',
    });
    expect(done).toMatchObject({ overdue: false, dueAt: null });
    expect(
      checkDueState({ kind: 'chip_brush', lastCheckedAt: null, lastBladeChangeAt: null, asOf: change }).overdue,
    ).toBe(false);
  });

  it('a periodic check falls due its interval after the last one (default 30 days)', () => {
    const last = new Date('2025-01-01T00:00:00Z');
    const before = checkDueState({
      kind: 'feed_pressure',
      lastCheckedAt: last,
      lastBladeChangeAt: null,
      asOf: new Date(last.getTime() + 29 * day),
    });
    expect(before.overdue).toBe(false);
    expect(before.dueAt?.toISOString()).toBe('2025-01-31T00:00:00.000Z');
    const after = checkDueState({
      kind: 'bearing_wear',
      lastCheckedAt: last,
      lastBladeChangeAt: null,
      asOf: new Date(last.getTime() + 31 * day),
    });
    expect(after.overdue).toBe(true);
    const custom = checkDueState({
      kind: 'bearing_wear',
      lastCheckedAt: last,
      lastBladeChangeAt: null,
      asOf: new Date(last.getTime() + 31 * day),
      intervalDays: 90,
    });
    expect(custom.overdue).toBe(false);
  });

  it('a periodic check never done is overdue', () => {
    const r = checkDueState({ kind: 'feed_pressure', lastCheckedAt: null, lastBladeChangeAt: null, asOf: change });
    expect(r.overdue).toBe(true);
    expect(r.reason).toContain('never been checked');
  });

  it('rejects bad dates and intervals with a message', () => {
    expect(() =>
      checkDueState({ kind: 'feed_pressure', lastCheckedAt: 'not a date', lastBladeChangeAt: null, asOf: change }),
    ).toThrow(/Last check must be a date/);
    expect(() =>
      checkDueState({
        kind: 'feed_pressure',
        lastCheckedAt: null,
        lastBladeChangeAt: null,
        asOf: change,
        intervalDays: 0,
      }),
    ).toThrow(/at least 1 day/);
  });
});
