import { useState } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { Figures, FleetSaw } from '@kerfline/domain/fleet/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { formatNumber } from '../../../lib/format';
import { costPerAreaText, hoursText, lifeText, percentText, spendText } from './figure-text';

type Row = { saw: FleetSaw; figures: Figures };
const col = createColumnHelper<Row>();

/** A site's saws over the period, sortable by any figure; each saw opens its own figures. */
export function SawFiguresTable({
  rows,
  units,
  hrefFor,
}: {
  rows: Row[];
  units: UnitSystem;
  hrefFor: (sawId: string) => string;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = [
    col.accessor((r) => r.saw.assetTag, {
      id: 'saw',
      header: 'Saw',
      cell: (info) => (
        <Link
          to={hrefFor(info.row.original.saw.id)}
          className="inline-flex min-h-11 flex-col justify-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark"
        >
          {info.getValue()}
          <span className="text-xs font-normal text-ink-muted no-underline">
            {info.row.original.saw.name}
            {info.row.original.saw.retiredAt ? ' · retired' : ''}
          </span>
        </Link>
      ),
    }),
    col.accessor((r) => (r.saw.mainMaterial ? MATERIAL_GROUP_LABELS[r.saw.mainMaterial] : ''), {
      id: 'material',
      header: 'Mostly cuts',
      cell: (info) => info.getValue() || <span className="text-ink-muted">Not recorded</span>,
    }),
    col.accessor((r) => r.figures.bladesUsed, {
      id: 'blades',
      header: 'Blades put on',
      cell: (i) => formatNumber(i.getValue()),
    }),
    col.accessor((r) => r.figures.spend.amountMinor, {
      id: 'spend',
      header: 'Blade spend',
      cell: (i) => spendText(i.row.original.figures.spend),
    }),
    col.accessor((r) => r.figures.costPerAreaMinorPerMm2 ?? -1, {
      id: 'cost',
      header: 'Cost per area',
      cell: (i) =>
        costPerAreaText(
          i.row.original.figures.costPerAreaMinorPerMm2,
          i.row.original.figures.spend.currency,
          units,
          i.row.original.figures.costPerAreaComplete,
        ),
    }),
    col.accessor((r) => r.figures.medianLifeMm2 ?? -1, {
      id: 'life',
      header: 'Blade life (median)',
      cell: (i) => lifeText(i.row.original.figures.medianLifeMm2, units),
    }),
    col.accessor((r) => r.figures.downtimeHours, {
      id: 'stops',
      header: 'Stop hours',
      cell: (i) => hoursText(i.getValue()),
    }),
    col.accessor((r) => r.figures.failures, {
      id: 'failures',
      header: 'Failures',
      cell: (i) => formatNumber(i.getValue()),
    }),
    col.accessor((r) => r.figures.operationalAvailability ?? -1, {
      id: 'availability',
      header: 'Operational availability',
      cell: (i) => percentText(i.row.original.figures.operationalAvailability),
    }),
  ];
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  if (rows.length === 0) return <p className="text-ink-muted">No saws were in service at this site in the period.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="border-b border-rule text-left">
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                    className="px-2 py-1 font-semibold"
                  >
                    <button
                      type="button"
                      onClick={header.column.getToggleSortingHandler()}
                      className="inline-flex min-h-11 items-center gap-1 text-left"
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <span aria-hidden="true" className="text-ink-muted">
                        {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                      </span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule last:border-0">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="tabular px-2 py-1 whitespace-nowrap">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
