import { CM2_PER_IN2, MM2_PER_IN2, MM_PER_INCH, M_PER_FOOT, N_PER_LBF, PA_PER_PSI } from '../units/units.js';

/**
 * The units a legacy file may use for each kind of quantity, and the factor that turns one of them into the unit
 * the record stores (SI inside: millimetres, metres per minute, newtons, square millimetres, megapascals,
 * minutes). Every factor comes from the exact definitions in `units/units.ts` (NIST SP 811, Appendix B.8) or is a
 * power of ten; standard gravity (kilogram-force) is exact by definition (9.806 65 m/s², 3rd CGPM, 1901).
 */
export const QUANTITIES = ['length', 'speed', 'force', 'area', 'stress', 'duration'] as const;
export type Quantity = (typeof QUANTITIES)[number];

export type UnitOption = {
  id: string;
  label: string;
  /** Multiply a value in this unit by `toStored` to get the stored unit. */
  toStored: number;
  /** How the unit is written in headers and cells, normalised (lower case, no spaces): `mm`, `ft/min`, `in²`… */
  spellings: readonly string[];
};

export const UNITS: Record<Quantity, { stored: string; options: readonly UnitOption[] }> = {
  length: {
    stored: 'mm',
    options: [
      {
        id: 'mm',
        label: 'mm',
        toStored: 1,
        spellings: ['mm', 'millimetre', 'millimetres', 'millimeter', 'millimeters'],
      },
      { id: 'cm', label: 'cm', toStored: 10, spellings: ['cm'] },
      { id: 'm', label: 'm', toStored: 1000, spellings: ['m', 'metre', 'metres', 'meter', 'meters'] },
      {
        id: 'in',
        label: 'in',
        toStored: MM_PER_INCH,
        spellings: ['in', 'inch', 'inches', '"', 'zoll', 'pulg', 'pulgadas', 'pouce', 'pouces'],
      },
      { id: 'ft', label: 'ft', toStored: M_PER_FOOT * 1000, spellings: ['ft', 'feet', 'foot', "'"] },
    ],
  },
  speed: {
    stored: 'm/min',
    options: [
      { id: 'm/min', label: 'm/min', toStored: 1, spellings: ['m/min', 'mpm', 'mmin', 'm/mn'] },
      {
        id: 'ft/min',
        label: 'ft/min',
        toStored: M_PER_FOOT,
        spellings: ['ft/min', 'fpm', 'sfpm', 'sfm', 'fmin', 'feet/min', "'/min"],
      },
      { id: 'm/s', label: 'm/s', toStored: 60, spellings: ['m/s', 'mps', 'm/sec'] },
    ],
  },
  force: {
    stored: 'N',
    options: [
      { id: 'N', label: 'N', toStored: 1, spellings: ['n', 'newton', 'newtons'] },
      { id: 'kN', label: 'kN', toStored: 1000, spellings: ['kn'] },
      { id: 'lbf', label: 'lbf', toStored: N_PER_LBF, spellings: ['lbf', 'lb', 'lbs', 'pound', 'pounds'] },
      // Kilogram-force: 9.806 65 N exactly by the definition of standard gravity.
      { id: 'kgf', label: 'kgf', toStored: 9.80665, spellings: ['kgf', 'kp', 'kg'] },
    ],
  },
  area: {
    stored: 'mm²',
    options: [
      { id: 'mm2', label: 'mm²', toStored: 1, spellings: ['mm2', 'mm²', 'sqmm', 'mm^2'] },
      { id: 'cm2', label: 'cm²', toStored: 100, spellings: ['cm2', 'cm²', 'sqcm', 'cm^2'] },
      { id: 'm2', label: 'm²', toStored: 1e6, spellings: ['m2', 'm²', 'sqm', 'm^2'] },
      {
        id: 'in2',
        label: 'in²',
        toStored: MM2_PER_IN2,
        spellings: ['in2', 'in²', 'sqin', 'sq.in', 'in^2', 'squareinches', 'squareinch'],
      },
      { id: 'ft2', label: 'ft²', toStored: MM2_PER_IN2 * 144, spellings: ['ft2', 'ft²', 'sqft', 'ft^2'] },
    ],
  },
  stress: {
    stored: 'MPa',
    options: [
      { id: 'MPa', label: 'MPa', toStored: 1, spellings: ['mpa', 'n/mm2', 'n/mm²'] },
      { id: 'psi', label: 'psi', toStored: PA_PER_PSI / 1e6, spellings: ['psi', 'lb/in2', 'lbf/in2', 'lb/in²'] },
      { id: 'ksi', label: 'ksi', toStored: (PA_PER_PSI * 1000) / 1e6, spellings: ['ksi'] },
    ],
  },
  duration: {
    stored: 'min',
    options: [
      {
        id: 'min',
        label: 'minutes',
        toStored: 1,
        spellings: ['min', 'mins', 'minute', 'minutes', 'minuten', 'minutos'],
      },
      {
        id: 'h',
        label: 'hours',
        toStored: 60,
        spellings: ['h', 'hr', 'hrs', 'hour', 'hours', 'std', 'stunden', 'horas'],
      },
      { id: 's', label: 'seconds', toStored: 1 / 60, spellings: ['s', 'sec', 'secs', 'seconds', 'sekunden'] },
    ],
  },
};

/** Exposed for the check that 1 in² = 6.4516 cm² holds through the table (both from the exact inch). */
export const AREA_CM2_PER_IN2 = CM2_PER_IN2;

/** The unit of `quantity` with this id, or undefined. */
export function unitOption(quantity: Quantity, id: string): UnitOption | undefined {
  return UNITS[quantity].options.find((o) => o.id === id);
}

/** Lower case, no spaces, superscript two as "2": how units are compared. */
export function normaliseUnitText(text: string): string {
  return text.toLowerCase().replace(/\s+/g, '').replace(/²/g, '2').replace(/per/g, '/').replace(/\.$/, '');
}

/** The unit of `quantity` written as `text` (`"in"`, `"ft/min"`, `"sq in"`), if it is one we know. */
export function unitFromText(quantity: Quantity, text: string): UnitOption | undefined {
  const wanted = normaliseUnitText(text);
  if (wanted === '') return undefined;
  return UNITS[quantity].options.find((o) => o.spellings.some((s) => normaliseUnitText(s) === wanted));
}

/** The default unit for a quantity at a site of this unit system, when neither the header nor memory says. */
export function defaultUnit(quantity: Quantity, system: 'metric' | 'imperial'): string {
  const imperial: Record<Quantity, string> = {
    length: 'in',
    speed: 'ft/min',
    force: 'lbf',
    area: 'in2',
    stress: 'psi',
    duration: 'min',
  };
  const metric: Record<Quantity, string> = {
    length: 'mm',
    speed: 'm/min',
    force: 'N',
    area: 'cm2',
    stress: 'MPa',
    duration: 'min',
  };
  return (system === 'imperial' ? imperial : metric)[quantity];
}
