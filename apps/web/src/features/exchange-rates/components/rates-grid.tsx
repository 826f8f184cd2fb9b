import { useId, useState } from 'react';
import type { ExchangeRates } from '@kerfline/domain/money/schema';
import { monthLabel } from '@kerfline/domain/fleet/period';
import { parseDisplayNumber } from '@kerfline/domain/units/display';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../lib/ui/button';
import { usePutRate } from '../api/mutations';

function RateCell({
  currency,
  month,
  rate,
  reporting,
  canEdit,
}: {
  currency: string;
  month: string;
  rate: number | null;
  reporting: string;
  canEdit: boolean;
}) {
  const put = usePutRate();
  const id = useId();
  const [value, setValue] = useState(rate === null ? '' : String(rate));
  if (!canEdit)
    return rate === null ? (
      <span className="font-semibold text-signal-stop">
        <span aria-hidden="true">▲ </span>No rate
      </span>
    ) : (
      <span className="tabular">{rate}</span>
    );
  const read = value.trim() === '' ? null : parseDisplayNumber(value);
  const invalid = read !== null && (!read.ok || read.value <= 0);
  return (
    <form
      className="flex items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        if (read && read.ok && read.value > 0) put.mutate({ currency, month, rate: read.value });
      }}
    >
      <label htmlFor={id} className="sr-only">
        {reporting} per {currency}, {monthLabel(month)}
      </label>
      <input
        id={id}
        inputMode="decimal"
        value={value}
        placeholder="No rate"
        aria-invalid={invalid}
        onChange={(e) => setValue(e.target.value)}
        className={`min-h-11 w-24 rounded-sheet border bg-card px-2 text-right tabular ${rate === null ? 'border-2 border-signal-caution-bg' : 'border-ink-muted'} aria-[invalid=true]:border-signal-stop`}
      />
      {value !== (rate === null ? '' : String(rate)) && !invalid && value.trim() !== '' ? (
        <Button type="submit" disabled={put.isPending}>
          Save
        </Button>
      ) : null}
      {put.isError ? (
        <span role="alert" className="text-xs text-signal-stop">
          {isApiError(put.error) ? put.error.message : 'Not saved'}
        </span>
      ) : null}
    </form>
  );
}

/** Months down, currencies across: what one unit of each currency was worth in the reporting currency. */
export function RatesGrid({ data, canEdit }: { data: ExchangeRates; canEdit: boolean }) {
  const rateOf = new Map(data.items.map((r) => [`${r.currency}|${r.month}`, r]));
  if (data.currencies.length === 0)
    return (
      <p className="text-ink-muted">Every site keeps its money in {data.reportingCurrency}: no rates are needed.</p>
    );
  return (
    <div className="overflow-x-auto">
      <table className="text-sm">
        <caption className="sr-only">{data.reportingCurrency} for one unit of each currency, by month</caption>
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className="px-2 py-2 font-semibold">
              Month
            </th>
            {data.currencies.map((c) => (
              <th key={c} scope="col" className="px-2 py-2 font-semibold">
                {data.reportingCurrency} per {c}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {data.months.map((m) => (
            <tr key={m} className="border-b border-rule last:border-0">
              <th scope="row" className="px-2 py-1 text-left font-semibold whitespace-nowrap">
                {monthLabel(m)}
              </th>
              {data.currencies.map((c) => {
                const r = rateOf.get(`${c}|${m}`);
                return (
                  <td key={c} className="px-2 py-1" title={r?.setByName ? `Entered by ${r.setByName}` : undefined}>
                    <RateCell
                      key={r?.updatedAt ?? 'none'}
                      currency={c}
                      month={m}
                      rate={r?.rate ?? null}
                      reporting={data.reportingCurrency}
                      canEdit={canEdit}
                    />
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
