import { Link } from 'react-router-dom';
import { IMPORT_KIND_LABELS } from '@kerfline/domain/imports/fields';
import type { ImportBatch } from '@kerfline/domain/imports/schema';
import { formatDateTime, formatNumber } from '../../../lib/format';
import { StateBadge } from './verdict-badge';

/** A site's imports, newest first: the file, the kind, where it stands and what it brought in. */
export function ImportsTable({ batches, timeZone }: { batches: ImportBatch[]; timeZone: string }) {
  if (batches.length === 0) return <p className="text-ink-muted">No files have been brought into this site yet.</p>;
  return (
    <div className="overflow-x-auto rounded-sheet border border-rule bg-card">
      <table className="w-full text-left text-sm">
        <thead className="border-b border-rule bg-paper-deep text-ink-muted">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">
              File
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              State
            </th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Added
            </th>
            <th scope="col" className="hidden px-3 py-2 text-right font-semibold sm:table-cell">
              Already there
            </th>
            <th scope="col" className="hidden px-3 py-2 text-right font-semibold sm:table-cell">
              Not brought in
            </th>
            <th scope="col" className="hidden px-3 py-2 font-semibold md:table-cell">
              When, by whom
            </th>
          </tr>
        </thead>
        <tbody>
          {batches.map((b) => (
            <tr key={b.id} className="border-b border-rule last:border-0">
              <th scope="row" className="px-3 py-2 font-semibold">
                <Link
                  to={`/imports/${b.id}`}
                  className="inline-flex min-h-11 flex-col justify-center text-accent-dark underline underline-offset-4"
                >
                  <span className="break-all">{b.fileName}</span>
                  <span className="font-normal text-ink-muted no-underline">{IMPORT_KIND_LABELS[b.kind].title}</span>
                </Link>
              </th>
              <td className="px-3 py-2">
                <StateBadge state={b.state} />
              </td>
              <td className="tabular px-3 py-2 text-right">{formatNumber(b.rowsAdded)}</td>
              <td className="tabular hidden px-3 py-2 text-right sm:table-cell">{formatNumber(b.rowsPresent)}</td>
              <td className="tabular hidden px-3 py-2 text-right sm:table-cell">{formatNumber(b.rowsRejected)}</td>
              <td className="hidden px-3 py-2 text-ink-muted md:table-cell">
                {formatDateTime(b.createdAt, timeZone)} · {b.createdByName ?? '—'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
