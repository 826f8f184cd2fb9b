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

/**
 * One line at the top of a calculator for work on the saw: the first rule, and where the full cautions are. On a
 * phone the answer comes next and the full cautions after it, so neither is out of sight.
 */
export function SafetyCautionBrief({ fullId }: { fullId: string }) {
  return (
    <p className="flex items-center gap-3 rounded-sheet border-2 border-ink bg-signal-caution-soft px-3 py-2 text-sm text-ink">
      <WarningTriangle className="size-6" />
      <span>
        <strong>Caution:</strong> isolate and lock out the power before reaching into the saw.{' '}
        <a href={`#${fullId}`} className="font-semibold underline underline-offset-4">
          All the cautions
        </a>
      </span>
    </p>
  );
}

/**
 * The usual cautions for adjusting a saw or changing a blade, shown on every calculator used for those jobs.
 * They point to the employer's procedures, local rules and the maker's manual, which always come first.
 */
export function SafetyCaution({ id }: { id?: string }) {
  const headingId = useId();
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
        <ul className="list-disc space-y-1 pl-5 text-base">
          <li>Isolate and lock out the power before reaching into the saw.</li>
          <li>Wear gloves and eye protection: the teeth cut.</li>
          <li>A coiled band stores energy. Uncoil it with care, pointing it away from people.</li>
          <li>Put the guards back before running the saw.</li>
        </ul>
        <p className="text-sm text-ink-muted">
          These figures do not replace your employer’s procedures, local regulations (such as lockout/tagout rules) or
          the saw maker’s manual.
        </p>
      </div>
    </section>
  );
}
