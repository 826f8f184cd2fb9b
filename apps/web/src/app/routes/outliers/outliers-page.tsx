import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { PEER_METRIC_INFO } from '@kerfline/domain/outliers/peer-review';
import { fleetQueryFromSearch } from '../../../features/fleet/api/queries';
import { FleetFilters, majorityUnits, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { RateWarning } from '../../../features/fleet/components/rate-warning';
import { SiteMark } from '../../../features/fleet/components/site-mark';
import { exportPath } from '../../../features/fleet/components/overview-charts';
import { outlierReviewQuery } from '../../../features/outliers/api/queries';
import { FlagCard } from '../../../features/outliers/components/flag-card';
import { FollowUpStateBadge } from '../../../features/follow-ups/components/follow-up-state';
import { useAppAbility } from '../../../lib/ability';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { ExportButton } from '../../../lib/ui/export-button';
import { Notice } from '../../../lib/ui/notice';
import { FiguresExplained } from '../../../features/fleet/components/figures-explained';

/** The lead's look-back: the last six whole months unless the address says otherwise. */
const queryOf = (search: URLSearchParams) => fleetQueryFromSearch(search, 6);

export function outliersLoader(queryClient: QueryClient) {
  return ({ request }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(outlierReviewQuery(queryOf(new URL(request.url).searchParams)));
    return null;
  };
}

const KIND_WORDS = { horizontal: 'Horizontal saws', vertical: 'Vertical saws' } as const;

/** The regional lead's home: saws compared with saws like them, the ones out of line first. */
export function OutliersPage() {
  const [search] = useSearchParams();
  const query = queryOf(search);
  const review = useQuery(outlierReviewQuery(query));
  const ability = useAppAbility();
  const data = review.data;
  const units = unitsFromSearch(search, majorityUnits(data?.saws.map((s) => s.site) ?? []));
  const carry = new URLSearchParams({ from: query.from, to: query.to, units }).toString();
  const sawOf = new Map(data?.saws.map((s) => [s.saw.id, s]) ?? []);
  const siteOptions = data ? [...new Map(data.saws.map((s) => [s.site.id, s.site])).values()] : undefined;
  const notJudgedBySaw = new Map<string, string[]>();
  for (const n of data?.notJudged ?? []) {
    const list = notJudgedBySaw.get(n.sawId) ?? [];
    list.push(`${PEER_METRIC_INFO[n.metric].label}: ${n.reason}`);
    notJudgedBySaw.set(n.sawId, list);
  }

  return (
    <div className="space-y-6">
      <title>Outliers · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Saws that need a look</h1>
          <p className="mt-1 max-w-3xl text-ink-muted">
            Each saw is compared with saws of the same kind that mostly cut the same material, on cost per area, blade
            life, unplanned stop hours and failures, {periodLabel(query)}. A saw is flagged only when it is far out on
            the side that costs money or hours.
          </p>
        </div>
        <ExportButton path={exportPath('/outliers/export', query, units)} />
      </div>
      <FleetFilters period={query} units={units} siteOptions={siteOptions} selectedSiteIds={query.sites} />
      {data ? <RateWarning warnings={data.warnings} canEnterRates={ability.can('update', 'ExchangeRate')} /> : null}
      {review.isError && !data ? (
        <Notice title="The comparison could not be loaded">
          <p>{review.error.message}</p>
          <Button className="mt-2" onClick={() => void review.refetch()}>
            Try again
          </Button>
        </Notice>
      ) : null}
      <section aria-labelledby="flags-heading" aria-busy={review.isFetching}>
        <h2 id="flags-heading" className="text-xl font-bold text-ink">
          Flags {data ? <span className="text-ink-muted">({data.flags.length})</span> : null}
        </h2>
        {!data ? (
          <p role="status" className="mt-2 text-ink-muted">
            Comparing the saws…
          </p>
        ) : data.flags.length === 0 ? (
          <p className="mt-2 text-ink-muted">No saw is out of line with its peers in this period.</p>
        ) : (
          <ul className="mt-3 grid gap-4 lg:grid-cols-2">
            {data.flags.map((flag) => {
              const s = sawOf.get(flag.sawId)!;
              const params = new URLSearchParams({ from: query.from, to: query.to, units, metric: flag.metric });
              return (
                <FlagCard
                  key={`${flag.sawId}-${flag.metric}`}
                  flag={flag}
                  currency={data.reportingCurrency}
                  units={units}
                  sawLabel={`${s.saw.assetTag} ${s.saw.name}`}
                  siteLabel={`${s.site.code} ${s.site.name}`}
                  mark={<SiteMark slot={s.site.colourIndex} />}
                  href={`/outliers/saws/${flag.sawId}?${params.toString()}`}
                  followUp={s.activeFollowUp ? <FollowUpStateBadge state={s.activeFollowUp.state} /> : undefined}
                />
              );
            })}
          </ul>
        )}
      </section>
      {data ? (
        <Card className="p-4">
          <h2 className="text-lg font-bold text-ink">How the saws were grouped</h2>
          <ul className="mt-2 space-y-1 text-sm">
            {data.groups.map((g) => (
              <li key={g.key}>
                <span className="font-semibold">
                  {KIND_WORDS[g.kind]} mostly cutting{' '}
                  {g.mainMaterial ? MATERIAL_GROUP_LABELS[g.mainMaterial].toLowerCase() : 'material not recorded'}
                </span>
                : {g.sawIds.length} saw{g.sawIds.length === 1 ? '' : 's'}
                {g.metrics.blade_life.notice ? (
                  <span className="text-ink-muted"> — {g.metrics.blade_life.notice}</span>
                ) : null}
              </li>
            ))}
          </ul>
          <details className="mt-4">
            <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold">
              Saws not judged on every figure ({notJudgedBySaw.size})
            </summary>
            <ul className="mt-2 space-y-2 text-sm">
              {[...notJudgedBySaw.entries()].map(([sawId, reasons]) => {
                const s = sawOf.get(sawId)!;
                return (
                  <li key={sawId}>
                    <Link
                      to={`/outliers/saws/${sawId}?${carry}`}
                      className="font-semibold underline decoration-accent underline-offset-4"
                    >
                      {s.saw.assetTag} {s.saw.name}
                    </Link>{' '}
                    <span className="text-ink-muted">({s.site.code})</span>
                    <ul className="ml-4 list-disc text-ink-muted">
                      {reasons.map((r) => (
                        <li key={r}>{r}</li>
                      ))}
                    </ul>
                  </li>
                );
              })}
            </ul>
          </details>
        </Card>
      ) : null}
      <FiguresExplained />
    </div>
  );
}
