import { useState } from 'react';
import type { HeadFeed } from '@kerfline/domain/saws/schema';
import { Field, inputClass } from '../../../lib/ui/field';

/**
 * What a calculator may take from one of the user's saws: plain figures in SI. The page that composes the
 * calculator reads the saws and hands these over; the calculators never fetch saws themselves.
 */
export interface CalculatorSaw {
  id: string;
  /** How the saw is named in the list, e.g. "HAM-S01 · Bay 1 bar saw". */
  label: string;
  /** How the head feeds; unknown for a saw typed in by hand. */
  headFeed?: HeadFeed;
  wheelDiameterMm?: number;
  bandThicknessMm: number;
  bandWidthMm: number;
  bandSpeedMinMPerMin: number;
  bandSpeedMaxMPerMin: number;
  /** The saw's own spring-balance limits (N); null or left out: the site's setting. */
  minHeadForceN?: number | null;
  maxHeadForceN?: number | null;
}

/** Fills a calculator's fields from one of the user's saws; the figures can still be changed by hand. */
export function SawPicker({
  saws,
  hint,
  onPick,
  initial = '',
}: {
  saws: readonly CalculatorSaw[];
  hint: string;
  onPick: (saw: CalculatorSaw) => void;
  /** The saw the calculator was opened for, shown as chosen. */
  initial?: string;
}) {
  const [chosen, setChosen] = useState(initial);
  if (saws.length === 0) return null;
  return (
    <Field label="Fill in from a saw" hint={hint} className="sm:col-span-2">
      {(props) => (
        <select
          {...props}
          value={chosen}
          onChange={(event) => {
            setChosen(event.target.value);
            const saw = saws.find((s) => s.id === event.target.value);
            if (saw) onPick(saw);
          }}
          className={inputClass}
        >
          <option value="">No saw: I will type the figures</option>
          {saws.map((saw) => (
            <option key={saw.id} value={saw.id}>
              {saw.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}
