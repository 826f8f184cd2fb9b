import { Link } from 'react-router-dom';
import { useInfiniteQuery } from '@tanstack/react-query';
import type { TimelineEntry } from '@kerfline/domain/saw-timeline/schema';
import { CAUSES } from '@kerfline/domain/diagnosis/likely-causes';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  formatArea,
  formatDateTime,
  formatForce,
  formatNumber,
  formatSmallLength,
  formatStress,
} from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { StatusShapeIcon } from '../../../lib/ui/status-mark';
import { sawTimelineQuery } from '../api/queries';
import { sinceText } from './saw-state-panel';

function minutesText(minutes: number): string {
  const m = Math.round(minutes);
  if (m < 60) return `${m} min`;
  const h = Math.floor(m / 60);
  return h < 24 ? `${h} h ${m % 60} min` : `${Math.floor(h / 24)} d ${h % 24} h`;
}

function RunEntry({
  entry,
  system,
  timeZone,
}: {
  entry: Extract<TimelineEntry, { kind: 'blade_run' }>;
  system: UnitSystem;
  timeZone: string;
}) {
  const life = [
    entry.areaCutMm2 !== null ? `cut ${formatArea(entry.areaCutMm2, system)}` : null,
    entry.cuts !== null ? `${formatNumber(entry.cuts)} cuts` : null,
  ].filter(Boolean);
  return (
    <>
      <p className="font-bold text-ink">
        <Link
          to={`/blade-runs/${entry.id}`}
          className="underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark"
        >
          Blade {entry.endedAt ? 'run' : 'on'}: {entry.bladeSpecName}
        </Link>
      </p>
      <p className="text-sm text-ink-muted tabular">
        On {formatDateTime(entry.startedAt, timeZone)}
        {entry.endedAt
          ? ` · off ${formatDateTime(entry.endedAt, timeZone)}`
          : ` · on the saw for ${sinceText(entry.startedAt)}`}
        {entry.byName ? ` · by ${entry.byName}` : ''}
      </p>
      {entry.removalReason ? (
        <p className="text-sm text-ink">
          {REMOVAL_REASON_LABELS[entry.removalReason]}
          {entry.confirmedCause ? ` — cause: ${CAUSES[entry.confirmedCause].label.toLowerCase()}` : ''}
          {life.length > 0 ? ` · ${life.join(' · ')}` : ''}
          {entry.photoCount > 0 ? ` · ${entry.photoCount} photo${entry.photoCount === 1 ? '' : 's'}` : ''}
        </p>
      ) : null}
      {entry.breakInFollowed === false ? <p className="text-sm text-ink">Break-in skipped.</p> : null}
    </>
  );
}

function StopEntry({ entry, timeZone }: { entry: Extract<TimelineEntry, { kind: 'stop' }>; timeZone: string }) {
  return (
    <>
      <p className="font-bold text-ink">
        <Link
          to={`/stops/${entry.id}`}
          className="underline decoration-accent decoration-2 underline-offset-4 hover:text-accent-dark"
        >
          Stopped: {STOP_CATEGORY_LABELS[entry.category].toLowerCase()}
        </Link>
        <span className="font-semibold text-ink-muted"> · {entry.planned ? 'planned' : 'unplanned'}</span>
      </p>
      <p className="text-sm text-ink-muted tabular">
        {formatDateTime(entry.startedAt, timeZone)}
        {entry.endedAt ? ` to ${formatDateTime(entry.endedAt, timeZone)}` : ' · still down'} ·{' '}
        {minutesText(entry.durationMin)}
        {entry.byName ? ` · by ${entry.byName}` : ''}
      </p>
      {entry.notes ? <p className="text-sm text-ink">{entry.notes}</p> : null}
    </>
  );
}

function readingText(entry: Extract<TimelineEntry, { kind: 'check' }>, system: UnitSystem): string | null {
  if (entry.reading === null) return null;
  if (entry.quantity === 'force') return formatForce(entry.reading, system);
  if (entry.quantity === 'stress') return formatStress(entry.reading * 1e6, system);
  return formatSmallLength(entry.reading, system);
}

