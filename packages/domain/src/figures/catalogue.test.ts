import { describe, expect, it } from 'vitest';
import { settingDefinition, SITE_SETTINGS } from '../settings/registry.js';
import { FIGURE_CATALOGUE, RULES_OF_THUMB } from './catalogue.js';

describe('every figure on a calculator or the saw page has a printed source or a site-setting origin', () => {
  it('lists each figure with only published, site-setting or input bases, and at least one that is not input', () => {
    expect(new Set(FIGURE_CATALOGUE.map((f) => f.id)).size).toBe(FIGURE_CATALOGUE.length);
    for (const figure of FIGURE_CATALOGUE) {
      expect(figure.bases.length, figure.id).toBeGreaterThan(0);
      for (const basis of figure.bases) {
        expect(['published', 'site_setting', 'input'], figure.id).toContain(basis.kind);
        if (basis.kind === 'published') expect(basis.source.citation.length, figure.id).toBeGreaterThan(20);
        if (basis.kind === 'site_setting') expect(settingDefinition(basis.settingKey), basis.settingKey).toBeDefined();
      }
      // A figure that is not pure input arithmetic names where its numbers come from.
      const ownInputOnly = figure.bases.every((b) => b.kind === 'input');
      expect(ownInputOnly, figure.id).toBe(false);
    }
  });

  it('every site setting is used by some figure', () => {
    const used = new Set(
      FIGURE_CATALOGUE.flatMap((f) => f.bases.flatMap((b) => (b.kind === 'site_setting' ? [b.settingKey] : []))),
    );
    for (const def of SITE_SETTINGS) expect(used.has(def.key), def.key).toBe(true);
  });

  it('no wording says "from memory"; the rules of thumb are the ones named', () => {
    expect(JSON.stringify(FIGURE_CATALOGUE)).not.toMatch(/memory|common practice/i);
    expect(RULES_OF_THUMB.map((r) => r.id)).toEqual(['tracking_ratio']);
  });
});
