import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { currencySchema } from '../sites/schema.js';
import { monthSchema } from '../fleet/period.js';
import { exchangeRateValueSchema } from './currency.js';

/**
 * The reporting currency the fleet screens total in, and the monthly rates administrators enter into it. One
 * rate per currency and month: units of the reporting currency that one unit of the currency bought in that month
 * (the company's own choice: month-end, month average or its bank's rate).
 */
export const exchangeRateSchema = z.object({
  id: idSchema,
  month: z.string(),
  currency: z.string(),
  reportingCurrency: z.string(),
  rate: z.number(),
  setByName: z.string().nullable(),
  updatedAt: z.string(),
});
export type ExchangeRate = z.infer<typeof exchangeRateSchema>;

export const exchangeRatesSchema = z.object({
  reportingCurrency: z.string(),
  /** Who chose the reporting currency and when; null while it is the one most sites use. */
  reportingCurrencySetByName: z.string().nullable(),
  reportingCurrencySetAt: z.string().nullable(),
  /** Currencies the caller's sites keep, other than the reporting one: the ones that need rates. */
  currencies: z.array(z.string()),
  months: z.array(z.string()),
  items: z.array(exchangeRateSchema),
});
export type ExchangeRates = z.infer<typeof exchangeRatesSchema>;

export const exchangeRatesQuerySchema = z.object({ from: monthSchema.optional(), to: monthSchema.optional() });
export type ExchangeRatesQuery = z.infer<typeof exchangeRatesQuerySchema>;

export const exchangeRateParamsSchema = z.object({ currency: currencySchema, month: monthSchema });

export const exchangeRatePutSchema = z.object({ rate: exchangeRateValueSchema }).strict();
export type ExchangeRatePut = z.infer<typeof exchangeRatePutSchema>;

export const reportingCurrencyPutSchema = z.object({ currency: currencySchema }).strict();
export type ReportingCurrencyPut = z.infer<typeof reportingCurrencyPutSchema>;
