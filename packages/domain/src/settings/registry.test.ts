import { describe, expect, it } from 'vitest';
import { SITE_SETTINGS, SITE_SETTING_KEYS, settingDefinition, settingValueSchema } from './registry.js';

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
});
