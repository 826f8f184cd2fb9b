import { useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { SAW_STATUSES, type Saw } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { newSawSubject, useAppAbility } from '../../../lib/ability';
import { formatLengthValue, formatSpeedRange, lengthUnit } from '../../../lib/format';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { SawStatusBadge } from './saw-status-badge';

export const SAW_KIND_LABELS = { horizontal: 'Horizontal', vertical: 'Vertical' } as const;
/** How the head comes down into the cut, in the words the saw form and page use. */
export const HEAD_FEED_LABELS = { gravity_spring: 'Gravity or spring', hydraulic: 'Hydraulic' } as const;

/** Width × thickness × length of the band a saw takes, one unit for all three. */
export function formatBandSize(saw: Saw, system: UnitSystem): string {
  const parts = [saw.bandWidthMm, saw.bandThicknessMm, saw.bandLengthMm].map((mm) => formatLengthValue(mm, system));
  return `${parts.join(' × ')}\u00a0${lengthUnit(system)}`;
}

const columnHelper = createColumnHelper<Saw>();

type SawsTableProps = {
  saws: Saw[];
  /** Each saw's figures are shown in its own site's units. */
  unitSystemOf: (saw: Saw) => UnitSystem;
  /** Given on lists that mix sites: adds a Site column. */
  siteNameOf?: (saw: Saw) => string;
  /** Offers "Add saw" for this site, when the user's ability allows creating a saw there. */
  addForSiteId?: string;
  heading: string;
  emptyMessage: string;
  /** Filters, above the table. */
  toolbar?: ReactNode;
  /** Paging, below the table. */
  footer?: ReactNode;
};

/**
 * The saws of a site (or of the fleet) as a sortable table. Below the md breakpoint each row becomes a
 * stacked card with its labels, so a phone never scrolls sideways.
 */
export function SawsTable({
  saws,
  unitSystemOf,
  siteNameOf,
  addForSiteId,
  heading,
  emptyMessage,
  toolbar,
  footer,
}: SawsTableProps) {
  const ability = useAppAbility();
  const canAdd = addForSiteId !== undefined && ability.can('create', newSawSubject(addForSiteId));
  const [sorting, setSorting] = useState<SortingState>([]);

  const columns = useMemo(
    () => [
      columnHelper.accessor('assetTag', {
        header: 'Asset tag',
        cell: (info) => (
          <Link
            to={`/saws/${info.row.original.id}`}
            className="inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark"
          >
            {info.getValue()}
          </Link>
        ),
      }),
      columnHelper.accessor('name', { header: 'Name' }),
      ...(siteNameOf ? [columnHelper.accessor((saw) => siteNameOf(saw), { id: 'site', header: 'Site' })] : []),
      columnHelper.accessor('status', {
        header: 'Status',
        // Sort by the order of the statuses (in service, down, retired), not alphabetically.
        sortingFn: (a, b) => SAW_STATUSES.indexOf(a.original.status) - SAW_STATUSES.indexOf(b.original.status),
        cell: (info) => <SawStatusBadge status={info.getValue()} down={info.row.original.down} />,
      }),
      columnHelper.accessor('kind', { header: 'Kind', cell: (info) => SAW_KIND_LABELS[info.getValue()] }),
      columnHelper.accessor('bandWidthMm', {
        id: 'band',
        header: 'Band (W × T × L)',
        cell: (info) => (
          <span className="tabular whitespace-nowrap">
            {formatBandSize(info.row.original, unitSystemOf(info.row.original))}
          </span>
        ),
      }),
      columnHelper.accessor('bandSpeedMaxMPerMin', {
        id: 'speed',
        header: 'Band speed',
        cell: (info) => {
          const saw = info.row.original;
          return (
            <span className="tabular whitespace-nowrap">
              {formatSpeedRange(saw.bandSpeedMinMPerMin, saw.bandSpeedMaxMPerMin, unitSystemOf(saw))}
            </span>
          );
        },
      }),
      columnHelper.accessor((saw) => [saw.make, saw.model].filter(Boolean).join(' '), {
        id: 'makeModel',
        header: 'Make and model',
        cell: (info) => info.getValue() || <span className="text-ink-muted">Not recorded</span>,
      }),
    ],
    [siteNameOf, unitSystemOf],
  );

  // The table instance is rebuilt every render by design; we use no React Compiler, so nothing goes stale.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: saws,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <Card aria-labelledby="saws-heading">
      <div className="flex flex-wrap items-center justify-between gap-3 border-b border-rule px-4 py-3 sm:px-5">
        <h2 id="saws-heading" className="text-lg font-bold text-ink">
          {heading}
        </h2>
        {canAdd ? (
          <LinkButton variant="primary" to={`/saws/new?siteId=${encodeURIComponent(addForSiteId)}`}>
            Add saw
          </LinkButton>
        ) : null}
      </div>
      {toolbar ? <div className="border-b border-rule px-4 py-3 sm:px-5">{toolbar}</div> : null}
      {saws.length === 0 ? (
        <p className="px-4 py-8 text-center text-ink-muted sm:px-5">{emptyMessage}</p>
      ) : (
        <table className="w-full border-collapse text-left text-sm max-md:block">
          <caption className="sr-only">{heading}</caption>
          <thead className="max-md:hidden">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                      className="px-3 py-1 font-semibold text-ink-muted first:pl-5"
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex min-h-11 items-center gap-1 hover:text-ink"
                      >
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden="true" className="w-3 text-ink">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="max-md:block">
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                className="border-b border-rule last:border-b-0 hover:bg-paper max-md:block max-md:px-4 max-md:py-3"
              >
                {row.getVisibleCells().map((cell) => (
                  <td
                    key={cell.id}
                    data-label={typeof cell.column.columnDef.header === 'string' ? cell.column.columnDef.header : ''}
                    className="px-3 py-1.5 align-middle text-ink first:pl-5 max-md:grid max-md:grid-cols-[7.5rem_1fr] max-md:items-center max-md:justify-items-start max-md:gap-3 max-md:px-0 max-md:py-1 max-md:first:pl-0 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
                  >
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {footer ? <div className="border-t border-rule px-4 py-3 sm:px-5">{footer}</div> : null}
    </Card>
  );
}
