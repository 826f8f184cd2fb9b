/**
 * Kerfline's shipped band speed ranges for bi-metal blades by material group, m/min, for a 4 in (100 mm) length
 * of cut with coolant: the reference size of the printed table in Machinery's Handbook, 31st ed., p. 1245, whose
 * size, blade and coolant corrections `speed-ranges.ts` applies.
 *
 * No printed table gives one range for a whole material group (the Handbook lists speeds grade by grade), so
 * these ship as site settings a site admin can change. Checked against the Handbook where it prints a figure:
 * its worked example gives 120 ft/min (36.6 m/min) for 304 stainless at 4 in, inside the stainless range.
 */
import type { MaterialGroup } from './schema.js';

export interface SpeedRangeMPerMin {
  minMPerMin: number;
  maxMPerMin: number;
}

export const SHIPPED_BAND_SPEEDS: Readonly<Record<MaterialGroup, SpeedRangeMPerMin>> = {
  carbon_steel: { minMPerMin: 50, maxMPerMin: 90 },
  alloy_steel: { minMPerMin: 35, maxMPerMin: 65 },
  stainless_steel: { minMPerMin: 20, maxMPerMin: 40 },
  tool_steel: { minMPerMin: 20, maxMPerMin: 45 },
  aluminium: { minMPerMin: 100, maxMPerMin: 300 },
  // Bronzes at the low end, free-cutting brass at the high end.
  copper_alloy: { minMPerMin: 45, maxMPerMin: 150 },
  cast_iron: { minMPerMin: 30, maxMPerMin: 60 },
};
