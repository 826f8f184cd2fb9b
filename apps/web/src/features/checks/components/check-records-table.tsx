import { useMemo, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type OnChangeFn, type SortingState } from '@tanstack/react-table';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { CHECK_RECORD_SORTS, type CheckRecord } from '@kerfline/domain/site-checks/schema';
import { formatDateTime } from '../../../lib/format';
import { RecordTable } from '../../../lib/ui/record-table';
import { VerdictBadge } from './check-status-badge';
import { checkFigure } from './check-words';

const columnHelper = createColumnHelper<CheckRecord>();
export const CHECK_RECORD_SORT_COLUMNS = [...new Set(CHECK_RECORD_SORTS.map((s) => s.replace('-', '')))];

const linkClass =
  'inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark';

/** What was read, in the site's unit, or the two answers of a condition check (the chip brush). */
export function recordedReadingText(record: CheckRecord, system: UnitSystem): string {
  if (record.answers) {
    const reaches = record.answers.reachesGullets ? 'reaches the gullets' : 'does not reach the gullets';
    return `${reaches}; ${record.answers.worn ? 'worn' : 'not worn'}`;
  }
  return record.reading === null ? '—' : checkFigure(record.quantity, record.reading, system);
}

/** The target and the passing range as they were when the check was recorded, in the site's unit. */
export function recordedTargetText(record: CheckRecord, system: UnitSystem): string {
  if (record.quantity === 'condition') return 'reaches the gullets, not worn';
  const figure = (v: number) => checkFigure(record.quantity, v, system);
  const range =
    record.min !== null && record.max !== null
      ? `${figure(record.min)} to ${figure(record.max)}`
      : record.min !== null
        ? `at least ${figure(record.min)}`
        : record.max !== null
          ? `at most ${figure(record.max)}`
          : null;
  if (record.target === null) return range ?? '—';
  return range ? `${figure(record.target)} (${range} passes)` : figure(record.target);
}

/**
 * A site's recorded checks, a page at a time, sorted and filtered on the server: when, the saw, the check, the
 * reading and target in the site's units (or the answers), the verdict as a word and a shape, and who read it.
 */
export function CheckRecordsTable({
  records,
  unitSystem,
  timeZone,
  sorting,
  onSortingChange,
  busy,
  emptyMessage,
  toolbar,
  footer,
  headingLevel,
}: {
  records: CheckRecord[];
  unitSystem: UnitSystem;
  timeZone: string;
  sorting: SortingState;
  onSortingChange: OnChangeFn<SortingState>;
  busy: boolean;
  emptyMessage: string;
  toolbar?: ReactNode;
  footer?: ReactNode;
  headingLevel?: 1 | 2;
}) {
  const columns = useMemo(
    () => [
      columnHelper.accessor('checkedAt', {
        header: 'When',
        cell: (info) => <span className="tabular whitespace-nowrap">{formatDateTime(info.getValue(), timeZone)}</span>,
      }),
      columnHelper.accessor('sawAssetTag', {
        header: 'Saw',
        cell: (info) => (
          <Link to={`/saws/${info.row.original.sawId}`} className={linkClass}>
            {info.getValue()}
          </Link>
        ),
      }),
      columnHelper.accessor('checkName', { header: 'Check' }),
      columnHelper.display({
        id: 'reading',
        header: 'Reading',
        cell: (info) => <span className="tabular">{recordedReadingText(info.row.original, unitSystem)}</span>,
      }),
      columnHelper.display({
        id: 'target',
        header: 'Target',
        cell: (info) => <span className="tabular">{recordedTargetText(info.row.original, unitSystem)}</span>,
      }),
      columnHelper.accessor('passed', {
        header: 'Verdict',
        cell: (info) => <VerdictBadge passed={info.getValue()} />,
      }),
      columnHelper.accessor('checkedByName', {
        header: 'Who',
        cell: (info) => info.getValue() ?? 'someone no longer listed',
      }),
    ],
    [timeZone, unitSystem],
  );
  return (
    <RecordTable
      heading="Checks recorded"
      headingLevel={headingLevel}
      rows={records}
      columns={columns}
      getRowId={(record) => record.id}
      sorting={sorting}
      onSortingChange={onSortingChange}
      sortableColumns={CHECK_RECORD_SORT_COLUMNS}
      busy={busy}
      emptyMessage={emptyMessage}
      toolbar={toolbar}
      footer={footer}
    />
  );
}
