import { describe, expect, it } from 'vitest';
import { wallClock, zoneOffsetMs } from './zone-clock.js';

// Offsets from the IANA time zone database (tzdata): Berlin is UTC+1 in winter and UTC+2 from the last Sunday of
// March (2026-03-29 01:00 UTC); New York is UTC−5 in winter; Kolkata UTC+5:30 all year.
describe('the clock on the wall in a time zone', () => {
  it('reads the offset either side of a daylight-saving change, and a half-hour zone', () => {
    expect(zoneOffsetMs(Date.parse('2026-03-29T00:59:59Z'), 'Europe/Berlin')).toBe(3_600_000);
    expect(zoneOffsetMs(Date.parse('2026-03-29T01:00:00Z'), 'Europe/Berlin')).toBe(7_200_000);
    expect(zoneOffsetMs(new Date('2026-01-15T12:00:00Z'), 'America/New_York')).toBe(-5 * 3_600_000);
    expect(zoneOffsetMs(new Date('2026-07-01T00:00:00Z'), 'Asia/Kolkata')).toBe(5.5 * 3_600_000);
  });

  it('gives the wall-clock fields, midnight as hour 0', () => {
    expect(wallClock(new Date('2026-02-28T23:00:00Z'), 'Europe/Berlin')).toEqual({
      year: 2026,
      month: 3,
      day: 1,
      hour: 0,
      minute: 0,
      second: 0,
    });
  });
});
