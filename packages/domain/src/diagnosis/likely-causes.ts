import { CHECK_KINDS, type CheckKindId } from '../checks/schema.js';
import {
  OBSERVED_PATTERN_LABELS,
  REMOVAL_REASON_LABELS,
  diagnosisEvidenceSchema,
  failureModeSchema,
  type DiagnosisEvidence,
  type DiagnosisEvidenceInput,
  type FailureMode,
} from './schema.js';

/** Causes Kerfline can name, in a fixed order that also breaks ties. */
export const CAUSE_IDS = [
  'teeth_in_work_low',
  'teeth_in_work_high',
  'feed_high',
  'feed_low',
  'band_speed_high',
  'hard_spots',
  'break_in_skipped',
  'tension_off',
  'guides_worn',
  'guides_too_far_apart',
  'guides_misaligned',
  'tracking_off',
  'wheel_too_small',
  'chip_brush_faulty',
  'dull_band',
  'normal_wear',
] as const;
export type CauseId = (typeof CAUSE_IDS)[number];

export const CAUSES: Record<CauseId, { label: string; advice: string }> = {
  teeth_in_work_low: {
    label: 'Too few teeth in the work',
    advice: 'Choose a finer pitch so at least 3 teeth are in the cut on thin sections.',
  },
  teeth_in_work_high: {
    label: 'Too many teeth in the work',
    advice: 'Choose a coarser pitch so the gullets do not pack with chips.',
  },
  feed_high: { label: 'Feed or head pressure too high', advice: 'Check the head pressure and reduce the feed.' },
  feed_low: {
    label: 'Feed too light: teeth rubbing',
    advice: 'Raise the feed until the teeth cut a chip instead of rubbing.',
  },
  band_speed_high: {
    label: 'Band speed too high for the material',
    advice: 'Lower the band speed into the range for this material and size.',
  },
  hard_spots: {
    label: 'Hard spots or scale in the material',
    advice: 'Check the material for scale, flame-cut edges or hardened areas.',
  },
  break_in_skipped: {
    label: 'Break-in skipped',
    advice: 'Break in every new blade at reduced feed before full production.',
  },
  tension_off: {
    label: 'Band tension wrong',
    advice: 'Measure the tension with a tension meter and set it into its range.',
  },
  guides_worn: {
    label: 'Guides worn',
    advice: 'Inspect guide and pressure bearings and carbide inserts; replace worn parts.',
  },
  guides_too_far_apart: {
    label: 'Guide arms set too far apart',
    advice: 'Bring the guide arms as close to the work as it allows.',
  },
  guides_misaligned: {
    label: 'Guides misaligned or set too loose',
    advice: 'Re-set the guide clearance and align the guides with the band path.',
  },
  tracking_off: { label: 'Tracking off', advice: 'Re-track the band so its back runs flush with the wheel edge.' },
  wheel_too_small: {
    label: 'Wheel too small for this band (bending stress)',
    advice: 'Use a thinner band for these wheels.',
  },
  chip_brush_faulty: {
    label: 'Chip brush not clearing the gullets',
    advice: 'Set or replace the chip brush so chips are not carried back into the cut.',
  },
  dull_band: { label: 'Band dull', advice: 'Replace the band; check why it dulled (speed, feed, break-in).' },
  normal_wear: {
    label: 'Normal end of life',
    advice: 'Compare the area cut with similar saws to see whether the life was normal.',
  },
};

/**
 * Base weight of each likely cause per failure mode, 0.15–0.6. Common practice, no source: these encode
 * trade knowledge, not a published table. Keep them within [0.15, 0.6] so that one piece of strong evidence
 * (+0.5) always lifts its cause above every cause without evidence.
 */
export const BASE_WEIGHTS: Record<FailureMode, Partial<Record<CauseId, number>>> = {
  worn_out: {
    normal_wear: 0.6,
    band_speed_high: 0.45,
    break_in_skipped: 0.4,
    feed_low: 0.35,
    hard_spots: 0.3,
    chip_brush_faulty: 0.2,
  },
  dulling: { band_speed_high: 0.6, hard_spots: 0.5, break_in_skipped: 0.45, feed_low: 0.4, chip_brush_faulty: 0.25 },
  tooth_strippage: {
    teeth_in_work_low: 0.6,
    feed_high: 0.55,
    hard_spots: 0.45,
    teeth_in_work_high: 0.4,
    chip_brush_faulty: 0.35,
    break_in_skipped: 0.25,
  },
  fatigue_crack: {
    tension_off: 0.55,
    guides_too_far_apart: 0.45,
    wheel_too_small: 0.45,
    feed_high: 0.4,
    guides_worn: 0.4,
  },
  broken: {
    feed_high: 0.5,
    tension_off: 0.5,
    guides_worn: 0.35,
    guides_too_far_apart: 0.35,
    wheel_too_small: 0.35,
    teeth_in_work_low: 0.25,
    hard_spots: 0.2,
  },
  crooked_cutting: {
    guides_worn: 0.55,
    tension_off: 0.5,
    dull_band: 0.45,
    guides_too_far_apart: 0.45,
    feed_high: 0.4,
    guides_misaligned: 0.35,
    tracking_off: 0.25,
    teeth_in_work_high: 0.2,
  },
  one_sided_wear: {
    guides_misaligned: 0.55,
    guides_worn: 0.45,
    tracking_off: 0.45,
    chip_brush_faulty: 0.3,
    tension_off: 0.25,
  },
  twist: { guides_misaligned: 0.5, guides_too_far_apart: 0.45, tension_off: 0.4, guides_worn: 0.35, feed_high: 0.35 },
  other: { tension_off: 0.2, feed_high: 0.2, guides_worn: 0.2, band_speed_high: 0.2, teeth_in_work_low: 0.2 },
};

