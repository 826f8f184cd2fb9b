import { Link } from 'react-router-dom';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { PEER_METRIC_INFO, peerValueText } from '@kerfline/domain/outliers/peer-review';
import type { OutlierReview } from '@kerfline/domain/outliers/review-schema';
import { formatNumber } from '../../../lib/format';

type Flag = OutlierReview['flags'][number];

/** One flag that explains itself: the saw's value, its peers' median, how far out and by which method. */
export function FlagCard({
  flag,
  currency,
  units,
  sawLabel,
  siteLabel,
  mark,
  href,
  followUp,
}: {
  flag: Flag;
  currency: string;
  units: UnitSystem;
  sawLabel: string;
  siteLabel: string;
  mark: React.ReactNode;
  href: string;
  followUp?: React.ReactNode;
}) {
  const info = PEER_METRIC_INFO[flag.metric];
  return (
    <li className="rounded-sheet border border-rule border-l-4 border-l-signal-caution-bg bg-card p-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="flex items-center gap-2 text-sm text-ink-muted">
            {mark}
            {siteLabel}
          </p>
          <h3 className="text-lg font-bold text-ink">
            <span aria-hidden="true" className="text-signal-caution">
              ▲{' '}
            </span>
            {sawLabel}: {info.label.toLowerCase()} unusually {flag.direction}
          </h3>
        </div>
        {followUp}
      </div>
      {/* Four abreast on a card as wide as the page; two where cards stand two abreast, so "17.5 h per 1,000 h" keeps to a line. */}
      <dl className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-2">
        <div>
          <dt className="text-xs font-semibold text-ink-muted uppercase">This saw</dt>
          <dd className="tabular font-bold">{peerValueText(flag.metric, flag.value, currency, units)}</dd>
        </div>
        <div>
          <dt className="text-xs font-semibold text-ink-muted uppercase">Peers’ median</dt>
          <dd className="tabular font-bold">{peerValueText(flag.metric, flag.peerMedian, currency, units)}</dd>
        </div>
        <div>
          <dt className="text-xs font-semibold text-ink-muted uppercase">How far</dt>
          <dd className="tabular font-bold">
            {flag.ratioToMedian === null ? '—' : `${formatNumber(flag.ratioToMedian, 2)}× the median`}
          </dd>
        </div>
        <div>
          <dt className="text-xs font-semibold text-ink-muted uppercase">Modified z-score</dt>
          <dd className="tabular font-bold">{formatNumber(flag.modifiedZ, 1)}</dd>
        </div>
      </dl>
      <p className="mt-2 text-sm text-ink-muted">{flag.method}</p>
      <Link
        to={href}
        className="mt-2 inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
      >
        See why, and follow it up →
      </Link>
    </li>
  );
}
