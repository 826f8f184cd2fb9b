import { useId, type ReactNode } from 'react';

export const inputClass =
  'min-h-11 w-full rounded-sheet border border-ink-muted bg-card px-3 text-base text-ink placeholder:text-ink-muted aria-[invalid=true]:border-2 aria-[invalid=true]:border-signal-stop';

type FieldControlProps = { id: string; 'aria-describedby': string | undefined; 'aria-invalid': boolean };

/**
 * A labelled form control with an optional unit beside it, a hint and an error in words. The control is
 * rendered by `children(props)` so any input or select gets the same wiring for assistive technology.
 */
export function Field({
  label,
  unit,
  hint,
  error,
  className = '',
  children,
}: {
  label: string;
  unit?: string;
  hint?: string;
  error?: string | undefined;
  className?: string;
  children: (props: FieldControlProps) => ReactNode;
}) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-semibold text-ink">
        {label}
        {/* The unit is shown beside the control; assistive technology hears it as part of the label. */}
        {unit ? <span className="sr-only"> ({unit})</span> : null}
      </label>
      <div className="mt-1 flex items-center gap-2">
        <div className="min-w-0 flex-1">
          {children({ id, 'aria-describedby': describedBy, 'aria-invalid': Boolean(error) })}
        </div>
        {unit ? (
          <span aria-hidden="true" className="w-12 shrink-0 text-sm font-semibold text-ink-muted">
            {unit}
          </span>
        ) : null}
      </div>
      {hint ? (
        <p id={hintId} className="mt-1 text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={errorId} className="mt-1 text-sm font-semibold text-signal-stop">
          {error}
        </p>
      ) : null}
    </div>
  );
}
