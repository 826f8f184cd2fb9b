import { Link } from 'react-router-dom';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { FleetRun } from '@kerfline/domain/fleet/schema';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { formatDate, formatLargeArea, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';

/** A saw's blade runs in the period, newest first; each opens the run. Stacks into cards on a phone. */
export function RunsTable({
  runs,
  units,
  timeZone,
  hrefFor,
}: {
  runs: FleetRun[];
  units: UnitSystem;
  timeZone: string;
  hrefFor: (runId: string) => string;
}) {
  if (runs.length === 0) return <p className="text-ink-muted">No blade was on this saw in the period.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            {['Blade', 'Put on', 'Taken off', 'Why', 'Area cut', 'Cuts', 'Cost', 'Break-in'].map((h) => (
              <th key={h} scope="col" className="px-2 py-2 font-semibold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => (
            <tr key={r.id} className="border-b border-rule last:border-0">
              <td className="px-2 py-1">
                <Link
                  to={hrefFor(r.id)}
                  className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4 hover:text-accent-dark"
                >
                  {r.bladeSpecName}
                </Link>
              </td>
              <td className="tabular px-2 py-1 whitespace-nowrap">{formatDate(r.installedAt, timeZone)}</td>
              <td className="tabular px-2 py-1 whitespace-nowrap">
                {r.removedAt ? formatDate(r.removedAt, timeZone) : 'Still on'}
              </td>
              <td className="px-2 py-1">{r.removalReason ? REMOVAL_REASON_LABELS[r.removalReason] : '—'}</td>
              <td className="tabular px-2 py-1 whitespace-nowrap">
                {r.areaCutMm2 === null ? 'Not recorded' : formatLargeArea(r.areaCutMm2, units)}
              </td>
              <td className="tabular px-2 py-1">{r.cuts === null ? '—' : formatNumber(r.cuts)}</td>
              <td className="tabular px-2 py-1 whitespace-nowrap">{formatMoney(r.costMinor, r.currency)}</td>
              <td className="px-2 py-1">
                {r.breakInFollowed === null ? 'Not recorded' : r.breakInFollowed ? 'Followed' : 'Skipped'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
