import { Component, Suspense, use, useId, useState, type ComponentProps, type ReactNode } from 'react';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { Button } from '../../../lib/ui/button';
import { ExportButton } from '../../../lib/ui/export-button';
import { isEmptySpec, type ChartSpec, type ChartTable } from './chart-spec';
import { forgetFailedChartCode, loadChartCode, loadedChartCode, useChartCode } from './chart-code';

/**
 * The chart itself, from the chart code's own chunk. When the route already started loading it and it has
 * arrived, it draws in the same render; otherwise it suspends until the chunk is here. A failed load reaches the
 * boundary below, whose "Try again" asks the network afresh.
 */
function FleetChart(props: ComponentProps<Awaited<ReturnType<typeof loadChartCode>>['default']>) {
  const code = loadedChartCode() ?? use(loadChartCode());
  return <code.default {...props} />;
}

/** Keeps a failed chart (its code could not load) inside its panel, with a way to try again. */
class ChartBoundary extends Component<
  { children: ReactNode; fallback: (retry: () => void) => ReactNode },
  { failed: boolean }
> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override render() {
    return this.state.failed ? this.props.fallback(() => this.setState({ failed: false })) : this.props.children;
  }
}

export type LegendItem = { key: string; label: string; mark: ReactNode };

/**
 * A chart with its units stated, a legend, an accessible label, and the same numbers as a table a click away;
 * loading, empty and error states of its own; and the export of its numbers.
 */
export function ChartPanel({
  title,
  units,
  spec,
  table,
  legend,
  exportPath,
  status,
  errorMessage,
  onRetry,
  emptyMessage,
}: {
  title: string;
  /** What the numbers are in, in words: "US dollars per month", "hours". */
  units: string;
  spec: ChartSpec | null;
  table: ChartTable | null;
  legend: LegendItem[];
  exportPath: string;
  status: 'pending' | 'error' | 'success';
  errorMessage?: string;
  onRetry?: () => void;
  emptyMessage: string;
}) {
  const [view, setView] = useState<'chart' | 'table'>('chart');
  const headingId = useId();
  const chartCode = useChartCode();
  const chartLoading = (
    <div role="status" className="flex h-80 items-center justify-center rounded-sheet bg-paper-deep text-ink-muted">
      Loading the chart…
    </div>
  );
  const empty = spec !== null && isEmptySpec(spec);
  const label = `${title}, in ${units}. The table view lists the same numbers.`;

  let body: ReactNode;
  if (status === 'pending' || spec === null || table === null) {
    body = (
      <div role="status" className="flex h-80 items-center justify-center rounded-sheet bg-paper-deep text-ink-muted">
        Loading the figures…
      </div>
    );
  } else if (status === 'error') {
    body = (
      <Notice title="These figures could not be loaded">
        <p>{errorMessage ?? 'The server did not answer.'}</p>
        {onRetry ? (
          <Button className="mt-2" onClick={onRetry}>
            Try again
          </Button>
        ) : null}
      </Notice>
    );
  } else if (empty) {
    body = (
      <p className="flex h-40 items-center justify-center rounded-sheet bg-paper-deep px-4 text-center text-ink-muted">
        {emptyMessage}
      </p>
    );
  } else if (view === 'table') {
    body = (
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <caption className="sr-only">{label}</caption>
          <thead>
            <tr className="border-b border-rule text-left">
              {table.columns.map((c, i) => (
                <th key={c} scope="col" className={`px-2 py-2 font-semibold ${i > 0 ? 'text-right' : ''}`}>
                  {c}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {table.rows.map((row) => (
              <tr key={row.key} className="border-b border-rule last:border-0">
                {row.cells.map((cell, i) =>
                  i === 0 ? (
                    <th key={i} scope="row" className="px-2 py-2 text-left font-semibold">
                      {cell}
                    </th>
                  ) : (
                    <td key={i} className="tabular px-2 py-2 text-right whitespace-nowrap">
                      {cell}
                    </td>
                  ),
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    );
  } else {
    body = (
      <ChartBoundary
        fallback={(retry) => (
          <Notice title="The chart could not be drawn">
            <p>Its code did not load. The table view still has the numbers.</p>
            <Button
              className="mt-2"
              onClick={() => {
                forgetFailedChartCode();
                retry();
              }}
            >
              Try again
            </Button>
          </Notice>
        )}
      >
        <Suspense fallback={chartLoading}>
          {chartCode === 'coming' ? (
            chartLoading
          ) : (
            <figure aria-labelledby={headingId}>
              <FleetChart spec={spec} label={label} />
            </figure>
          )}
        </Suspense>
      </ChartBoundary>
    );
  }

  return (
    <Card className="p-4" aria-labelledby={headingId}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={headingId} className="text-lg font-bold text-ink">
            {title}
          </h2>
          <p className="text-sm text-ink-muted">In {units}.</p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <div role="group" aria-label={`${title}: view`} className="flex rounded-sheet border border-ink-muted">
            {(['chart', 'table'] as const).map((v) => (
              <button
                key={v}
                type="button"
                aria-pressed={view === v}
                onClick={() => setView(v)}
                className={`min-h-11 px-3 text-sm font-semibold first:rounded-l-sheet last:rounded-r-sheet ${
                  view === v ? 'bg-ink text-card' : 'bg-card text-ink hover:bg-paper-deep'
                }`}
              >
                {v === 'chart' ? 'Chart' : 'Table'}
              </button>
            ))}
          </div>
          <ExportButton path={exportPath} />
        </div>
      </div>
      {legend.length > 0 && status === 'success' && !empty ? (
        <ul aria-label="Legend" className="mt-3 flex flex-wrap gap-x-4 gap-y-1 text-sm">
          {legend.map((item) => (
            <li key={item.key} className="flex items-center gap-1.5">
              {item.mark}
              {item.label}
            </li>
          ))}
        </ul>
      ) : null}
      <div className="mt-3">{body}</div>
    </Card>
  );
}
