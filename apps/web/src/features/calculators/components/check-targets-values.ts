import type { z } from 'zod';
import {
  bandTensionTarget,
  bearingWearTarget,
  chipBrushCheck,
  feedPressureTarget,
  guideClearanceTarget,
  trackingTarget,
  type CheckResult,
} from '@kerfline/domain/checks/check-targets';
import {
  BLADE_MATERIALS,
  CHECK_KINDS,
  bandTensionInputSchema,
  bearingWearInputSchema,
  chipBrushInputSchema,
  feedPressureInputSchema,
  guideClearanceInputSchema,
  trackingInputSchema,
  type BladeMaterial,
  type CheckKind,
  type HeadFeed,
} from '@kerfline/domain/checks/schema';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readNumber, readQuantity, type Entry, type Quantity } from './quantities';
import { compute, placeIssues, take } from './readings';
import type { FieldErrors } from './use-entries';

export type CheckTargetsKey =
  | 'thickness'
  | 'width'
  | 'material'
  | 'maxForce'
  | 'minForce'
  | 'guideMeasured'
  | 'trackingMeasured'
  | 'forceMeasured'
  | 'wearMeasured'
  | 'tensionMeasured'
  | 'brushReaches'
  | 'brushWorn';

export const BLADE_MATERIAL_LABELS: Record<BladeMaterial, string> = {
  carbon: 'Carbon steel',
  bimetal: 'Bi-metal',
  carbide_tipped: 'Carbide tipped',
};

export const BLADE_MATERIAL_OPTIONS = BLADE_MATERIALS.map((material) => ({
  value: material,
  label: BLADE_MATERIAL_LABELS[material],
}));

/** Yes, no, or not looked at yet: for the chip brush's two questions. */
export const YES_NO_OPTIONS = [
  { value: '', label: 'Not checked yet' },
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
];

export interface CheckOutcome {
  kind: CheckKind;
  /** The target and, with a reading, pass or fail; null until the figures it needs are entered. */
  result: CheckResult | null;
  /** What is missing for the target, in words; null when there is a result. */
  waiting: string | null;
}

export interface CheckTargetsEvaluation {
  errors: FieldErrors<CheckTargetsKey>;
  checks: CheckOutcome[];
}

/** Reads an optional figure in SI; a text that cannot be read gets its message and counts as not given. */
function optional(
  entry: Entry,
  quantity: Quantity,
  key: CheckTargetsKey,
  label: string,
  errors: FieldErrors<CheckTargetsKey>,
) {
  return take(readQuantity(entry, quantity), key, label, errors, false);
}

function yesNo(entry: Entry): boolean | null {
  return entry.text === 'yes' ? true : entry.text === 'no' ? false : null;
}

/**
 * Parses one check's input with its domain schema, puts any message beside the field it concerns, and works out
 * the target (and pass or fail) when the input is sound.
 */
function runCheck<S extends z.ZodType>(
  schema: S,
  candidate: unknown,
  fields: Record<string, CheckTargetsKey>,
  errors: FieldErrors<CheckTargetsKey>,
  system: UnitSystem,
  evaluate: (input: z.output<S>) => CheckResult,
): CheckResult | null {
  const parsed = schema.safeParse(candidate);
  if (!parsed.success) {
    placeIssues(parsed.error.issues, (path) => fields[String(path[0])], errors, system);
    return null;
  }
  const worked = compute(() => evaluate(parsed.data));
  return worked.ok ? worked.value : null;
}

const kindInfo = (id: CheckKind['kind']): CheckKind => CHECK_KINDS.find((kind) => kind.kind === id)!;

/**
 * Target and tolerance of each maintenance check for the band entered, in the domain's order. Each check needs
 * only its own figures: the head force and bearing checks have targets before any band is entered.
 */
