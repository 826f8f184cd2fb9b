/**
 * Status as shape and word, with colour as a third cue, after the meanings of ISO 3864 safety signs: a circle
 * for running or fine, a triangle for needs attention, a square block for down or stopped. A plain dash is for
 * what is neither (retired, not recorded).
 */
export type StatusShape = 'circle' | 'triangle' | 'block' | 'dash';

const TONES: Record<StatusShape, string> = {
  circle: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  triangle: 'border-signal-caution bg-signal-caution-soft text-signal-caution',
  block: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
  dash: 'border-rule bg-paper-deep text-ink-muted',
};

export function StatusShapeIcon({ shape, className = 'size-3.5' }: { shape: StatusShape; className?: string }) {
  return (
    <svg
      viewBox="0 0 14 14"
      aria-hidden="true"
      focusable="false"
      data-shape={shape}
      className={`shrink-0 ${className}`}
    >
      {shape === 'circle' ? <circle cx="7" cy="7" r="6" fill="currentColor" /> : null}
      {shape === 'triangle' ? (
        <path d="M7 1 13.2 12.6H.8Z" fill="currentColor" stroke="#1E2226" strokeWidth="1" strokeLinejoin="round" />
      ) : null}
      {shape === 'block' ? <rect x="1" y="1" width="12" height="12" fill="currentColor" /> : null}
      {shape === 'dash' ? (
        <line x1="1.5" y1="7" x2="12.5" y2="7" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      ) : null}
    </svg>
  );
}

/** A small status label: shape, word, colour. */
export function StatusMark({
  shape,
  children,
  large = false,
}: {
  shape: StatusShape;
  children: React.ReactNode;
  large?: boolean;
}) {
  return (
    <span
      data-status-shape={shape}
      className={`inline-flex items-center gap-2 rounded-sheet border font-bold ${TONES[shape]} ${
        large ? 'px-3 py-1.5 text-base' : 'px-2 py-0.5 text-sm'
      }`}
    >
      <StatusShapeIcon shape={shape} className={large ? 'size-4' : 'size-3.5'} />
      {children}
    </span>
  );
}
