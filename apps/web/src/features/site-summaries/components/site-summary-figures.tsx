import type { ReactNode } from 'react';
import type { SiteSummary } from '@kerfline/domain/site-summaries/schema';
import { formatDateTime, formatNumber } from '../../../lib/format';
import { StatusShapeIcon, type StatusShape } from '../../../lib/ui/status-mark';

function Figure({
  shape,
  value,
  label,
  note,
}: {
  shape: StatusShape;
  value: string;
  label: string;
  note?: string | undefined;
}) {
  const tone =
    shape === 'block'
      ? 'text-signal-stop'
      : shape === 'triangle'
        ? 'text-signal-caution'
        : shape === 'circle'
          ? 'text-signal-safe'
          : 'text-ink-muted';
  return (
    <div className="flex items-start gap-2.5">
      <span className={`mt-1.5 ${tone}`}>
        <StatusShapeIcon shape={shape} className="size-4" />
      </span>
      <div className="min-w-0">
        <dt className="text-sm text-ink-muted">{label}</dt>
        <dd className="tabular text-2xl leading-tight font-extrabold text-ink">{value}</dd>
        {note ? <dd className="text-sm text-ink-muted">{note}</dd> : null}
      </div>
    </div>
  );
}

/** "6 days", "under a day", or none used lately. */
function daysText(days: number | null): string {
  if (days === null) return 'No use lately';
  if (days < 1) return 'Under a day';
  const whole = Math.floor(days);
  return whole === 1 ? '1 day' : `${formatNumber(whole)} days`;
}

/**
 * What a site's tile shows people to act on: saws down now (a block when any, since when), the blade stock that
 * runs out first (a triangle when a spec is at its reorder point), and blades on saws. `extra` takes more figures
 * (checks overdue, when checks are recorded).
 */
export function SiteSummaryFigures({
  summary,
  timeZone,
  extra,
}: {
  summary: SiteSummary | undefined;
  timeZone: string;
  extra?: ReactNode;
}) {
  if (!summary) return <p className="text-sm text-ink-muted">Figures not loaded.</p>;
  const stock = summary.stock;
  return (
    <dl className="grid gap-3">
      <Figure
        shape={summary.sawsDown > 0 ? 'block' : 'circle'}
        value={summary.sawsDown === 0 ? 'None' : formatNumber(summary.sawsDown)}
        label={`Saws down now, of ${formatNumber(summary.sawsInUse)}`}
        note={summary.downSince ? `Longest since ${formatDateTime(summary.downSince, timeZone, true)}` : undefined}
      />
      {stock ? (
        <Figure
          shape={stock.toReorder > 0 ? 'triangle' : stock.specs === 0 ? 'dash' : 'circle'}
          value={stock.specs === 0 ? 'No stock kept' : daysText(stock.fewestDaysLeft)}
          label="Blade stock left"
          note={
            stock.specs === 0
              ? undefined
              : [
                  stock.fewestDaysSpecName ? `${stock.fewestDaysSpecName} runs out first` : null,
                  stock.toReorder > 0
                    ? `${formatNumber(stock.toReorder)} spec${stock.toReorder === 1 ? '' : 's'} to reorder`
                    : null,
                ]
                  .filter(Boolean)
                  .join(' · ') || undefined
          }
        />
      ) : null}
      {extra}
      <Figure shape="dash" value={formatNumber(summary.bladesOn)} label="Saws with a blade recorded on" />
    </dl>
  );
}