/**
 * Where the ranking comes from, in words a screen may show: the cause weights are common practice, no source (a
 * marking for tests and the contributor guide, never the screen), weighed with the saw's own records.
 */
export const DIAGNOSIS_BASIS =
  'Kerfline’s own weighing of the usual causes (no printed source ranks them), adjusted by this saw’s checks, cut logs and break-in record';

/** Effect of strong evidence (a failed check, a reported fact, every cut log out of range). */
export const STRONG_EVIDENCE = 0.5;
/** Effect of an overdue check: the setting may have drifted, but nobody saw it wrong. */
export const OVERDUE_EVIDENCE = 0.25;
/** Effect of evidence against a cause (a current passed check, a fact reported as fine). */
export const COUNTER_EVIDENCE = -0.15;

/** Which causes a failed or overdue check of each kind speaks for. */
const CAUSES_BY_CHECK: Record<CheckKindId, CauseId[]> = {
  guide_clearance: ['guides_misaligned', 'guides_worn'],
  bearing_wear: ['guides_worn'],
  band_tension: ['tension_off'],
  feed_pressure: ['feed_high'],
  tracking: ['tracking_off'],
  chip_brush: ['chip_brush_faulty'],
};

export interface EvidenceLine {
  text: string;
  /** What this line added to (or took from) the score. */
  effect: number;
}

export interface RankedCause {
  cause: CauseId;
  label: string;
  advice: string;
  baseWeight: number;
  /** Base weight plus the evidence effects, never below 0, rounded to 6 decimals. */
  score: number;
  evidence: EvidenceLine[];
}

export interface Diagnosis {
  mode: FailureMode;
  modeLabel: string;
  causes: RankedCause[];
  basis: string;
}

const modeLabel = (mode: FailureMode): string =>
  mode in REMOVAL_REASON_LABELS
    ? REMOVAL_REASON_LABELS[mode as keyof typeof REMOVAL_REASON_LABELS]
    : OBSERVED_PATTERN_LABELS[mode as keyof typeof OBSERVED_PATTERN_LABELS];

/** Share-weighted effect for cut logs: 0.25 when one log is out of range, up to 0.5 when all are. */
const logEffect = (share: number): number => OVERDUE_EVIDENCE + (STRONG_EVIDENCE - OVERDUE_EVIDENCE) * share;

