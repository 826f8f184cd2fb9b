import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type OnChangeFn, type SortingState } from '@tanstack/react-table';
import { BLADE_RUN_SORTS, type BladeRun } from '@kerfline/domain/blade-runs/schema';
import { CAUSES } from '@kerfline/domain/diagnosis/likely-causes';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatArea, formatDateTime, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { RecordTable } from '../../../lib/ui/record-table';
import { StatusMark } from '../../../lib/ui/status-mark';

const columnHelper = createColumnHelper<BladeRun>();
/** The columns the API can sort by (`installedAt`, `removedAt`). */
export const BLADE_RUN_SORT_COLUMNS = [...new Set(BLADE_RUN_SORTS.map((s) => s.replace('-', '')))];

const linkClass =
  'inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark';

/** What a run's blade did, in the site's units: area, cuts, or what is missing. */
export function lifeText(run: Pick<BladeRun, 'areaCutMm2' | 'cuts' | 'removedAt'>, system: UnitSystem): string {
  const parts = [
    run.areaCutMm2 !== null ? formatArea(run.areaCutMm2, system) : null,
    run.cuts !== null ? `${formatNumber(run.cuts)} cuts` : null,
  ].filter(Boolean);
  if (parts.length > 0) return parts.join(' · ');
  return run.removedAt ? 'Not recorded' : 'Still cutting';
}

/** A site's blade runs, a page at a time, sorted and filtered on the server. */
export function BladeRunsTable({
  runs,
  system,
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
  runs: BladeRun[];
  system: UnitSystem;
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
      columnHelper.accessor('bladeSpecName', { header: 'Blade' }),
      columnHelper.accessor('installedAt', {
        header: 'Put on',
        cell: (info) => <span className="tabular whitespace-nowrap">{formatDateTime(info.getValue(), timeZone)}</span>,
      }),
      columnHelper.accessor('removedAt', {
        header: 'Taken off',
        cell: (info) =>
          info.getValue() ? (
            <span className="tabular whitespace-nowrap">{formatDateTime(info.getValue()!, timeZone)}</span>
          ) : (
            <StatusMark shape="circle">On the saw</StatusMark>
          ),
      }),
      columnHelper.accessor('removalReason', {
        header: 'Why',
        cell: (info) => {
          const run = info.row.original;
          if (!run.removalReason) return <span className="text-ink-muted">—</span>;
          return (
            <span>
              {REMOVAL_REASON_LABELS[run.removalReason]}
              {run.confirmedCause ? (
                <span className="block text-ink-muted">Cause: {CAUSES[run.confirmedCause].label.toLowerCase()}</span>
              ) : null}
            </span>
          );
        },
      }),
      columnHelper.accessor('areaCutMm2', {
        header: 'Cut',
        cell: (info) => <span className="tabular">{lifeText(info.row.original, system)}</span>,
      }),
      columnHelper.accessor('costMinor', {
        header: 'Cost',
        cell: (info) => <span className="tabular">{formatMoney(info.getValue(), info.row.original.currency)}</span>,
      }),
      columnHelper.display({
        id: 'open',
        header: 'Record',
        cell: (info) => (
          <Link to={`/blade-runs/${info.row.original.id}`} className={linkClass}>
            Open
            {info.row.original.photoCount > 0
              ? ` · ${info.row.original.photoCount} photo${info.row.original.photoCount === 1 ? '' : 's'}`
              : ''}
          </Link>
        ),
      }),
    ],
    [system, timeZone],
  );
  return (
    <RecordTable
      heading="Blade runs"
      headingLevel={headingLevel}
      rows={runs}
      columns={columns}
      getRowId={(run) => run.id}
      sorting={sorting}
      onSortingChange={onSortingChange}
      sortableColumns={BLADE_RUN_SORT_COLUMNS}
      busy={busy}
      emptyMessage={emptyMessage}
      toolbar={toolbar}
      actions={actions}
      footer={footer}
    />
  );
}
