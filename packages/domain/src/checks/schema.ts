import { z } from 'zod';
import { inToMm, lbfToN, psiToPa } from '../units/units.js';
import { FWW_BAND_TENSION } from '../figures/sources.js';
import type { PrintedSource } from '../figures/basis.js';

/** The kinds of maintenance check Kerfline records, as stored ids. */
export const CHECK_KIND_IDS = [
  'guide_clearance',
  'tracking',
  'feed_pressure',
  'bearing_wear',
  'band_tension',
  'chip_brush',
] as const;
export type CheckKindId = (typeof CHECK_KIND_IDS)[number];

/** When a check falls due: at every blade change, or every so many days. */
export type CheckSchedule = 'blade_change' | 'periodic';
export type CheckUnit = 'mm' | 'N' | 'MPa' | 'condition';

export interface CheckKind {
  kind: CheckKindId;
  label: string;
  /** What is measured or looked at, and with what: the shipped wording of a site's check list. */
  measures: string;
  unit: CheckUnit;
  due: CheckSchedule;
  /** Default days between periodic checks; null for checks due at every blade change. */
  defaultIntervalDays: number | null;
  /** Default hours allowed after the check falls due before it counts as overdue. */
  defaultGraceHours: number;
}

/**
 * Which checks are due when: the shipped default set every site's list of checks starts from. Common practice,
 * no source: the checks a new band changes (its thickness, width, tension and how it runs on the wheels, and the
 * brush that clears its gullets) are done at every blade change, within one shift (8 h, our choice); the saw's
 * own wear (head pressure, bearing faces) is checked on a calendar, with a day's grace (our choice). Intervals
 * and grace are defaults a site may change.
 */
export const CHECK_KINDS: readonly CheckKind[] = [
  {
    kind: 'guide_clearance',
    label: 'Guide bearing clearance',
    measures: 'Opening of the guides across the band, with feeler gauges',
    unit: 'mm',
    due: 'blade_change',
    defaultIntervalDays: null,
    defaultGraceHours: 8,
  },
  {
    kind: 'tracking',
    label: 'Band tracking',
    measures: 'How far the tooth edge stands off the front of the wheel face',
    unit: 'mm',
    due: 'blade_change',
    defaultIntervalDays: null,
    defaultGraceHours: 8,
  },
  {
    kind: 'band_tension',
    label: 'Band tension',
    measures: 'Stress in the band, read on a band tension meter',
    unit: 'MPa',
    due: 'blade_change',
    defaultIntervalDays: null,
    defaultGraceHours: 8,
  },
  {
    kind: 'chip_brush',
    label: 'Chip brush',
    measures: 'Whether the brush reaches into the gullets, and whether it is worn',
    unit: 'condition',
    due: 'blade_change',
    defaultIntervalDays: null,
    defaultGraceHours: 8,
  },
  {
    kind: 'feed_pressure',
    label: 'Head down-force',
    measures: 'Spring-balance reading over the last inch of head travel (gravity- or spring-fed heads)',
    unit: 'N',
    due: 'periodic',
    defaultIntervalDays: 30,
    defaultGraceHours: 24,
  },
  {
    kind: 'bearing_wear',
    label: 'Guide and pressure bearing wear',
    measures: 'Largest gap under a straightedge laid across each bearing face',
    unit: 'mm',
    due: 'periodic',
    defaultIntervalDays: 30,
    defaultGraceHours: 24,
  },
];

/** Blade materials with their own tension range. */
export const BLADE_MATERIALS = ['carbon', 'bimetal', 'carbide_tipped'] as const;
export type BladeMaterial = (typeof BLADE_MATERIALS)[number];

const mpaFromPsi = (psi: number): number => psiToPa(psi) / 1e6;

/**
 * Shipped band tension ranges by blade material, MPa. Carbon and bi-metal: the blade makers' ranges printed in
 * Fine Woodworking, "Setting Bandsaw Blade Tension" (carbon-steel blades 15,000–20,000 psi, bimetal
 * 25,000–30,000 psi). Carbide-tipped: no printed range for metal-cutting bands; Kerfline starts from the bi-metal
 * range as a site setting. The blade maker's figure for a blade always overrides these.
 */
