import { useLocation, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteStockQuery } from '../../../features/blade-stock/api/queries';
import { StockLines } from '../../../features/blade-stock/components/stock-lines';
import { useAppAbility } from '../../../lib/ability';
import { formatDateTime } from '../../../lib/format';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { returnNoticeOf } from '../records/refresh';
import { SiteRecordsNav } from './site-records-nav';

export function siteStockPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteStockQuery(siteId)),
    ]);
    return null;
  };
}

/** A site's blade stock: `/sites/:siteId/stock` — per spec on hand, days left and reorder point. */
export function SiteStockPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: stock } = useSuspenseQuery(siteStockQuery(siteId));
  const ability = useAppAbility();
  const notice = returnNoticeOf(useLocation().state);
  const canReceive = ability.can('create', subject('StockReceipt', { id: '', siteId }));
  const canSetLevels = ability.can('update', subject('StockLevel', { id: '', siteId }));
  const toReorder = stock.items.filter((line) => line.reorderNow).length;
  return (
    <div className="space-y-5">
      <title>{`Blade stock · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Blade stock</h1>
          <p className="mt-1 text-ink-muted">
            {stock.items.length === 0
              ? 'Nothing received yet.'
              : toReorder === 0
                ? 'No spec is at its reorder point.'
                : `${toReorder} spec${toReorder === 1 ? ' is' : 's are'} at or below the reorder point.`}{' '}
            As of {formatDateTime(stock.asOf, site.timeZone)}.
          </p>
        </div>
        <div className="grid w-full gap-2 sm:flex sm:w-auto">
          {canReceive ? (
            <LinkButton to={`/sites/${site.id}/stock/receive`} variant="primary" className="min-h-12 text-base">
              Receive blades
            </LinkButton>
          ) : null}
          <LinkButton to={`/sites/${site.id}/stock/movements`}>Movements</LinkButton>
          <LinkButton to="/blade-specs">Blade specs</LinkButton>
        </div>
      </header>
      {notice ? <Notice tone={notice.tone} title={notice.title} /> : null}
      <StockLines stock={stock} timeZone={site.timeZone} canSetLevels={canSetLevels} />
    </div>
  );
}
