import { useId, type ReactNode } from 'react';
import { Field, inputClass } from '../../../lib/ui/field';
import type { BoundField } from './use-entries';

/**
 * A number field of a calculator: its label, the unit beside it, a hint and the message in words. Typed as
 * text with a decimal keypad, so "1 1/4" and "1,250.5" reach the parser as the user wrote them. The unit sits in
 * a slot that grows for the longer units (cm²/min), and is part of the field's name for assistive technology.
 */
export function EntryField({
  label,
  hint,
  field,
  className = '',
}: {
  label: string;
  hint?: string | undefined;
  field: BoundField;
  className?: string;
}) {
  return (
    <Field label={label} hint={hint} error={field.error} className={className}>
      {(props) => (
        <div className="flex items-center gap-2">
          <input
            {...props}
            aria-label={field.unit ? `${label} (${field.unit})` : undefined}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            value={field.value}
            onChange={(event) => field.onChange(event.target.value)}
            onBlur={field.onBlur}
            className={`${inputClass} tabular min-w-0 flex-1`}
          />
          {field.unit ? (
            <span
              aria-hidden="true"
              className="min-w-12 shrink-0 text-sm font-semibold whitespace-nowrap text-ink-muted"
            >
              {field.unit}
            </span>
          ) : null}
        </div>
      )}
    </Field>
  );
}

/** A choice from a short list (a shape, a material, a pitch), wired like every other field. */
export function ChoiceField({
  label,
  hint,
  field,
  options,
  className = '',
}: {
  label: string;
  hint?: string;
  field: BoundField;
  options: readonly { value: string; label: string }[];
  className?: string;
}) {
  return (
    <Field label={label} hint={hint} error={field.error} className={className}>
      {(props) => (
        <select
          {...props}
          value={field.value}
          onChange={(event) => field.onChange(event.target.value)}
          onBlur={field.onBlur}
          className={inputClass}
        >
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** A group of fields under a small heading, two to a row from tablet width up. */
export function FieldGroup({
  legend,
  children,
  columns = 2,
}: {
  legend: string;
  children: ReactNode;
  columns?: 2 | 3;
}) {
  return (
    <fieldset className={`grid gap-4 ${columns === 3 ? 'sm:grid-cols-3' : 'sm:grid-cols-2'}`}>
      <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">{legend}</legend>
      {children}
    </fieldset>
  );
}

/**
 * A choice of two or three ways to work something out, as large radio tiles: one tap with a glove, and the
 * choice visible without opening a list.
 */
export function ModeChoice({
  legend,
  field,
  options,
}: {
  legend: string;
  field: BoundField;
  options: readonly { value: string; label: string; hint: string }[];
}) {
  const name = useId();
  return (
    <fieldset>
      <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">{legend}</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((option) => (
          <label key={option.value} className="relative block cursor-pointer">
            {/* The radio itself covers its tile, unseen: a tap anywhere on the tile lands on the control. */}
            <input
              type="radio"
              name={name}
              value={option.value}
              checked={field.value === option.value}
              onChange={() => field.onChange(option.value)}
              aria-labelledby={`${name}-${option.value}-label`}
              aria-describedby={`${name}-${option.value}-hint`}
              className="peer absolute inset-0 z-10 size-full cursor-pointer appearance-none opacity-0"
            />
            <span className="flex min-h-11 items-start gap-3 rounded-sheet border border-ink-muted bg-card px-3 py-2.5 peer-checked:border-2 peer-checked:border-accent peer-checked:bg-accent-soft peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-ink">
              <span
                aria-hidden="true"
                className={`mt-0.5 flex size-5 shrink-0 items-center justify-center rounded-full border-2 ${
                  field.value === option.value ? 'border-accent' : 'border-ink-muted'
                }`}
              >
                {field.value === option.value ? <span className="size-2.5 rounded-full bg-accent" /> : null}
              </span>
              <span>
                <span id={`${name}-${option.value}-label`} className="block font-bold text-ink">
                  {option.label}
                </span>
                <span id={`${name}-${option.value}-hint`} className="block text-sm text-ink-muted">
                  {option.hint}
                </span>
              </span>
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