export const DEFAULT_TENSION_RANGE_MPA: Record<BladeMaterial, { minMPa: number; maxMPa: number }> = {
  carbon: { minMPa: mpaFromPsi(15000), maxMPa: mpaFromPsi(20000) },
  bimetal: { minMPa: mpaFromPsi(25000), maxMPa: mpaFromPsi(30000) },
  carbide_tipped: { minMPa: mpaFromPsi(25000), maxMPa: mpaFromPsi(30000) },
};

/** The printed source of each shipped tension range; null where none was found. */
export const TENSION_RANGE_SOURCES: Record<BladeMaterial, PrintedSource | null> = {
  carbon: FWW_BAND_TENSION,
  bimetal: FWW_BAND_TENSION,
  carbide_tipped: null,
};

/**
 * Shipped values of the check targets, SI: the defaults of the site settings in `settings/registry.ts`. Common
 * practice, no source, except where said otherwise; the tolerances and the tracking scaling are Kerfline's own
 * choices, documented beside each.
 */
export const CHECK_DEFAULTS = {
  /** Guide opening = band thickness + 0.001 in (common practice, no source). */
  guideExtraClearanceMm: inToMm(0.001),
  /**
   * Our choice: up to 0.001 in more open than the target passes; the tolerance is on the open side only, since
   * any opening tighter than the target pinches the band.
   */
  guideToleranceMm: inToMm(0.001),
  /** 1/8 in overhang on a 1 in band (common practice, no source), scaled as 1/8 of the band width. */
  trackingOverhangPerWidth: 1 / 8,
  /** Our bounds on the scaled overhang: at least 1/16 in so the set stays off the wheel on narrow bands… */
  trackingMinOverhangMm: inToMm(1 / 16),
  /** …and at most 1/4 in so a wide band keeps most of its width on the wheel. */
  trackingMaxOverhangMm: inToMm(1 / 4),
  /** Our choice: ±1/32 in around the target overhang. */
  trackingToleranceMm: inToMm(1 / 32),
  /** 8 lbf ≈ 35.6 N on a spring balance over the last inch of head travel (common practice, no source). */
  maxHeadForceN: lbfToN(8),
  /** Our choice: below 2 lbf ≈ 8.9 N over the last inch the head is taken as not feeding. */
  minHeadForceN: lbfToN(2),
  /** Our choice: a 0.001 in feeler under the straightedge is the most a bearing face may show. */
  bearingWearToleranceMm: inToMm(0.001),
} as const;

/** How a saw's head is fed: by its own weight or a spring (checked with a spring balance), or hydraulically. */
export const HEAD_FEEDS = ['gravity_spring', 'hydraulic'] as const;
export type HeadFeed = (typeof HEAD_FEEDS)[number];

// zod 4's number() already refuses NaN and ±Infinity.
const finite = (label: string, unit: string) => z.number({ message: `${label} must be a number (${unit})` });
const positive = (label: string, unit: string, max: number) =>
  finite(label, unit)
    .positive({ message: `${label} must be greater than 0 ${unit}` })
    .max(max, { message: `${label} must be at most ${max} ${unit}` });
const nonNegative = (label: string, unit: string, max: number) =>
  finite(label, unit)
    .min(0, { message: `${label} must not be negative` })
    .max(max, { message: `${label} must be at most ${max} ${unit}` });

/** Guide bearing clearance: the opening of the guide across the band, measured with feeler gauges. */
export const guideClearanceInputSchema = z.object({
  kind: z.literal('guide_clearance'),
  bandThicknessMm: positive('Band thickness', 'mm', 5),
  /** This saw's own clearance over the band thickness; the site's `guide_clearance` setting when left out. */
  extraClearanceMm: nonNegative('Extra clearance', 'mm', 1).optional(),
  /** This saw's own allowed extra opening (open side only); the site's setting when left out. */
  toleranceMm: nonNegative('Tolerance', 'mm', 1).optional(),
  measuredMm: nonNegative('Measured clearance', 'mm', 10).nullable().optional(),
});

