import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { fleetQueryFromSearch, practiceQuery } from '../../../features/fleet/api/queries';
import { Breadcrumbs } from '../../../features/fleet/components/breadcrumbs';
import { ChartPanel } from '../../../features/fleet/components/chart-panel';
import { FleetFilters, majorityUnits, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { exportPath } from '../../../features/fleet/components/overview-charts';
import { lifeText, percentText } from '../../../features/fleet/components/figure-text';
import { SiteMark } from '../../../features/fleet/components/site-mark';
import { formatNumber } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';

export function practiceLoader(queryClient: QueryClient) {
  return ({ request }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(practiceQuery(fleetQueryFromSearch(new URL(request.url).searchParams)));
    return null;
  };
}

/** Two habits per site side by side (break-in followed, checks on time) and the blade life with and without them. */
export function PracticePage() {
  const [search] = useSearchParams();
  const query = fleetQueryFromSearch(search);
  const practice = useQuery(practiceQuery(query));
  const data = practice.data;
  const units = unitsFromSearch(search, majorityUnits(data?.sites.map((s) => s.site) ?? []));
  const carry = new URLSearchParams({ from: query.from, to: query.to, units }).toString();
  const status = data ? 'success' : practice.isError ? 'error' : 'pending';

  return (
    <div className="space-y-6">
      <title>Practice compared · Kerfline</title>
      <Breadcrumbs trail={[{ label: 'Fleet', to: `/fleet?${carry}` }, { label: 'Practice compared' }]} />
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Practice compared</h1>
        <p className="mt-1 text-ink-muted">
          How often each site follows the break-in plan and does its checks on time, and what its blades lasted with and
          without, {periodLabel(query)}.
        </p>
      </div>
      <FleetFilters
        period={query}
        units={units}
        siteOptions={data?.sites.map((s) => s.site)}
        selectedSiteIds={query.sites}
      />
      <ChartPanel
        title="Break-in followed, share of blades put on"
        units="per cent of the blades whose break-in was recorded"
        status={status}
        errorMessage={practice.error?.message}
        onRetry={() => void practice.refetch()}
        spec={
          data
            ? {
                kind: 'bars',
                rows: data.sites.map((s) => ({
                  id: s.site.id,
                  label: s.site.code,
                  slot: s.site.colourIndex,
                  value: s.breakInShare === null ? null : s.breakInShare * 100,
                })),
                yLegend: '% followed',
                formatY: (v) => `${formatNumber(v)} %`,
              }
            : null
        }
        table={
          data
            ? {
                columns: [
                  'Site',
                  'Break-in followed',
                  'Blade life, followed',
                  'Blade life, skipped',
                  'Checks on time',
                  'Blade life, checks on time',
                  'Blade life, checks late',
                ],
                rows: data.sites.map((s) => ({
                  key: s.site.id,
                  cells: [
                    `${s.site.code} ${s.site.name}`,
                    `${percentText(s.breakInShare, 0)} (${formatNumber(s.breakInFollowed)} of ${formatNumber(s.breakInRecorded)})`,
                    `${lifeText(s.medianLifeFollowedMm2, units)} (${formatNumber(s.bladesFollowed)})`,
                    `${lifeText(s.medianLifeSkippedMm2, units)} (${formatNumber(s.bladesSkipped)})`,
                    s.checksDue === null
                      ? 'Not recorded'
                      : `${percentText(s.checksOnTimeShare, 0)} (${formatNumber(s.checksOnTime ?? 0)} of ${formatNumber(s.checksDue)})`,
                    lifeText(s.medianLifeChecksOnTimeMm2, units),
                    lifeText(s.medianLifeChecksLateMm2, units),
                  ],
                })),
              }
            : null
        }
        legend={(data?.sites ?? []).map((s) => ({
          key: s.site.id,
          label: `${s.site.code} ${s.site.name}`,
          mark: <SiteMark slot={s.site.colourIndex} />,
        }))}
        exportPath={exportPath('/fleet/practice/export', query, units)}
        emptyMessage="No break-in was recorded in this period."
      />
      {data ? (
        <Card className="p-4">
          <h2 className="text-lg font-bold text-ink">What it meant for blade life</h2>
          <ul className="mt-2 grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
            {data.sites.map((s) => {
              const gain =
                s.medianLifeFollowedMm2 !== null && s.medianLifeSkippedMm2 !== null && s.medianLifeSkippedMm2 > 0
                  ? s.medianLifeFollowedMm2 / s.medianLifeSkippedMm2 - 1
                  : null;
              return (
                <li key={s.site.id} className="rounded-sheet border border-rule p-3">
                  <p className="flex items-center gap-2 font-bold">
                    <SiteMark slot={s.site.colourIndex} /> {s.site.code} {s.site.name}
                  </p>
                  <p className="mt-1 text-sm">
                    Break-in followed on {percentText(s.breakInShare, 0)} of blades.{' '}
                    {gain === null
                      ? 'Too few blades of one kind or the other to compare their life.'
                      : `Blades broken in lasted ${gain >= 0 ? formatNumber(gain * 100) + ' % longer' : formatNumber(-gain * 100) + ' % less'} (median ${lifeText(s.medianLifeFollowedMm2, units)} against ${lifeText(s.medianLifeSkippedMm2, units)}).`}
                  </p>
                  <p className="mt-1 text-sm text-ink-muted">
                    {s.checksDue === null
                      ? 'Checks on time: maintenance checks are not recorded here yet.'
                      : `Checks on time: ${percentText(s.checksOnTimeShare, 0)} of ${formatNumber(s.checksDue)} due. Blades whose checks at the blade change were done on time lasted ${lifeText(s.medianLifeChecksOnTimeMm2, units)} (median), the others ${lifeText(s.medianLifeChecksLateMm2, units)}.`}
                  </p>
                </li>
              );
            })}
          </ul>
          <p className="mt-3 text-sm text-ink-muted">
            A median compares blades taken off in the period; a difference shows where to look, not a proof of cause.
          </p>
        </Card>
      ) : null}
    </div>
  );
}
