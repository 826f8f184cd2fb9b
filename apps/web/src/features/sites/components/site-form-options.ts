export type ZoneGroup = { area: string; zones: { value: string; label: string }[] };

/**
 * The IANA time zones this browser knows, grouped by area (Africa, America, Europe…), or undefined where the
 * browser cannot list them (the form then takes the zone as text; the domain schema checks it either way).
 */
export function timeZoneGroups(): ZoneGroup[] | undefined {
  let listed: string[];
  try {
    if (typeof Intl.supportedValuesOf !== 'function') return undefined;
    listed = Intl.supportedValuesOf('timeZone');
  } catch {
    return undefined;
  }
  if (listed.length === 0) return undefined;
  // Some engines leave UTC out of the list; a site on UTC is a reasonable choice, so it is always offered.
  const zones = listed.includes('UTC') ? listed : [...listed, 'UTC'];
  const groups = new Map<string, ZoneGroup['zones']>();
  for (const zone of zones) {
    const slash = zone.indexOf('/');
    const area = slash > 0 ? zone.slice(0, slash) : 'Other';
    // The whole name, as the site's header shows it, so the closed list reads the same; spaces for legibility.
    groups.set(area, [...(groups.get(area) ?? []), { value: zone, label: zone.replaceAll('_', ' ') }]);
  }
  return [...groups.entries()]
    .sort(([a], [b]) => (a === 'Other' ? 1 : b === 'Other' ? -1 : a.localeCompare(b)))
    .map(([area, list]) => ({ area, zones: list.sort((x, y) => x.label.localeCompare(y.label)) }));
}

/** The weekday and time of day in `timeZone` now, e.g. `Tue 14:05`; undefined for a zone the browser rejects. */
export function timeNowIn(timeZone: string, now = new Date()): string | undefined {
  try {
    return new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'short', hour: '2-digit', minute: '2-digit' }).format(
      now,
    );
  } catch {
    return undefined;
  }
}

/**
 * A short pick of widely used currencies, by ISO 4217 code, offered first; any other code can be typed.
 */
export const COMMON_CURRENCIES = [
  'USD',
  'CAD',
  'MXN',
  'BRL',
  'EUR',
  'GBP',
  'CHF',
  'SEK',
  'NOK',
  'DKK',
  'PLN',
  'CZK',
  'HUF',
  'TRY',
  'ZAR',
  'INR',
  'CNY',
  'JPY',
  'KRW',
  'AUD',
  'NZD',
] as const;

/** The select's value for "a code not in the list"; never sent. */
export const OTHER_CURRENCY = 'other';

/** `EUR — Euro`, with the name in English where the browser knows it. */
export function currencyLabel(code: string): string {
  try {
    const name = new Intl.DisplayNames(['en'], { type: 'currency' }).of(code);
    return name && name !== code ? `${code} — ${name}` : code;
  } catch {
    return code;
  }
}