function collectEvidence(e: DiagnosisEvidence): Map<CauseId, EvidenceLine[]> {
  const lines = new Map<CauseId, EvidenceLine[]>();
  const add = (cause: CauseId, text: string, effect: number) => {
    const list = lines.get(cause) ?? [];
    list.push({ text, effect });
    lines.set(cause, list);
  };

  // One verdict per check kind, the worst one given: failed, then overdue, then passed and current.
  const rank = (c: { passed: boolean | null; overdue: boolean }) =>
    c.passed === false ? 3 : c.overdue ? 2 : c.passed === true ? 1 : 0;
  const worst = new Map<CheckKindId, { passed: boolean | null; overdue: boolean }>();
  for (const c of e.checks) {
    const prev = worst.get(c.kind);
    if (prev === undefined || rank(c) > rank(prev)) worst.set(c.kind, c);
  }
  for (const info of CHECK_KINDS) {
    const c = worst.get(info.kind);
    if (c === undefined) continue;
    for (const cause of CAUSES_BY_CHECK[info.kind]) {
      if (c.passed === false) add(cause, `Last ${info.label.toLowerCase()} check failed.`, STRONG_EVIDENCE);
      else if (c.overdue) add(cause, `${info.label} check is overdue.`, OVERDUE_EVIDENCE);
      else if (c.passed === true)
        add(cause, `Last ${info.label.toLowerCase()} check passed and is current.`, COUNTER_EVIDENCE);
    }
  }

  const { min, max } = e.teethInWorkRange;
  const teeth = e.cutLogs.map((l) => l.teethInWork).filter((t): t is number => t !== null);
  if (teeth.length > 0) {
    const low = teeth.filter((t) => t < min).length;
    const high = teeth.filter((t) => t > max).length;
    if (low > 0)
      add(
        'teeth_in_work_low',
        `${low} of ${teeth.length} cut logs had fewer than ${min} teeth in the work.`,
        logEffect(low / teeth.length),
      );
    else
      add('teeth_in_work_low', `All ${teeth.length} cut logs had at least ${min} teeth in the work.`, COUNTER_EVIDENCE);
    if (high > 0)
      add(
        'teeth_in_work_high',
        `${high} of ${teeth.length} cut logs had more than ${max} teeth in the work.`,
        logEffect(high / teeth.length),
      );
    else
      add('teeth_in_work_high', `All ${teeth.length} cut logs had at most ${max} teeth in the work.`, COUNTER_EVIDENCE);
  }

  const speeds = e.cutLogs.filter(
    (l): l is { teethInWork: number | null; bandSpeedMPerMin: number; recommendedMaxMPerMin: number } =>
      l.bandSpeedMPerMin !== null && l.recommendedMaxMPerMin !== null,
  );
  if (speeds.length > 0) {
    const fast = speeds.filter((l) => l.bandSpeedMPerMin > l.recommendedMaxMPerMin);
    if (fast.length > 0) {
      const worstRatio = Math.max(...fast.map((l) => l.bandSpeedMPerMin / l.recommendedMaxMPerMin));
      add(
        'band_speed_high',
        `${fast.length} of ${speeds.length} cut logs ran above the recommended band speed (up to ${Math.round((worstRatio - 1) * 100)} % over).`,
        logEffect(fast.length / speeds.length),
      );
    } else {
      add('band_speed_high', `All ${speeds.length} cut logs ran within the recommended band speed.`, COUNTER_EVIDENCE);
    }
  }

  if (e.breakInDone === false) add('break_in_skipped', 'Break-in was not done on this blade.', STRONG_EVIDENCE);
  if (e.breakInDone === true) add('break_in_skipped', 'Break-in was done on this blade.', COUNTER_EVIDENCE);

  if (e.bendingStressRatio !== null) {
    const r = e.bendingStressRatio;
    if (r > 1)
      add(
        'wheel_too_small',
        `Bending stress on these wheels is ${r.toFixed(2)}× the limit used for this band.`,
        STRONG_EVIDENCE,
      );
    else
      add(
        'wheel_too_small',
        `Bending stress on these wheels is within the limit (${r.toFixed(2)}×).`,
        COUNTER_EVIDENCE,
      );
  }

  if (e.guideArmsSetWide === true)
    add('guides_too_far_apart', 'Guide arms were found set wider than the work needs.', STRONG_EVIDENCE);
  if (e.guideArmsSetWide === false)
    add('guides_too_far_apart', 'Guide arms were found set close to the work.', COUNTER_EVIDENCE);

  if (e.hardSpotsReported === true)
    add('hard_spots', 'Hard spots or scale were reported in the material.', STRONG_EVIDENCE);
  if (e.hardSpotsReported === false)
    add('hard_spots', 'The material was reported free of hard spots.', COUNTER_EVIDENCE);

  return lines;
}

const round6 = (x: number): number => Math.round(x * 1e6) / 1e6;

/**
 * Likely causes of a blade failure, ranked. Each cause of the failure mode starts at its base weight
 * (common practice, no source) and is moved by the evidence from this saw: failed checks and every cut log
 * out of range add up to +0.5 each, overdue checks +0.25, current passed checks and facts reported as fine
 * −0.15. Only causes that belong to the mode are listed. Sorted by score, then base weight, then the fixed
 * order of `CAUSE_IDS`, so equal inputs always give the same order.
 *
 * @param mode removal reason or observed pattern
 * @param evidence plain facts about the saw; omit for the base ranking
 */
export function rankLikelyCauses(mode: FailureMode, evidence: DiagnosisEvidenceInput = {}): Diagnosis {
  const m = failureModeSchema.parse(mode);
  const e = diagnosisEvidenceSchema.parse(evidence);
  const lines = collectEvidence(e);
  const weights = BASE_WEIGHTS[m];
  const causes: RankedCause[] = CAUSE_IDS.filter((id) => weights[id] !== undefined).map((id) => {
    const baseWeight = weights[id]!;
    const ev = lines.get(id) ?? [];
    const score = round6(
      Math.max(
        0,
        ev.reduce((s, l) => s + l.effect, baseWeight),
      ),
    );
    return { cause: id, ...CAUSES[id], baseWeight, score, evidence: ev };
  });
  causes.sort(
    (a, b) =>
      b.score - a.score || b.baseWeight - a.baseWeight || CAUSE_IDS.indexOf(a.cause) - CAUSE_IDS.indexOf(b.cause),
  );
  return { mode: m, modeLabel: modeLabel(m), causes, basis: DIAGNOSIS_BASIS };
}
