import { useId } from 'react';

/**
 * The warning triangle of a caution sign: yellow, black edge, black exclamation mark. Drawn here so it prints
 * the same everywhere; its meaning is always repeated in words beside it.
 */
export function WarningTriangle({ className = 'size-12' }: { className?: string }) {
  return (
    <svg viewBox="0 0 48 44" aria-hidden="true" focusable="false" className={`shrink-0 ${className}`}>
      <path d="M24 3 45.5 40.5H2.5Z" fill="#F6C64A" stroke="#1E2226" strokeWidth="4" strokeLinejoin="round" />
      <rect x="21.5" y="14" width="5" height="15" rx="1.5" fill="#1E2226" />
      <circle cx="24" cy="34" r="2.9" fill="#1E2226" />
    </svg>
  );
}

/** The cautions for work inside a saw, one line each, in the order the work goes. */
export const SAFETY_CAUTIONS = [
  'Isolate and lock out the power before reaching into the saw.',
  'Wear gloves and eye protection: the teeth cut.',
  'A coiled or broken band stores energy and can spring. Uncoil it with care, pointing it away from people.',
  'Put the guards back before running the saw.',
] as const;

export const SAFETY_DEFERENCE =
  'Your employer’s procedures, local regulations (such as lockout/tagout rules) and the saw maker’s manual come first.';

/**
 * The usual cautions for changing a blade or adjusting a saw, shown on every form and calculator used for those
 * jobs. They point to the employer's procedures, local rules and the maker's manual, which always come first.
 * `compact` keeps them short on a phone form: the first rule in full, the rest one tap away.
 */
export function SafetyCaution({
  id,
  compact = false,
  deference = SAFETY_DEFERENCE,
}: {
  id?: string;
  compact?: boolean;
  /** What comes first, in the words of the screen (a calculator speaks of its figures). */
  deference?: string;
}) {
  const headingId = useId();
  const list = (
    <ul className="list-disc space-y-1 pl-5 text-base">
      {SAFETY_CAUTIONS.map((line) => (
        <li key={line}>{line}</li>
      ))}
    </ul>
  );
  return (
    <section
      id={id}
      aria-labelledby={headingId}
      className="flex gap-4 rounded-sheet border-2 border-ink bg-signal-caution-soft p-4 sm:p-5"
    >
      <WarningTriangle className="size-10 sm:size-12" />
      <div className="min-w-0 space-y-2 text-ink">
        <h2 id={headingId} className="text-lg leading-tight font-extrabold">
          Caution: work on the saw safely
        </h2>
        {compact ? (
          <details className="group">
            <summary className="flex min-h-11 cursor-pointer items-center font-semibold underline underline-offset-4">
              <span className="group-open:hidden">{SAFETY_CAUTIONS[0]} All the cautions…</span>
              <span className="hidden group-open:inline">The cautions</span>
            </summary>
            {list}
          </details>
        ) : (
          list
        )}
        <p className="text-sm text-ink-muted">{deference}</p>
      </div>
    </section>
  );
}
