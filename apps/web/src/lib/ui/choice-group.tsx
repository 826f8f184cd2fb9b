import { useId, type ComponentPropsWithRef, type ReactNode } from 'react';

/**
 * A labelled group of radio buttons or checkboxes with an optional hint and an error in words. The group
 * is a fieldset, so assistive technology reads the legend, the hint and the error on entering it.
 */
export function ChoiceGroup({
  legend,
  hint,
  error,
  className = '',
  children,
}: {
  legend: string;
  hint?: ReactNode;
  error?: string | undefined;
  className?: string;
  children: ReactNode;
}) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  return (
    <fieldset
      className={className}
      aria-describedby={[errorId, hintId].filter(Boolean).join(' ') || undefined}
      aria-invalid={error ? true : undefined}
    >
      <legend className="mb-1 block text-sm font-semibold text-ink">{legend}</legend>
      {hint ? (
        <p id={hintId} className="mb-2 text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {children}
      {error ? (
        <p id={errorId} className="mt-1 text-sm font-semibold text-signal-stop">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

/**
 * One radio button or checkbox as a tile at least 44 px high: the whole tile takes the tap, and a chosen
 * tile is marked by its copper border and tint as well as by the control's own tick.
 */
export function ChoiceTile({
  label,
  hint,
  ...input
}: { label: ReactNode; hint?: ReactNode } & Omit<ComponentPropsWithRef<'input'>, 'className'>) {
  return (
    <label className="flex min-h-11 cursor-pointer items-start gap-3 rounded-sheet border border-ink-muted bg-card px-3 py-2.5 has-checked:border-accent has-checked:bg-accent-soft has-checked:ring-1 has-checked:ring-accent">
      <input {...input} className="mt-0.5 size-5 shrink-0 cursor-pointer accent-accent" />
      <span className="min-w-0">
        <span className="block font-semibold text-ink">{label}</span>
        {hint ? <span className="block text-sm text-ink-muted">{hint}</span> : null}
      </span>
    </label>
  );
}
