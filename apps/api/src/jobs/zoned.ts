import { wallClock } from '@kerfline/domain/common/zone-clock';

/**
 * The wall-clock date and time in `timeZone` as a Date whose UTC fields hold them, so calendar arithmetic
 * (ISO weeks, months) reads the local day without a time-zone library.
 */
export function wallClockIn(date: Date, timeZone: string): Date {
  const w = wallClock(date, timeZone);
  return new Date(Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second));
}

/** A date and time for a mail, in a named zone with the zone written beside it. */
export function formatForMail(date: Date, timeZone: string): string {
  const text = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(date);
  return `${text} (${timeZone})`;
}
