import type { ReactNode } from 'react';

/**
 * Shapes after the meanings of ISO 3864 signs: a filled circle for fine, a ring for acceptable, a triangle for
 * needs attention, a square block for stop. The word always comes with the shape; colour is the third cue.
 */
export type StatusShape = 'circle' | 'ring' | 'triangle' | 'square' | 'dash';

const TONES: Record<StatusShape, string> = {
  circle: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  ring: 'border-ink-muted bg-card text-ink',
  triangle: 'border-signal-caution bg-signal-caution-soft text-ink',
  square: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
  dash: 'border-rule bg-paper-deep text-ink-muted',
};

export function StatusMark({ shape, className = 'size-3.5' }: { shape: StatusShape; className?: string }) {
  return (
    <svg
      viewBox="0 0 14 14"
      aria-hidden="true"
      focusable="false"
      data-shape={shape}
      className={`shrink-0 ${className}`}
    >
      {shape === 'circle' ? <circle cx="7" cy="7" r="6" fill="currentColor" /> : null}
      {shape === 'ring' ? <circle cx="7" cy="7" r="5.25" fill="none" stroke="currentColor" strokeWidth="2" /> : null}
      {shape === 'triangle' ? (
        // Yellow with a dark edge, like the caution sign it borrows from.
        <path d="M7 1.2 13.2 12.6H.8Z" fill="#F6C64A" stroke="#1E2226" strokeWidth="1.4" strokeLinejoin="round" />
      ) : null}
      {shape === 'square' ? <rect x="1" y="1" width="12" height="12" fill="currentColor" /> : null}
      {shape === 'dash' ? (
        <line x1="1.5" y1="7" x2="12.5" y2="7" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      ) : null}
    </svg>
  );
}

/** A status in a word and a shape, e.g. a pitch's fit or a check's pass or fail. */
export function StatusBadge({ shape, children }: { shape: StatusShape; children: ReactNode }) {
  return (
    <span
      data-shape={shape}
      className={`inline-flex items-center gap-1.5 rounded-sheet border px-2 py-0.5 text-sm font-bold ${TONES[shape]}`}
    >
      <StatusMark shape={shape} />
      {children}
    </span>
  );
}
