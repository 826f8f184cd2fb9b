import { describe, expect, it } from 'vitest';
import {
  addMonths,
  defaultPeriod,
  monthLabel,
  monthOf,
  monthSchema,
  monthStartInstant,
  monthsOf,
  periodLabel,
  periodLength,
  previousPeriod,
} from './period.js';
import { fleetQuerySchema } from './schema.js';

describe('months and periods', () => {
  it('moves across year ends and lists a period’s months', () => {
    expect(addMonths('2026-11', 3)).toBe('2027-02');
    expect(addMonths('2026-01', -1)).toBe('2025-12');
    expect(monthsOf({ from: '2025-11', to: '2026-02' })).toEqual(['2025-11', '2025-12', '2026-01', '2026-02']);
    expect(monthsOf({ from: '2026-03', to: '2026-02' })).toEqual([]);
    expect(periodLength({ from: '2025-12', to: '2026-11' })).toBe(12);
  });
  it('compares a period with the same number of months just before it', () => {
    expect(previousPeriod({ from: '2026-01', to: '2026-06' })).toEqual({ from: '2025-07', to: '2025-12' });
    expect(previousPeriod({ from: '2026-03', to: '2026-03' })).toEqual({ from: '2026-02', to: '2026-02' });
  });
  it('reads the month of an instant in a time zone', () => {
    // 31 March 23:30 UTC is already 1 April in Berlin (UTC+2 in summer) but still March in Chicago.
    const at = new Date('2026-03-31T23:30:00Z');
    expect(monthOf(at, 'Europe/Berlin')).toBe('2026-04');
    expect(monthOf(at, 'America/Chicago')).toBe('2026-03');
    expect(monthOf(at)).toBe('2026-03');
    // UTC is read without a formatter: it agrees with the formatter's answer for the same zone, at a year's edge too.
    for (const instant of [at, new Date('2026-12-31T23:59:59.999Z'), new Date('2027-01-01T00:00:00Z')]) {
      expect(monthOf(instant, 'UTC')).toBe(monthOf(instant, 'Etc/UTC'));
    }
    expect(monthOf(new Date('2027-01-01T00:00:00Z'))).toBe('2027-01');
  });
  it('finds the instant a month starts in a time zone', () => {
    // CET is UTC+1 in winter; Toronto is UTC−5 in winter and UTC−4 in summer.
    expect(monthStartInstant('2026-03', 'Europe/Berlin').toISOString()).toBe('2026-02-28T23:00:00.000Z');
    expect(monthStartInstant('2026-04', 'Europe/Berlin').toISOString()).toBe('2026-03-31T22:00:00.000Z');
    expect(monthStartInstant('2026-01', 'America/Toronto').toISOString()).toBe('2026-01-01T05:00:00.000Z');
    expect(monthStartInstant('2026-07', 'America/Toronto').toISOString()).toBe('2026-07-01T04:00:00.000Z');
    expect(monthStartInstant('2026-07', 'UTC').toISOString()).toBe('2026-07-01T00:00:00.000Z');
  });
  it('defaults to the twelve whole months before the month in progress', () => {
    expect(defaultPeriod(new Date('2026-12-02T03:00:00Z'))).toEqual({ from: '2025-12', to: '2026-11' });
  });
  it('names months and periods in words', () => {
    expect(monthLabel('2026-03')).toBe('Mar 2026');
    expect(periodLabel({ from: '2025-12', to: '2026-11' })).toBe('Dec 2025 – Nov 2026');
    expect(periodLabel({ from: '2026-03', to: '2026-03' })).toBe('Mar 2026');
  });
  it('refuses a malformed month, a backwards period and one longer than five years', () => {
    expect(monthSchema.safeParse('2026-13').success).toBe(false);
    expect(monthSchema.safeParse('26-01').success).toBe(false);
    const backwards = fleetQuerySchema.safeParse({ from: '2026-05', to: '2026-01' });
    expect(backwards.success).toBe(false);
    expect(backwards.error?.issues[0]?.message).toBe('The last month must not be before the first');
    expect(fleetQuerySchema.safeParse({ from: '2020-01', to: '2026-01' }).error?.issues[0]?.message).toMatch(
      /at most 60 months/,
    );
    expect(fleetQuerySchema.parse({ to: '2026-06' })).toMatchObject({ from: '2025-07', to: '2026-06' });
    const badSite = fleetQuerySchema.safeParse({ sites: 'not-an-id' });
    expect(badSite.error?.issues[0]).toMatchObject({ path: ['sites', 0], message: 'must be an id (UUID)' });
  });
});
