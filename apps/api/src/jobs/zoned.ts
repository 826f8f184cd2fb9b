/**
 * The wall-clock date and time in `timeZone` as a Date whose UTC fields hold them, so calendar arithmetic
 * (ISO weeks, months) reads the local day without a time-zone library.
 */
export function wallClockIn(date: Date, timeZone: string): Date {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  }).formatToParts(date);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0);
  return new Date(Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second')));
}

/** A date and time for a mail, in a named zone with the zone written beside it. */
export function formatForMail(date: Date, timeZone: string): string {
  const text = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(date);
  return `${text} (${timeZone})`;
}
