/**
 * Site settings as the API stores and returns them. The registry (`registry.ts`) says which settings exist,
 * their fields, shipped values and bases; this file says how one site's values travel: what a list of a site's
 * settings holds, what a change sends, and how a setting's origin becomes the `FigureBasis` a screen shows.
 */
import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import type { FigureBasis } from '../figures/basis.js';
import type { DisplayQuantityKind } from '../units/display.js';
import { settingBasis, type EffectiveSetting, type EffectiveSettings } from './effective.js';
import {
  SITE_SETTINGS,
  settingDefinition,
  settingValueSchema,
  type PlainQuantity,
  type SettingField,
  type SiteSettingDefinition,
} from './registry.js';

/** One setting's value: its fields' numbers, in the units their names say (`toleranceMm`, `minMPa`). */
export const settingValuesSchema = z.record(z.string(), z.number());
export type SettingValues = z.infer<typeof settingValuesSchema>;

export const shippedBasisSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('published'), citation: z.string().min(1) }),
  z.object({ kind: z.literal('shipped_default'), note: z.string() }),
]);

/** Whether the site uses Kerfline's shipped value or keeps its own. */
export const SETTING_SOURCES = ['shipped', 'site'] as const;
export type SettingSource = (typeof SETTING_SOURCES)[number];

/**
 * One setting of one site: the value in force, the shipped value and its basis, and — when the site keeps its
 * own value — who set it and when (the name as it reads now).
 */
export const siteSettingSchema = z.object({
  key: z.string(),
  value: settingValuesSchema,
  defaultValue: settingValuesSchema,
  shippedBasis: shippedBasisSchema,
  source: z.enum(SETTING_SOURCES),
  changedById: idSchema.nullable(),
  changedByName: z.string().nullable(),
  changedAt: z.iso.datetime().nullable(),
});
export type SiteSetting = z.infer<typeof siteSettingSchema>;

/** Every setting of a site, in the registry's order. */
export const siteSettingsSchema = z.object({ siteId: idSchema, items: z.array(siteSettingSchema) });
export type SiteSettings = z.infer<typeof siteSettingsSchema>;

/** The body of a change: the setting's whole value (checked against the setting's own schema by the API). */
export const siteSettingChangeSchema = z.strictObject({
  value: z.record(z.string(), z.unknown(), { message: 'value must be an object of the setting’s fields' }),
});
export type SiteSettingChange = z.infer<typeof siteSettingChangeSchema>;

export const siteSettingParamsSchema = z.object({
  siteId: idSchema,
  key: z.string().trim().min(1).max(120),
});

export const siteSettingsParamsSchema = z.object({ siteId: idSchema });

/**
 * The value a site's stored record gives, or null when the stored record no longer fits the setting (a field
 * added or a range narrowed since it was saved): the caller then uses the shipped value. Fields no longer in
 * the setting are dropped; fields added since are taken from the shipped value.
 */
export function storedValueInForce(def: SiteSettingDefinition, stored: Record<string, unknown>): SettingValues | null {
  const merged: Record<string, unknown> = { ...def.defaults };
  for (const field of def.fields) if (field.name in stored) merged[field.name] = stored[field.name];
  const parsed = settingValueSchema(def).safeParse(merged);
  return parsed.success ? (parsed.data as SettingValues) : null;
}

/** One setting of a site as the trade's computations take it (`settings/effective.ts`). */
function effectiveOf(setting: SiteSetting): EffectiveSetting {
  return {
    key: setting.key,
    values: setting.value,
    changedByName: setting.source === 'site' ? setting.changedByName : null,
    changedAt: setting.source === 'site' ? setting.changedAt : null,
  };
}

/**
 * A site's settings as the trade's computations take them: the site's own values by key; a setting on the
 * shipped value is left out, so a computation uses the shipped value and says so.
 */
