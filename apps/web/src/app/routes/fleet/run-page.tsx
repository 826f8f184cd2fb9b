import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { fleetRunQuery, periodQueryFromSearch } from '../../../features/fleet/api/queries';
import { Breadcrumbs } from '../../../features/fleet/components/breadcrumbs';
import { unitsFromSearch } from '../../../features/fleet/components/fleet-filters';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { formatDateTime, formatLargeArea, formatMoneyPerArea, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';

export function runPageLoader(queryClient: QueryClient) {
  return ({ params }: LoaderFunctionArgs) => {
    void queryClient.prefetchQuery(fleetRunQuery(params.runId!));
    return null;
  };
}

/** One blade's life on its saw: the last step of fleet → site → saw → blade run. */
export function RunPage() {
  const { runId } = useParams();
  const [search] = useSearchParams();
  const q = periodQueryFromSearch(search);
  const run = useQuery(fleetRunQuery(runId!));
  const saw = useQuery({ ...sawDetailQuery(run.data?.sawId ?? ''), enabled: Boolean(run.data) });
  const site = useQuery({ ...siteDetailQuery(run.data?.siteId ?? ''), enabled: Boolean(run.data) });
  const units = unitsFromSearch(search, site.data?.unitSystem ?? 'metric');
  const carry = new URLSearchParams({ from: q.from, to: q.to, units }).toString();
  const r = run.data;
  const tz = site.data?.timeZone ?? 'UTC';
  const trail = [
    { label: 'Fleet', to: `/fleet?${carry}` },
    site.data
      ? { label: `${site.data.code} ${site.data.name}`, to: `/fleet/sites/${site.data.id}?${carry}` }
      : { label: 'Site' },
    saw.data
      ? { label: `${saw.data.assetTag} ${saw.data.name}`, to: `/fleet/saws/${saw.data.id}?${carry}` }
      : { label: 'Saw' },
    { label: r ? r.bladeSpecName : 'Blade run' },
  ];
  if (run.isError)
    return (
      <div className="space-y-4">
        <Breadcrumbs trail={trail} />
        <Notice title="This blade run could not be loaded">{run.error.message}</Notice>
      </div>
    );
  if (!r)
    return (
      <p role="status" className="text-ink-muted">
        Loading the blade run…
      </p>
    );
  const rows: [string, string][] = [
    ['Blade spec', r.bladeSpecName],
    ['Put on', formatDateTime(r.installedAt, tz, true)],
    ['Taken off', r.removedAt ? formatDateTime(r.removedAt, tz, true) : 'Still on the saw'],
    ['Why it came off', r.removalReason ? REMOVAL_REASON_LABELS[r.removalReason] : '—'],
    ['Area cut', r.areaCutMm2 === null ? 'Not recorded' : formatLargeArea(r.areaCutMm2, units)],
    ['Cuts', r.cuts === null ? 'Not recorded' : formatNumber(r.cuts)],
    ['Cost (fixed when put on)', formatMoney(r.costMinor, r.currency)],
    ['Cost per area cut', r.areaCutMm2 ? formatMoneyPerArea(r.costMinor / r.areaCutMm2, r.currency, units) : '—'],
    ['Break-in', r.breakInFollowed === null ? 'Not recorded' : r.breakInFollowed ? 'Followed' : 'Skipped'],
    ['Material', r.materialGroup ? MATERIAL_GROUP_LABELS[r.materialGroup] : 'Not recorded'],
  ];
  return (
    <div className="space-y-6">
      <title>{`${r.bladeSpecName} · Kerfline`}</title>
      <Breadcrumbs trail={trail} />
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{r.bladeSpecName}</h1>
      <Card className="p-4">
        <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-2">
          {rows.map(([label, value]) => (
            <div key={label}>
              <dt className="text-sm font-semibold text-ink-muted">{label}</dt>
              <dd className="tabular text-lg text-ink">{value}</dd>
            </div>
          ))}
        </dl>
      </Card>
      {saw.data ? (
        <Link
          to={`/saws/${saw.data.id}`}
          className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
        >
          Open {saw.data.assetTag}’s own page for its records
        </Link>
      ) : null}
    </div>
  );
}
