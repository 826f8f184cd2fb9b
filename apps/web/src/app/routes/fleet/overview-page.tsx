import { useQuery } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router-dom';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { fleetOverviewQuery, fleetQueryFromSearch } from '../../../features/fleet/api/queries';
import { FleetFilters, majorityUnits, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { FleetTotals } from '../../../features/fleet/components/fleet-totals';
import { SiteFigureTiles } from '../../../features/fleet/components/site-figure-tiles';
import { OverviewCharts, exportPath } from '../../../features/fleet/components/overview-charts';
import { RateWarning } from '../../../features/fleet/components/rate-warning';
import { useAppAbility } from '../../../lib/ability';
import { ExportButton } from '../../../lib/ui/export-button';
import { Notice } from '../../../lib/ui/notice';
import { Button } from '../../../lib/ui/button';
import { FiguresExplained } from '../../../features/fleet/components/figures-explained';

/** The manager's home: every site's figures side by side for a period, against the period before. */
export function OverviewPage() {
  const [search] = useSearchParams();
  const query = fleetQueryFromSearch(search);
  const overview = useQuery(fleetOverviewQuery(query));
  const ability = useAppAbility();
  const data = overview.data;
  const units = unitsFromSearch(search, majorityUnits(data?.choices ?? []));
  const carry = new URLSearchParams({ from: query.from, to: query.to, units }).toString();
  const previousLabel = data ? periodLabel(data.previous) : 'the previous period';

  return (
    <div className="space-y-6">
      <title>Fleet overview · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Fleet overview</h1>
          <p className="mt-1 text-ink-muted">
            Blade spend, cost per area cut, blade life, stops and availability of your sites, side by side
            {data ? `, in ${data.reportingCurrency}` : ''}.
          </p>
        </div>
        <nav aria-label="More figures" className="flex flex-wrap gap-2 text-sm">
          <Link
            className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
            to={`/fleet/practice?${carry}`}
          >
            Practice compared
          </Link>
          <span aria-hidden="true" className="self-center text-ink-faint">
            ·
          </span>
          <Link
            className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
            to={`/budgets?${carry}`}
          >
            Budgets
          </Link>
          <span aria-hidden="true" className="self-center text-ink-faint">
            ·
          </span>
          <Link
            className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
            to={`/outliers?${carry}`}
          >
            Outliers
          </Link>
        </nav>
      </div>
      <FleetFilters period={query} units={units} siteOptions={data?.choices} selectedSiteIds={query.sites} />
      {overview.isError && !data ? (
        <Notice title="The overview could not be loaded">
          <p>{overview.error.message}</p>
          <Button className="mt-2" onClick={() => void overview.refetch()}>
            Try again
          </Button>
        </Notice>
      ) : null}
      {data ? <RateWarning warnings={data.warnings} canEnterRates={ability.can('update', 'ExchangeRate')} /> : null}
      {data ? (
        <FleetTotals
          current={data.fleet.current}
          previous={data.fleet.previous}
          units={units}
          previousLabel={previousLabel}
        />
      ) : (
        <div role="status" className="h-28 rounded-sheet bg-paper-deep p-4 text-ink-muted">
          Loading the figures…
        </div>
      )}
      <section aria-labelledby="sites-heading" className="space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <div>
            <h2 id="sites-heading" className="text-xl font-bold text-ink">
              Sites
            </h2>
            <p className="text-sm text-ink-muted">Each change is against {previousLabel}. Open a site for its saws.</p>
          </div>
          <ExportButton path={exportPath('/fleet/overview/export', query, units, { table: 'sites' })} />
        </div>
        {data ? (
          <div aria-busy={overview.isFetching}>
            <SiteFigureTiles
              entries={data.sites}
              units={units}
              previousLabel={previousLabel}
              hrefFor={(siteId) => `/fleet/sites/${siteId}?${carry}`}
            />
          </div>
        ) : null}
      </section>
      <OverviewCharts
        data={data}
        status={data ? 'success' : overview.isError ? 'error' : 'pending'}
        errorMessage={overview.error?.message}
        onRetry={() => void overview.refetch()}
        units={units}
        query={query}
      />
      <FiguresExplained />
    </div>
  );
}
