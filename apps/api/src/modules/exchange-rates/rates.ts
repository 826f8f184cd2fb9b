import { Op, fn, col } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { RateLookup } from '@kerfline/domain/money/currency';
import { monthStart, type Month } from '@kerfline/domain/fleet/period';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { Site } from '../sites/site.model.js';
import { ExchangeRate, ReportingCurrency } from './exchange-rate.model.js';

/**
 * Reading the reporting currency and its rates, for every feature that totals money across sites (fleet
 * figures, budgets, outliers, mail). Not a service: it answers questions, it never writes.
 */

export type Reporting = { currency: string; setById: string | null; setAt: Date | null };

/** The reporting currency: the one an administrator chose, else the currency most sites keep (USD with no sites). */
export async function reportingCurrency(): Promise<Reporting> {
  const row = await ReportingCurrency.findOne();
  if (row) return { currency: row.currency.trim(), setById: row.setById, setAt: row.updatedAt };
  const counts = (await Site.findAll({
    attributes: ['currency', [fn('count', col('id')), 'n']],
    where: { retiredAt: { [Op.is]: null } },
    group: ['currency'],
    order: [
      [fn('count', col('id')), 'DESC'],
      ['currency', 'ASC'],
    ],
    raw: true,
  })) as unknown as { currency: string; n: number }[];
  return { currency: counts[0]?.currency.trim() ?? 'USD', setById: null, setAt: null };
}

/** Every rate into `reporting` for the months `from`–`to`, as a lookup (`null`: no rate entered). */
export async function rateLookup(ability: AppAbility, reporting: string, from: Month, to: Month): Promise<RateLookup> {
  const rows = await ExchangeRate.findAll({
    where: scopedWhere(ability, 'read', 'ExchangeRate', ExchangeRate, {
      reportingCurrency: reporting,
      month: { [Op.between]: [monthStart(from), monthStart(to)] },
    }),
  });
  const rates = new Map(rows.map((r) => [`${r.currency.trim()}|${r.month.slice(0, 7)}`, Number(r.rate)]));
  return (currency, month) => rates.get(`${currency}|${month}`) ?? null;
}
