import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  DISPLAY_UNITS,
  parseDisplayNumber,
  quantityFromDisplay,
  quantityToDisplay,
  type DisplayQuantityKind,
} from '@kerfline/domain/units/display';

/**
 * Numbers typed into the records' forms, in the site's units: read as people type them in a shop ("1,250",
 * "1 1/4"), turned into SI for the domain schema, and turned back for a default. A blank optional field is null;
 * text that is not a number is said so in words beside the field.
 */

export type ReadNumber = { ok: true; value: number | null } | { ok: false; message: string };

/** The unit label of a quantity in the site's system (`psi`, `MPa`, `in²`, `cm²`). */
export function unitOf(kind: DisplayQuantityKind, system: UnitSystem): string {
  return DISPLAY_UNITS[kind][system].unit;
}

/** A quantity typed in the site's unit, in SI; blank is null (the field is optional) or a message (required). */
export function readQuantity(
  text: string,
  kind: DisplayQuantityKind,
  system: UnitSystem,
  label: string,
  required = false,
): ReadNumber {
  if (text.trim() === '')
    return required ? { ok: false, message: `Enter the ${label.toLowerCase()}` } : { ok: true, value: null };
  const parsed = parseDisplayNumber(text);
  if (!parsed.ok) return { ok: false, message: `${label}: ${parsed.message}` };
  return { ok: true, value: quantityFromDisplay(kind, parsed.value, system) };
}

/** A plain count typed in a form (cuts, blades); blank is null. */
export function readCount(text: string, label: string): ReadNumber {
  if (text.trim() === '') return { ok: true, value: null };
  const parsed = parseDisplayNumber(text);
  if (!parsed.ok) return { ok: false, message: `${label}: ${parsed.message}` };
  return { ok: true, value: parsed.value };
}

/** An SI value as a person would type it in the site's unit, at the display policy's decimals (no separators). */
export function quantityInput(si: number, kind: DisplayQuantityKind, system: UnitSystem): string {
  return String(quantityToDisplay(kind, si, system).value);
}
