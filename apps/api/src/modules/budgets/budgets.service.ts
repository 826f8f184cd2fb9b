import { ForbiddenError, subject } from '@casl/ability';
import { QueryTypes, type Attributes } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Budget as BudgetDto, BudgetMonth, BudgetStatus } from '@kerfline/domain/budgets/schema';
import type { FleetQuery, FleetSite } from '@kerfline/domain/fleet/schema';
import { addMonths, monthStart, monthStartInstant, monthsOf, type MonthPeriod } from '@kerfline/domain/fleet/period';
import { convertMinor, crossRate, type UnconvertedPart } from '@kerfline/domain/money/currency';
import { spendAgainstBudgetChecked } from '@kerfline/domain/metrics/blade-economics';
import { SqlParams, scopeSql } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { auditCopy, namesOf } from '../records/record-support.js';
import { moneyRows } from '../fleet/fleet-figures.js';
import { fleetSite, fleetSites, moneyParts, periodStartsBy, rateWarnings } from '../fleet/assemble.js';
import { rateLookup, reportingCurrency } from '../exchange-rates/rates.js';
import { Budget } from './budget.model.js';

/** A budget as the API gives it; `setByName` is the name of who set it (null when unknown). */
function toDto(
  b: Pick<Attributes<Budget>, 'id' | 'siteId' | 'month' | 'amountMinor' | 'currency' | 'updatedAt'>,
  setByName: string | null,
): BudgetDto {
  return {
    id: b.id,
    siteId: b.siteId,
    month: b.month.slice(0, 7),
    amountMinor: Number(b.amountMinor),
    currency: b.currency.trim(),
    setByName,
    updatedAt: b.updatedAt.toISOString(),
  };
}

const canReadBudgets = (ability: AppAbility, site: FleetSite) =>
  ability.can('read', subject('Budget', { id: '', siteId: site.id }));

type BudgetRow = {
  id: string;
  site_id: string;
  month: string;
  amount_minor: number;
  currency: string;
  set_by_name: string | null;
  updated_at: Date;
};

/**
 * The budgets of the sites in the months, by `siteId|YYYY-MM`, each with the name of who set it: one statement
 * (a fleet's year is 720 of them, read beside the spend rather than before a second read of the names).
 */
async function budgetsOf(ability: AppAbility, siteIds: string[], period: MonthPeriod): Promise<Map<string, BudgetDto>> {
  if (siteIds.length === 0) return new Map();
  const params = new SqlParams();
  const scope = scopeSql(ability, 'read', 'Budget', Budget, 'b', params);
  const rows = await Budget.sequelize!.query<BudgetRow>(
    `SELECT b.id, b.site_id, to_char(b.month, 'YYYY-MM') AS month, b.amount_minor, b.currency,
            u.name AS set_by_name, b.updated_at
       FROM budgets b LEFT JOIN users u ON u.id = b.set_by_id
      WHERE b.site_id = ANY(${params.add(siteIds)}::uuid[])
        AND b.month BETWEEN ${params.add(monthStart(period.from))}::date AND ${params.add(monthStart(period.to))}::date
        AND ${scope}`,
    { bind: params.values, type: QueryTypes.SELECT },
  );
  const out = new Map<string, BudgetDto>();
  for (const r of rows) {
    const { id, site_id: siteId, month, amount_minor: amountMinor, currency, updated_at: updatedAt } = r;
    out.set(`${siteId}|${month}`, toDto({ id, siteId, month, amountMinor, currency, updatedAt }, r.set_by_name));
  }
  return out;
}

/**
 * Spend against budget per site and month, in each site's own currency. Spend is the SQL sum of the blades put on
 * in the month (cost fixed at install); a blade bought in another currency is converted through the reporting
 * currency at that month's rates, and a missing rate marks the month. The month in progress is projected with
 * the core of the domain's `bladeSpendAgainstBudget`, `spendAgainstBudgetChecked` (spend so far ÷ share of the
 * month gone); its input is built here from checked values (one currency, whole minor units, a month's bounds), so it is not checked again 720 times.
 */
