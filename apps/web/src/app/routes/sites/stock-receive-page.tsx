import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { bladeSpecListQuery, parseBladeSpecListQuery } from '../../../features/blade-specs/api/queries';
import { useReceiveStock } from '../../../features/blade-stock/api/mutations';
import { ReceiveForm } from '../../../features/blade-stock/components/receive-form';
import { formatMoney } from '../../../lib/money';
import { LinkButton } from '../../../lib/ui/button';

const specsFor = (siteId: string) => bladeSpecListQuery(parseBladeSpecListQuery({ siteId }));

export function stockReceivePageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(specsFor(siteId)),
    ]);
    return null;
  };
}

/** Receiving blades into a site's stock: `/sites/:siteId/stock/receive` (site admins and administrators). */
export function StockReceivePage() {
  const siteId = useParams().siteId ?? '';
  const navigate = useNavigate();
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: specs } = useSuspenseQuery(specsFor(siteId));
  const receive = useReceiveStock();
  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <title>{`Receive blades · ${site.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link
          to={`/sites/${site.id}/stock`}
          className="inline-flex min-h-11 items-center underline-offset-4 hover:underline"
        >
          {site.name}: blade stock
        </Link>
      </nav>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">Receive blades</h1>
      <p className="text-ink-muted">Costs in {site.currency}, the site’s currency.</p>
      <ReceiveForm
        siteId={site.id}
        currency={site.currency}
        timeZone={site.timeZone}
        specs={specs.items.filter((spec) => !spec.archived)}
        onSubmit={async (input) => {
          const receipt = await receive.mutateAsync(input);
          await navigate(`/sites/${site.id}/stock`, {
            state: {
              notice: {
                tone: 'info',
                title: `${receipt.quantity} × ${receipt.bladeSpecName} received at ${formatMoney(receipt.unitCostMinor, receipt.currency)} each.`,
              },
            },
          });
        }}
        cancel={<LinkButton to={`/sites/${site.id}/stock`}>Cancel</LinkButton>}
      />
    </div>
  );
}
