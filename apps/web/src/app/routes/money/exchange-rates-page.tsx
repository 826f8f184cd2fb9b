import { useState } from 'react';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { exchangeRatesQuery } from '../../../features/exchange-rates/api/queries';
import { usePutReportingCurrency } from '../../../features/exchange-rates/api/mutations';
import { RatesGrid } from '../../../features/exchange-rates/components/rates-grid';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';

export function exchangeRatesLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(exchangeRatesQuery());
    return null;
  };
}

/** The reporting currency and the monthly rates into it: administrators enter them, everyone sees them. */
export function ExchangeRatesPage() {
  const { data } = useSuspenseQuery(exchangeRatesQuery());
  const ability = useAppAbility();
  const canEdit = ability.can('update', 'ExchangeRate');
  const chooseCurrency = usePutReportingCurrency();
  const [currency, setCurrency] = useState(data.reportingCurrency);
  return (
    <div className="space-y-6">
      <title>Exchange rates · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Exchange rates</h1>
        <p className="mt-1 max-w-3xl text-ink-muted">
          Fleet totals are in {data.reportingCurrency}. Each site keeps its own currency; its money is converted at the
          rate entered here for the month it was spent. A month without a rate is left out of the totals, and they say
          so.
        </p>
      </div>
      <Card className="p-4">
        <h2 className="text-lg font-bold text-ink">Reporting currency</h2>
        <p className="mt-1 text-sm text-ink-muted">
          {data.reportingCurrencySetByName && data.reportingCurrencySetAt
            ? `Chosen by ${data.reportingCurrencySetByName} on ${formatDateTime(data.reportingCurrencySetAt, 'UTC')}.`
            : 'Not chosen yet: Kerfline uses the currency most sites keep.'}
        </p>
        {canEdit ? (
          <form
            className="mt-3 flex flex-wrap items-end gap-3"
            onSubmit={(e) => {
              e.preventDefault();
              chooseCurrency.mutate(currency);
            }}
          >
            <Field label="Currency (ISO 4217 code)" className="w-56">
              {(props) => (
                <input
                  {...props}
                  value={currency}
                  maxLength={3}
                  onChange={(e) => setCurrency(e.target.value.toUpperCase())}
                  className={inputClass}
                />
              )}
            </Field>
            <Button type="submit" disabled={currency === data.reportingCurrency || chooseCurrency.isPending}>
              Use {currency || '…'} for totals
            </Button>
          </form>
        ) : null}
        {chooseCurrency.isError ? (
          <div className="mt-2">
            <Notice title="Not changed">
              {isApiError(chooseCurrency.error) ? chooseCurrency.error.message : 'Try again.'}
            </Notice>
          </div>
        ) : null}
      </Card>
      <Card className="p-4">
        <h2 className="text-lg font-bold text-ink">Rates by month</h2>
        <p className="mt-1 text-sm text-ink-muted">
          {canEdit
            ? 'Type a rate and save it; every figure that needs it updates.'
            : 'Only administrators enter rates.'}
        </p>
        <div className="mt-3">
          <RatesGrid data={data} canEdit={canEdit} />
        </div>
      </Card>
    </div>
  );
}
