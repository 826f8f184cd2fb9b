import { numberFormat } from '@kerfline/domain/common/number-format';
import { APP_LOCALE } from './format';

/**
 * Money on screen and in forms. The API keeps integer minor units (cents) with the currency beside them; people
 * read and type major units ("64.50"). The number of decimals is the currency's own (none for yen).
 */
export function currencyDigits(currency: string): number {
  try {
    return numberFormat(APP_LOCALE, { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

/**
 * Minor units as money, e.g. `$64.50`, `€1,200.00`, `¥6,450`. With `{ cents: 'auto' }` an amount of a thousand or
 * more drops its cents, as totals on the fleet screens read (`$37,475`, not `$37,475.17`).
 */
export function formatMoney(minor: number, currency: string, options: { cents?: boolean | 'auto' } = {}): string {
  const digits = currencyDigits(currency);
  const major = minor / 10 ** digits;
  const cents = options.cents ?? true;
  const keep = cents === 'auto' ? Math.abs(major) < 1000 : cents;
  return numberFormat(APP_LOCALE, {
    style: 'currency',
    currency,
    minimumFractionDigits: keep ? digits : 0,
    maximumFractionDigits: keep ? digits : 0,
  }).format(major);
}

/** Minor units as a person types them in a form: `64.5` for 6450 cents. */
export function moneyInput(minor: number, currency: string): string {
  return String(minor / 10 ** currencyDigits(currency));
}

/**
 * An amount typed in major units, in minor units: "64.50" or "1,200" → 6450, 120000. Null for blank; a message
 * for text that is not an amount or has more decimals than the currency has.
 */
export function minorFromText(
  text: string,
  currency: string,
): { ok: true; value: number | null } | { ok: false; message: string } {
  const trimmed = text.trim().replace(/^[^\d.-]+/, '');
  if (trimmed === '') return { ok: true, value: null };
  if (!/^(\d{1,3}(,\d{3})+|\d+)?(\.\d+)?$/.test(trimmed) || !/\d/.test(trimmed))
    return { ok: false, message: `Write the amount in ${currency} with a point for decimals, such as 64.50` };
  const digits = currencyDigits(currency);
  const decimals = trimmed.split('.')[1]?.length ?? 0;
  if (decimals > digits)
    return {
      ok: false,
      message:
        digits === 0 ? `${currency} has no decimals` : `${currency} has ${digits} decimals at most, such as 64.50`,
    };
  return { ok: true, value: Math.round(Number(trimmed.replaceAll(',', '')) * 10 ** digits) };
}

/** Minor units to the plain major-unit number a form shows (12345 cents → 123.45). */
export function minorToMajor(minor: number, currency: string): number {
  return minor / 10 ** currencyDigits(currency);
}

/** A typed major-unit amount to minor units, rounded to the nearest minor unit. */
export function majorToMinor(major: number, currency: string): number {
  return Math.round(major * 10 ** currencyDigits(currency));
}
