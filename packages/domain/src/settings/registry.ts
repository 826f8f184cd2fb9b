/**
 * Site settings: figures the trade has no single printed value for (band speeds by material, tension ranges,
 * check tolerances, head-force limits). Each ships with a default that a site admin can change for their site;
 * the change is stored per site and audited (who, when, old and new value), and every screen that uses the
 * figure says whether it is the shipped value or the site's own.
 *
 * A setting is a flat record of named numbers in SI units; each field names the display quantity it is shown
 * and typed in, so one generic editor serves every setting in the site's unit system.
 */
import { z } from 'zod';
import type { DisplayQuantityKind } from '../units/display.js';
import type { FigureBasis } from '../figures/basis.js';
import { CHECK_DEFAULTS, DEFAULT_TENSION_RANGE_MPA, TENSION_RANGE_SOURCES } from '../checks/schema.js';
import { SHIPPED_BAND_SPEEDS } from '../band-speed/defaults.js';
import { MATERIAL_GROUPS, MATERIAL_GROUP_LABELS } from '../band-speed/schema.js';
import { BREAK_IN_DEFAULTS } from '../break-in/schema.js';

/**
 * Numbers that are plain counts in any unit system: days, minutes, a percentage of a normal value, teeth. Their
 * field names end in the unit (`intervalDays`, `startMinutes`, `startFeedPercent`, `fewestTeeth`).
 */
export const PLAIN_QUANTITIES = ['days', 'minutes', 'percent', 'teeth'] as const;
export type PlainQuantity = (typeof PLAIN_QUANTITIES)[number];

export interface SettingField {
  /** The key of the value in the setting's record, with its SI unit in the name (`toleranceMm`). */
  name: string;
  label: string;
  /** How the value is shown and typed: a display quantity, or a plain count. */
  quantity: DisplayQuantityKind | PlainQuantity;
  /** Decimals to show beyond the quantity's default (thousandths of an inch for guide clearances). */
  decimals?: { metric: number; imperial: number };
  /** Accepted range in SI, so a typo in the units is refused with a message that says the range. */
  min: number;
  max: number;
}

/** The shipped value's basis: a printed source, or none (then the note says why it is a shop default). */
export type ShippedBasis = Extract<FigureBasis, { kind: 'published' }> | { kind: 'shipped_default'; note: string };

export interface SiteSettingDefinition {
  key: string;
  /** Groups settings on the settings page. */
  group: 'band_speed' | 'band_tension' | 'checks' | 'blades';
  label: string;
  /** One or two sentences: what the figure is for and what changing it does. */
  help: string;
  fields: readonly SettingField[];
  defaults: Readonly<Record<string, number>>;
  basis: ShippedBasis;
  /** Cross-field rules (lowest ≤ highest), as messages on a field. */
  issues?: (value: Record<string, number>) => { path: string; message: string }[];
}

const atMost = (low: string, high: string, what: string) => (v: Record<string, number>) =>
  (v[low] ?? 0) <= (v[high] ?? 0) ? [] : [{ path: high, message: `The highest ${what} must not be below the lowest` }];

const NO_PRINTED_SOURCE =
  'No printed table gives one value for this; Kerfline ships a common shop figure as a starting point for your site.';

const BAND_SPEED_NOTE =
  "No printed table gives one band speed range for a whole material group: Machinery's Handbook (31st ed., p. 1245) lists speeds grade by grade for 4 in material. Kerfline ships a range for the group as your site's starting point; the Handbook's corrections for the length of cut, carbon-steel blades and cutting dry are applied to it.";

const increasing = (fields: string[], what: string) => (v: Record<string, number>) => {
  const issues: { path: string; message: string }[] = [];
  for (let i = 1; i < fields.length; i++)
    if ((v[fields[i]!] ?? 0) <= (v[fields[i - 1]!] ?? 0))
      issues.push({ path: fields[i]!, message: `Each ${what} must be above the one before it` });
  return issues;
};

const bladeMaterialLabel = (material: string) => (material === 'bimetal' ? 'bi-metal' : material.replace('_', '-'));

/**
 * The registry. Keys are stable (stored in the database); labels and defaults may be refined. The trade
 * figures' module owners keep defaults and bases here in step with the computations that read them.
 */
