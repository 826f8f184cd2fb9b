import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import type { SawOutlier } from '@kerfline/domain/outliers/review-schema';
import { formatNumber } from '../../../lib/format';

const pct = (share: number) => `${formatNumber(share * 100)}\u00a0%`;

/** Why this saw's blades came off, beside its peers' pooled reasons, with a bar of each share. */
export function ReasonMix({ data }: { data: SawOutlier }) {
  if (data.reasonMix.length === 0)
    return <p className="text-ink-muted">No blade came off this saw or its peers in the period.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Blades taken off by reason: this saw against its peers</caption>
      <thead>
        <tr className="border-b border-rule text-left">
          <th scope="col" className="py-2 font-semibold">
            Reason
          </th>
          <th scope="col" className="py-2 font-semibold">
            This saw
          </th>
          <th scope="col" className="py-2 font-semibold">
            Its peers
          </th>
        </tr>
      </thead>
      <tbody>
        {data.reasonMix.map((row) => (
          <tr key={row.reason} className="border-b border-rule last:border-0">
            <th scope="row" className="py-2 text-left font-semibold">
              {REMOVAL_REASON_LABELS[row.reason]}
              {row.reason === data.standoutReason ? (
                <span className="ml-2 rounded border border-signal-caution px-1 text-xs text-ink">stands out</span>
              ) : null}
            </th>
            {[
              [row.saw, row.sawShare],
              [row.peers, row.peerShare],
            ].map(([n, share], i) => (
              <td key={i} className="py-2 pr-3">
                <div className="flex items-center gap-2">
                  <div className="h-2 w-24 rounded-full bg-paper-deep" aria-hidden="true">
                    <div
                      className={`h-2 rounded-full ${i === 0 ? 'bg-accent' : 'bg-ink-muted'}`}
                      style={{ width: `${share! * 100}%` }}
                    />
                  </div>
                  <span className="tabular">
                    {pct(share!)} ({formatNumber(n!)})
                  </span>
                </div>
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The likely causes behind the reason that stands out, ranked, each with its advice and the evidence used. */
export function LikelyCauses({ data }: { data: SawOutlier }) {
  const causes = data.likelyCauses;
  if (!causes)
    return <p className="text-ink-muted">No blade came off in the period, so there is no failure to explain.</p>;
  return (
    <div>
      <p className="text-sm text-ink-muted">
        For <span className="font-semibold text-ink">{causes.modeLabel.toLowerCase()}</span>, ranked by Kerfline’s rules
        for that failure and this saw’s own records: {causes.evidenceUsed.cutLogs} cut log
        {causes.evidenceUsed.cutLogs === 1 ? '' : 's'} in the period
        {causes.evidenceUsed.breakInSkippedShare === null
          ? ''
          : `, break-in skipped on ${formatNumber(causes.evidenceUsed.breakInSkippedShare * 100)} % of its blades`}
        .
      </p>
      <ol className="mt-3 space-y-3">
        {causes.causes.map((c, i) => (
          <li key={c.cause} className="rounded-sheet border border-rule p-3">
            <p className="font-bold text-ink">
              {i + 1}. {c.label}
            </p>
            <p className="text-sm">{c.advice}</p>
            {c.evidence.length > 0 ? (
              <ul className="mt-1 list-disc pl-5 text-sm text-ink-muted">
                {c.evidence.map((e) => (
                  <li key={e.text}>
                    {e.text} {e.effect > 0 ? '(speaks for it)' : '(speaks against it)'}
                  </li>
                ))}
              </ul>
            ) : null}
          </li>
        ))}
      </ol>
    </div>
  );
}
