import { DomainInputError } from '../errors.js';
/**
 * Stresses in a band running over the wheels, in pascals. Inputs in mm and N (SI inside).
 *
 * Bending: a thin band wrapped on a wheel of diameter D has its outer fibre strained by t/D, so
 * σ_b = E·t/D. A band much wider than it is thick bends as a plate rather than a beam, which raises the figure
 * by 1/(1 − ν²) (about 9 % for steel); pass `poissonRatio` for that form, E·t/((1 − ν²)·D), as used for flat
 * metal belts in Shigley's Mechanical Engineering Design, chapter 17.
 * Tension: the tension force spread over the band's section, σ_t = F/(w·t).
 * Their sum is the peak stress each bend adds to the static pull, used here as an index of fatigue: a band is
 * flagged when it exceeds a threshold the caller chooses (from the blade maker's data or the site's own history).
 */
import { requireNonNegative, requirePositive } from '../units/guards.js';

/**
 * Young's modulus of carbon steel, 207 GPa = 30 000 ksi, as a university strength-of-materials table prints it for
 * 0.2–0.8 % C steels, within Gere's 190–210 GPa for steels (see `STEEL_MODULUS_SOURCE`).
 */
export const STEEL_ELASTIC_MODULUS_PA = 207e9;

export interface BendingInput {
  /** Band (gauge) thickness, mm. */
  bandThicknessMm: number;
  /** Diameter the band bends round, mm; with unequal wheels use the smaller, which bends it hardest. */
  wheelDiameterMm: number;
  /** Young's modulus of the band's backing steel, Pa; 207 GPa unless given. */
  elasticModulusPa?: number;
  /** Poisson's ratio for the plate form; leave out for the thin-beam figure E·t/D. */
  poissonRatio?: number;
}

/** Bending stress at the band's surface on a wheel, Pa: E·t/D, or E·t/((1 − ν²)·D) with a Poisson's ratio. */
export function bendingStressPa({
  bandThicknessMm,
  wheelDiameterMm,
  elasticModulusPa = STEEL_ELASTIC_MODULUS_PA,
  poissonRatio = 0,
}: BendingInput): number {
  requirePositive(bandThicknessMm, 'Band thickness', 'mm');
  requirePositive(wheelDiameterMm, 'Wheel diameter', 'mm');
  requirePositive(elasticModulusPa, 'Elastic modulus', 'Pa');
  requireNonNegative(poissonRatio, "Poisson's ratio", '');
  if (poissonRatio >= 0.5) throw new DomainInputError("Poisson's ratio must be below 0.5 (steel is about 0.29)");
  if (bandThicknessMm >= wheelDiameterMm)
    throw new DomainInputError('Band thickness must be far smaller than the wheel diameter');
  return (elasticModulusPa * bandThicknessMm) / ((1 - poissonRatio ** 2) * wheelDiameterMm);
}

export interface BandSection {
  /** Band width, mm. The full width gives the usual figure; the width below the gullets gives the stricter one. */
  bandWidthMm: number;
  /** Band thickness, mm. */
  bandThicknessMm: number;
}

function sectionMm2({ bandWidthMm, bandThicknessMm }: BandSection): number {
  requirePositive(bandWidthMm, 'Band width', 'mm');
  requirePositive(bandThicknessMm, 'Band thickness', 'mm');
  return bandWidthMm * bandThicknessMm;
}

/** Tension stress in the band, Pa: σ_t = F/(w·t). N/mm² are MPa, hence × 10⁶. */
export function tensionStressPa({ tensionForceN, ...section }: BandSection & { tensionForceN: number }): number {
  const areaMm2 = sectionMm2(section);
  return (requireNonNegative(tensionForceN, 'Tension force', 'N') / areaMm2) * 1e6;
}

/** Tension force giving a tension stress in the band, N: F = σ_t·w·t (the inverse of `tensionStressPa`). */
export function tensionForceForStressN({
  tensionStressPa: stressPa,
  ...section
}: BandSection & { tensionStressPa: number }): number {
  const areaMm2 = sectionMm2(section);
  return (requireNonNegative(stressPa, 'Tension stress', 'Pa') / 1e6) * areaMm2;
}

export interface FatigueIndexInput extends BendingInput, BandSection {
  /** Tension force in the band, N. */
  tensionForceN: number;
  /** Combined stress above which the band is flagged, Pa. No default: it belongs to the blade and the site. */
  fatigueThresholdPa: number;
}

export interface FatigueIndex {
  bendingStressPa: number;
  tensionStressPa: number;
  /** Bending plus tension, Pa. */
  combinedStressPa: number;
  fatigueThresholdPa: number;
  /** True when the combined stress is above the threshold. */
  aboveThreshold: boolean;
}

/** Bending, tension and combined stress of a band on its wheels (Pa), flagged above the given threshold. */
export function bandFatigueIndex(input: FatigueIndexInput): FatigueIndex {
  const fatigueThresholdPa = requirePositive(input.fatigueThresholdPa, 'Fatigue threshold', 'Pa');
  const bending = bendingStressPa(input);
  const tension = tensionStressPa(input);
  const combined = bending + tension;
  return {
    bendingStressPa: bending,
    tensionStressPa: tension,
    combinedStressPa: combined,
    fatigueThresholdPa,
    aboveThreshold: combined > fatigueThresholdPa,
  };
}
