import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { periodQueryFromSearch, siteFiguresQuery } from '../../../features/fleet/api/queries';
import { Breadcrumbs } from '../../../features/fleet/components/breadcrumbs';
import { FleetFilters, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { FleetTotals } from '../../../features/fleet/components/fleet-totals';
import { MonthPanel } from '../../../features/fleet/components/month-panels';
import { RateWarning } from '../../../features/fleet/components/rate-warning';
import { SawFiguresTable } from '../../../features/fleet/components/saw-figures-table';
import { SiteMark } from '../../../features/fleet/components/site-mark';
import { useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { ExportButton } from '../../../lib/ui/export-button';
import { Notice } from '../../../lib/ui/notice';
import { FiguresExplained } from '../../../features/fleet/components/figures-explained';

export function siteFiguresLoader(queryClient: QueryClient) {
  return ({ params, request }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(
      siteFiguresQuery(params.siteId!, periodQueryFromSearch(new URL(request.url).searchParams)),
    );
    return null;
  };
}

/** One site's figures over the period, month by month, and each of its saws: fleet → site. */
export function SiteFiguresPage() {
  const { siteId } = useParams();
  const [search] = useSearchParams();
  const q = periodQueryFromSearch(search);
  const result = useQuery(siteFiguresQuery(siteId!, q));
  const ability = useAppAbility();
  const data = result.data;
  const units = unitsFromSearch(search, data?.site.unitSystem ?? 'metric');
  const carry = new URLSearchParams({ from: q.from, to: q.to, units }).toString();
  const exportBase = `/fleet/sites/${siteId}/export?${carry}`;

  if (result.isError && !data)
    return (
      <div className="space-y-4">
        <Breadcrumbs trail={[{ label: 'Fleet', to: `/fleet?${carry}` }, { label: 'Site' }]} />
        <Notice title="This site’s figures could not be loaded">{result.error.message}</Notice>
      </div>
    );

  return (
    <div className="space-y-6">
      <title>{`${data?.site.code ?? 'Site'} figures · Kerfline`}</title>
      <Breadcrumbs
        trail={[
          { label: 'Fleet', to: `/fleet?${carry}` },
          { label: data ? `${data.site.code} ${data.site.name}` : 'Site' },
        ]}
      />
      <div>
        <h1 className="flex items-center gap-2 text-3xl font-extrabold tracking-tight text-ink">
          {data ? <SiteMark slot={data.site.colourIndex} size={18} /> : null}
          {data ? data.site.name : 'Loading…'}
        </h1>
        <p className="mt-1 text-ink-muted">
          {periodLabel(q)}, in {data?.reportingCurrency ?? 'the reporting currency'}. Open a saw for its blades.
        </p>
      </div>
      <FleetFilters period={q} units={units} />
      {data ? <RateWarning warnings={data.warnings} canEnterRates={ability.can('update', 'ExchangeRate')} /> : null}
      {data ? <FleetTotals current={data.figures} units={units} title="This site over the period" /> : null}
      <Card className="space-y-3 p-4">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 className="text-lg font-bold text-ink">Saws</h2>
          <ExportButton path={`${exportBase}&table=saws`} />
        </div>
        {data ? (
          <SawFiguresTable rows={data.saws} units={units} hrefFor={(sawId) => `/fleet/saws/${sawId}?${carry}`} />
        ) : (
          <p role="status" className="text-ink-muted">
            Loading the saws…
          </p>
        )}
      </Card>
      <MonthPanel
        title="Month by month"
        label={data?.site.code ?? ''}
        slot={data?.site.colourIndex ?? 0}
        months={data?.months ?? null}
        currency={data?.reportingCurrency ?? 'USD'}
        units={units}
        exportPath={`${exportBase}&table=months`}
        status={data ? 'success' : result.isError ? 'error' : 'pending'}
        onRetry={() => void result.refetch()}
      />
      <FiguresExplained />
    </div>
  );
}
