import type { Saw } from '@kerfline/domain/saws/schema';
import { bandLengthMm } from '@kerfline/domain/band/band-length';
import { bendingStressPa } from '@kerfline/domain/band/band-stress';
import { flexCycles } from '@kerfline/domain/band/flex-cycles';
import { guideClearanceTarget, trackingTarget } from '@kerfline/domain/checks/check-targets';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';

/**
 * A recorded band length further than this from the wheels' geometry is worth a second look: the take-up
 * travels a few millimetres, not a few percent (common practice, no source).
 */
export const LENGTH_MISMATCH_FRACTION = 0.01;

export type SawFigures = {
  /** Open-belt length for the recorded wheels and centre distance, mm. */
  geometryLengthMm: number;
  /** Recorded minus geometry, mm. */
  lengthDifferenceMm: number;
  lengthMismatch: boolean;
  /** Bending stress at the band surface on the wheels, E·t/D, Pa. */
  bendingStressPa: number;
  /** Bending cycles per hour of running at the saw's top band speed. */
  bendCyclesPerHourAtTopSpeed: number;
  /** Target guide opening and its passing range, mm, and where the site's figures for it come from. */
  guideClearance: { targetMm: number; minMm: number; maxMm: number; basis: FigureBasis | null };
  /** Target overhang of the tooth edge past the wheel face, mm. */
  trackingOverhangMm: number;
  trackingBasis: FigureBasis | null;
};

/**
 * The trade's figures for one saw's recorded geometry, all from the domain's computations (SI in and out).
 * Returns null when the record cannot give them (a centre distance too short for the wheels, say).
 */
export function sawFigures(
  saw: Saw,
  /** The saw's site's settings (guide opening, tracking); shipped values for any left out. */
  settings: EffectiveSettings = {},
): SawFigures | null {
  try {
    const wheels = { driveWheelDiameterMm: saw.wheelDiameterMm, idlerWheelDiameterMm: saw.wheelDiameterMm };
    const geometryLengthMm = bandLengthMm({ ...wheels, centreDistanceMm: saw.centreDistanceMm });
    const lengthDifferenceMm = saw.bandLengthMm - geometryLengthMm;
    const opening = guideClearanceTarget(
      { kind: 'guide_clearance', bandThicknessMm: saw.bandThicknessMm },
      { settings },
    );
    const tracking = trackingTarget({ kind: 'tracking', bandWidthMm: saw.bandWidthMm }, { settings });
    return {
      geometryLengthMm,
      lengthDifferenceMm,
      lengthMismatch: Math.abs(lengthDifferenceMm) > LENGTH_MISMATCH_FRACTION * geometryLengthMm,
      bendingStressPa: bendingStressPa({ bandThicknessMm: saw.bandThicknessMm, wheelDiameterMm: saw.wheelDiameterMm }),
      bendCyclesPerHourAtTopSpeed: flexCycles({
        bandSpeedMPerMin: saw.bandSpeedMaxMPerMin,
        bandLengthMm: saw.bandLengthMm,
      }).bendCyclesPerHour,
      guideClearance: { targetMm: opening.target!, minMm: opening.min!, maxMm: opening.max!, basis: opening.basis },
      trackingOverhangMm: tracking.target!,
      trackingBasis: tracking.basis,
    };
  } catch {
    return null;
  }
}
