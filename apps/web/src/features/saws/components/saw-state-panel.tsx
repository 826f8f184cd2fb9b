import type { ReactNode } from 'react';
import type { Saw } from '@kerfline/domain/saws/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { formatDateTime } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { StatusShapeIcon } from '../../../lib/ui/status-mark';

/** Time since an instant, as the shop says it: `40 min`, `3 h 5 min`, `2 d 4 h`. */
export function sinceText(iso: string, now = Date.now()): string {
  const minutes = Math.max(0, Math.round((now - Date.parse(iso)) / 60_000));
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return minutes % 60 === 0 ? `${hours} h` : `${hours} h ${minutes % 60} min`;
  const days = Math.floor(hours / 24);
  return hours % 24 === 0 ? `${days} d` : `${days} d ${hours % 24} h`;
}

function Line({
  shape,
  title,
  children,
}: {
  shape: 'circle' | 'block' | 'dash';
  title: ReactNode;
  children?: ReactNode;
}) {
  const tone = shape === 'circle' ? 'text-signal-safe' : shape === 'block' ? 'text-signal-stop' : 'text-ink-muted';
  return (
    <div className="flex gap-3">
      <span className={`mt-1 ${tone}`}>
        <StatusShapeIcon shape={shape} className="size-5" />
      </span>
      <div className="min-w-0">
        <p className="text-xl font-extrabold text-ink">{title}</p>
        {children ? <p className="text-ink-muted">{children}</p> : null}
      </div>
    </div>
  );
}

/**
 * A saw's state at a glance, the first thing on its page and on a technician's start screen: down since when and
 * why (its open stop) or running since its last stop ended; the blade on it, which spec and since when. `slot`
 * takes more lines (the checks due); `actions` the buttons for the work that starts here.
 */
export function SawStatePanel({
  saw,
  timeZone,
  lastStopEndedAt,
  heading,
  slot,
  actions,
}: {
  saw: Saw;
  /** A title above the state (the saw's tag and name, where the page is not the saw's own). */
  heading?: ReactNode;
  timeZone: string;
  /** When its latest stop ended; null when it never stopped; undefined while not known. */
  lastStopEndedAt: string | null | undefined;
  slot?: ReactNode;
  actions?: ReactNode;
}) {
  const down = saw.status === 'down' && saw.down ? saw.down : null;
  return (
    <Card aria-label={`State of ${saw.assetTag}`} className="space-y-4 p-4 sm:p-5">
      {heading}
      {saw.status === 'retired' ? (
        <Line shape="dash" title="Retired">
          Kept for its history.
        </Line>
      ) : down ? (
        <Line shape="block" title={`Down: ${STOP_CATEGORY_LABELS[down.category].toLowerCase()}`}>
          Since {formatDateTime(down.since, timeZone)} ({sinceText(down.since)}),{' '}
          {down.planned ? 'planned' : 'unplanned'}.
        </Line>
      ) : (
        <Line shape="circle" title="Running">
          {lastStopEndedAt === undefined
            ? ' '
            : lastStopEndedAt === null
              ? 'No stops recorded.'
              : `Since ${formatDateTime(lastStopEndedAt, timeZone)} (${sinceText(lastStopEndedAt)}), when its last stop ended.`}
        </Line>
      )}
      {saw.status !== 'retired' ? (
        saw.bladeOn ? (
          <Line shape="circle" title={saw.bladeOn.bladeSpecName}>
            Blade on since {formatDateTime(saw.bladeOn.since, timeZone)} ({sinceText(saw.bladeOn.since)}).
          </Line>
        ) : (
          <Line shape="dash" title="No blade recorded">
            Put the blade on here when you fit one.
          </Line>
        )
      ) : null}
      {slot}
      {actions ? <div className="grid gap-2 border-t border-rule pt-4 sm:flex sm:flex-wrap">{actions}</div> : null}
    </Card>
  );
}
