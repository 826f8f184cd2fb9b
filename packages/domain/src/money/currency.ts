import { z } from 'zod';
import { currencySchema } from '../sites/schema.js';

/**
 * Money across currencies. Amounts are integer minor units (cents) of their own currency; a rate says how many
 * units of the reporting currency one unit of another currency bought in a month. Kerfline never guesses a rate:
 * an amount without one stays unconverted and the total that needed it says so.
 */

const digitsCache = new Map<string, number>();

/**
 * `currencySchema.parse`, remembered for the few codes a database holds: a fleet-wide review converts tens of
 * thousands of monthly parts, all in a handful of currencies. Only valid codes are kept, and at most 256 of them.
 */
const codeCache = new Map<string, string>();
function currencyCode(input: string): string {
  let code = codeCache.get(input);
  if (code === undefined) {
    code = currencySchema.parse(input);
    if (codeCache.size < 256) codeCache.set(input, code);
  }
  return code;
}

/**
 * Digits of the currency's minor unit (ISO 4217 "minor unit": USD 2, JPY 0, KWD 3), read from the platform's
 * CLDR data through Intl, so no table of our own can drift from the standard.
 */
export function minorUnitDigits(currency: string): number {
  const code = currencyCode(currency);
  let digits = digitsCache.get(code);
  if (digits === undefined) {
    digits = new Intl.NumberFormat('en', { style: 'currency', currency: code }).resolvedOptions()
      .maximumFractionDigits as number;
    digitsCache.set(code, digits);
  }
  return digits;
}

/** A rate: units of `to` per one unit of `from`; positive and finite. */
export const exchangeRateValueSchema = z
  .number({ message: 'Rate must be a number' })
  .positive({ message: 'Rate must be greater than 0' })
  .max(1_000_000, { message: 'Rate must be at most 1,000,000' })
  .refine((v) => Number.isFinite(v), { message: 'Rate must be a finite number' });

/**
 * Converts integer minor units of `from` into minor units of `to` at `rate` (units of `to` per unit of `from`),
 * allowing for the two currencies' minor units (JPY has none, KWD three), rounded half away from zero to a whole
 * minor unit. The same currency converts at 1 whatever rate is given.
 */
export function convertMinor(input: { amountMinor: number; from: string; to: string; rate: number }): number {
  const from = currencyCode(input.from);
  const to = currencyCode(input.to);
  if (!Number.isInteger(input.amountMinor)) throw new Error('Amount must be a whole number of minor units');
  if (from === to) return input.amountMinor;
  const rate = exchangeRateValueSchema.parse(input.rate);
  const scaled = input.amountMinor * rate * 10 ** (minorUnitDigits(to) - minorUnitDigits(from));
  const rounded = Math.sign(scaled) * Math.round(Math.abs(scaled));
  return Object.is(rounded, -0) ? 0 : rounded;
}

/** One amount of a total: money in its own currency, dated by the month whose rate converts it. */
export type MoneyPart = { amountMinor: number; currency: string; month: string };

/** An amount the total could not include: no rate for its currency in its month. */
export type UnconvertedPart = MoneyPart;

/** A total in one currency, and what it leaves out. */
export type ConvertedTotal = {
  /** Sum of the parts that could be converted, minor units of `currency`. */
  amountMinor: number;
  currency: string;
  /** False when some part had no rate: the total is then too low and must be shown as incomplete. */
  complete: boolean;
  /** The parts left out, merged by currency and month. */
  missing: UnconvertedPart[];
};

/** The rate of `currency` into the reporting currency in `month`, or null when none was entered. */
export type RateLookup = (currency: string, month: string) => number | null;

/**
 * Adds money in several currencies into `to`, converting each part at its own month's rate (`convertMinor`, so
 * each part is rounded once). Parts with no rate are left out and listed in `missing`; `complete` is then false.
 */
export function convertTotal(parts: readonly MoneyPart[], to: string, rateOf: RateLookup): ConvertedTotal {
  const target = currencyCode(to);
  let amountMinor = 0;
  const missing = new Map<string, UnconvertedPart>();
  for (const part of parts) {
    const currency = currencyCode(part.currency);
    if (currency === target) {
      amountMinor += part.amountMinor;
      continue;
    }
    const rate = rateOf(currency, part.month);
    if (rate === null) {
      const key = `${currency}|${part.month}`;
      const seen = missing.get(key);
      if (seen) seen.amountMinor += part.amountMinor;
      else missing.set(key, { amountMinor: part.amountMinor, currency, month: part.month });
      continue;
    }
    amountMinor += convertMinor({ amountMinor: part.amountMinor, from: currency, to: target, rate });
  }
  const list = [...missing.values()].sort(
    (a, b) => a.month.localeCompare(b.month) || a.currency.localeCompare(b.currency),
  );
  return { amountMinor, currency: target, complete: list.length === 0, missing: list };
}

/**
 * A cross rate through the reporting currency: units of `to` per unit of `from`, when both have a rate into the
 * reporting currency for the month (`from` → reporting ÷ `to` → reporting). The reporting currency itself is 1.
 */
export function crossRate(
  from: string,
  to: string,
  month: string,
  reporting: string,
  rateOf: RateLookup,
): number | null {
  const toReporting = (c: string) => (c === reporting ? 1 : rateOf(c, month));
  const a = toReporting(from);
  const b = toReporting(to);
  return a === null || b === null ? null : a / b;
}

/** "CAD for 2026-03" lines for a warning, most recent month first. */
export function missingRateWords(missing: readonly UnconvertedPart[], reporting: string): string[] {
  const pairs = new Map<string, string[]>();
  for (const m of missing) {
    const months = pairs.get(m.currency) ?? [];
    if (!months.includes(m.month)) months.push(m.month);
    pairs.set(m.currency, months);
  }
  return [...pairs.entries()].map(
    ([currency, months]) => `${currency} → ${reporting}: no rate for ${months.sort().join(', ')}`,
  );
}