export async function getBudgetStatus(ability: AppAbility, q: FleetQuery, asOf = new Date()): Promise<BudgetStatus> {
  const period = { from: q.from, to: q.to };
  const [readable, { currency: reporting }] = await Promise.all([
    fleetSites(ability, { only: q.sites, activeFrom: periodStartsBy(period) }),
    reportingCurrency(),
  ]);
  const sites = readable.filter((s) => canReadBudgets(ability, s));
  const siteIds = sites.map((s) => s.id);
  const [budgetOf, money, rateOf] = await Promise.all([
    budgetsOf(ability, siteIds, period),
    moneyRows(Budget.sequelize!, 'site', { ability, siteIds, asOf }, period.from, period.to),
    rateLookup(ability, reporting, period.from, period.to),
  ]);
  const missing: UnconvertedPart[] = [];

  const statusSites = sites.map((site) => {
    const months: BudgetMonth[] = monthsOf(period).map((month) => {
      let spentMinor = 0;
      let complete = true;
      for (const part of moneyParts(money, site.id, 'spend', new Set([month]))) {
        if (part.currency === site.currency) {
          spentMinor += part.amountMinor;
          continue;
        }
        const rate = crossRate(part.currency, site.currency, month, reporting, rateOf);
        if (rate === null) {
          complete = false;
          missing.push({ amountMinor: part.amountMinor, currency: part.currency, month });
        } else {
          spentMinor += convertMinor({ amountMinor: part.amountMinor, from: part.currency, to: site.currency, rate });
        }
      }
      const budget = budgetOf.get(`${site.id}|${month}`) ?? null;
      const periodStart = monthStartInstant(month, site.timeZone);
      const periodEnd = monthStartInstant(addMonths(month, 1), site.timeZone);
      const status = spendAgainstBudgetChecked({
        currency: site.currency,
        budgetMinor: budget?.amountMinor ?? 0,
        spends: spentMinor > 0 ? [{ amountMinor: spentMinor, currency: site.currency, at: periodStart }] : [],
        periodStart,
        periodEnd,
        asOf,
      });
      const inProgress = status.elapsedFraction > 0 && status.elapsedFraction < 1;
      return {
        month,
        budget,
        spentMinor,
        spendComplete: complete,
        varianceMinor: budget ? budget.amountMinor - spentMinor : null,
        percentUsed: budget ? status.percentUsed : null,
        elapsedFraction: status.elapsedFraction,
        projectedMinor: inProgress ? status.projectedMinor : null,
        projectedOverBudget: inProgress && budget ? status.projectedOverBudget : null,
      };
    });
    const budgeted = months.filter((m) => m.budget !== null);
    return {
      site,
      months,
      budgetMinor: budgeted.reduce((t, m) => t + m.budget!.amountMinor, 0),
      spentMinor: months.reduce((t, m) => t + m.spentMinor, 0),
      spendComplete: months.every((m) => m.spendComplete),
      budgetedMonths: budgeted.length,
      varianceMinor: budgeted.length ? budgeted.reduce((t, m) => t + m.varianceMinor!, 0) : null,
    };
  });
  return { period, asOf: asOf.toISOString(), sites: statusSites, warnings: rateWarnings(missing, reporting) };
}

async function budgetSite(ability: AppAbility, siteId: string, action: 'create' | 'update' | 'delete') {
  const site = await fleetSite(ability, siteId);
  if (!site) throw AppError.notFound('Site');
  ForbiddenError.from(ability)
    .setMessage('Only administrators and managers set blade budgets')
    .throwUnlessCan(action, subject('Budget', { id: '', siteId: site.id }));
  return site;
}

/** Sets a site's blade budget for a month, in the site's currency; audited. */
export async function putBudget(
  { ability, userId }: Actor,
  siteId: string,
  month: string,
  amountMinor: number,
): Promise<BudgetDto> {
  const site = await budgetSite(ability, siteId, 'update');
  const saved = await inTransaction(async (transaction) => {
    const existing = await Budget.findOne({
      where: { siteId: site.id, month: monthStart(month) },
      transaction,
      lock: true,
    });
    if (existing) {
      const before = auditCopy(existing);
      await existing.update({ amountMinor, currency: site.currency, setById: userId }, { transaction });
      await writeAudit(transaction, userId, [
        {
          siteId: site.id,
          entity: 'Budget',
          entityId: existing.id,
          action: 'update',
          before,
          after: auditCopy(existing),
        },
      ]);
      return existing;
    }
    ForbiddenError.from(ability)
      .setMessage('Only administrators and managers set blade budgets')
      .throwUnlessCan('create', subject('Budget', { id: '', siteId: site.id }));
    const created = await Budget.create(
      { siteId: site.id, month: monthStart(month), amountMinor, currency: site.currency, setById: userId },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: site.id, entity: 'Budget', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created;
  });
  await saved.reload();
  const names = await namesOf([saved.setById]);
  return toDto(saved, saved.setById ? (names.get(saved.setById) ?? null) : null);
}

export async function deleteBudget({ ability, userId }: Actor, siteId: string, month: string): Promise<void> {
  const site = await budgetSite(ability, siteId, 'delete');
  await inTransaction(async (transaction) => {
    const row = await Budget.findOne({ where: { siteId: site.id, month: monthStart(month) }, transaction });
    if (!row) throw AppError.notFound('Budget');
    const before = auditCopy(row);
    await row.destroy({ transaction });
    await writeAudit(transaction, userId, [
      { siteId: site.id, entity: 'Budget', entityId: row.id, action: 'delete', before },
    ]);
  });
}
