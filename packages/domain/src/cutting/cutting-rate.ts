/**
 * Cutting rate: area of cut face per minute, the trade's measure of how fast a saw cuts (mm²/min inside;
 * in²/min and cm²/min through `units`). Cut times are in seconds, as a stopwatch or a saw's cycle counter reads.
 */
import { bundleCutAreaMm2 } from '../stock-area/cut-area.js';
import type { StockShape } from '../stock-area/schema.js';
import { requireNonNegative, requirePositive } from '../units/guards.js';
import { mm2ToIn2 } from '../units/units.js';

/**
 * Area cut per minute, mm²/min: area ÷ time.
 * @param areaMm2 area of the cut face (all pieces of a bundle), mm² (≥ 0)
 * @param cutTimeS time the cut took, s (> 0)
 */
export function cuttingRateMm2PerMin(areaMm2: number, cutTimeS: number): number {
  requireNonNegative(areaMm2, 'Area cut', 'mm²');
  requirePositive(cutTimeS, 'Cut time', 's');
  return areaMm2 / (cutTimeS / 60);
}

/** Area cut per minute in square inches per minute (in²/min), from mm² and seconds. */
export function cuttingRateIn2PerMin(areaMm2: number, cutTimeS: number): number {
  return mm2ToIn2(cuttingRateMm2PerMin(areaMm2, cutTimeS));
}

/**
 * Time a cut takes at a cutting rate, s: area ÷ rate.
 * @param areaMm2 area of the cut face, mm² (≥ 0)
 * @param rateMm2PerMin cutting rate, mm²/min (> 0)
 */
export function cutTimeSForRate(areaMm2: number, rateMm2PerMin: number): number {
  requireNonNegative(areaMm2, 'Area cut', 'mm²');
  requirePositive(rateMm2PerMin, 'Cutting rate', 'mm²/min');
  return (areaMm2 / rateMm2PerMin) * 60;
}

/** Cutting rate of a cut of `pieceCount` pieces of a stock shape (mm) that took `cutTimeS` seconds, mm²/min. */
export function cuttingRateForStockMm2PerMin(shape: StockShape, pieceCount: number, cutTimeS: number): number {
  return cuttingRateMm2PerMin(bundleCutAreaMm2(shape, pieceCount), cutTimeS);
}