function CheckEntry({
  entry,
  system,
  timeZone,
}: {
  entry: Extract<TimelineEntry, { kind: 'check' }>;
  system: UnitSystem;
  timeZone: string;
}) {
  const reading = readingText(entry, system);
  return (
    <>
      <p className="font-bold text-ink">
        Check: {entry.checkName}{' '}
        <span className={entry.passed ? 'text-signal-safe' : 'text-signal-stop'}>
          · {entry.passed ? 'passed' : 'failed'}
        </span>
      </p>
      <p className="text-sm text-ink-muted tabular">
        {formatDateTime(entry.startedAt, timeZone)}
        {reading ? ` · read ${reading}` : ''}
        {entry.byName ? ` · by ${entry.byName}` : ''}
        {entry.photoCount > 0 ? ` · ${entry.photoCount} photo${entry.photoCount === 1 ? '' : 's'}` : ''}
      </p>
    </>
  );
}

/** The mark of an entry: a block for a stop or a failed check, a circle for a blade or a check passed. */
function EntryMark({ entry }: { entry: TimelineEntry }) {
  if (entry.kind === 'check')
    return (
      <span className={entry.passed ? 'text-signal-safe' : 'text-signal-stop'}>
        <StatusShapeIcon shape={entry.passed ? 'circle' : 'block'} className="size-4" />
      </span>
    );
  if (entry.kind === 'stop')
    return (
      <span className={entry.endedAt ? 'text-ink-muted' : 'text-signal-stop'}>
        <StatusShapeIcon shape="block" className="size-4" />
      </span>
    );
  return (
    <span className={entry.endedAt ? 'text-ink-muted' : 'text-signal-safe'}>
      <StatusShapeIcon shape="circle" className="size-4" />
    </span>
  );
}

/**
 * One timeline of everything recorded on a saw — blades, stops and checks —
 * newest first, loaded a page at a time from the server.
 */
export function SawTimeline({ sawId, system, timeZone }: { sawId: string; system: UnitSystem; timeZone: string }) {
  const timeline = useInfiniteQuery(sawTimelineQuery(sawId));
  const entries = timeline.data?.pages.flatMap((page) => page.items) ?? [];
  const total = timeline.data?.pages[0]?.total ?? 0;
  return (
    <Card aria-labelledby="timeline-heading" className="p-4 sm:p-5">
      <h2 id="timeline-heading" className="text-lg font-bold text-ink">
        Timeline
      </h2>
      {timeline.isPending ? (
        <p role="status" className="py-4 text-ink-muted">
          Loading the saw’s history…
        </p>
      ) : timeline.isError ? (
        <div className="mt-3">
          <Notice title="The timeline could not be loaded">
            {timeline.error.message}{' '}
            <button type="button" className="font-semibold underline" onClick={() => void timeline.refetch()}>
              Try again
            </button>
          </Notice>
        </div>
      ) : entries.length === 0 ? (
        <p className="py-4 text-ink-muted">Nothing is recorded on this saw yet.</p>
      ) : (
        <>
          <p className="mt-1 text-sm text-ink-muted tabular">
            {formatNumber(entries.length)} of {formatNumber(total)} entries, newest first.
          </p>
          <ol className="mt-3 divide-y divide-rule">
            {entries.map((entry) => (
              <li key={`${entry.kind}-${entry.id}`} className="flex gap-3 py-3">
                <span className="mt-1">
                  <EntryMark entry={entry} />
                </span>
                <div className="min-w-0 space-y-0.5">
                  {entry.kind === 'blade_run' ? (
                    <RunEntry entry={entry} system={system} timeZone={timeZone} />
                  ) : entry.kind === 'check' ? (
                    <CheckEntry entry={entry} system={system} timeZone={timeZone} />
                  ) : (
                    <StopEntry entry={entry} timeZone={timeZone} />
                  )}
                </div>
              </li>
            ))}
          </ol>
          {timeline.hasNextPage ? (
            <Button
              onClick={() => void timeline.fetchNextPage()}
              disabled={timeline.isFetchingNextPage}
              className="mt-2"
            >
              {timeline.isFetchingNextPage ? 'Loading…' : 'Show older'}
            </Button>
          ) : null}
        </>
      )}
    </Card>
  );
}
