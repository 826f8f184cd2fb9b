import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { addMonths, monthOf, periodLabel } from '@kerfline/domain/fleet/period';
import { fleetQuerySchema, type FleetQuery } from '@kerfline/domain/fleet/schema';
import { budgetStatusQuery } from '../../../features/budgets/api/queries';
import { BudgetTable } from '../../../features/budgets/components/budget-table';
import { FleetFilters, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { RateWarning } from '../../../features/fleet/components/rate-warning';
import { SiteMark } from '../../../features/fleet/components/site-mark';
import { exportPath } from '../../../features/fleet/components/overview-charts';
import { useAppAbility } from '../../../lib/ability';
import { formatDateTime } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { ExportButton } from '../../../lib/ui/export-button';
import { Notice } from '../../../lib/ui/notice';

/** Budgets look forward as well as back: by default the five months before this one, and this one so far. */
function queryOf(search: URLSearchParams): FleetQuery {
  const to = monthOf(new Date());
  const parsed = fleetQuerySchema.safeParse({
    from: search.get('from') ?? addMonths(to, -5),
    to: search.get('to') ?? to,
    sites: search.get('sites') ?? undefined,
  });
  return parsed.success ? parsed.data : { from: addMonths(to, -5), to };
}

export function budgetsLoader(queryClient: QueryClient) {
  return ({ request }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(budgetStatusQuery(queryOf(new URL(request.url).searchParams)));
    return null;
  };
}

/** Blade spend against each site's monthly budget, with the month in progress projected from its spend so far. */
export function BudgetsPage() {
  const [search] = useSearchParams();
  const q = queryOf(search);
  const status = useQuery(budgetStatusQuery(q));
  const ability = useAppAbility();
  const data = status.data;
  const units = unitsFromSearch(search, 'metric');
  return (
    <div className="space-y-6">
      <title>Blade budgets · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Blade budgets</h1>
          <p className="mt-1 max-w-3xl text-ink-muted">
            Each site’s monthly blade budget in its own currency against what it spent, {periodLabel(q)}. The month in
            progress is projected from its spend so far.
          </p>
        </div>
        <ExportButton path={exportPath('/budgets/export', q, units)} />
      </div>
      {/* Money alone: no areas to show in a unit system. */}
      <FleetFilters period={q} siteOptions={data?.sites.map((s) => s.site)} selectedSiteIds={q.sites} />
      {data ? <RateWarning warnings={data.warnings} canEnterRates={ability.can('update', 'ExchangeRate')} /> : null}
      {status.isError && !data ? <Notice title="The budgets could not be loaded">{status.error.message}</Notice> : null}
      {!data ? (
        <p role="status" className="text-ink-muted">
          Loading the budgets…
        </p>
      ) : data.sites.length === 0 ? (
        <p className="text-ink-muted">No budgets are kept for your sites.</p>
      ) : (
        data.sites.map((s) => (
          <Card key={s.site.id} className="p-4">
            <h2 className="flex items-center gap-2 text-lg font-bold text-ink">
              <SiteMark slot={s.site.colourIndex} /> {s.site.code} {s.site.name}
              <span className="text-sm font-normal text-ink-muted">({s.site.currency})</span>
            </h2>
            <div className="mt-2">
              <BudgetTable status={s} asOfLabel={formatDateTime(data.asOf, s.site.timeZone, true)} />
            </div>
          </Card>
        ))
      )}
    </div>
  );
}
