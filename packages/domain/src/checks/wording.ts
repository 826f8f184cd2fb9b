/**
 * Figures in a check's words, site units first and the other system in brackets: "0.036 in (0.914 mm)" on an
 * imperial site, "0.914 mm (0.036 in)" on a metric one. Built on `units/display.ts`, with the decimals a check
 * needs (feeler gauges read thousandths of an inch).
 */
import { forceToDisplay, lengthToDisplay, stressToDisplay, type UnitSystem } from '../units/display.js';

export type CheckQuantity = 'length' | 'force' | 'stress';

const DECIMALS: Record<CheckQuantity, Record<UnitSystem, number>> = {
  length: { imperial: 3, metric: 3 },
  force: { imperial: 1, metric: 1 },
  stress: { imperial: 0, metric: 0 },
};

const other = (system: UnitSystem): UnitSystem => (system === 'imperial' ? 'metric' : 'imperial');

/** One figure in one system. Lengths in mm, forces in N, stresses in MPa. */
function inSystem(quantity: CheckQuantity, value: number, system: UnitSystem) {
  const decimals = DECIMALS[quantity][system];
  if (quantity === 'length') return lengthToDisplay(value, system, { decimals });
  if (quantity === 'force') return forceToDisplay(value, system, { decimals });
  return stressToDisplay(value * 1e6, system, { decimals });
}

/** "0.036 in (0.914 mm)": the site's unit first. */
export function bothUnits(quantity: CheckQuantity, value: number, system: UnitSystem): string {
  return `${inSystem(quantity, value, system).text} (${inSystem(quantity, value, other(system)).text})`;
}

/** "0.036–0.037 in (0.914–0.940 mm)": a range, the site's unit first. */
export function bothUnitsRange(quantity: CheckQuantity, low: number, high: number, system: UnitSystem): string {
  const part = (s: UnitSystem) => {
    const lo = inSystem(quantity, low, s);
    const hi = inSystem(quantity, high, s);
    return `${lo.text.slice(0, -lo.unit.length - 1)}–${hi.text}`;
  };
  return `${part(system)} (${part(other(system))})`;
}
