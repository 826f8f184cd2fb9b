/**
 * The one place where the records' services call the trade's computations in packages/domain: break-in plan,
 * likely causes, cut area, teeth in the work and band speed. Keeping the calls together means a change of a
 * domain function's signature touches this file only. Each takes the site's effective settings, so its figures
 * are the site's own and say so.
 */
import { planBreakInForSite } from '@kerfline/domain/break-in/break-in-plan';
import { rankLikelyCauses, type Diagnosis } from '@kerfline/domain/diagnosis/likely-causes';
import type { DiagnosisEvidenceInput, FailureMode } from '@kerfline/domain/diagnosis/schema';
import { bundleCutAreaMm2 } from '@kerfline/domain/stock-area/cut-area';
import type { StockShape } from '@kerfline/domain/stock-area/schema';
import {
  judgeTeethInWork,
  teethInWorkForStock,
  teethInWorkRule,
  type TeethInWorkRule,
} from '@kerfline/domain/teeth-in-work/teeth-in-work';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import type { Pitch } from '@kerfline/domain/teeth-in-work/schema';
import { engagedLengthMm } from '@kerfline/domain/teeth-in-work/engaged-length';
import type { BladeMaterial } from '@kerfline/domain/checks/schema';
import { checkBandSpeed } from '@kerfline/domain/band-speed/check-band-speed';
import { recommendedBandSpeed } from '@kerfline/domain/band-speed/speed-ranges';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { BreakInAdvice } from '@kerfline/domain/blade-runs/schema';
import type { RecordWarning } from '@kerfline/domain/records/schema';

type SawBand = {
  id: string;
  bandWidthMm: number;
  bandThicknessMm: number;
  bandLengthMm: number;
  bandSpeedMinMPerMin: number;
  bandSpeedMaxMPerMin: number;
};
type SpecBand = {
  id: string;
  name: string;
  widthMm: number;
  thicknessMm: number;
  lengthMm: number;
  material: BladeMaterial;
};

/**
 * The blade material as the band speed corrections know it: the printed table covers bi-metal and carbon steel
 * blades; carbide-tipped bands are read against the bi-metal range (no printed correction for them).
 */
function speedBlade(material: BladeMaterial | null | undefined): 'bimetal' | 'carbon' | undefined {
  return material === 'carbon' ? 'carbon' : material === 'bimetal' ? 'bimetal' : undefined;
}

/**
 * Where a spec does not match the band the saw takes. Our tolerances, not a standard: 1 % on length (a band
 * welded for another saw will not tension), 2 % on width and thickness (inch and metric sizes of one band
 * differ by less).
 */
export function specFitWarnings(saw: SawBand, spec: SpecBand): RecordWarning[] {
  const warnings: RecordWarning[] = [];
  const off = (a: number, b: number, share: number) => Math.abs(a - b) > share * b;
  if (off(spec.lengthMm, saw.bandLengthMm, 0.01))
    warnings.push({
      code: 'length_mismatch',
      message: `${spec.name} is ${Math.round(spec.lengthMm)} mm long; this saw takes ${Math.round(saw.bandLengthMm)} mm bands.`,
    });
  if (off(spec.widthMm, saw.bandWidthMm, 0.02))
    warnings.push({
      code: 'width_mismatch',
      message: `${spec.name} is ${spec.widthMm} mm wide; this saw takes ${Number(saw.bandWidthMm.toFixed(2))} mm bands.`,
    });
  if (off(spec.thicknessMm, saw.bandThicknessMm, 0.02))
    warnings.push({
      code: 'thickness_mismatch',
      message: `${spec.name} is ${spec.thicknessMm} mm thick; this saw takes ${Number(saw.bandThicknessMm.toFixed(3))} mm bands.`,
    });
  return warnings;
}

/**
 * The break-in plan for a saw, band and material: the site's break-in steps (its `break_in` setting), the
 * material's band speeds for this blade (the site's range, corrected for a carbon blade), and step areas from
 * this saw's usual cutting rate for the material when its cut logs give one.
 */
export function breakInAdvice(
  saw: SawBand,
  spec: SpecBand,
  materialGroup: MaterialGroup | null,
  normalCuttingRateMm2PerMin: number | null,
  system: UnitSystem = 'metric',
  settings?: EffectiveSettings,
): BreakInAdvice {
  const rate =
    normalCuttingRateMm2PerMin !== null && normalCuttingRateMm2PerMin > 0 ? normalCuttingRateMm2PerMin : null;
  const bladeMaterial = speedBlade(spec.material);
  let bandSpeed: BreakInAdvice['bandSpeed'] = null;
  if (materialGroup) {
    const recommended = recommendedBandSpeed(materialGroup, { bladeMaterial, settings });
    const low = Math.max(recommended.minMPerMin, saw.bandSpeedMinMPerMin);
    const high = Math.min(recommended.maxMPerMin, saw.bandSpeedMaxMPerMin);
    bandSpeed = { recommended, reachableMPerMin: low <= high ? { minMPerMin: low, maxMPerMin: high } : null };
  }
  return {
    sawId: saw.id,
    bladeSpecId: spec.id,
    materialGroup,
    plan: planBreakInForSite(
      'time',
      rate,
      materialGroup ? { materialGroup, bladeMaterial, system, settings } : { system, settings },
    ),
    normalCuttingRateMm2PerMin: rate,
    cuttingRateBasis:
      rate === null
        ? 'No timed cut logs of this saw for this material yet, so the plan is given in minutes only.'
        : 'Median cutting rate of this saw’s timed cut logs for this material in the last 90 days.',
    bandSpeed,
    warnings: specFitWarnings(saw, spec),
  };
}

