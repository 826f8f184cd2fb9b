import { DomainInputError } from '../errors.js';
/**
 * Band speed ranges for a material group, m/min (SI inside; fpm through `units`).
 *
 * The range for a group at the reference size (bi-metal blade, 4 in length of cut, with coolant) is the site's
 * `band_speed.<group>` setting (shipped values in `defaults.ts`). Machinery's Handbook, 31st ed., p. 1245, prints
 * how the speed changes from that reference, and those corrections are applied here:
 * - length of cut: +15 % at 1/4 in, +12 % at 3/4 in, +10 % at 1 1/4 in, 0 at 4 in, −12 % at 8 in. Between the
 *   printed lengths the change is interpolated linearly in the length (our reading); beyond them it stays at the
 *   end value (ours: the table says nothing there);
 * - carbon steel blades: −50 %;
 * - cutting dry: −30 % to −50 % (the range's top comes down 30 %, its bottom 50 %).
 */
import { published, type FigureBasis } from '../figures/basis.js';
import { MH31_BAND_SAW_NOTES } from '../figures/sources.js';
import { effectiveSetting, settingBasis, settingValue, type EffectiveSettings } from '../settings/effective.js';
import { requirePositive } from '../units/guards.js';
import { inToMm, mmToIn, mPerMinToFpm } from '../units/units.js';
import { SHIPPED_BAND_SPEEDS, type SpeedRangeMPerMin } from './defaults.js';
import { MATERIAL_GROUPS, type MaterialGroup } from './schema.js';

export type { SpeedRangeMPerMin };

/** The shipped reference ranges (bi-metal, 4 in, coolant), m/min: the defaults of the `band_speed.*` settings. */
export const BI_METAL_BAND_SPEEDS = SHIPPED_BAND_SPEEDS;

/** Length of cut (in) → change of band speed, as printed (Machinery's Handbook, 31st ed., p. 1245). */
export const PRINTED_SPEED_CHANGES: readonly { lengthOfCutIn: number; change: number }[] = [
  { lengthOfCutIn: 0.25, change: 0.15 },
  { lengthOfCutIn: 0.75, change: 0.12 },
  { lengthOfCutIn: 1.25, change: 0.1 },
  { lengthOfCutIn: 4, change: 0 },
  { lengthOfCutIn: 8, change: -0.12 },
];

/** Carbon steel blades run 50 % slower than bi-metal; dry cutting 30–50 % slower (same page). */
export const CARBON_BLADE_FACTOR = 0.5;
export const DRY_FACTORS = { top: 0.7, bottom: 0.5 } as const;

/** The printed change of band speed for a length of cut (mm), as a fraction (+0.15 = 15 % faster). */
export function speedChangeForLengthOfCut(lengthOfCutMm: number): number {
  requirePositive(lengthOfCutMm, 'Length of cut', 'mm');
  const inches = mmToIn(lengthOfCutMm);
  const points = PRINTED_SPEED_CHANGES;
  if (inches <= points[0]!.lengthOfCutIn) return points[0]!.change;
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    if (inches <= b.lengthOfCutIn) {
      return a.change + ((b.change - a.change) * (inches - a.lengthOfCutIn)) / (b.lengthOfCutIn - a.lengthOfCutIn);
    }
  }
  return points[points.length - 1]!.change;
}

export interface BandSpeedOptions {
  /** The site's effective settings; the shipped range when left out. */
  settings?: EffectiveSettings;
  /** Length of cut, mm; the 4 in reference when left out. */
  lengthOfCutMm?: number;
  /** Blade material; bi-metal when left out. Carbide-tipped bands are not covered by the printed table. */
  bladeMaterial?: 'bimetal' | 'carbon';
  /** Cutting without coolant. */
  dry?: boolean;
}

export interface RecommendedBandSpeed extends SpeedRangeMPerMin {
  /** The same range in feet per minute (NIST SP 811 foot). */
  minFpm: number;
  maxFpm: number;
  /** The site's range at the reference size, before the printed corrections, m/min. */
  reference: SpeedRangeMPerMin;
  /** Where the reference range comes from: the site's setting (shipped or changed). */
  basis: FigureBasis;
  /** The printed corrections applied, as factors, and their source; empty when none applies. */
  corrections: { label: string; factor: number | { top: number; bottom: number } }[];
  /** Source of the corrections (Machinery's Handbook); null when none was applied. */
  correctionBasis: FigureBasis | null;
}

/**
 * Band speed range for a material group, m/min and fpm: the site's reference range, corrected for the length
 * of cut, a carbon-steel blade and dry cutting as Machinery's Handbook prints. Each part carries its basis.
 */
export function recommendedBandSpeed(
  materialGroup: MaterialGroup,
  options: BandSpeedOptions = {},
): RecommendedBandSpeed {
  if (!(MATERIAL_GROUPS as readonly string[]).includes(materialGroup)) {
    throw new DomainInputError(`Unknown material group: ${String(materialGroup)}`);
  }
  const setting = effectiveSetting(options.settings, `band_speed.${materialGroup}`);
  const reference = {
    minMPerMin: settingValue(setting, 'minMPerMin'),
    maxMPerMin: settingValue(setting, 'maxMPerMin'),
  };
  const corrections: RecommendedBandSpeed['corrections'] = [];
  let bottom = 1;
  let top = 1;
  if (options.lengthOfCutMm !== undefined) {
    const change = speedChangeForLengthOfCut(options.lengthOfCutMm);
    if (change !== 0) {
      const percent = Math.round(change * 1000) / 10;
      corrections.push({
        label: `${percent > 0 ? '+' : '−'}${Math.abs(percent)} % for a ${formatInches(options.lengthOfCutMm)} length of cut`,
        factor: 1 + change,
      });
      bottom *= 1 + change;
      top *= 1 + change;
    }
  }
  if (options.bladeMaterial === 'carbon') {
    corrections.push({ label: '−50 % for a carbon steel blade', factor: CARBON_BLADE_FACTOR });
    bottom *= CARBON_BLADE_FACTOR;
    top *= CARBON_BLADE_FACTOR;
  }
  if (options.dry) {
    corrections.push({ label: '−30 % to −50 % for cutting dry', factor: { ...DRY_FACTORS } });
    bottom *= DRY_FACTORS.bottom;
    top *= DRY_FACTORS.top;
  }
  const minMPerMin = reference.minMPerMin * bottom;
  const maxMPerMin = reference.maxMPerMin * top;
  return {
    minMPerMin,
    maxMPerMin,
    minFpm: mPerMinToFpm(minMPerMin),
    maxFpm: mPerMinToFpm(maxMPerMin),
    reference,
    basis: settingBasis(setting),
    corrections,
    correctionBasis: corrections.length > 0 ? published(MH31_BAND_SAW_NOTES) : null,
  };
}

function formatInches(mm: number): string {
  const inches = mmToIn(mm);
  return `${Math.round(inches * 100) / 100} in (${Math.round(mm)} mm)`;
}

/** The reference length of cut of the printed speed table, 4 in, in mm. */
export const REFERENCE_LENGTH_OF_CUT_MM = inToMm(4);
