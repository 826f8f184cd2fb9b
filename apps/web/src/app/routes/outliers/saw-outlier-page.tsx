import { useState } from 'react';
import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { subject } from '@casl/ability';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { PEER_METRICS, PEER_METRIC_INFO, peerValueText, type PeerMetric } from '@kerfline/domain/outliers/peer-review';
import type { FollowUp } from '@kerfline/domain/follow-ups/schema';
import { fleetQueryFromSearch } from '../../../features/fleet/api/queries';
import { Breadcrumbs } from '../../../features/fleet/components/breadcrumbs';
import { FleetFilters, unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { SiteMark } from '../../../features/fleet/components/site-mark';
import { sawOutlierQuery } from '../../../features/outliers/api/queries';
import { SawVerdicts } from '../../../features/outliers/components/saw-verdicts';
import { LikelyCauses, ReasonMix } from '../../../features/outliers/components/reason-mix';
import { FollowUpForm } from '../../../features/follow-ups/components/follow-up-form';
import { FollowUpsPanel } from '../../../features/follow-ups/components/follow-ups-panel';
import { useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';

const queryOf = (search: URLSearchParams) => {
  const q = fleetQueryFromSearch(search, 6);
  return { from: q.from, to: q.to };
};

export function sawOutlierLoader(queryClient: QueryClient) {
  return ({ params, request }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(sawOutlierQuery(params.sawId!, queryOf(new URL(request.url).searchParams)));
    return null;
  };
}

/** One saw against its peers: the verdicts, why its blades came off, the likely causes, and a follow-up. */
export function SawOutlierPage() {
  const { sawId } = useParams();
  const [search] = useSearchParams();
  const q = queryOf(search);
  const result = useQuery(sawOutlierQuery(sawId!, q));
  const ability = useAppAbility();
  const [opened, setOpened] = useState<FollowUp | null>(null);
  const data = result.data;
  const units = unitsFromSearch(search, data?.saw.site.unitSystem ?? 'metric');
  const carry = new URLSearchParams({ from: q.from, to: q.to, units }).toString();
  const asked = search.get('metric');
  const metric: PeerMetric | null = (PEER_METRICS as readonly string[]).includes(asked ?? '')
    ? (asked as PeerMetric)
    : (data?.flags[0]?.metric ?? null);
  const trail = [
    { label: 'Outliers', to: `/outliers?${carry}` },
    { label: data ? `${data.saw.saw.assetTag} ${data.saw.saw.name}` : 'Saw' },
  ];
  if (result.isError && !data)
    return (
      <div className="space-y-4">
        <Breadcrumbs trail={trail} />
        <Notice title="This saw could not be compared">{result.error.message}</Notice>
      </div>
    );
  if (!data)
    return (
      <p role="status" className="text-ink-muted">
        Comparing the saw with its peers…
      </p>
    );
  const saw = data.saw.saw;
  const canOpen = ability.can('create', subject('FollowUp', { id: '', siteId: saw.siteId }));
  const flag = metric ? data.flags.find((f) => f.metric === metric) : undefined;
  const defaultTitle = flag
    ? `${PEER_METRIC_INFO[flag.metric].label} unusually ${flag.direction} on ${saw.assetTag}: find the cause${
        data.likelyCauses?.causes[0] ? ` (check first: ${data.likelyCauses.causes[0].label.toLowerCase()})` : ''
      }`
    : `Look at ${saw.assetTag}`;

  return (
    <div className="space-y-6">
      <title>{`${saw.assetTag} against its peers · Kerfline`}</title>
      <Breadcrumbs trail={trail} />
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="flex items-center gap-2 text-ink-muted">
            <SiteMark slot={data.saw.site.colourIndex} />
            {data.saw.site.code} {data.saw.site.name}
          </p>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">
            {saw.assetTag} {saw.name}
          </h1>
          <p className="mt-1 text-ink-muted">
            Against {data.peers.length} peer{data.peers.length === 1 ? '' : 's'}: {saw.kind} saws mostly cutting{' '}
            {saw.mainMaterial ? MATERIAL_GROUP_LABELS[saw.mainMaterial].toLowerCase() : 'material not recorded'},{' '}
            {periodLabel(q)}.
          </p>
        </div>
        <Link
          to={`/fleet/saws/${saw.id}?${carry}`}
          className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
        >
          Its figures and blade runs
        </Link>
      </div>
      <FleetFilters period={q} units={units} />
      <SawVerdicts data={data} units={units} />
      {flag ? (
        <Notice tone="info" title="How this flag was reached">
          {flag.method}
        </Notice>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="p-4">
          <h2 className="text-lg font-bold text-ink">Why its blades came off</h2>
          <div className="mt-2">
            <ReasonMix data={data} />
          </div>
        </Card>
        <Card className="p-4">
          <h2 className="text-lg font-bold text-ink">Likely causes</h2>
          <div className="mt-2">
            <LikelyCauses data={data} />
          </div>
        </Card>
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        {canOpen ? (
          <Card className="p-4">
            <h2 className="text-lg font-bold text-ink">Open a follow-up</h2>
            <p className="mt-1 text-sm text-ink-muted">
              The person you choose sees it on the saw’s page and on their start screen.
            </p>
            {opened ? (
              <div className="mt-3">
                <Notice tone="info" title="Follow-up opened">
                  <Link to={`/follow-ups/${opened.id}`} className="font-semibold underline">
                    {opened.title}
                  </Link>{' '}
                  — for {opened.assignee?.name}, due {opened.dueOn}.
                </Notice>
              </div>
            ) : null}
            <div className="mt-3">
              <FollowUpForm
                key={defaultTitle}
                sawId={saw.id}
                siteId={saw.siteId}
                defaultTitle={defaultTitle}
                fromFlag={metric ? { metric, from: q.from, to: q.to } : null}
                onCreated={setOpened}
              />
            </div>
          </Card>
        ) : null}
        <FollowUpsPanel sawId={saw.id} heading="Follow-ups on this saw" />
      </div>
      <Card className="p-4">
        <h2 className="text-lg font-bold text-ink">Its peers</h2>
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-sm">
            <thead>
              <tr className="border-b border-rule text-left">
                <th scope="col" className="py-2 font-semibold">
                  Saw
                </th>
                {PEER_METRICS.map((m) => (
                  <th key={m} scope="col" className="py-2 font-semibold">
                    {PEER_METRIC_INFO[m].label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {[data.saw, ...data.peers].map((p) => (
                <tr
                  key={p.saw.id}
                  className={`border-b border-rule last:border-0 ${p.saw.id === saw.id ? 'bg-accent-soft' : ''}`}
                >
                  <th scope="row" className="py-2 text-left font-semibold">
                    <Link
                      to={`/outliers/saws/${p.saw.id}?${carry}`}
                      className="inline-flex min-h-11 items-center gap-2 underline decoration-accent underline-offset-4"
                    >
                      <SiteMark slot={p.site.colourIndex} />
                      {p.saw.assetTag}
                    </Link>
                    {p.saw.id === saw.id ? <span className="ml-1 text-xs text-ink-muted">(this saw)</span> : null}
                  </th>
                  {PEER_METRICS.map((m) => (
                    <td key={m} className="tabular py-2 pr-3 whitespace-nowrap">
                      {p.values[m] === null ? '—' : peerValueText(m, p.values[m]!, data.reportingCurrency, units)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Card>
    </div>
  );
}
