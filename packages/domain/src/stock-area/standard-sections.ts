/**
 * Finds the standard AISC section (W or C) whose printed dimensions a typed shape matches, so its printed area
 * and fillet can be used (see `standard-sections-data.ts`).
 */
import { in2ToMm2, inToMm } from '../units/units.js';
import { C_SHAPES, W_SHAPES, type SectionRow } from './standard-sections-data.js';

export interface StandardSection {
  designation: string;
  /** Printed area, mm². */
  areaMm2: number;
  /** Root fillet radius, mm: kdes − tf for a W-shape; null for a channel (its kdes sits on a sloped flange). */
  rootRadiusMm: number | null;
}

export interface FlangedDimsMm {
  depthMm: number;
  flangeWidthMm: number;
  webThicknessMm: number;
  flangeThicknessMm: number;
}

/**
 * A typed dimension matches a printed one within 0.5 % or 0.002 in, whichever is larger: the Manual prints three
 * significant figures, and a figure typed in millimetres from the inch value lands within that.
 */
function close(typedMm: number, printedIn: number): boolean {
  const printedMm = inToMm(printedIn);
  return Math.abs(typedMm - printedMm) <= Math.max(0.005 * printedMm, inToMm(0.002));
}

function match(rows: readonly SectionRow[], dims: FlangedDimsMm): SectionRow | undefined {
  return rows.find(
    ([, , d, bf, tw, tf]) =>
      close(dims.depthMm, d) &&
      close(dims.flangeWidthMm, bf) &&
      close(dims.webThicknessMm, tw) &&
      close(dims.flangeThicknessMm, tf),
  );
}

/** The W-shape (for a beam) or C-shape (for a channel) whose printed dimensions these are, or null. */
export function findStandardSection(family: 'W' | 'C', dims: FlangedDimsMm): StandardSection | null {
  const row = match(family === 'W' ? W_SHAPES : C_SHAPES, dims);
  if (!row) return null;
  const [designation, areaIn2, , , , tf, kdes] = row;
  return {
    designation,
    areaMm2: in2ToMm2(areaIn2),
    rootRadiusMm: family === 'W' ? inToMm(kdes - tf) : null,
  };
}
