import { minorUnitDigits } from '@kerfline/domain/money/currency';
import { APP_LOCALE } from './format';

/**
 * Money on screen: integer minor units with the currency they are in, printed with the currency's symbol.
 * Amounts of a thousand or more drop the cents (a tile of blade spend reads `$37,475`, not `$37,475.17`).
 */
export function formatMoney(minor: number, currency: string, options: { cents?: boolean } = {}): string {
  const digits = minorUnitDigits(currency);
  const major = minor / 10 ** digits;
  const keepCents = options.cents ?? Math.abs(major) < 1000;
  return new Intl.NumberFormat(APP_LOCALE, {
    style: 'currency',
    currency,
    minimumFractionDigits: keepCents ? digits : 0,
    maximumFractionDigits: keepCents ? digits : 0,
  }).format(major);
}

/** Minor units to the plain major-unit number a form shows (12345 cents → 123.45). */
export function minorToMajor(minor: number, currency: string): number {
  return minor / 10 ** minorUnitDigits(currency);
}

/** A typed major-unit amount to minor units, rounded to the nearest minor unit. */
export function majorToMinor(major: number, currency: string): number {
  return Math.round(major * 10 ** minorUnitDigits(currency));
}
