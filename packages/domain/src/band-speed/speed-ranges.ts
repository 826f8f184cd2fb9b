import { DomainInputError } from '../errors.js';
/**
 * Recommended band speeds for bi-metal blades by material group, in m/min (SI inside; fpm through `units`).
 *
 * The figures are from memory, not from a named handbook table: typical speeds for solid stock of about
 * 50–150 mm cut with coolant. Larger sections, harder tempers and work-hardening grades sit at the low end or
 * below it; small sections and free-machining grades at the high end.
 */
import { mPerMinToFpm } from '../units/units.js';
import type { MaterialGroup } from './schema.js';

export interface SpeedRangeMPerMin {
  minMPerMin: number;
  maxMPerMin: number;
}

/** Bi-metal blade band speeds, m/min (from memory; see the module note). */
export const BI_METAL_BAND_SPEEDS: Record<MaterialGroup, SpeedRangeMPerMin> = {
  carbon_steel: { minMPerMin: 50, maxMPerMin: 90 },
  alloy_steel: { minMPerMin: 35, maxMPerMin: 65 },
  stainless_steel: { minMPerMin: 20, maxMPerMin: 40 },
  tool_steel: { minMPerMin: 20, maxMPerMin: 45 },
  aluminium: { minMPerMin: 100, maxMPerMin: 300 },
  // Bronzes at the low end, free-cutting brass at the high end.
  copper_alloy: { minMPerMin: 45, maxMPerMin: 150 },
  cast_iron: { minMPerMin: 30, maxMPerMin: 60 },
};

export interface RecommendedBandSpeed extends SpeedRangeMPerMin {
  /** The same range in feet per minute (NIST SP 811 foot). */
  minFpm: number;
  maxFpm: number;
}

/** Recommended bi-metal band speed range for a material group, in m/min and fpm. */
export function recommendedBandSpeed(materialGroup: MaterialGroup): RecommendedBandSpeed {
  const range = BI_METAL_BAND_SPEEDS[materialGroup];
  if (range === undefined) throw new DomainInputError(`Unknown material group: ${String(materialGroup)}`);
  return { ...range, minFpm: mPerMinToFpm(range.minMPerMin), maxFpm: mPerMinToFpm(range.maxMPerMin) };
}
