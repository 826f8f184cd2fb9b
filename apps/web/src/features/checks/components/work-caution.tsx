import { useId } from 'react';

/** The warning triangle of a caution sign, its meaning always repeated in words beside it. */
function WarningTriangle({ className }: { className: string }) {
  return (
    <svg viewBox="0 0 48 44" aria-hidden="true" focusable="false" className={`shrink-0 ${className}`}>
      <path d="M24 3 45.5 40.5H2.5Z" fill="#F6C64A" stroke="#1E2226" strokeWidth="4" strokeLinejoin="round" />
      <rect x="21.5" y="14" width="5" height="15" rx="1.5" fill="#1E2226" />
      <circle cx="24" cy="34" r="2.9" fill="#1E2226" />
    </svg>
  );
}

/**
 * The cautions for adjusting a saw to take a reading: shown on the record form before anything else. The
 * employer's procedures, local regulations and the saw maker's manual come first.
 */
export function WorkCaution() {
  const headingId = useId();
  return (
    <section
      aria-labelledby={headingId}
      className="flex gap-3 rounded-sheet border-2 border-ink bg-signal-caution-soft p-3 sm:gap-4 sm:p-4"
    >
      <WarningTriangle className="size-8 sm:size-10" />
      <div className="min-w-0 space-y-1.5 text-ink">
        <h2 id={headingId} className="text-base leading-tight font-extrabold">
          Caution: adjusting a saw
        </h2>
        <ul className="list-disc space-y-0.5 pl-5 text-sm">
          <li>Isolate and lock out the power before reaching into the saw.</li>
          <li>Wear gloves and eye protection: the teeth cut.</li>
          <li>Put the guards back on before running the saw.</li>
        </ul>
        <p className="text-xs text-ink-muted">
          Your employer’s procedures, local regulations (such as lockout/tagout rules) and the saw maker’s manual come
          first.
        </p>
      </div>
    </section>
  );
}
