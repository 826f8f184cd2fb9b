/**
 * How often a running band is bent round its wheels. Each time a point of the band runs onto a wheel it is bent
 * and straightened again: one bending cycle per wheel per pass. The twist through the guide arms is not counted.
 */
import { requireCount, requirePositive } from '../units/guards.js';

export interface FlexCyclesInput {
  /** Band speed, m/min. */
  bandSpeedMPerMin: number;
  /** Band length, mm. */
  bandLengthMm: number;
  /** Wheels the band wraps; 2 on most saws. */
  wheelCount?: number;
}

export interface FlexCycles {
  /** Times a given point of the band goes round per hour: speed ÷ length × 60. */
  passesPerHour: number;
  /** Bending cycles per hour at a given point: passes × wheels (one cycle per wheel bend). */
  bendCyclesPerHour: number;
}

/** Passes and bending cycles per hour of running time for a band of a given length at a given speed. */
export function flexCycles({ bandSpeedMPerMin, bandLengthMm, wheelCount = 2 }: FlexCyclesInput): FlexCycles {
  requirePositive(bandSpeedMPerMin, 'Band speed', 'm/min');
  requirePositive(bandLengthMm, 'Band length', 'mm');
  requireCount(wheelCount, 'Wheels');
  const passesPerHour = (bandSpeedMPerMin / (bandLengthMm / 1000)) * 60;
  return { passesPerHour, bendCyclesPerHour: passesPerHour * wheelCount };
}
