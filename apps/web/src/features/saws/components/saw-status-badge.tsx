import type { SawDown, SawStatus } from '@kerfline/domain/saws/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';

export const SAW_STATUS_LABELS: Record<SawStatus, string> = {
  in_service: 'In service',
  down: 'Down',
  retired: 'Retired',
};

/**
 * The shape carries the meaning without colour, after the sign shapes of ISO 3864: a circle for running,
 * a square block for stopped. A retired saw is neither, so it gets a plain dash.
 */
export const SAW_STATUS_SHAPES: Record<SawStatus, 'circle' | 'square' | 'dash'> = {
  in_service: 'circle',
  down: 'square',
  retired: 'dash',
};

const tones: Record<SawStatus, string> = {
  in_service: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  down: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
  retired: 'border-rule bg-paper-deep text-ink-muted',
};

export function SawStatusShape({ status, className = 'size-3.5' }: { status: SawStatus; className?: string }) {
  const shape = SAW_STATUS_SHAPES[status];
  return (
    <svg
      viewBox="0 0 14 14"
      aria-hidden="true"
      focusable="false"
      data-shape={shape}
      className={`shrink-0 ${className}`}
    >
      {shape === 'circle' ? <circle cx="7" cy="7" r="6" fill="currentColor" /> : null}
      {shape === 'square' ? <rect x="1" y="1" width="12" height="12" fill="currentColor" /> : null}
      {shape === 'dash' ? (
        <line x1="1.5" y1="7" x2="12.5" y2="7" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      ) : null}
    </svg>
  );
}

/**
 * A saw's status as a word and a shape, with colour as a third cue. A down saw also says why (its open stop's
 * category); the start of the stop is in the tooltip.
 */
export function SawStatusBadge({
  status,
  down = null,
  large = false,
}: {
  status: SawStatus;
  down?: SawDown | null;
  large?: boolean;
}) {
  const why = status === 'down' && down ? STOP_CATEGORY_LABELS[down.category] : null;
  return (
    <span
      data-status={status}
      title={why && down ? `Down since ${new Date(down.since).toLocaleString()}` : undefined}
      className={`inline-flex items-center gap-2 rounded-sheet border font-bold whitespace-nowrap ${tones[status]} ${
        large ? 'px-3 py-1.5 text-base' : 'px-2 py-0.5 text-sm'
      }`}
    >
      <SawStatusShape status={status} className={large ? 'size-4' : 'size-3.5'} />
      {SAW_STATUS_LABELS[status]}
      {why ? <span className="font-semibold">· {why}</span> : null}
    </span>
  );
}
