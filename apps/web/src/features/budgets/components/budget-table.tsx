import { useId, useState } from 'react';
import { subject } from '@casl/ability';
import type { BudgetStatus } from '@kerfline/domain/budgets/schema';
import { monthLabel } from '@kerfline/domain/fleet/period';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { parseDisplayNumber } from '@kerfline/domain/units/display';
import { formatNumber } from '../../../lib/format';
import { formatMoney, majorToMinor, minorToMajor } from '../../../lib/money';
import { Button } from '../../../lib/ui/button';
import { useSetBudget } from '../api/mutations';

type SiteStatus = BudgetStatus['sites'][number];
type Month = SiteStatus['months'][number];

/** A month's budget, typed in the site's currency, saved on its own. */
function BudgetCell({
  siteId,
  month,
  currency,
  cents,
  canSet,
}: {
  siteId: string;
  month: Month;
  currency: string;
  cents: boolean;
  canSet: boolean;
}) {
  const set = useSetBudget();
  const id = useId();
  const current = month.budget ? String(minorToMajor(month.budget.amountMinor, currency)) : '';
  const [value, setValue] = useState(current);
  if (!canSet)
    return (
      <>
        {month.budget ? (
          formatMoney(month.budget.amountMinor, currency, { cents })
        ) : (
          <span className="text-ink-muted">Not set</span>
        )}
      </>
    );
  const read = value.trim() === '' ? null : parseDisplayNumber(value);
  const parsed = read && read.ok ? read.value : null;
  const invalid = read !== null && (!read.ok || read.value < 0);
  return (
    <form
      className="flex items-center gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (!invalid)
          set.mutate({
            siteId,
            month: month.month,
            amountMinor: parsed === null ? null : majorToMinor(parsed, currency),
          });
      }}
    >
      <label htmlFor={id} className="sr-only">
        Budget for {monthLabel(month.month)} in {currency}
      </label>
      <input
        id={id}
        inputMode="decimal"
        value={value}
        onChange={(e) => setValue(e.target.value)}
        aria-invalid={invalid}
        placeholder="Not set"
        className="min-h-11 w-28 rounded-sheet border border-ink-muted bg-card px-2 text-right tabular aria-[invalid=true]:border-2 aria-[invalid=true]:border-signal-stop"
      />
      {value !== current ? (
        <Button type="submit" disabled={set.isPending || invalid}>
          {set.isPending ? 'Saving…' : 'Save'}
        </Button>
      ) : null}
      {invalid ? <span className="text-xs font-semibold text-signal-stop">a number of {currency}</span> : null}
      {set.isError ? (
        <span role="alert" className="text-xs font-semibold text-signal-stop">
          {isApiError(set.error) ? set.error.message : 'Not saved'}
        </span>
      ) : null}
    </form>
  );
}

/**
 * Whether a site's table shows cents: only when every amount in it is under a thousand. One precision for the
 * whole table, so that a row adds up as read (a budget of $3,300 and a spend of $3,123 leave $177, not $176.68).
 */
function tableShowsCents(status: SiteStatus, currency: string): boolean {
  const amounts = [status.budgetMinor, status.spentMinor, status.varianceMinor ?? 0];
  for (const m of status.months)
    amounts.push(m.budget?.amountMinor ?? 0, m.spentMinor, m.varianceMinor ?? 0, m.projectedMinor ?? 0);
  return amounts.every((minor) => Math.abs(minorToMajor(minor, currency)) < 1000);
}

/** One site's months: budget (editable by managers and administrators), spend, variance, use, projection. */
export function BudgetTable({ status, asOfLabel }: { status: SiteStatus; asOfLabel: string }) {
  const ability = useAppAbility();
  const currency = status.site.currency;
  const cents = tableShowsCents(status, currency);
  const canSet = ability.can('update', subject('Budget', { id: '', siteId: status.site.id }));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">
          Blade budget and spend of {status.site.name} by month, in {currency}
        </caption>
        <thead>
          <tr className="border-b border-rule text-left">
            {['Month', `Budget (${currency})`, 'Spend', 'Variance', 'Used', 'Projected for the month'].map((h) => (
              <th key={h} scope="col" className="px-2 py-2 font-semibold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {status.months.map((m) => (
            <tr key={m.month} className="border-b border-rule last:border-0">
              <th scope="row" className="px-2 py-1 text-left font-semibold whitespace-nowrap">
                {monthLabel(m.month)}
                {m.elapsedFraction > 0 && m.elapsedFraction < 1 ? (
                  <span className="block text-xs font-normal text-ink-muted">
                    in progress ({formatNumber(m.elapsedFraction * 100)} % gone)
                  </span>
                ) : null}
              </th>
              <td className="px-2 py-1">
                <BudgetCell
                  key={m.budget?.updatedAt ?? 'none'}
                  siteId={status.site.id}
                  month={m}
                  currency={currency}
                  cents={cents}
                  canSet={canSet}
                />
              </td>
              <td className="tabular px-2 py-1 whitespace-nowrap">
                {formatMoney(m.spentMinor, currency, { cents })}
                {m.spendComplete ? '' : ' *'}
              </td>
              <td className="tabular px-2 py-1 whitespace-nowrap">
                {m.varianceMinor === null ? (
                  '—'
                ) : m.varianceMinor < 0 ? (
                  <span className="font-semibold text-signal-stop">
                    <span aria-hidden="true">▲ </span>
                    {formatMoney(-m.varianceMinor, currency, { cents })} over
                  </span>
                ) : (
                  <span>{formatMoney(m.varianceMinor, currency, { cents })} under</span>
                )}
              </td>
              <td className="tabular px-2 py-1">{m.percentUsed === null ? '—' : `${formatNumber(m.percentUsed)} %`}</td>
              <td className="tabular px-2 py-1 whitespace-nowrap">
                {m.projectedMinor === null ? (
                  '—'
                ) : m.spentMinor === 0 ? (
                  // A rate of spending needs a spend: "$0 for the month" on its second day would read as a forecast.
                  <span className="text-ink-muted">No spend yet</span>
                ) : (
                  <span className={m.projectedOverBudget ? 'font-semibold text-signal-stop' : ''}>
                    {m.projectedOverBudget ? <span aria-hidden="true">▲ </span> : null}
                    {formatMoney(m.projectedMinor, currency, { cents })}
                    {m.projectedOverBudget ? ' (over budget)' : ''}
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="border-t-2 border-ink text-left">
            <th scope="row" className="px-2 py-2">
              Period
            </th>
            <td className="tabular px-2 py-2 font-semibold">
              {formatMoney(status.budgetMinor, currency, { cents })}{' '}
              <span className="font-normal text-ink-muted">({status.budgetedMonths} months set)</span>
            </td>
            <td className="tabular px-2 py-2 font-semibold">
              {formatMoney(status.spentMinor, currency, { cents })}
              {status.spendComplete ? '' : ' *'}
            </td>
            <td className="tabular px-2 py-2 font-semibold" colSpan={3}>
              {status.varianceMinor === null
                ? 'No budget set'
                : status.varianceMinor < 0
                  ? `${formatMoney(-status.varianceMinor, currency, { cents })} over in the months with a budget`
                  : `${formatMoney(status.varianceMinor, currency, { cents })} under in the months with a budget`}
            </td>
          </tr>
        </tfoot>
      </table>
      <p className="mt-2 text-xs text-ink-muted">
        Spend as of {asOfLabel}: the blades put on the site’s saws, at the cost fixed when they went on.
      </p>
    </div>
  );
}
