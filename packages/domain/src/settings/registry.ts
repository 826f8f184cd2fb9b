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

export interface SettingField {
  /** The key of the value in the setting's record, with its SI unit in the name (`toleranceMm`). */
  name: string;
  label: string;
  /** How the value is shown and typed: a display quantity, or a plain count of days. */
  quantity: DisplayQuantityKind | 'days';
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
  group: 'band_speed' | 'band_tension' | 'checks';
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
