import { describe, expect, it } from 'vitest';
import { fromZonedInput, toZonedInput } from './zoned-time';

describe('times on the site’s clock', () => {
  it('reads a wall time at the site as the instant it was there, whatever zone the browser is in', () => {
    expect(fromZonedInput('2026-03-04T07:30', 'America/Chicago')?.toISOString()).toBe('2026-03-04T13:30:00.000Z');
    expect(fromZonedInput('2026-07-04T07:30', 'America/Chicago')?.toISOString()).toBe('2026-07-04T12:30:00.000Z');
    expect(fromZonedInput('2026-03-04T07:30', 'Europe/Berlin')?.toISOString()).toBe('2026-03-04T06:30:00.000Z');
    expect(fromZonedInput('2026-03-04T07:30', 'Asia/Kolkata')?.toISOString()).toBe('2026-03-04T02:00:00.000Z');
  });

  it('writes an instant as the wall time at the site', () => {
    expect(toZonedInput('2026-03-04T13:30:00Z', 'America/Chicago')).toBe('2026-03-04T07:30');
    expect(toZonedInput(new Date('2026-12-31T23:30:00Z'), 'Europe/Berlin')).toBe('2027-01-01T00:30');
  });

  it('goes round the daylight-saving changes as a person means them', () => {
    // Chicago, 8 March 2026: 02:00 jumps to 03:00. 02:30 never happens on the wall; read as 03:30.
    expect(toZonedInput(fromZonedInput('2026-03-08T02:30', 'America/Chicago')!, 'America/Chicago')).toBe(
      '2026-03-08T03:30',
    );
    // Chicago, 1 November 2026: 01:30 happens twice; the first (still daylight time, UTC−5) is taken.
    expect(fromZonedInput('2026-11-01T01:30', 'America/Chicago')?.toISOString()).toBe('2026-11-01T06:30:00.000Z');
    for (const iso of [
      '2026-03-08T07:59:00Z',
      '2026-03-08T08:00:00Z',
      '2026-11-01T06:59:00Z',
      '2026-11-01T07:01:00Z',
    ]) {
      const wall = toZonedInput(iso, 'America/Chicago');
      expect(toZonedInput(fromZonedInput(wall, 'America/Chicago')!, 'America/Chicago')).toBe(wall);
    }
  });

  it('gives null for text that is not a date and time', () => {
    expect(fromZonedInput('', 'UTC')).toBeNull();
    expect(fromZonedInput('yesterday', 'UTC')).toBeNull();
    expect(fromZonedInput('2026-02-30T07:00', 'UTC')).toBeNull();
  });
});

describe('a time field left as the form opened it', () => {
  it('means the moment the form opened, seconds included; a typed time is read on the site’s clock', async () => {
    const { readZonedTime } = await import('./zoned-time');
    const opened = new Date('2026-03-04T13:30:42.500Z');
    expect(readZonedTime('2026-03-04T07:30', 'America/Chicago', opened)).toBe(opened);
    expect(readZonedTime('2026-03-04T07:31', 'America/Chicago', opened)?.toISOString()).toBe(
      '2026-03-04T13:31:00.000Z',
    );
    expect(readZonedTime('soon', 'America/Chicago', opened)).toBeNull();
  });
});
