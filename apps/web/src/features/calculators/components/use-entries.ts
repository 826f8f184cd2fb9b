import { useState } from 'react';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { entryText, unitLabel, type Entry, type Quantity } from './quantities';

export type FieldErrors<K extends string> = Partial<Record<K, string>>;

/** What an `EntryField` needs to show one entry: its text in the current units, its unit and its message. */
export interface BoundField {
  value: string;
  unit: string | undefined;
  error: string | undefined;
  onChange: (text: string) => void;
  onBlur: () => void;
}

export interface EntriesForm<K extends string> {
  entries: Record<K, Entry>;
  /** Sets a field's text as typed now, in the current unit system. */
  change: (key: K, text: string) => void;
  /** Sets several fields at once (a saw picked from the list), each with the system its figure is in. */
  fill: (values: Partial<Record<K, Entry>>) => void;
  /** The user asked for the result: every field's message shows from now on. */
  submit: () => void;
  /** The props of the field `key` of a `quantity` (null for counts, TPI and choices), with its message. */
  bind: (key: K, quantity: Quantity | null, errors: FieldErrors<K>) => BoundField;
}

/**
 * Starting texts a calculator was opened with (from its address: `?thickness=0.042&width=1.25`), typed in the
 * address's unit system. Names the calculator does not have are ignored.
 */
export type StartTexts = Readonly<Partial<Record<string, string>>>;

/**
 * The entries of one calculator. Each keeps what was typed and the unit system it was typed in (see
 * `entryText`). A field's message shows once the user has typed in it and left it, or asked for the result:
 * nobody is told off for a field they have not reached yet. `start` fills fields when the calculator opens.
 */
export function useEntries<K extends string>(
  system: UnitSystem,
  initial: Record<K, string>,
  start: StartTexts = {},
): EntriesForm<K> {
  const [entries, setEntries] = useState<Record<K, Entry>>(() => {
    const first = {} as Record<K, Entry>;
    for (const key of Object.keys(initial) as K[]) first[key] = { text: start[key] ?? initial[key], system };
    return first;
  });
  const [dirty, setDirty] = useState<Partial<Record<K, true>>>({});
  const [left, setLeft] = useState<Partial<Record<K, true>>>({});
  const [submitted, setSubmitted] = useState(false);

  const change = (key: K, text: string) => {
    setEntries((current) => ({ ...current, [key]: { text, system } }));
    setDirty((current) => (current[key] ? current : { ...current, [key]: true }));
  };

  const fill = (values: Partial<Record<K, Entry>>) => {
    setEntries((current) => ({ ...current, ...values }));
  };

  const bind = (key: K, quantity: Quantity | null, errors: FieldErrors<K>): BoundField => ({
    value: entryText(entries[key], quantity, system),
    unit: quantity === null ? undefined : unitLabel(quantity, system),
    error: submitted || (dirty[key] && left[key]) ? errors[key] : undefined,
    onChange: (text) => change(key, text),
    onBlur: () => setLeft((current) => (current[key] ? current : { ...current, [key]: true })),
  });

  return { entries, change, fill, submit: () => setSubmitted(true), bind };
}
