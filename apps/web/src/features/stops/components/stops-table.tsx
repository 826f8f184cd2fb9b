import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type OnChangeFn, type SortingState } from '@tanstack/react-table';
import { STOP_CATEGORY_LABELS, STOP_SORTS, type Stop } from '@kerfline/domain/stops/schema';
import { formatDateTime } from '../../../lib/format';
import { RecordTable } from '../../../lib/ui/record-table';
import { StatusMark } from '../../../lib/ui/status-mark';

const columnHelper = createColumnHelper<Stop>();
export const STOP_SORT_COLUMNS = [...new Set(STOP_SORTS.map((s) => s.replace('-', '')))];

const linkClass =
  'inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark';

/** A length of time as the shop says it: `45 min`, `3 h 20 min`, `2 d 4 h`. */
export function durationText(minutes: number): string {
  const m = Math.round(minutes);
  if (m < 60) return `${m} min`;
  const h = Math.floor(m / 60);
  if (h < 24) return m % 60 === 0 ? `${h} h` : `${h} h ${m % 60} min`;
  const d = Math.floor(h / 24);
  return h % 24 === 0 ? `${d} d` : `${d} d ${h % 24} h`;
}

/** A site's stops, a page at a time, sorted and filtered on the server. */
export function StopsTable({
  stops,
  timeZone,
  sorting,
  onSortingChange,
  busy,
  emptyMessage,
  toolbar,
  actions,
  footer,
  headingLevel,
}: {
  stops: Stop[];
  timeZone: string;
  sorting: SortingState;
  onSortingChange: OnChangeFn<SortingState>;
  busy: boolean;
  emptyMessage: string;
  toolbar?: React.ReactNode;
  /** Beside the heading: the table's export, for those who may export the site. */
  actions?: React.ReactNode;
  footer?: React.ReactNode;
  headingLevel?: 1 | 2;
}) {
  const columns = useMemo(
    () => [
      columnHelper.accessor('sawAssetTag', {
        header: 'Saw',
        cell: (info) => (
          <Link to={`/saws/${info.row.original.sawId}`} className={linkClass}>
            {info.getValue()}
          </Link>
        ),
      }),
      columnHelper.accessor('category', {
        header: 'Why',
        cell: (info) => (
          <span>
            {STOP_CATEGORY_LABELS[info.getValue()]}
            <span className="block text-ink-muted">{info.row.original.planned ? 'Planned' : 'Unplanned'}</span>
          </span>
        ),
      }),
      columnHelper.accessor('startedAt', {
        header: 'Stopped',
        cell: (info) => <span className="tabular whitespace-nowrap">{formatDateTime(info.getValue(), timeZone)}</span>,
      }),
      columnHelper.accessor('endedAt', {
        header: 'Running again',
        cell: (info) =>
          info.getValue() ? (
            <span className="tabular whitespace-nowrap">{formatDateTime(info.getValue()!, timeZone)}</span>
          ) : (
            <StatusMark shape="block">Still down</StatusMark>
          ),
      }),
      columnHelper.accessor('durationMin', {
        header: 'Down for',
        cell: (info) => <span className="tabular">{durationText(info.getValue())}</span>,
      }),
      columnHelper.accessor('notes', {
        header: 'Notes',
        cell: (info) => <span className="line-clamp-2 max-w-xs">{info.getValue() ?? ''}</span>,
      }),
      columnHelper.display({
        id: 'open',
        header: 'Record',
        cell: (info) => (
          <Link to={`/stops/${info.row.original.id}`} className={linkClass}>
            Open
          </Link>
        ),
      }),
    ],
    [timeZone],
  );
  return (
    <RecordTable
      heading="Stops"
      headingLevel={headingLevel}
      rows={stops}
      columns={columns}
      getRowId={(stop) => stop.id}
      sorting={sorting}
      onSortingChange={onSortingChange}
      sortableColumns={STOP_SORT_COLUMNS}
      busy={busy}
      emptyMessage={emptyMessage}
      toolbar={toolbar}
      actions={actions}
      footer={footer}
    />
  );
}
