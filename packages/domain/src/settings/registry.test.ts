import { describe, expect, it } from 'vitest';
import { SITE_SETTINGS, SITE_SETTING_KEYS, settingDefinition, settingValueSchema } from './registry.js';
import { effectiveSetting, settingBasis, settingValue, shippedSetting } from './effective.js';
import { describeBasis } from '../figures/basis.js';
import { MATERIAL_GROUPS } from '../band-speed/schema.js';

describe('site settings registry', () => {
  it('has unique keys, and every shipped default passes its own schema', () => {
    expect(new Set(SITE_SETTING_KEYS).size).toBe(SITE_SETTING_KEYS.length);
    for (const def of SITE_SETTINGS) {
      expect(settingValueSchema(def).safeParse(def.defaults).success, def.key).toBe(true);
      expect(Object.keys(def.defaults).sort(), def.key).toEqual(def.fields.map((f) => f.name).sort());
    }
  });

  it('refuses unknown fields, values out of range and a lowest above the highest, naming the field', () => {
    const tension = settingDefinition('band_tension.bimetal')!;
    const schema = settingValueSchema(tension);
    expect(schema.safeParse({ minMPa: 200, maxMPa: 240, extra: 1 }).success).toBe(false);
    expect(schema.safeParse({ minMPa: 5, maxMPa: 240 }).error?.issues[0]).toMatchObject({ path: ['minMPa'] });
    expect(schema.safeParse({ minMPa: 250, maxMPa: 240 }).error?.issues[0]).toMatchObject({
      path: ['maxMPa'],
      message: 'The highest tension must not be below the lowest',
    });
  });

  it('keeps the keys the settings screens store, and adds band speeds, tracking and bearing wear', () => {
    for (const key of [
      'guide_clearance',
      'head_force',
      'band_tension.carbon',
      'band_tension.bimetal',
      'band_tension.carbide_tipped',
      'tracking',
      'bearing_wear',
      ...MATERIAL_GROUPS.map((g) => `band_speed.${g}`),
    ]) {
      expect(settingDefinition(key), key).toBeDefined();
    }
  });

  it('cites a printed source where one was found, and says why not elsewhere; nothing reads "from memory"', () => {
    expect(settingDefinition('band_tension.carbon')?.basis).toEqual({
      kind: 'published',
      citation: expect.stringContaining('15,000–20,000 psi'),
    });
    expect(settingDefinition('band_tension.bimetal')?.basis.kind).toBe('published');
    expect(settingDefinition('band_tension.carbide_tipped')?.basis.kind).toBe('shipped_default');
    expect(settingDefinition('band_speed.stainless_steel')?.basis).toEqual({
      kind: 'shipped_default',
      note: expect.stringContaining("Machinery's Handbook"),
    });
    for (const def of SITE_SETTINGS) {
      const text = JSON.stringify(def);
      expect(text, def.key).not.toMatch(/memory|common practice/i);
    }
  });
});

describe('effective settings and their basis', () => {
  it('a shipped value with a printed source is published; a shipped value without one is the site’s starting value', () => {
    expect(settingBasis(shippedSetting('band_tension.carbon'))).toEqual({
      kind: 'published',
      citation: expect.stringContaining('Fine Woodworking'),
    });
    expect(settingBasis(shippedSetting('guide_clearance'))).toEqual({
      kind: 'site_setting',
      settingKey: 'guide_clearance',
      changedByName: null,
      changedAt: null,
      note: expect.stringContaining('starting point'),
    });
  });

  it('a changed value is the site’s own, with who and when, even where the shipped value was published', () => {
    const changed = {
      key: 'band_tension.carbon',
      values: { minMPa: 110, maxMPa: 130 },
      changedByName: 'Ana Ruiz',
      changedAt: '2025-03-04T10:00:00.000Z',
    };
    expect(settingBasis(changed)).toMatchObject({ kind: 'site_setting', changedByName: 'Ana Ruiz' });
    expect(effectiveSetting({ 'band_tension.carbon': changed }, 'band_tension.carbon')).toBe(changed);
    expect(effectiveSetting({}, 'guide_clearance').values).toEqual(settingDefinition('guide_clearance')?.defaults);
    expect(settingValue(changed, 'minMPa')).toBe(110);
    expect(() => shippedSetting('nope')).toThrow('Unknown site setting: nope');
    expect(describeBasis(settingBasis(changed))).toBe("Your site's setting, changed by Ana Ruiz on 2025-03-04");
  });
});
