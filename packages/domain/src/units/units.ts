/**
 * Unit conversions with the exact factors of NIST SP 811 (2008), Appendix B. Kerfline stores SI
 * (millimetres, metres per minute, newtons, pascals) and converts only at the edges.
 */

/** 1 in = 25.4 mm exactly (NIST SP 811, B.8 "inch"). */
export const MM_PER_INCH = 25.4;
/** 1 ft = 0.3048 m exactly (NIST SP 811, B.8 "foot"). */
export const M_PER_FOOT = 0.3048;
/** 1 lbf = 4.448 221 615 260 5 N exactly (NIST SP 811, B.8 "pound-force"). */
export const N_PER_LBF = 4.4482216152605;
/** 1 in² = 6.4516 cm² exactly (from the inch). */
export const CM2_PER_IN2 = 6.4516;
/** 1 in² = 645.16 mm² exactly (from the inch). */
export const MM2_PER_IN2 = 645.16;
/** 1 psi = 1 lbf/in² = 6 894.757 293 168 36 Pa (derived from the exact lbf and inch). */
export const PA_PER_PSI = N_PER_LBF / (0.0254 * 0.0254);

export const inToMm = (inches: number): number => inches * MM_PER_INCH;
export const mmToIn = (mm: number): number => mm / MM_PER_INCH;
export const ftToM = (feet: number): number => feet * M_PER_FOOT;
export const mToFt = (metres: number): number => metres / M_PER_FOOT;
/** Band speed: feet per minute to metres per minute. */
export const fpmToMPerMin = (fpm: number): number => fpm * M_PER_FOOT;
/** Band speed: metres per minute to feet per minute. */
export const mPerMinToFpm = (mPerMin: number): number => mPerMin / M_PER_FOOT;
export const lbfToN = (lbf: number): number => lbf * N_PER_LBF;
export const nToLbf = (newtons: number): number => newtons / N_PER_LBF;
export const psiToPa = (psi: number): number => psi * PA_PER_PSI;
export const paToPsi = (pa: number): number => pa / PA_PER_PSI;
export const in2ToMm2 = (in2: number): number => in2 * MM2_PER_IN2;
export const mm2ToIn2 = (mm2: number): number => mm2 / MM2_PER_IN2;
export const in2ToCm2 = (in2: number): number => in2 * CM2_PER_IN2;
export const cm2ToIn2 = (cm2: number): number => cm2 / CM2_PER_IN2;
export const mm2ToCm2 = (mm2: number): number => mm2 / 100;
export const cm2ToMm2 = (cm2: number): number => cm2 * 100;
