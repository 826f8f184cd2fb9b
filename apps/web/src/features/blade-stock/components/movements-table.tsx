import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { StockMovement } from '@kerfline/domain/blade-stock/schema';
import { formatDate, formatDateTime, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { RecordTable } from '../../../lib/ui/record-table';

const columnHelper = createColumnHelper<StockMovement>();
const linkClass =
  'inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark';

/**
 * Blades in and out of a site's stock, newest first, a page at a time: receipts (+n) and blades drawn for saws
 * (−1). The API pages them in SQL and keeps one order (newest first), so the table offers no other sort.
 */
export function MovementsTable({
  movements,
  timeZone,
  busy,
  emptyMessage,
  toolbar,
  actions,
  footer,
}: {
  movements: StockMovement[];
  timeZone: string;
  busy: boolean;
  emptyMessage: string;
  toolbar?: React.ReactNode;
  /** Beside the heading: the table's export, for those who may export the site. */
  actions?: React.ReactNode;
  footer?: React.ReactNode;
}) {
  const columns = useMemo(
    () => [
      columnHelper.accessor('at', {
        header: 'When',
        cell: (info) => (
          <span className="tabular whitespace-nowrap">
            {info.row.original.kind === 'receipt'
              ? formatDate(info.getValue(), 'UTC')
              : formatDateTime(info.getValue(), timeZone)}
          </span>
        ),
      }),
      columnHelper.accessor('quantity', {
        header: 'Blades',
        cell: (info) => (
          <span className={`tabular font-bold ${info.getValue() > 0 ? 'text-signal-safe' : 'text-ink'}`}>
            {info.getValue() > 0 ? `+${formatNumber(info.getValue())}` : `−${formatNumber(-info.getValue())}`}
          </span>
        ),
      }),
      columnHelper.accessor('bladeSpecName', { header: 'Blade spec' }),
      columnHelper.accessor('kind', {
        header: 'What',
        cell: (info) => {
          const m = info.row.original;
          if (m.kind === 'receipt') return <span>Received{m.reference ? ` · ${m.reference}` : ''}</span>;
          return (
            <span>
              Put on{' '}
              {m.sawId ? (
                <Link to={`/saws/${m.sawId}`} className={linkClass}>
                  {m.sawAssetTag}
                </Link>
              ) : (
                'a saw'
              )}
              {m.bladeRunId ? (
                <>
                  {' '}
                  ·{' '}
                  <Link to={`/blade-runs/${m.bladeRunId}`} className={linkClass}>
                    the run
                  </Link>
                </>
              ) : null}
            </span>
          );
        },
      }),
      columnHelper.accessor('unitCostMinor', {
        header: 'Cost of one',
        cell: (info) => <span className="tabular">{formatMoney(info.getValue(), info.row.original.currency)}</span>,
      }),
    ],
    [timeZone],
  );
  return (
    <RecordTable
      heading="Stock movements"
      headingLevel={1}
      rows={movements}
      columns={columns}
      getRowId={(m) => `${m.kind}-${m.stockReceiptId}-${m.bladeRunId ?? ''}`}
      sorting={[{ id: 'at', desc: true }]}
      onSortingChange={() => undefined}
      sortableColumns={[]}
      busy={busy}
      emptyMessage={emptyMessage}
      toolbar={toolbar}
      actions={actions}
      footer={footer}
    />
  );
}
