import { describe, expect, it } from 'vitest';
import { isoWeekKey, optionalMailKindsFor, previousMonthKey } from './schema.js';

describe('ISO 8601 week keys', () => {
  // Source: ISO 8601-1:2019 §5.2.3.3 (week 1 holds the year's first Thursday; weeks start on Monday). The
  // calendar facts used: 1 Jan 2026 is a Thursday, 1 Jan 2021 a Friday, 31 Dec 2024 a Tuesday, and 2020
  // (a leap year starting on a Wednesday) has 53 weeks.
  it.each([
    ['2026-01-01', '2026-W01'],
    ['2025-12-29', '2026-W01'],
    ['2025-12-28', '2025-W52'],
    ['2021-01-03', '2020-W53'],
    ['2021-01-04', '2021-W01'],
    ['2024-12-31', '2025-W01'],
    ['2026-12-02', '2026-W49'],
  ])('%s is in %s', (day, week) => {
    expect(isoWeekKey(new Date(`${day}T12:00:00Z`))).toBe(week);
  });

  it('names the month before, across a year end', () => {
    expect(previousMonthKey(new Date('2026-12-01T06:00:00Z'))).toBe('2026-11');
    expect(previousMonthKey(new Date('2027-01-01T06:00:00Z'))).toBe('2026-12');
  });
});

describe('mail a person can turn off', () => {
  it('depends on the role, and never includes invitations or password resets', () => {
    expect(optionalMailKindsFor('regional_lead')).toEqual(['weekly_digest']);
    expect(optionalMailKindsFor('manager')).toEqual(['monthly_summary']);
    expect(optionalMailKindsFor('site_admin')).toEqual(['low_stock']);
    expect(optionalMailKindsFor('technician')).toEqual([]);
  });
});
