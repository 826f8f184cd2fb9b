import type { ReactNode } from 'react';
import type { DueStateName } from '@kerfline/domain/checks/check-due';
import { DUE_STATE_WORDS } from './check-words';

/**
 * Status as a word and a shape, colour third, after the meanings of ISO 3864 signs: a filled circle for fine
 * (passed, up to date), an open ring for due now, a triangle for needs attention (overdue), a square block for
 * stop (failed: put it right before cutting).
 */
type Shape = 'circle' | 'ring' | 'triangle' | 'square';

const TONES: Record<Shape, string> = {
  circle: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  ring: 'border-signal-info bg-signal-info-soft text-signal-info',
  triangle: 'border-signal-caution bg-signal-caution-soft text-ink',
  square: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
};

export function CheckShape({ shape, className = 'size-3.5' }: { shape: Shape; className?: string }) {
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
        <path d="M7 1.2 13.2 12.6H.8Z" fill="#F6C64A" stroke="#1E2226" strokeWidth="1.4" strokeLinejoin="round" />
      ) : null}
      {shape === 'square' ? <rect x="1" y="1" width="12" height="12" fill="currentColor" /> : null}
    </svg>
  );
}

function Badge({ shape, large, children }: { shape: Shape; large?: boolean; children: ReactNode }) {
  return (
    <span
      data-shape={shape}
      className={`inline-flex items-center gap-1.5 rounded-sheet border font-bold whitespace-nowrap ${TONES[shape]} ${
        large ? 'px-3 py-1.5 text-xl' : 'px-2 py-0.5 text-sm'
      }`}
    >
      <CheckShape shape={shape} className={large ? 'size-5' : 'size-3.5'} />
      {children}
    </span>
  );
}

const STATE_SHAPE: Record<DueStateName, Shape> = { ok: 'circle', due: 'ring', overdue: 'triangle' };

/** Whether a check is up to date, due now or overdue. */
export function DueStateBadge({ state }: { state: DueStateName }) {
  return <Badge shape={STATE_SHAPE[state]}>{DUE_STATE_WORDS[state]}</Badge>;
}

/** A recorded check's verdict: passed (circle) or failed (square block). */
export function VerdictBadge({ passed, large = false }: { passed: boolean; large?: boolean }) {
  return (
    <Badge shape={passed ? 'circle' : 'square'} large={large}>
      {passed ? 'Passed' : 'Failed'}
    </Badge>
  );
}
