import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  PLAIN_QUANTITIES,
  type PlainQuantity,
  type SettingField,
  type SiteSettingDefinition,
} from '@kerfline/domain/settings/registry';
import { storedToSiFactor, type SettingValues } from '@kerfline/domain/settings/schema';
import {
  DISPLAY_UNITS,
  OTHER_SYSTEM,
  parseDisplayNumber,
  quantityFromDisplay,
  quantityToDisplay,
  type DisplayQuantityKind,
} from '@kerfline/domain/units/display';

/**
 * The settings editor's edge: a setting's stored numbers (in the units their names say: `toleranceMm`, `minMPa`)
 * shown and typed in the site's units, and typed text turned back into stored numbers. One generic editor
 * serves every setting of the registry through these.
 */

const NBSP = '\u00a0';

/**
 * Decimals a value shows with when it is put in a field to edit: fine enough that an untouched value survives
 * the trip (0.0001 in, 0.001 mm), plain enough to read. A field's own `decimals` wins.
 */
const EDIT_DECIMALS: Record<DisplayQuantityKind | PlainQuantity, Record<UnitSystem, number>> = {
  length: { imperial: 4, metric: 2 },
  smallLength: { imperial: 4, metric: 3 },
  bandSpeed: { imperial: 1, metric: 1 },
  area: { imperial: 3, metric: 2 },
  largeArea: { imperial: 2, metric: 3 },
  areaRate: { imperial: 3, metric: 2 },
  force: { imperial: 2, metric: 1 },
  stress: { imperial: 0, metric: 2 },
  days: { imperial: 0, metric: 0 },
  minutes: { imperial: 1, metric: 1 },
  percent: { imperial: 1, metric: 1 },
  teeth: { imperial: 0, metric: 0 },
};

/** Plain counts read the same in both systems: their unit, singular and plural. */
const PLAIN_UNITS: Record<PlainQuantity, { one: string; many: string; short: string }> = {
  days: { one: 'day', many: 'days', short: 'days' },
  minutes: { one: 'min', many: 'min', short: 'min' },
  percent: { one: '%', many: '%', short: '%' },
  teeth: { one: 'tooth', many: 'teeth', short: 'teeth' },
};

function plainOf(field: SettingField): PlainQuantity | null {
  return (PLAIN_QUANTITIES as readonly string[]).includes(field.quantity) ? (field.quantity as PlainQuantity) : null;
}

/** A field's quantity when it is one the display policy converts between systems. */
function displayKind(field: SettingField): DisplayQuantityKind {
  return field.quantity as DisplayQuantityKind;
}

const factor = (field: SettingField): number => storedToSiFactor(field) ?? 1;

/** The unit a field is shown and typed in on a site: in or mm, lbf or N, psi or MPa, days, %, teeth. */
export function fieldUnit(field: SettingField, system: UnitSystem): string {
  const plain = plainOf(field);
  return plain ? PLAIN_UNITS[plain].short : DISPLAY_UNITS[displayKind(field)][system].unit;
}

/** A stored number in the site's unit, unrounded. */
function displayNumber(field: SettingField, stored: number, system: UnitSystem): number {
  if (plainOf(field)) return stored;
  const si = stored * factor(field);
  return quantityToDisplay(displayKind(field), si, system, { decimals: 12 }).value;
}

/** A stored number as it reads on the page: by the formatting policy, or the field's own decimals. */
export function fieldText(field: SettingField, stored: number, system: UnitSystem): string {
  const plain = plainOf(field);
  if (plain) {
    const shown = Number(stored.toFixed(EDIT_DECIMALS[plain][system]));
    const unit = shown === 1 ? PLAIN_UNITS[plain].one : PLAIN_UNITS[plain].many;
    return plain === 'percent' ? `${shown}${NBSP}%` : `${shown.toLocaleString('en-US')}${NBSP}${unit}`;
  }
  const decimals = field.decimals?.[system];
  const shown = quantityToDisplay(
    displayKind(field),
    stored * factor(field),
    system,
    decimals === undefined ? {} : { decimals },
  );
  return shown.text.replace(' ', NBSP);
}

/** The site's unit first, the other system's second: "30,000 psi (206.8 MPa)". */
export function fieldDualText(field: SettingField, stored: number, system: UnitSystem): string {
  const first = fieldText(field, stored, system);
  if (plainOf(field)) return first;
  return `${first} (${fieldText(field, stored, OTHER_SYSTEM[system])})`;
}

function editDecimals(field: SettingField, system: UnitSystem): number {
  return field.decimals?.[system] ?? EDIT_DECIMALS[field.quantity][system];
}

/** A stored number as the text a field starts with: plain digits, no grouping, no trailing zeros. */
export function fieldEntryText(field: SettingField, stored: number, system: UnitSystem): string {
  return String(Number(displayNumber(field, stored, system).toFixed(editDecimals(field, system))));
}

/** A number typed in the site's unit as the stored number. */
export function storedFromDisplay(field: SettingField, value: number, system: UnitSystem): number {
  if (plainOf(field)) return value;
  return quantityFromDisplay(displayKind(field), value, system) / factor(field);
}

/** The accepted range in the site's unit, rounded inwards, so typing a limit as shown is accepted. */
export function fieldBounds(field: SettingField, system: UnitSystem): { min: number; max: number } {
  const step = 10 ** -editDecimals(field, system);
  const min = Math.ceil(displayNumber(field, field.min, system) / step - 1e-9) * step;
  const max = Math.floor(displayNumber(field, field.max, system) / step + 1e-9) * step;
  const digits = editDecimals(field, system);
  return { min: Number(min.toFixed(digits)), max: Number(max.toFixed(digits)) };
}

/** The editor's starting texts: each field's value in force, in the site's unit. */
export function settingFormTexts(def: SiteSettingDefinition, value: SettingValues, system: UnitSystem) {
  const texts: Record<string, string> = {};
  for (const field of def.fields) texts[field.name] = fieldEntryText(field, value[field.name] ?? 0, system);
  return texts;
}

/**
 * What the editor sends for what was typed, and the messages only the form can word well (text that is not a
 * number, a value outside the range, both in the site's unit). A field left as it started keeps its stored
 * number exactly, so changing one limit never re-rounds the other. Cross-field rules are left to the schema.
 */
export function settingInputFromTexts(
  def: SiteSettingDefinition,
  texts: Record<string, string>,
  start: { texts: Record<string, string>; value: SettingValues },
  system: UnitSystem,
): { input: Record<string, number>; fieldErrors: Record<string, string> } {
  const input: Record<string, number> = {};
  const fieldErrors: Record<string, string> = {};
  for (const field of def.fields) {
    const text = texts[field.name] ?? '';
    if (text === start.texts[field.name] && start.value[field.name] !== undefined) {
      input[field.name] = start.value[field.name]!;
      continue;
    }
    const parsed = parseDisplayNumber(text);
    if (!parsed.ok) {
      fieldErrors[field.name] = parsed.message;
      input[field.name] = Number.NaN;
      continue;
    }
    const stored = storedFromDisplay(field, parsed.value, system);
    input[field.name] = stored;
    // The range is checked on the stored number (what the server checks), and said in the site's unit.
    if (stored < field.min - 1e-9 || stored > field.max + 1e-9) {
      const { min, max } = fieldBounds(field, system);
      const unit = fieldUnit(field, system);
      fieldErrors[field.name] =
        `${field.label} must be from ${min.toLocaleString('en-US')} to ${max.toLocaleString('en-US')} ${unit}`;
    }
  }
  return { input, fieldErrors };
}
