import type { ImportState, RowVerdict } from '@kerfline/domain/imports/schema';
import { IMPORT_STATE_LABELS } from '@kerfline/domain/imports/schema';

type Shape = 'circle' | 'ring' | 'triangle' | 'square';

const TONES: Record<Shape, string> = {
  circle: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  ring: 'border-ink-muted bg-card text-ink',
  triangle: 'border-signal-caution bg-signal-caution-soft text-ink',
  square: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
};

/** The ISO 3864 shapes: circle fine, ring set aside, triangle attention, square stopped. Never colour alone. */
function Mark({ shape }: { shape: Shape }) {
  return (
    <svg viewBox="0 0 14 14" aria-hidden="true" focusable="false" data-shape={shape} className="size-3.5 shrink-0">
      {shape === 'circle' ? <circle cx="7" cy="7" r="6" fill="currentColor" /> : null}
      {shape === 'ring' ? <circle cx="7" cy="7" r="5.25" fill="none" stroke="currentColor" strokeWidth="2" /> : null}
      {shape === 'triangle' ? (
        <path d="M7 1.2 13.2 12.6H.8Z" fill="#F6C64A" stroke="#1E2226" strokeWidth="1.4" strokeLinejoin="round" />
      ) : null}
      {shape === 'square' ? <rect x="1" y="1" width="12" height="12" fill="currentColor" /> : null}
    </svg>
  );
}

function Badge({ shape, children }: { shape: Shape; children: string }) {
  return (
    <span
      data-shape={shape}
      className={`inline-flex items-center gap-1.5 rounded-sheet border px-2 py-0.5 text-sm font-bold whitespace-nowrap ${TONES[shape]}`}
    >
      <Mark shape={shape} />
      {children}
    </span>
  );
}

const VERDICTS: Record<RowVerdict, [Shape, string]> = {
  add: ['circle', 'Will be added'],
  present: ['ring', 'Already in Kerfline'],
  repeated: ['ring', 'Repeats a row'],
  rejected: ['square', 'Not brought in'],
};

export function VerdictBadge({ verdict }: { verdict: RowVerdict }) {
  const [shape, word] = VERDICTS[verdict];
  return <Badge shape={shape}>{word}</Badge>;
}

const STATES: Record<ImportState, Shape> = {
  committed: 'circle',
  undone: 'ring',
  running: 'triangle',
  failed: 'square',
};

export function StateBadge({ state }: { state: ImportState }) {
  return <Badge shape={STATES[state]}>{IMPORT_STATE_LABELS[state]}</Badge>;
}