export function evaluateCheckTargets(
  entries: Record<CheckTargetsKey, Entry>,
  system: UnitSystem,
  /**
   * The site's effective settings (shipped values when left out), and how the saw's head feeds when the
   * calculator was opened for a saw (a hydraulic head has no spring-balance check).
   */
  site: { settings?: EffectiveSettings; headFeed?: HeadFeed } = {},
): CheckTargetsEvaluation {
  const context = { system, ...(site.settings ? { settings: site.settings } : {}) };
  const errors: FieldErrors<CheckTargetsKey> = {};
  const thicknessMm = take(readQuantity(entries.thickness, 'length'), 'thickness', 'Band thickness', errors);
  const widthMm = take(readQuantity(entries.width, 'length'), 'width', 'Band width', errors);
  const maxForceN = optional(entries.maxForce, 'force', 'maxForce', 'Largest head force', errors);
  const minForceN = optional(entries.minForce, 'force', 'minForce', 'Least head force', errors);
  const measured = {
    guide: optional(entries.guideMeasured, 'length', 'guideMeasured', 'Measured opening', errors) ?? null,
    // A negative overhang (the tooth edge back on the wheel face) is a reading like any other.
    tracking: optional(entries.trackingMeasured, 'length', 'trackingMeasured', 'Measured overhang', errors) ?? null,
    force: optional(entries.forceMeasured, 'force', 'forceMeasured', 'Spring-balance reading', errors) ?? null,
    wear: optional(entries.wearMeasured, 'length', 'wearMeasured', 'Gap under the straightedge', errors) ?? null,
    tensionPa: optional(entries.tensionMeasured, 'stress', 'tensionMeasured', 'Tension meter reading', errors) ?? null,
  };
  const maxForceReading = readNumber(entries.maxForce.text);
  const minForceReading = readNumber(entries.minForce.text);

  const guide =
    thicknessMm === undefined
      ? null
      : runCheck(
          guideClearanceInputSchema,
          { kind: 'guide_clearance', bandThicknessMm: thicknessMm, measuredMm: measured.guide },
          { bandThicknessMm: 'thickness', measuredMm: 'guideMeasured' },
          errors,
          system,
          (input) => guideClearanceTarget(input, context),
        );
  const tracking =
    widthMm === undefined
      ? null
      : runCheck(
          trackingInputSchema,
          { kind: 'tracking', bandWidthMm: widthMm, measuredOverhangMm: measured.tracking },
          { bandWidthMm: 'width', measuredOverhangMm: 'trackingMeasured' },
          errors,
          system,
          (input) => trackingTarget(input, context),
        );
  const feed =
    maxForceReading.kind === 'invalid' || minForceReading.kind === 'invalid'
      ? null
      : runCheck(
          feedPressureInputSchema,
          // A saw typed in by hand may feed either way: the spring-balance check is shown unless the saw says hydraulic.
          {
            kind: 'feed_pressure',
            headFeed: site.headFeed ?? 'gravity_spring',
            maxHeadForceN: maxForceN,
            minHeadForceN: minForceN,
            measuredN: measured.force,
          },
          { maxHeadForceN: 'maxForce', minHeadForceN: 'minForce', measuredN: 'forceMeasured' },
          errors,
          system,
          (input) => feedPressureTarget(input, context),
        );
  const wear = runCheck(
    bearingWearInputSchema,
    { kind: 'bearing_wear', measuredGapMm: measured.wear },
    { measuredGapMm: 'wearMeasured' },
    errors,
    system,
    (input) => bearingWearTarget(input, context),
  );
  const tension = runCheck(
    bandTensionInputSchema,
    {
      kind: 'band_tension',
      bladeMaterial: entries.material.text,
      measuredMPa: measured.tensionPa === null ? null : measured.tensionPa / 1e6,
    },
    { bladeMaterial: 'material', measuredMPa: 'tensionMeasured' },
    errors,
    system,
    (input) => bandTensionTarget(input, context),
  );
  const brush = runCheck(
    chipBrushInputSchema,
    { kind: 'chip_brush', reachesGullets: yesNo(entries.brushReaches), worn: yesNo(entries.brushWorn) },
    { reachesGullets: 'brushReaches', worn: 'brushWorn' },
    errors,
    system,
    chipBrushCheck,
  );

  const outcome = (id: CheckKind['kind'], result: CheckResult | null, missing: string | null): CheckOutcome => ({
    kind: kindInfo(id),
    result,
    waiting: result ? null : (missing ?? 'Correct the figure with a message to get this target.'),
  });
  return {
    errors,
    checks: [
      outcome(
        'guide_clearance',
        guide,
        thicknessMm === undefined ? 'Enter the band thickness above for this target.' : null,
      ),
      outcome('tracking', tracking, widthMm === undefined ? 'Enter the band width above for this target.' : null),
      outcome('band_tension', tension, null),
      outcome('chip_brush', brush, null),
      outcome('feed_pressure', feed, null),
      outcome('bearing_wear', wear, null),
    ],
  };
}
