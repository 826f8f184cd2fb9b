import { DomainInputError } from '../errors.js';
/**
 * Compares a band speed with the recommended range for the material and with what the saw can run.
 */
import { formatNumber, DISPLAY_UNITS } from '../units/display.js';
import type { UnitSystem } from '../units/display.js';
import { requirePositive } from '../units/guards.js';
import { mPerMinToFpm } from '../units/units.js';
import { MATERIAL_GROUP_LABELS } from './schema.js';
import type { MaterialGroup } from './schema.js';
import { recommendedBandSpeed } from './speed-ranges.js';
import type { BandSpeedOptions, RecommendedBandSpeed, SpeedRangeMPerMin } from './speed-ranges.js';

export const SPEED_POSITIONS = ['below', 'within', 'above'] as const;
export type SpeedPosition = (typeof SPEED_POSITIONS)[number];

export interface BandSpeedCheck {
  materialGroup: MaterialGroup;
  speedMPerMin: number;
  /** The range checked against, with its basis (the site's setting) and the printed corrections applied. */
  recommended: RecommendedBandSpeed;
  /** Where the speed sits against the recommended range (edges count as within). */
  position: SpeedPosition;
  /** Whether the speed is one the saw can run. */
  speedWithinSaw: boolean;
  /** Whether any part of the recommended range lies within the saw's range. */
  sawCanReachRange: boolean;
  /** The part of the recommended range the saw can run, m/min; null when it cannot reach it. */
  reachableMPerMin: SpeedRangeMPerMin | null;
  /** One line for the user, in their unit system. */
  explanation: string;
}

function speedIn(valueMPerMin: number, system: UnitSystem): string {
  const { decimals } = DISPLAY_UNITS.bandSpeed[system];
  return formatNumber(system === 'imperial' ? mPerMinToFpm(valueMPerMin) : valueMPerMin, decimals);
}

function withUnit(text: string, system: UnitSystem): string {
  return `${text} ${DISPLAY_UNITS.bandSpeed[system].unit}`;
}

function rangeIn(range: SpeedRangeMPerMin, system: UnitSystem): string {
  return withUnit(`${speedIn(range.minMPerMin, system)}–${speedIn(range.maxMPerMin, system)}`, system);
}

/**
 * Checks a band speed (m/min) against the range for a material group (the site's setting, corrected as
 * Machinery's Handbook prints for the length of cut, blade and coolant given in `options`) and against the saw's
 * speed range (m/min): below, within or above the recommended range, whether the saw can reach that range at
 * all, and a one-line explanation in the given unit system (metric unless given).
 */
export function checkBandSpeed(
  materialGroup: MaterialGroup,
  speedMPerMin: number,
  sawRange: SpeedRangeMPerMin,
  options: { system?: UnitSystem } & BandSpeedOptions = {},
): BandSpeedCheck {
  const system = options.system ?? 'metric';
  const recommended = recommendedBandSpeed(materialGroup, options);
  requirePositive(speedMPerMin, 'Band speed', 'm/min');
  requirePositive(sawRange.minMPerMin, 'Lowest band speed of the saw', 'm/min');
  requirePositive(sawRange.maxMPerMin, 'Highest band speed of the saw', 'm/min');
  if (sawRange.minMPerMin > sawRange.maxMPerMin) {
    throw new DomainInputError('Highest band speed of the saw must not be below the lowest');
  }

  const position: SpeedPosition =
    speedMPerMin < recommended.minMPerMin ? 'below' : speedMPerMin > recommended.maxMPerMin ? 'above' : 'within';
  const speedWithinSaw = speedMPerMin >= sawRange.minMPerMin && speedMPerMin <= sawRange.maxMPerMin;
  const reachMin = Math.max(recommended.minMPerMin, sawRange.minMPerMin);
  const reachMax = Math.min(recommended.maxMPerMin, sawRange.maxMPerMin);
  const sawCanReachRange = reachMin <= reachMax;
  const reachableMPerMin = sawCanReachRange ? { minMPerMin: reachMin, maxMPerMin: reachMax } : null;

  const label = MATERIAL_GROUP_LABELS[materialGroup];
  const speedText = withUnit(speedIn(speedMPerMin, system), system);
  const where = position === 'within' ? 'is within' : `is ${position}`;
  let explanation = `${speedText} ${where} the ${rangeIn(recommended, system)} range for ${label}`;
  if (!sawCanReachRange) {
    explanation += `; this saw runs ${rangeIn(sawRange, system)} and cannot reach that range`;
  } else if (position === 'below') {
    explanation += `; raise it to at least ${withUnit(speedIn(reachMin, system), system)}`;
  } else if (position === 'above') {
    explanation += `; lower it to at most ${withUnit(speedIn(reachMax, system), system)}`;
  }
  if (sawCanReachRange && !speedWithinSaw) {
    explanation += ` (this saw runs ${rangeIn(sawRange, system)})`;
  }

  return {
    materialGroup,
    speedMPerMin,
    recommended,
    position,
    speedWithinSaw,
    sawCanReachRange,
    reachableMPerMin,
    explanation: `${explanation}.`,
  };
}
