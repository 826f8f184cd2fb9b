import { describe, expect, it } from 'vitest';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import { basisSentence, basisWords, STARTING_VALUE_WORDS } from './figure-basis';

describe('where a figure comes from, in words', () => {
  it('cites a printed source', () => {
    expect(basisWords({ kind: 'published', citation: 'A handbook, 1st ed., Table 3' })).toBe(
      'published: A handbook, 1st ed., Table 3',
    );
    expect(basisSentence({ kind: 'published', citation: 'A handbook' })).toBe('Published: A handbook');
  });

  it('says a shipped value is Kerfline’s starting value, and a changed one whose it is and since when', () => {
    const shipped: FigureBasis = {
      kind: 'site_setting',
      settingKey: 'head_force',
      changedByName: null,
      changedAt: null,
      note: '',
    };
    expect(basisWords(shipped)).toBe(STARTING_VALUE_WORDS);
    const changed: FigureBasis = {
      ...shipped,
      changedByName: 'Ines Carvalho',
      // 02:30 UTC on 3 Dec is still 2 Dec in Toronto (UTC−5): the date is the site's.
      changedAt: '2026-12-03T02:30:00.000Z',
    };
    expect(basisWords(changed, 'America/Toronto')).toBe('your site’s setting, changed by Ines Carvalho on Dec 2, 2026');
    expect(basisWords(changed, 'Europe/Amsterdam')).toBe(
      'your site’s setting, changed by Ines Carvalho on Dec 3, 2026',
    );
  });

  it('passes on the note of a figure from a record or a reading', () => {
    expect(basisWords({ kind: 'record', note: 'from this saw’s record' })).toBe('from this saw’s record');
    expect(basisWords({ kind: 'measured', note: 'your reading' })).toBe('your reading');
  });
});