/** What a cut log stores beside what was typed: areas, teeth in the work, warnings. */
export function cutLogFigures(input: {
  shape: StockShape;
  pieceCount: number;
  piecesAcross: number;
  quantity: number;
  materialGroup: MaterialGroup;
  bandSpeedMPerMin: number | null;
  pitch: Pitch | null;
  /** The blade's material, for the band speed range (a carbon blade runs slower); bi-metal when unknown. */
  bladeMaterial?: BladeMaterial | null;
  saw: SawBand;
  unitSystem: UnitSystem;
  /** The site's settings: its teeth-in-work guards and band speed ranges. */
  settings?: EffectiveSettings;
}): {
  areaPerCutMm2: number;
  areaCutMm2: number;
  teethInWorkMin: number | null;
  teethInWorkMax: number | null;
  warnings: RecordWarning[];
} {
  const areaPerCutMm2 = bundleCutAreaMm2(input.shape, input.pieceCount);
  const warnings: RecordWarning[] = [];
  let teethInWorkMin: number | null = null;
  let teethInWorkMax: number | null = null;
  if (input.pitch) {
    const range = teethInWorkForStock(input.shape, input.pitch, input.piecesAcross);
    teethInWorkMin = range.min;
    teethInWorkMax = range.max;
    warnings.push(...judgeTeethInWork(range, teethInWorkRule(input.settings)).warnings);
  } else {
    warnings.push({
      code: 'no_blade_recorded',
      message: 'No blade was recorded on this saw at that time, so the teeth in the work could not be worked out.',
    });
  }
  if (input.bandSpeedMPerMin !== null) {
    const check = checkBandSpeed(
      input.materialGroup,
      input.bandSpeedMPerMin,
      { minMPerMin: input.saw.bandSpeedMinMPerMin, maxMPerMin: input.saw.bandSpeedMaxMPerMin },
      // The printed table's speeds depend on the length of cut: the most metal the band crosses in this cut.
      {
        system: input.unitSystem,
        bladeMaterial: speedBlade(input.bladeMaterial),
        lengthOfCutMm: engagedLengthMm(input.shape, input.piecesAcross).maxMm,
        settings: input.settings,
      },
    );
    if (check.position !== 'within')
      warnings.push({ code: `band_speed_${check.position}`, message: check.explanation });
    else if (!check.speedWithinSaw) warnings.push({ code: 'band_speed_outside_saw', message: check.explanation });
  }
  return { areaPerCutMm2, areaCutMm2: areaPerCutMm2 * input.quantity, teethInWorkMin, teethInWorkMax, warnings };
}

/**
 * The cut log's teeth in the work as the diagnosis reads it (one figure per log): the least when it is below
 * the site's fewest (teeth may strip), else the greatest when it is above the most (gullets pack), else the
 * least. So each log counts once, on the side where it breaks the rule.
 */
export function teethForDiagnosis(
  min: number | null,
  max: number | null,
  rule: TeethInWorkRule = teethInWorkRule(),
): number | null {
  if (min === null || max === null) return null;
  if (min < rule.fewest) return min;
  if (max > rule.most) return max;
  return min;
}

export type DiagnosisCutLog = {
  teethInWorkMin: number | null;
  teethInWorkMax: number | null;
  bandSpeedMPerMin: number | null;
  materialGroup: MaterialGroup;
};

/**
 * Ranked likely causes for a failure mode, fed with the saw's cut logs during the run, the run's break-in
 * record and the saw's latest checks (their verdicts, and whether each was overdue), read against the site's
 * teeth-in-work guards and band speed ranges.
 */
export function diagnose(
  mode: FailureMode,
  evidence: {
    cutLogs: DiagnosisCutLog[];
    breakInFollowed: boolean | null;
    /** The saw's latest check of each rule kind: its verdict and whether it was overdue. */
    checks?: DiagnosisEvidenceInput['checks'];
    settings?: EffectiveSettings;
  },
): Diagnosis {
  const rule = teethInWorkRule(evidence.settings);
  return rankLikelyCauses(mode, {
    checks: evidence.checks ?? [],
    cutLogs: evidence.cutLogs.map((l) => ({
      teethInWork: teethForDiagnosis(l.teethInWorkMin, l.teethInWorkMax, rule),
      bandSpeedMPerMin: l.bandSpeedMPerMin,
      recommendedMaxMPerMin: recommendedBandSpeed(l.materialGroup, { settings: evidence.settings }).maxMPerMin,
    })),
    breakInDone: evidence.breakInFollowed,
    teethInWorkRange: { min: rule.fewest, max: rule.most },
  });
}
