import type { CheckCounts } from '@kerfline/domain/site-checks/schema';
import { formatNumber } from '../../../lib/format';
import { CheckShape } from './check-status-badge';

/**
 * A site tile's figure for checks: how many are overdue (a triangle while any is), with those due now beside it.
 * Part of the tile's list of figures (a `dt`/`dd` pair).
 */
export function CheckCountsFigure({ counts }: { counts: CheckCounts | undefined }) {
  if (!counts) return null;
  const shape = counts.overdue > 0 ? 'triangle' : counts.due > 0 ? 'ring' : 'circle';
  const tone = shape === 'circle' ? 'text-signal-safe' : shape === 'ring' ? 'text-signal-info' : '';
  return (
    <div className="flex items-start gap-2.5">
      <span className={`mt-1.5 ${tone}`}>
        <CheckShape shape={shape} className="size-4" />
      </span>
      <div className="min-w-0">
        <dt className="text-sm text-ink-muted">Checks overdue</dt>
        <dd className="tabular text-2xl leading-tight font-extrabold text-ink">
          {counts.overdue === 0 ? 'None' : formatNumber(counts.overdue)}
        </dd>
        {counts.due > 0 ? <dd className="text-sm text-ink-muted">{formatNumber(counts.due)} more due now</dd> : null}
      </div>
    </div>
  );
}
