import { DomainInputError } from '../errors.js';
/**
 * Band length of a two-wheel saw from its wheels and centre distance, and the centre distance a band length needs.
 * All lengths in mm. Enter the diameters the band actually runs on (with a tyre, over the tyre); the band's own
 * thickness puts its mid-plane a further t/2 out on each wheel, adding π·t to the length, which is within the
 * tolerance a band is welded to and is left out.
 */
import { requirePositive } from '../units/guards.js';

export interface Wheels {
  /** Diameter of the driven wheel, mm. */
  driveWheelDiameterMm: number;
  /** Diameter of the idler (tension) wheel, mm. */
  idlerWheelDiameterMm: number;
}

function checkWheels({ driveWheelDiameterMm, idlerWheelDiameterMm }: Wheels): void {
  requirePositive(driveWheelDiameterMm, 'Drive wheel diameter', 'mm');
  requirePositive(idlerWheelDiameterMm, 'Idler wheel diameter', 'mm');
}

/**
 * Centre distance at which the wheels would touch, (D1 + D2)/2 in mm. Any real saw is above it, and the
 * formulas below require it.
 */
export function touchingCentreDistanceMm(wheels: Wheels): number {
  checkWheels(wheels);
  return (wheels.driveWheelDiameterMm + wheels.idlerWheelDiameterMm) / 2;
}

function checkCentreDistance(wheels: Wheels, centreDistanceMm: number): void {
  requirePositive(centreDistanceMm, 'Centre distance', 'mm');
  const touching = touchingCentreDistanceMm(wheels);
  if (centreDistanceMm <= touching) {
    throw new DomainInputError(
      `Centre distance must be more than ${touching} mm (half the sum of the wheel diameters), or the wheels overlap`,
    );
  }
}

/** Open-belt formula without guards: L = 2C + π(D1 + D2)/2 + (D1 − D2)²/(4C). */
function openBeltLength(d1: number, d2: number, c: number): number {
  return 2 * c + (Math.PI * (d1 + d2)) / 2 + (d1 - d2) ** 2 / (4 * c);
}

/** Exact tangent geometry without guards; defined down to the touching distance, where |sin φ| ≤ 1. */
function exactLength(d1: number, d2: number, c: number): number {
  const phi = Math.asin((d1 - d2) / (2 * c));
  return 2 * c * Math.cos(phi) + (Math.PI * (d1 + d2)) / 2 + phi * (d1 - d2);
}

/**
 * Band length by the open-belt formula L = 2C + π(D1 + D2)/2 + (D1 − D2)²/(4C), in mm. Exact for equal wheels
 * (2C + πD); for unequal wheels it reads short of the exact geometry by about (D1 − D2)⁴/(192·C³), far below a
 * millimetre on a saw.
 */
export function bandLengthMm({ centreDistanceMm, ...wheels }: Wheels & { centreDistanceMm: number }): number {
  checkCentreDistance(wheels, centreDistanceMm);
  return openBeltLength(wheels.driveWheelDiameterMm, wheels.idlerWheelDiameterMm, centreDistanceMm);
}

/**
 * Band length from the exact geometry of two wheels and their outer tangents, in mm:
 * L = 2C·cos φ + π(D1 + D2)/2 + φ(D1 − D2), where sin φ = (D1 − D2)/(2C).
 */
export function bandLengthExactMm({ centreDistanceMm, ...wheels }: Wheels & { centreDistanceMm: number }): number {
  checkCentreDistance(wheels, centreDistanceMm);
  return exactLength(wheels.driveWheelDiameterMm, wheels.idlerWheelDiameterMm, centreDistanceMm);
}

/**
 * Shortest band (mm) the open-belt formula allows on these wheels: its length at the touching distance. Any band
 * must be longer than this.
 */
export function shortestBandLengthMm(wheels: Wheels): number {
  return openBeltLength(wheels.driveWheelDiameterMm, wheels.idlerWheelDiameterMm, touchingCentreDistanceMm(wheels));
}

/** Checks a band length against the shortest that clears the wheels; returns the touching centre distance. */
function checkBandLength(wheels: Wheels, lengthMm: number, lengthAt: (c: number) => number): number {
  requirePositive(lengthMm, 'Band length', 'mm');
  const touching = touchingCentreDistanceMm(wheels);
  const shortest = lengthAt(touching);
  if (lengthMm <= shortest) {
    throw new DomainInputError(
      `A ${lengthMm} mm band is too short for these wheels: it must be longer than ${Math.ceil(shortest)} mm, or the wheels overlap`,
    );
  }
  return touching;
}

/**
 * Centre distance (mm) at which the open-belt formula gives `bandLengthMm`: the larger root of
 * 8C² − 4(L − P)C + (D1 − D2)² = 0 with P = π(D1 + D2)/2, C = [(L − P) + √((L − P)² − 2(D1 − D2)²)]/4.
 * The smaller root puts the wheels inside each other. Throws when the band is too short for the wheels.
 */
export function centreDistanceForBandLengthMm({
  bandLengthMm: lengthMm,
  ...wheels
}: Wheels & { bandLengthMm: number }): number {
  const { driveWheelDiameterMm: d1, idlerWheelDiameterMm: d2 } = wheels;
  checkBandLength(wheels, lengthMm, () => shortestBandLengthMm(wheels));
  const spare = lengthMm - (Math.PI * (d1 + d2)) / 2;
  // The discriminant is positive: 2C + (D1 − D2)²/(4C) is least, √2·|D1 − D2|, at C = |D1 − D2|/(2√2), which is
  // below the touching distance, so any band longer than the shortest has L − P above that least value.
  return (spare + Math.sqrt(spare * spare - 2 * (d1 - d2) ** 2)) / 4;
}

/**
 * Centre distance (mm) at which the exact geometry gives `bandLengthMm`, found by bisection. The exact length
 * grows steadily with C (dL/dC = 2·cos φ > 0), so there is one answer above the touching distance, and it lies
 * below L/2: there the length is L·cos φ + P + φ(D1 − D2) with sin φ = (D1 − D2)/L, which exceeds L because
 * φ·sin φ ≥ 1 − cos φ and P > 0.
 */
export function centreDistanceForBandLengthExactMm({
  bandLengthMm: lengthMm,
  ...wheels
}: Wheels & { bandLengthMm: number }): number {
  const { driveWheelDiameterMm: d1, idlerWheelDiameterMm: d2 } = wheels;
  let low = checkBandLength(wheels, lengthMm, (c) => exactLength(d1, d2, c));
  let high = lengthMm / 2;
  for (let i = 0; i < 200 && high - low > 1e-12 * high; i++) {
    const mid = (low + high) / 2;
    if (exactLength(d1, d2, mid) < lengthMm) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}
