/**
 * A site's effective settings: the value each setting has at a site (its own, or Kerfline's shipped default),
 * with who changed it and when. The API reads them from storage; the trade's computations take them as a
 * parameter and return the basis of each figure they produce, so a screen can say "published: …" or "your
 * site's setting, changed by … on …".
 */
import type { FigureBasis } from '../figures/basis.js';
import { settingDefinition, type SiteSettingDefinition } from './registry.js';

export interface EffectiveSetting {
  key: string;
  /** The setting's values in SI, by field name. */
  values: Readonly<Record<string, number>>;
  /** Null while the site uses the shipped value. */
  changedByName: string | null;
  /** ISO date-time of the site's change; null while the site uses the shipped value. */
  changedAt: string | null;
}

/** A site's effective settings by key; a key left out means the shipped value. */
export type EffectiveSettings = Readonly<Record<string, EffectiveSetting>>;

function definitionOf(key: string): SiteSettingDefinition {
  const def = settingDefinition(key);
  if (!def) throw new RangeError(`Unknown site setting: ${key}`);
  return def;
}

/** The shipped value of a setting, as a site that never changed it has it. */
export function shippedSetting(key: string): EffectiveSetting {
  const def = definitionOf(key);
  return { key, values: { ...def.defaults }, changedByName: null, changedAt: null };
}

/** The site's value of a setting, or the shipped one when the site has none. */
export function effectiveSetting(settings: EffectiveSettings | undefined, key: string): EffectiveSetting {
  return settings?.[key] ?? shippedSetting(key);
}

/** One value of a setting, in SI; falls back to the shipped default for a field the stored value lacks. */
export function settingValue(setting: EffectiveSetting, field: string): number {
  const value = setting.values[field] ?? definitionOf(setting.key).defaults[field];
  if (value === undefined) throw new RangeError(`Setting ${setting.key} has no field ${field}`);
  return value;
}

/**
 * Where a setting's figure comes from. A shipped value with a printed source is "published"; a shipped value
 * without one is Kerfline's starting value for the site's setting (the note says why); a site's own value is the
 * site's setting, with who changed it and when.
 */
export function settingBasis(setting: EffectiveSetting): FigureBasis {
  const def = definitionOf(setting.key);
  if (setting.changedAt === null && def.basis.kind === 'published') {
    return { kind: 'published', citation: def.basis.citation };
  }
  const shippedNote =
    def.basis.kind === 'published' ? `Kerfline's shipped value was published: ${def.basis.citation}` : def.basis.note;
  return {
    kind: 'site_setting',
    settingKey: setting.key,
    changedByName: setting.changedAt === null ? null : setting.changedByName,
    changedAt: setting.changedAt,
    note: shippedNote,
  };
}