/** Tracking: how far the band's tooth edge stands off the front of the wheel face. */
export const trackingInputSchema = z
  .object({
    kind: z.literal('tracking'),
    bandWidthMm: positive('Band width', 'mm', 200),
    /** This saw's own figures; the site's `tracking` setting for each one left out. */
    toleranceMm: nonNegative('Tolerance', 'mm', 10).optional(),
    minOverhangMm: nonNegative('Smallest overhang', 'mm', 50).optional(),
    maxOverhangMm: nonNegative('Largest overhang', 'mm', 50).optional(),
    /** Negative when the tooth edge sits back on the wheel face. */
    measuredOverhangMm: finite('Measured overhang', 'mm').nullable().optional(),
  })
  .refine((v) => v.minOverhangMm === undefined || v.maxOverhangMm === undefined || v.minOverhangMm <= v.maxOverhangMm, {
    path: ['maxOverhangMm'],
    message: 'Largest overhang must not be below the smallest',
  });

/**
 * Head down-force: spring-balance reading of a gravity- or spring-fed head over the last inch of its travel. A
 * hydraulically fed head is not checked this way (the check answers "does not apply").
 */
export const feedPressureInputSchema = z
  .object({
    kind: z.literal('feed_pressure'),
    headFeed: z.enum(HEAD_FEEDS, { message: 'Say how the head feeds: gravity_spring or hydraulic' }),
    /** This saw's own least and greatest force; the site's `head_force` setting for each one left out. */
    minHeadForceN: nonNegative('Least head force', 'N', 100000).optional(),
    maxHeadForceN: positive('Largest head force', 'N', 100000).optional(),
    measuredN: nonNegative('Measured head force', 'N', 1000000).nullable().optional(),
  })
  .refine((v) => v.minHeadForceN === undefined || v.maxHeadForceN === undefined || v.minHeadForceN <= v.maxHeadForceN, {
    path: ['maxHeadForceN'],
    message: 'Largest head force must not be below the least',
  });

/** Guide and pressure bearing wear: gap under a straightedge laid on the bearing face. */
export const bearingWearInputSchema = z.object({
  kind: z.literal('bearing_wear'),
  /** This saw's own largest gap; the site's `bearing_wear` setting when left out. */
  toleranceMm: nonNegative('Allowed gap', 'mm', 5).optional(),
  measuredGapMm: nonNegative('Measured gap', 'mm', 50).nullable().optional(),
});

/** Band tension: stress read from a band tension meter. */
export const bandTensionInputSchema = z
  .object({
    kind: z.literal('band_tension'),
    bladeMaterial: z.enum(BLADE_MATERIALS, { message: 'Blade material must be carbon, bimetal or carbide_tipped' }),
    /** The blade maker's range overrides the defaults when given. */
    minMPa: positive('Lowest tension', 'MPa', 2000).optional(),
    maxMPa: positive('Highest tension', 'MPa', 2000).optional(),
    measuredMPa: nonNegative('Measured tension', 'MPa', 5000).nullable().optional(),
  })
  .refine((v) => (v.minMPa === undefined) === (v.maxMPa === undefined), {
    path: ['maxMPa'],
    message: "Give both ends of the blade maker's tension range, or neither",
  })
  .refine((v) => v.minMPa === undefined || v.maxMPa === undefined || v.minMPa <= v.maxMPa, {
    path: ['maxMPa'],
    message: 'Highest tension must not be below the lowest',
  });

/** Chip brush: does it reach into the gullets, and is it worn? */
export const chipBrushInputSchema = z.object({
  kind: z.literal('chip_brush'),
  reachesGullets: z.boolean({ message: 'Say whether the brush reaches into the gullets' }).nullable().optional(),
  worn: z.boolean({ message: 'Say whether the brush is worn' }).nullable().optional(),
});

/** Any check, picked by `kind`: what a check form sends to get its target and pass/fail. */
export const checkInputSchema = z.discriminatedUnion(
  'kind',
  [
    guideClearanceInputSchema,
    trackingInputSchema,
    feedPressureInputSchema,
    bearingWearInputSchema,
    bandTensionInputSchema,
    chipBrushInputSchema,
  ],
  { message: `Check kind must be one of ${CHECK_KIND_IDS.join(', ')}` },
);
export type CheckInput = z.input<typeof checkInputSchema>;
