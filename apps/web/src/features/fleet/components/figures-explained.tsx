import { FLEET_FIGURE_DEFINITIONS } from '@kerfline/domain/fleet/definitions';

/** What each fleet figure means and where its rule comes from, folded away under the figures. */
export function FiguresExplained() {
  return (
    <details className="rounded-sheet border border-rule bg-card p-4 text-sm">
      <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold text-ink">
        What these figures mean and where they come from
      </summary>
      <dl className="mt-3 space-y-3">
        {FLEET_FIGURE_DEFINITIONS.map((d) => (
          <div key={d.label}>
            <dt className="font-semibold text-ink">{d.label}</dt>
            <dd className="text-ink">{d.meaning}</dd>
            <dd className="text-ink-muted">Source: {d.source}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}
