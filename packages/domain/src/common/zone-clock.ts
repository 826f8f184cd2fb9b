/**
 * The clock on the wall in a time zone, from the platform's zone data (Intl), with one formatter per zone kept:
 * making an Intl.DateTimeFormat costs far more than using one. Used wherever a site's local time is read: month
 * boundaries, imported wall times, and the web's time fields.
 */
export type WallClock = Record<'year' | 'month' | 'day' | 'hour' | 'minute' | 'second', number>;

const zoneFormats = new Map<string, Intl.DateTimeFormat>();
function zoneFormat(timeZone: string): Intl.DateTimeFormat {
  let format = zoneFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    zoneFormats.set(timeZone, format);
  }
  return format;
}

/** The wall-clock fields in `timeZone` at an instant. */
export function wallClock(at: Date | number, timeZone: string): WallClock {
  const fields: WallClock = { year: 0, month: 0, day: 0, hour: 0, minute: 0, second: 0 };
  for (const part of zoneFormat(timeZone).formatToParts(typeof at === 'number' ? new Date(at) : at)) {
    if (part.type in fields) fields[part.type as keyof WallClock] = Number(part.value);
  }
  return fields;
}

/** Milliseconds the zone's clock is ahead of UTC at an instant (negative west of Greenwich), to the second. */
export function zoneOffsetMs(at: Date | number, timeZone: string): number {
  const ms = typeof at === 'number' ? at : at.getTime();
  const w = wallClock(ms, timeZone);
  return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - Math.floor(ms / 1000) * 1000;
}