export function effectiveSettingsOf(settings: readonly SiteSetting[]): EffectiveSettings {
  const effective: Record<string, EffectiveSetting> = {};
  for (const setting of settings) {
    if (setting.source === 'site' && settingDefinition(setting.key)) effective[setting.key] = effectiveOf(setting);
  }
  return effective;
}

/**
 * The basis of a figure taken from a site setting, for the screen to put into words: the site's own value
 * (who, when), else the shipped value's printed source, else Kerfline's starting value with the reason it is
 * one — the same rule the computations apply (`settingBasis`).
 */
export function settingFigureBasis(setting: SiteSetting): FigureBasis {
  if (settingDefinition(setting.key)) return settingBasis(effectiveOf(setting));
  // A key the registry no longer has: say only whose value it is.
  const site = setting.source === 'site';
  return {
    kind: 'site_setting',
    settingKey: setting.key,
    changedByName: site ? setting.changedByName : null,
    changedAt: site ? setting.changedAt : null,
    note: '',
  };
}

/** Every registry setting with its shipped value: what a screen uses when it knows no site. */
export function shippedSettings(): SiteSetting[] {
  return SITE_SETTINGS.map((def) => ({
    key: def.key,
    value: { ...def.defaults },
    defaultValue: { ...def.defaults },
    shippedBasis: def.basis,
    source: 'shipped',
    changedById: null,
    changedByName: null,
    changedAt: null,
  }));
}

/** The value in force of one setting in a site's list, or the shipped value when the list lacks it. */
export function settingValue(settings: readonly SiteSetting[], key: string): SettingValues | undefined {
  const found = settings.find((s) => s.key === key);
  if (found) return found.value;
  const def = settingDefinition(key);
  return def ? { ...def.defaults } : undefined;
}

/**
 * The unit a field's stored number is in, read from the end of its name as the registry's convention has it
 * (`toleranceMm`, `minMPerMin`, `minMPa`, `maxN`, `intervalDays`), with the factor that turns it into the SI
 * unit of its display quantity (mm, m/min, mm², mm²/min, N, Pa). Longest suffix first: `MPa` before `Pa`.
 */
const STORED_UNITS: { suffix: string; quantity: DisplayQuantityKind | PlainQuantity; toSi: number }[] = [
  { suffix: 'Mm2PerMin', quantity: 'areaRate', toSi: 1 },
  { suffix: 'MPerMin', quantity: 'bandSpeed', toSi: 1 },
  { suffix: 'Mm2', quantity: 'area', toSi: 1 },
  { suffix: 'MPa', quantity: 'stress', toSi: 1e6 },
  { suffix: 'Mm', quantity: 'length', toSi: 1 },
  { suffix: 'Pa', quantity: 'stress', toSi: 1 },
  { suffix: 'Days', quantity: 'days', toSi: 1 },
  { suffix: 'Minutes', quantity: 'minutes', toSi: 1 },
  { suffix: 'Percent', quantity: 'percent', toSi: 1 },
  { suffix: 'Teeth', quantity: 'teeth', toSi: 1 },
  { suffix: 'N', quantity: 'force', toSi: 1 },
];

const SAME_DIMENSION: Record<DisplayQuantityKind | PlainQuantity, DisplayQuantityKind | PlainQuantity> = {
  length: 'length',
  smallLength: 'length',
  bandSpeed: 'bandSpeed',
  area: 'area',
  largeArea: 'area',
  areaRate: 'areaRate',
  force: 'force',
  stress: 'stress',
  days: 'days',
  minutes: 'minutes',
  percent: 'percent',
  teeth: 'teeth',
};

/**
 * The factor from a field's stored unit to its display quantity's SI unit, or undefined when the field's name
 * does not say a unit of that quantity (a registry mistake a test catches).
 */
export function storedToSiFactor(field: SettingField): number | undefined {
  const unit = STORED_UNITS.find((u) => field.name.endsWith(u.suffix));
  if (!unit || unit.quantity !== SAME_DIMENSION[field.quantity]) return undefined;
  return unit.toSi;
}
