import { describe, expect, it } from 'vitest';
import { SITE_SETTINGS, settingDefinition } from './registry.js';
import {
  effectiveSettingsOf,
  settingFigureBasis,
  settingValue,
  shippedSettings,
  storedToSiFactor,
  storedValueInForce,
  type SiteSetting,
} from './schema.js';

// Carbide-tipped tension has no printed range: a shipped starting value. Bi-metal's is published.
const tension = settingDefinition('band_tension.carbide_tipped')!;
const published = settingDefinition('band_tension.bimetal')!;

const setting = (overrides: Partial<SiteSetting>): SiteSetting => ({
  key: tension.key,
  value: { minMPa: 210, maxMPa: 240 },
  defaultValue: { ...tension.defaults },
  shippedBasis: { kind: 'shipped_default', note: 'No printed table gives one value for this.' },
  source: 'shipped',
  changedById: null,
  changedByName: null,
  changedAt: null,
  ...overrides,
});

describe('a site setting’s value and origin', () => {
  it('names every registry field’s stored unit in a way the editor can convert to SI', () => {
    for (const def of SITE_SETTINGS) {
      for (const field of def.fields) {
        expect(storedToSiFactor(field), `${def.key}.${field.name}`).toBeDefined();
      }
    }
    expect(storedToSiFactor({ name: 'minMPa', label: 'Lowest', quantity: 'stress', min: 0, max: 1 })).toBe(1e6);
    expect(storedToSiFactor({ name: 'maxN', label: 'Most', quantity: 'force', min: 0, max: 1 })).toBe(1);
    expect(storedToSiFactor({ name: 'gapMm', label: 'Gap', quantity: 'smallLength', min: 0, max: 1 })).toBe(1);
    // A name whose unit does not match its quantity is a registry mistake.
    expect(storedToSiFactor({ name: 'maxN', label: 'Most', quantity: 'length', min: 0, max: 1 })).toBeUndefined();
  });

  it('uses a stored value while it still fits the setting, filling fields added since from the shipped value', () => {
    expect(storedValueInForce(tension, { minMPa: 210, maxMPa: 240 })).toEqual({ minMPa: 210, maxMPa: 240 });
    expect(storedValueInForce(tension, { minMPa: 150 })).toEqual({ minMPa: 150, maxMPa: tension.defaults.maxMPa });
    expect(storedValueInForce(tension, { minMPa: 210, maxMPa: 240, retired: 3 })).toEqual({
      minMPa: 210,
      maxMPa: 240,
    });
    // Lowest above highest, or outside the range: the shipped value applies instead.
    expect(storedValueInForce(tension, { minMPa: 300, maxMPa: 240 })).toBeNull();
    expect(storedValueInForce(tension, { minMPa: 'x', maxMPa: 240 })).toBeNull();
  });

  it('says the site’s own value is its setting, with who and when', () => {
    const basis = settingFigureBasis(
      setting({ source: 'site', changedByName: 'Ines Carvalho', changedAt: '2026-11-30T14:00:00.000Z' }),
    );
    expect(basis).toEqual({
      kind: 'site_setting',
      settingKey: 'band_tension.carbide_tipped',
      changedByName: 'Ines Carvalho',
      changedAt: '2026-11-30T14:00:00.000Z',
      note: (tension.basis as { note: string }).note,
    });
  });

  it('cites the printed source of a shipped value that has one, and says when there is none', () => {
    const citation = (published.basis as { citation: string }).citation;
    const shippedPublished = setting({ key: published.key, shippedBasis: published.basis });
    expect(settingFigureBasis(shippedPublished)).toEqual({ kind: 'published', citation });
    expect(settingFigureBasis(setting({}))).toMatchObject({ kind: 'site_setting', changedAt: null });
    // A site's own value over a published one is the site's, and keeps the citation in its note.
    const own = settingFigureBasis({ ...shippedPublished, source: 'site', changedAt: '2026-11-30T14:00:00.000Z' });
    expect(own).toMatchObject({ kind: 'site_setting' });
    expect(own.kind === 'site_setting' && own.note).toContain(citation);
  });

  it('hands the computations only the site’s own values', () => {
    const own = setting({ source: 'site', changedByName: 'Ines Carvalho', changedAt: '2026-11-30T14:00:00.000Z' });
    expect(effectiveSettingsOf([own, setting({ key: published.key })])).toEqual({
      [tension.key]: {
        key: tension.key,
        values: own.value,
        changedByName: 'Ines Carvalho',
        changedAt: '2026-11-30T14:00:00.000Z',
      },
    });
  });

  it('gives the shipped value of every setting when no site is known', () => {
    const shipped = shippedSettings();
    expect(shipped.map((s) => s.key)).toEqual(SITE_SETTINGS.map((d) => d.key));
    expect(settingValue(shipped, tension.key)).toEqual(tension.defaults);
    expect(settingValue([], tension.key)).toEqual(tension.defaults);
    expect(settingValue([setting({})], tension.key)).toEqual({ minMPa: 210, maxMPa: 240 });
    expect(settingValue([], 'no_such_setting')).toBeUndefined();
  });
});
