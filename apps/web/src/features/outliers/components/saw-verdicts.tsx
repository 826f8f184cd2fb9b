import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { PEER_METRICS, PEER_METRIC_INFO, peerValueText } from '@kerfline/domain/outliers/peer-review';
import type { SawOutlier } from '@kerfline/domain/outliers/review-schema';
import { formatNumber } from '../../../lib/format';

/** Each of the four figures: this saw, its peers' median, and the verdict in words and a shape. */
export function SawVerdicts({ data, units }: { data: SawOutlier; units: UnitSystem }) {
  return (
    <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-4">
      {PEER_METRICS.map((metric) => {
        const value = data.saw.values[metric];
        const flag = data.flags.find((f) => f.metric === metric);
        const notJudged = data.notJudged.find((n) => n.metric === metric);
        const median = data.group.metrics[metric].median;
        return (
          <li
            key={metric}
            className={`rounded-sheet border bg-card p-3 ${flag ? 'border-l-4 border-rule border-l-signal-caution-bg' : 'border-rule'}`}
          >
            <p className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
              {PEER_METRIC_INFO[metric].label}
            </p>
            <p className="tabular text-xl font-bold text-ink">
              {value === null ? '—' : peerValueText(metric, value, data.reportingCurrency, units)}
            </p>
            <p className="text-sm text-ink-muted">
              Peers’ median {median === null ? '—' : peerValueText(metric, median, data.reportingCurrency, units)}
            </p>
            <p className="mt-2 text-sm font-semibold">
              {flag ? (
                <span className="text-signal-stop">
                  <span aria-hidden="true">▲ </span>Flagged: unusually {flag.direction} (modified z-score{' '}
                  {formatNumber(flag.modifiedZ, 1)})
                </span>
              ) : notJudged ? (
                <span className="text-ink-muted">
                  <span aria-hidden="true">○ </span>Not judged: {notJudged.reason}
                </span>
              ) : (
                <span className="text-signal-safe">
                  <span aria-hidden="true">● </span>In line with its peers
                </span>
              )}
            </p>
          </li>
        );
      })}
    </ul>
  );
}
