import { ForbiddenError, subject } from '@casl/ability';
import { Op } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { ExchangeRate as ExchangeRateDto, ExchangeRates, ExchangeRatesQuery } from '@kerfline/domain/money/schema';
import { addMonths, monthOf, monthStart, monthsOf } from '@kerfline/domain/fleet/period';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { auditCopy, namesOf } from '../records/record-support.js';
import { ExchangeRate, ReportingCurrency } from './exchange-rate.model.js';
import { reportingCurrency } from './rates.js';

function toDto(r: ExchangeRate, names: Map<string, string>): ExchangeRateDto {
  return {
    id: r.id,
    month: r.month.slice(0, 7),
    currency: r.currency.trim(),
    reportingCurrency: r.reportingCurrency.trim(),
    rate: Number(r.rate),
    setByName: r.setById ? (names.get(r.setById) ?? null) : null,
    updatedAt: r.updatedAt.toISOString(),
  };
}

/**
 * The reporting currency and the rates into it for a run of months (the last twelve and the month in progress
 * by default), with the currencies the caller's sites keep, so the screen can show which months lack a rate.
 */
export async function listExchangeRates(ability: AppAbility, q: ExchangeRatesQuery): Promise<ExchangeRates> {
  const reporting = await reportingCurrency();
  const to = q.to ?? monthOf(new Date());
  const from = q.from ?? addMonths(to, -12);
  if (to < from)
    throw AppError.validation('The last month must not be before the first', [
      { path: 'to', message: 'must not be before from' },
    ]);
  const [rows, sites] = await Promise.all([
    ExchangeRate.findAll({
      where: scopedWhere(ability, 'read', 'ExchangeRate', ExchangeRate, {
        reportingCurrency: reporting.currency,
        month: { [Op.between]: [monthStart(from), monthStart(to)] },
      }),
      order: [
        ['month', 'DESC'],
        ['currency', 'ASC'],
      ],
    }),
    Site.findAll({ where: scopedWhere(ability, 'read', 'Site', Site), attributes: ['currency'] }),
  ]);
  const names = await namesOf([...rows.map((r) => r.setById), reporting.setById]);
  const currencies = [...new Set(sites.map((s) => s.currency.trim()))].filter((c) => c !== reporting.currency).sort();
  return {
    reportingCurrency: reporting.currency,
    reportingCurrencySetByName: reporting.setById ? (names.get(reporting.setById) ?? null) : null,
    reportingCurrencySetAt: reporting.setAt ? reporting.setAt.toISOString() : null,
    currencies,
    months: monthsOf({ from, to }).reverse(),
    items: rows.map((r) => toDto(r, names)),
  };
}

/** Enters or corrects the rate of a currency into the reporting currency for a month (administrators). */
export async function putExchangeRate(
  { ability, userId }: Actor,
  currency: string,
  month: string,
  rate: number,
): Promise<ExchangeRateDto> {
  const reporting = (await reportingCurrency()).currency;
  if (currency === reporting)
    throw AppError.validation(`${currency} is the reporting currency: it needs no rate`, [
      { path: 'currency', message: 'choose another currency' },
    ]);
  ForbiddenError.from(ability)
    .setMessage('Only administrators enter exchange rates')
    .throwUnlessCan('update', subject('ExchangeRate', { id: '', currency }));
  const saved = await inTransaction(async (transaction) => {
    const existing = await ExchangeRate.findOne({
      where: { reportingCurrency: reporting, currency, month: monthStart(month) },
      transaction,
      lock: true,
    });
    if (existing) {
      const before = auditCopy(existing);
      await existing.update({ rate, setById: userId }, { transaction });
      await writeAudit(transaction, userId, [
        {
          siteId: null,
          entity: 'ExchangeRate',
          entityId: existing.id,
          action: 'update',
          before,
          after: auditCopy(existing),
        },
      ]);
      return existing;
    }
    const created = await ExchangeRate.create(
      { reportingCurrency: reporting, currency, month: monthStart(month), rate, setById: userId },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: null, entity: 'ExchangeRate', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created;
  });
  await saved.reload();
  return toDto(saved, await namesOf([saved.setById]));
}

export async function deleteExchangeRate({ ability, userId }: Actor, currency: string, month: string): Promise<void> {
  const reporting = (await reportingCurrency()).currency;
  ForbiddenError.from(ability)
    .setMessage('Only administrators enter exchange rates')
    .throwUnlessCan('delete', subject('ExchangeRate', { id: '', currency }));
  await inTransaction(async (transaction) => {
    const row = await ExchangeRate.findOne({
      where: { reportingCurrency: reporting, currency, month: monthStart(month) },
      transaction,
    });
    if (!row) throw AppError.notFound('Exchange rate');
    const before = auditCopy(row);
    await row.destroy({ transaction });
    await writeAudit(transaction, userId, [
      { siteId: null, entity: 'ExchangeRate', entityId: row.id, action: 'delete', before },
    ]);
  });
}

/**
 * Chooses the reporting currency (administrators). Rates are kept per reporting currency, so switching back
 * finds the old rates again; the new one starts without rates and every total says so until they are entered.
 */
export async function putReportingCurrency({ ability, userId }: Actor, currency: string): Promise<ExchangeRates> {
  ForbiddenError.from(ability)
    .setMessage('Only administrators choose the reporting currency')
    .throwUnlessCan('manage', 'all');
  await inTransaction(async (transaction) => {
    const existing = await ReportingCurrency.findOne({ transaction, lock: true });
    const before = existing ? auditCopy(existing) : null;
    if (existing) await existing.update({ currency, setById: userId }, { transaction });
    else await ReportingCurrency.create({ id: true, currency, setById: userId }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: null,
        entity: 'ReportingCurrency',
        entityId: 'reporting-currency',
        action: existing ? 'update' : 'create',
        before,
        after: { currency },
      },
    ]);
  });
  return listExchangeRates(ability, {});
}
