import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { REMOVAL_REASON_LABELS, REMOVAL_REASONS } from '@kerfline/domain/diagnosis/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import {
  periodQueryFromSearch,
  periodRunsQuerySchema,
  sawFiguresQuery,
  sawRunsQuery,
} from '../../../features/fleet/api/queries';
import { Breadcrumbs } from '../../../features/fleet/components/breadcrumbs';
import { FleetFilters, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { FleetTotals } from '../../../features/fleet/components/fleet-totals';
import { MonthPanel } from '../../../features/fleet/components/month-panels';
import { RateWarning } from '../../../features/fleet/components/rate-warning';
import { RunsTable } from '../../../features/fleet/components/runs-table';
import { useAppAbility } from '../../../lib/ability';
import { formatNumber } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { ExportButton } from '../../../lib/ui/export-button';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { FiguresExplained } from '../../../features/fleet/components/figures-explained';

const runsQueryOf = (search: URLSearchParams) => {
  const q = periodQueryFromSearch(search);
  return periodRunsQuerySchema.parse({ from: q.from, to: q.to, limit: 25, offset: search.get('offset') ?? 0 });
};

export function sawFiguresLoader(queryClient: QueryClient) {
  return ({ params, request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    void queryClient.prefetchQuery(sawFiguresQuery(params.sawId!, periodQueryFromSearch(search)));
    void queryClient.prefetchQuery(sawRunsQuery(params.sawId!, runsQueryOf(search)));
    return null;
  };
}

/** One saw's figures, its blades by the reason they came off, and its blade runs: fleet → site → saw. */
export function SawFiguresPage() {
  const { sawId } = useParams();
  const [search] = useSearchParams();
  const q = periodQueryFromSearch(search);
  const figures = useQuery(sawFiguresQuery(sawId!, q));
  const runs = useQuery(sawRunsQuery(sawId!, runsQueryOf(search)));
  const ability = useAppAbility();
  const data = figures.data;
  const units = unitsFromSearch(search, data?.site.unitSystem ?? 'metric');
  const carry = new URLSearchParams({ from: q.from, to: q.to, units }).toString();
  const exportBase = `/fleet/saws/${sawId}/export?${carry}`;
  const trail = [
    { label: 'Fleet', to: `/fleet?${carry}` },
    data
      ? { label: `${data.site.code} ${data.site.name}`, to: `/fleet/sites/${data.site.id}?${carry}` }
      : { label: 'Site' },
    { label: data ? `${data.saw.assetTag} ${data.saw.name}` : 'Saw' },
  ];
  if (figures.isError && !data)
    return (
      <div className="space-y-4">
        <Breadcrumbs trail={trail} />
        <Notice title="This saw’s figures could not be loaded">{figures.error.message}</Notice>
      </div>
    );
  const removed = data ? REMOVAL_REASONS.filter((r) => data.removalReasons[r] > 0) : [];
  const removedTotal = removed.reduce((t, r) => t + data!.removalReasons[r], 0);

  return (
    <div className="space-y-6">
      <title>{`${data?.saw.assetTag ?? 'Saw'} figures · Kerfline`}</title>
      <Breadcrumbs trail={trail} />
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">
            {data ? `${data.saw.assetTag} ${data.saw.name}` : 'Loading…'}
          </h1>
          <p className="mt-1 text-ink-muted">
            {periodLabel(q)}
            {data?.saw.mainMaterial ? ` · mostly ${MATERIAL_GROUP_LABELS[data.saw.mainMaterial].toLowerCase()}` : ''}
          </p>
        </div>
        <nav aria-label="About this saw" className="flex flex-wrap gap-3 text-sm">
          <Link
            to={`/outliers/saws/${sawId}?${carry}`}
            className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
          >
            Compare with its peers
          </Link>
          <Link
            to={`/saws/${sawId}`}
            className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
          >
            The saw’s own page
          </Link>
        </nav>
      </div>
      <FleetFilters period={q} units={units} />
      {data ? <RateWarning warnings={data.warnings} canEnterRates={ability.can('update', 'ExchangeRate')} /> : null}
      {data ? <FleetTotals current={data.figures} units={units} title="This saw over the period" /> : null}
      <div className="grid gap-6 lg:grid-cols-3">
        <Card className="p-4">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 className="text-lg font-bold text-ink">Why blades came off</h2>
            <ExportButton path={`${exportBase}&table=reasons`} />
          </div>
          {data && removedTotal > 0 ? (
            <table className="mt-2 w-full text-sm">
              <caption className="sr-only">Blades taken off in the period, by reason</caption>
              <tbody>
                {removed.map((r) => (
                  <tr key={r} className="border-b border-rule last:border-0">
                    <th scope="row" className="py-2 text-left font-semibold">
                      {REMOVAL_REASON_LABELS[r]}
                    </th>
                    <td className="tabular py-2 text-right">{formatNumber(data.removalReasons[r])}</td>
                    <td className="tabular py-2 text-right text-ink-muted">
                      {formatNumber((data.removalReasons[r] / removedTotal) * 100)} %
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            <p className="mt-2 text-ink-muted">{data ? 'No blade came off in the period.' : 'Loading…'}</p>
          )}
        </Card>
        <div className="lg:col-span-2">
          <MonthPanel
            title="Month by month"
            label={data?.saw.assetTag ?? ''}
            slot={data?.site.colourIndex ?? 0}
            months={data?.months ?? null}
            currency={data?.reportingCurrency ?? 'USD'}
            units={units}
            exportPath={`${exportBase}&table=months`}
            status={data ? 'success' : figures.isError ? 'error' : 'pending'}
            onRetry={() => void figures.refetch()}
          />
        </div>
      </div>
      <Card className="space-y-3 p-4">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <div>
            <h2 className="text-lg font-bold text-ink">Blade runs</h2>
            <p className="text-sm text-ink-muted">Every blade on this saw at some time in the period, newest first.</p>
          </div>
          <ExportButton path={`${exportBase}&table=runs`} label="Export all runs" />
        </div>
        {runs.data && data ? (
          <>
            <RunsTable
              runs={runs.data.items}
              units={units}
              timeZone={data.site.timeZone}
              hrefFor={(runId) => `/fleet/runs/${runId}?${carry}`}
            />
            <Pager total={runs.data.total} limit={runs.data.limit} offset={runs.data.offset} noun="blade runs" />
          </>
        ) : runs.isError ? (
          <Notice title="The blade runs could not be loaded">{runs.error.message}</Notice>
        ) : (
          <p role="status" className="text-ink-muted">
            Loading the blade runs…
          </p>
        )}
      </Card>
      <FiguresExplained />
    </div>
  );
}
