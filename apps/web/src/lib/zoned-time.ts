/**
 * Times typed at a site are the clock on the wall there, whatever zone the phone is set to: a `datetime-local`
 * field holds `2026-03-04T07:30` in the site's time zone, and these turn it into the instant the API stores
 * (and back). Daylight-saving changes are handled by asking Intl for the zone's offset at that moment.
 */
import { wallClock, zoneOffsetMs } from '@kerfline/domain/common/zone-clock';

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** An instant as a `datetime-local` value (`2026-03-04T07:30`) on the site's clock. */
export function toZonedInput(at: Date | string, timeZone: string): string {
  const w = wallClock(typeof at === 'string' ? new Date(at) : at, timeZone);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

const INPUT_PATTERN = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/;

/**
 * A `datetime-local` value on the site's clock as an instant; null for text that is not one. A wall time that
 * happens twice (clocks going back) gives the first; one that never happens (clocks going forward) is read with
 * the offset from before the change, so it lands an hour later on the wall, as a person would mean it.
 */
export function fromZonedInput(value: string, timeZone: string): Date | null {
  const match = INPUT_PATTERN.exec(value.trim());
  if (!match) return null;
  const [y, mo, d, h, mi, s] = match.slice(1).map((part) => (part === undefined ? 0 : Number(part))) as number[];
  const asUtc = Date.UTC(y!, mo! - 1, d!, h!, mi!, s!);
  if (Number.isNaN(asUtc)) return null;
  const check = new Date(asUtc);
  if (check.getUTCMonth() !== mo! - 1 || check.getUTCDate() !== d!) return null;
  // Try the offsets in force a day either side; keep the earliest instant whose wall clock is the one typed.
  const candidates = [
    zoneOffsetMs(new Date(asUtc - 86_400_000), timeZone),
    zoneOffsetMs(new Date(asUtc + 86_400_000), timeZone),
  ]
    .map((offset) => asUtc - offset)
    .sort((a, b) => a - b);
  for (const instant of candidates) {
    if (toZonedInput(new Date(instant), timeZone) === `${value.trim().slice(0, 16)}`) return new Date(instant);
  }
  return new Date(candidates[candidates.length - 1]!);
}

/**
 * The instant a time field means. A field still showing the minute the form opened at means that moment itself,
 * seconds included, so a stop logged and ended within the same minute still ends after it starts; a time the
 * person typed is read on the site's clock.
 */
export function readZonedTime(value: string, timeZone: string, openedAt: Date): Date | null {
  if (value.trim() === toZonedInput(openedAt, timeZone)) return openedAt;
  return fromZonedInput(value, timeZone);
}