export const SITE_SETTINGS: readonly SiteSettingDefinition[] = [
  {
    key: 'guide_clearance',
    group: 'checks',
    label: 'Guide opening',
    help: 'Added to the band thickness for the guide opening, and how much more open than that still passes. A reading tighter than the target fails: it pinches the band.',
    fields: [
      {
        name: 'extraClearanceMm',
        label: 'Opening over the band thickness',
        quantity: 'length',
        decimals: { metric: 3, imperial: 4 },
        min: 0,
        max: 0.5,
      },
      {
        name: 'toleranceMm',
        label: 'Allowed extra opening',
        quantity: 'length',
        decimals: { metric: 3, imperial: 4 },
        min: 0,
        max: 0.5,
      },
    ],
    defaults: {
      extraClearanceMm: CHECK_DEFAULTS.guideExtraClearanceMm,
      toleranceMm: CHECK_DEFAULTS.guideToleranceMm,
    },
    basis: { kind: 'shipped_default', note: NO_PRINTED_SOURCE },
  },
  {
    key: 'tracking',
    group: 'checks',
    label: 'Band tracking',
    help: 'How far the tooth edge stands off the wheel face: 1/8 of the band width, kept between the least and greatest overhang, and how far either side still passes.',
    fields: [
      {
        name: 'minOverhangMm',
        label: 'Least overhang',
        quantity: 'length',
        decimals: { metric: 2, imperial: 3 },
        min: 0,
        max: 50,
      },
      {
        name: 'maxOverhangMm',
        label: 'Greatest overhang',
        quantity: 'length',
        decimals: { metric: 2, imperial: 3 },
        min: 0,
        max: 50,
      },
      {
        name: 'toleranceMm',
        label: 'Allowed either side',
        quantity: 'length',
        decimals: { metric: 2, imperial: 3 },
        min: 0,
        max: 10,
      },
    ],
    defaults: {
      minOverhangMm: CHECK_DEFAULTS.trackingMinOverhangMm,
      maxOverhangMm: CHECK_DEFAULTS.trackingMaxOverhangMm,
      toleranceMm: CHECK_DEFAULTS.trackingToleranceMm,
    },
    basis: { kind: 'shipped_default', note: NO_PRINTED_SOURCE },
    issues: atMost('minOverhangMm', 'maxOverhangMm', 'overhang'),
  },
  {
    key: 'bearing_wear',
    group: 'checks',
    label: 'Guide and pressure bearing wear',
    help: 'The largest gap under a straightedge laid across a bearing face that still passes.',
    fields: [
      {
        name: 'toleranceMm',
        label: 'Largest gap',
        quantity: 'length',
        decimals: { metric: 3, imperial: 4 },
        min: 0,
        max: 5,
      },
    ],
    defaults: { toleranceMm: CHECK_DEFAULTS.bearingWearToleranceMm },
    basis: { kind: 'shipped_default', note: NO_PRINTED_SOURCE },
  },
  {
    key: 'head_force',
    group: 'checks',
    label: 'Head down-force (spring balance)',
    help: 'The spring-balance reading of a gravity- or spring-fed head over the last inch of travel, hooked on the head directly above the band. Below the least the head is not feeding; above the greatest it overloads the teeth. Not used for hydraulic feed.',
    fields: [
      { name: 'minN', label: 'Least force (below it the head is not feeding)', quantity: 'force', min: 0, max: 5000 },
      { name: 'maxN', label: 'Greatest force', quantity: 'force', min: 0, max: 5000 },
    ],
    defaults: { minN: CHECK_DEFAULTS.minHeadForceN, maxN: CHECK_DEFAULTS.maxHeadForceN },
    basis: { kind: 'shipped_default', note: NO_PRINTED_SOURCE },
    issues: atMost('minN', 'maxN', 'force'),
  },
  {
    key: 'break_in',
    group: 'blades',
    label: 'Break-in of a new blade',
    help: 'How a new blade is brought up to normal cutting: the feed it starts at and the two steps up, the band speed meanwhile, and how long each step lasts, in minutes or in area cut. The blade maker’s own break-in takes precedence.',
    fields: [
      { name: 'startFeedPercent', label: 'Starting feed, of normal', quantity: 'percent', min: 5, max: 95 },
      { name: 'secondFeedPercent', label: 'Second step feed, of normal', quantity: 'percent', min: 5, max: 99 },
      { name: 'thirdFeedPercent', label: 'Third step feed, of normal', quantity: 'percent', min: 5, max: 99 },
      {
        name: 'bandSpeedPercent',
        label: 'Band speed during break-in, of normal',
        quantity: 'percent',
        min: 10,
        max: 100,
      },
      { name: 'startMinutes', label: 'Minutes at the starting feed', quantity: 'minutes', min: 1, max: 240 },
      { name: 'stepMinutes', label: 'Minutes at each step', quantity: 'minutes', min: 1, max: 240 },
      { name: 'startAreaMm2', label: 'Area cut at the starting feed', quantity: 'area', min: 100, max: 1e7 },
      { name: 'stepAreaMm2', label: 'Area cut at each step', quantity: 'area', min: 100, max: 1e7 },
    ],
    defaults: {
      startFeedPercent: BREAK_IN_DEFAULTS.initialFeedFraction * 100,
      secondFeedPercent: BREAK_IN_DEFAULTS.rampFeedFractions[0]! * 100,
      thirdFeedPercent: BREAK_IN_DEFAULTS.rampFeedFractions[1]! * 100,
      bandSpeedPercent: BREAK_IN_DEFAULTS.bandSpeedFraction * 100,
      startMinutes: BREAK_IN_DEFAULTS.initialDurationMin,
      stepMinutes: BREAK_IN_DEFAULTS.rampStepDurationMin,
      startAreaMm2: BREAK_IN_DEFAULTS.initialAreaMm2,
      stepAreaMm2: BREAK_IN_DEFAULTS.rampStepAreaMm2,
    },
    basis: {
      kind: 'shipped_default',
      note: 'No printed break-in plan applies to every blade; Kerfline ships a common shop plan as your site’s starting point, and the blade maker’s own break-in takes precedence.',
    },
    issues: increasing(['startFeedPercent', 'secondFeedPercent', 'thirdFeedPercent'], 'feed step'),
  },
  {
    key: 'teeth_in_work',
    group: 'blades',
    label: 'Teeth in the work',
    help: 'The fewest and most teeth that should be cutting at once, and the range the pitch advice prefers. Below the fewest teeth may strip; above the most the gullets pack with chips. The printed pitch table for solid bars comes first; these guard it and choose for tubes and shapes.',
    fields: [
      { name: 'fewestTeeth', label: 'Fewest teeth (below it teeth may strip)', quantity: 'teeth', min: 1, max: 20 },
      { name: 'preferredFewestTeeth', label: 'Preferred, from', quantity: 'teeth', min: 1, max: 60 },
      { name: 'preferredMostTeeth', label: 'Preferred, up to', quantity: 'teeth', min: 1, max: 60 },
      { name: 'mostTeeth', label: 'Most teeth (above it gullets pack)', quantity: 'teeth', min: 2, max: 100 },
    ],
    defaults: { fewestTeeth: 3, preferredFewestTeeth: 6, preferredMostTeeth: 12, mostTeeth: 24 },
    basis: { kind: 'shipped_default', note: NO_PRINTED_SOURCE },
    issues: (v) => {
      const order = ['fewestTeeth', 'preferredFewestTeeth', 'preferredMostTeeth', 'mostTeeth'];
      const issues: { path: string; message: string }[] = [];
      for (let i = 1; i < order.length; i++)
        if ((v[order[i]!] ?? 0) < (v[order[i - 1]!] ?? 0))
          issues.push({ path: order[i]!, message: 'Keep fewest ≤ preferred from ≤ preferred up to ≤ most' });
      return issues;
    },
  },
  ...(['carbon', 'bimetal', 'carbide_tipped'] as const).map((material): SiteSettingDefinition => {
    const source = TENSION_RANGE_SOURCES[material];
    return {
      key: `band_tension.${material}`,
      group: 'band_tension',
      label: `Band tension, ${bladeMaterialLabel(material)} bands`,
      help: 'The range a band tension meter must read. A blade maker’s own figure for a blade takes precedence.',
      fields: [
        { name: 'minMPa', label: 'Lowest', quantity: 'stress', min: 10, max: 1000 },
        { name: 'maxMPa', label: 'Highest', quantity: 'stress', min: 10, max: 1000 },
      ],
      defaults: { ...DEFAULT_TENSION_RANGE_MPA[material] },
      basis:
        source === null
          ? {
              kind: 'shipped_default',
              note: 'No printed tension range for carbide-tipped metal-cutting bands: Kerfline starts from the bi-metal range; the blade maker’s figure takes precedence.',
            }
          : { kind: 'published', citation: source.citation },
      issues: atMost('minMPa', 'maxMPa', 'tension'),
    };
  }),
  ...MATERIAL_GROUPS.map((group): SiteSettingDefinition => ({
    key: `band_speed.${group}`,
    group: 'band_speed',
    label: `Band speed, ${MATERIAL_GROUP_LABELS[group]}`,
    help: 'Bi-metal blade, 4 in (100 mm) length of cut, with coolant. Kerfline raises it for shorter cuts and lowers it for longer ones, for carbon-steel blades and for cutting dry, as Machinery’s Handbook prints.',
    fields: [
      { name: 'minMPerMin', label: 'Lowest', quantity: 'bandSpeed', min: 1, max: 5000 },
      { name: 'maxMPerMin', label: 'Highest', quantity: 'bandSpeed', min: 1, max: 5000 },
    ],
    defaults: { ...SHIPPED_BAND_SPEEDS[group] },
    basis: { kind: 'shipped_default', note: BAND_SPEED_NOTE },
    issues: atMost('minMPerMin', 'maxMPerMin', 'band speed'),
  })),
];

export const SITE_SETTING_KEYS = SITE_SETTINGS.map((s) => s.key);

export function settingDefinition(key: string): SiteSettingDefinition | undefined {
  return SITE_SETTINGS.find((s) => s.key === key);
}

/**
 * The zod schema of one setting's value: every field a finite number within its range, no others, plus the
 * setting's cross-field rules. Messages name the field.
 */
export function settingValueSchema(def: SiteSettingDefinition) {
  const shape: Record<string, z.ZodNumber> = {};
  for (const f of def.fields) {
    shape[f.name] = z
      .number({ message: `${f.label} must be a number` })
      .min(f.min, { message: `${f.label} must be at least ${f.min}` })
      .max(f.max, { message: `${f.label} must be at most ${f.max}` });
  }
  return z.strictObject(shape).superRefine((value, ctx) => {
    for (const issue of def.issues?.(value as Record<string, number>) ?? []) {
      ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
    }
  });
}
