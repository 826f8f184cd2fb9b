import type { ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type OnChangeFn,
  type SortingState,
} from '@tanstack/react-table';
import { Card } from './card';

type RecordTableProps<T> = {
  heading: string;
  /** Heading level of the table's title: 1 when the table is the page. */
  headingLevel?: 1 | 2;
  /** One page of rows, as the server sent it. */
  rows: T[];
  // Columns of mixed value types: the table only reads them through flexRender.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  getRowId: (row: T) => string;
  /** The server's sort; only the columns the API can sort by offer it. */
  sorting: SortingState;
  onSortingChange: OnChangeFn<SortingState>;
  sortableColumns: readonly string[];
  emptyMessage: string;
  /** True while the next page or filter is loading: the rows dim and the table says it is busy. */
  busy?: boolean;
  toolbar?: ReactNode;
  actions?: ReactNode;
  footer?: ReactNode;
};

/**
 * A page of a site's records as a table whose sorting and paging the server does (the rows are never all
 * loaded): the sort and the page live in the URL, the page shows what the server answered. Below the md
 * breakpoint each row becomes a card with its labels, so a phone never scrolls sideways.
 */
export function RecordTable<T>({
  heading,
  headingLevel = 2,
  rows,
  columns,
  getRowId,
  sorting,
  onSortingChange,
  sortableColumns,
  emptyMessage,
  busy = false,
  toolbar,
  actions,
  footer,
}: RecordTableProps<T>) {
  // The table instance is rebuilt every render by design; we use no React Compiler, so nothing goes stale.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    getRowId,
    state: { sorting },
    onSortingChange,
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    // The API sorts newest first by default; a first click on a date column asks for that.
    sortDescFirst: true,
    getCoreRowModel: getCoreRowModel(),
  });
  const Heading = headingLevel === 1 ? 'h1' : 'h2';
  const headingId = `${heading.replace(/\W+/g, '-').toLowerCase()}-heading`;

  return (
    <Card aria-labelledby={headingId} aria-busy={busy}>
      <div className="flex flex-wrap items-center justify-between gap-3 border-b border-rule px-4 py-3 sm:px-5">
        <Heading
          id={headingId}
          className={
            headingLevel === 1 ? 'text-2xl font-extrabold tracking-tight text-ink' : 'text-lg font-bold text-ink'
          }
        >
          {heading}
        </Heading>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      {toolbar ? <div className="border-b border-rule px-4 py-3 sm:px-5">{toolbar}</div> : null}
      {rows.length === 0 ? (
        <p className="px-4 py-8 text-center text-ink-muted sm:px-5">{emptyMessage}</p>
      ) : (
        <table
          className={`w-full border-collapse text-left text-sm transition-opacity max-md:block ${busy ? 'opacity-60' : ''}`}
        >
          <caption className="sr-only">{heading}</caption>
          <thead className="max-md:hidden">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule">
                {group.headers.map((header) => {
                  const sortable = sortableColumns.includes(header.column.id);
                  const sorted = header.column.getIsSorted();
                  const label = flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={
                        !sortable
                          ? undefined
                          : sorted === 'asc'
                            ? 'ascending'
                            : sorted === 'desc'
                              ? 'descending'
                              : 'none'
                      }
                      className="px-3 py-1 font-semibold whitespace-nowrap text-ink-muted first:pl-5 last:pr-5"
                    >
                      {sortable ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex min-h-11 items-center gap-1 hover:text-ink"
                        >
                          {label}
                          <span aria-hidden="true" className="w-3 text-ink">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      ) : (
                        <span className="inline-flex min-h-11 items-center">{label}</span>
                      )}
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
                    className="px-3 py-2 align-middle text-ink first:pl-5 last:pr-5 max-md:grid max-md:grid-cols-[7.5rem_1fr] max-md:items-center max-md:justify-items-start max-md:gap-3 max-md:px-0 max-md:py-1 max-md:first:pl-0 max-md:last:pr-0 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
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
