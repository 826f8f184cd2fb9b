import { useMemo } from 'react';
import { Form, Link } from 'react-router-dom';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import type { Page } from '@kerfline/domain/common/schema';
import { CHECK_SCHEDULE_LABELS, type DueCheck, type SiteCheck } from '@kerfline/domain/site-checks/schema';
import { formatDateTime } from '../../../lib/format';
import { Button, buttonClass } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { inputClass } from '../../../lib/ui/field';
import { Pager } from '../../../lib/ui/pager';
import type { OverdueFilterValues } from '../api/overdue-search';
import { DueStateBadge } from './check-status-badge';
import { recordCheckHref } from './due-checks-panel';

const columnHelper = createColumnHelper<DueCheck>();

const STATE_CHOICES = [
  { value: 'overdue', label: 'Overdue' },
  { value: 'due', label: 'Due now' },
  { value: 'pending', label: 'Due or overdue' },
];

/** The filters, kept in the URL: a plain GET form, so the page can be shared and reloaded as it is. */
function Filters({ values, checks }: { values: OverdueFilterValues; checks: SiteCheck[] }) {
  return (
    <Form method="get" className="grid gap-3 sm:grid-cols-[repeat(3,minmax(0,1fr))_auto] sm:items-end">
      <label className="text-sm font-semibold text-ink">
        Show
        <select name="state" defaultValue={values.state} className={`${inputClass} mt-1`}>
          {STATE_CHOICES.map((c) => (
            <option key={c.value} value={c.value}>
              {c.label}
            </option>
          ))}
        </select>
      </label>
      <label className="text-sm font-semibold text-ink">
        Check
        <select name="check" defaultValue={values.check} className={`${inputClass} mt-1`}>
          <option value="">Every check</option>
          {checks.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </select>
      </label>
      <label className="text-sm font-semibold text-ink">
        When due
        <select name="schedule" defaultValue={values.schedule} className={`${inputClass} mt-1`}>
          <option value="">Either</option>
          {(['blade_change', 'periodic'] as const).map((s) => (
            <option key={s} value={s}>
              {CHECK_SCHEDULE_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      <Button type="submit">Show</Button>
    </Form>
  );
}

/**
 * A site's pending checks, the longest overdue first: paged on the server, filters in the URL. Below the md
 * breakpoint each row is a card with its labels, so a phone never scrolls sideways.
 */
export function OverdueChecksTable({
  page,
  checks,
  filters,
  timeZone,
  canRecord,
}: {
  page: Page<DueCheck>;
  checks: SiteCheck[];
  filters: OverdueFilterValues;
  timeZone: string;
  canRecord: boolean;
}) {
  const columns = useMemo(
    () => [
      columnHelper.accessor('state', { header: 'State', cell: (info) => <DueStateBadge state={info.getValue()} /> }),
      columnHelper.accessor('sawAssetTag', {
        header: 'Saw',
        cell: (info) => (
          <Link
            to={`/saws/${info.row.original.sawId}`}
            className="inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent decoration-2 underline-offset-4"
          >
            {info.getValue()} · {info.row.original.sawName}
          </Link>
        ),
      }),
      columnHelper.accessor('checkName', { header: 'Check' }),
      columnHelper.accessor('overdueAt', {
        header: 'Overdue from',
        cell: (info) => (
          <span className="tabular">{info.getValue() ? formatDateTime(info.getValue()!, timeZone) : '—'}</span>
        ),
      }),
      columnHelper.accessor('lastCheckedAt', {
        header: 'Last recorded',
        cell: (info) =>
          info.getValue() ? (
            <span className="tabular">
              {formatDateTime(info.getValue()!, timeZone)} · {info.row.original.lastPassed ? 'passed' : 'failed'}
            </span>
          ) : (
            <span className="text-ink-muted">Never</span>
          ),
      }),
      ...(canRecord
        ? [
            columnHelper.display({
              id: 'record',
              header: '',
              cell: (info) => (
                <Link
                  to={recordCheckHref(info.row.original.sawId, info.row.original.siteCheckId)}
                  className={buttonClass('secondary')}
                  aria-label={`Record ${info.row.original.checkName} on ${info.row.original.sawAssetTag}`}
                >
                  Record
                </Link>
              ),
            }),
          ]
        : []),
    ],
    [timeZone, canRecord],
  );

  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: page.items,
    columns,
    manualPagination: true,
    rowCount: page.total,
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <Card aria-labelledby="overdue-heading">
      <div className="border-b border-rule px-4 py-3 sm:px-5">
        <h2 id="overdue-heading" className="text-lg font-bold text-ink">
          {STATE_CHOICES.find((c) => c.value === filters.state)?.label ?? 'Overdue'} checks
        </h2>
      </div>
      <div className="border-b border-rule px-4 py-3 sm:px-5">
        <Filters values={filters} checks={checks} />
      </div>
      {page.items.length === 0 ? (
        <p className="px-4 py-8 text-center text-ink-muted sm:px-5">
          <span aria-hidden="true" className="mr-1 text-signal-safe">
            ●
          </span>
          Nothing to show: no check matches these filters.
        </p>
      ) : (
        <table className="w-full border-collapse text-left text-sm max-md:block">
          <caption className="sr-only">Checks due and overdue</caption>
          <thead className="max-md:hidden">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-rule">
                {group.headers.map((header) => (
                  <th key={header.id} scope="col" className="px-3 py-2 font-semibold text-ink-muted first:pl-5">
                    {flexRender(header.column.columnDef.header, header.getContext())}
                  </th>
                ))}
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
      <div className="border-t border-rule px-4 py-3 sm:px-5">
        <Pager total={page.total} limit={page.limit} offset={page.offset} noun="checks" />
      </div>
    </Card>
  );
}
