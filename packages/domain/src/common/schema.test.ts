import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { isPlainText, pageQuerySchema, text } from './schema.js';
import { notesSchema } from '../records/schema.js';

describe('shared input pieces', () => {
  it('trims text and refuses empty, over-long and control characters', () => {
    expect(text(5).parse('  abc ')).toBe('abc');
    expect(text(5).safeParse('   ').error?.issues[0]?.message).toBe('must not be empty');
    expect(text(5).safeParse('abcdef').error?.issues[0]?.message).toBe('must be at most 5 characters');
    expect(text(5).safeParse('a\u0000b').error?.issues[0]?.message).toMatch(/control characters/);
    expect(text(20).safeParse('line\nbreak').success).toBe(false);
  });

  it('says a missing field is required', () => {
    expect(z.object({ name: text(5) }).safeParse({}).error?.issues[0]?.message).toBe('is required');
  });

  it('caps paging so no request asks for a whole table', () => {
    expect(pageQuerySchema.parse({})).toEqual({ limit: 100, offset: 0 });
    expect(pageQuerySchema.safeParse({ limit: '501' }).success).toBe(false);
  });

  // Each example is one of the Unicode categories a name refuses (Unicode 15, UnicodeData.txt general categories).
  const SPOOFERS: [string, string][] = [
    ['RLO U+202E (Cf: right-to-left override)', 'invoice\u202Efdp.exe'],
    ['LRI U+2066 (Cf: left-to-right isolate)', 'Saw \u2066B'],
    ['ZWSP U+200B (Cf: zero-width space)', 'Band\u200Bsaw 7'],
    ['ZWJ U+200D (Cf: zero-width joiner)', 'Saw\u200D7'],
    ['BOM U+FEFF inside (Cf)', 'Hammer\uFEFFfield'],
    ['soft hyphen U+00AD (Cf)', 'Hammer\u00ADfield'],
    ['LS U+2028 (Zl: line separator)', 'Line\u2028two'],
    ['PS U+2029 (Zp: paragraph separator)', 'Para\u2029two'],
    ['NEL U+0085 (Cc: C1 control)', 'Next\u0085line'],
    ['CSI U+009B (Cc: C1 control)', 'Esc\u009B31m'],
    ['ESC U+001B (Cc: C0 control)', 'Esc\u001B[31m'],
    ['TAB U+0009 (Cc)', 'Tab\tbed'],
    ['lone high surrogate U+D800', 'Half\uD800pair'],
    ['lone low surrogate U+DC00', 'Half\uDC00pair'],
  ];

  it.each(SPOOFERS)('refuses %s in a name or tag', (_label, value) => {
    const result = text(120).safeParse(value);
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toMatch(/invisible characters/);
  });

  it('keeps what names really hold: accents, other scripts, emoji pairs, no-break spaces, punctuation', () => {
    for (const fine of [
      'Hammerfield Service Centre',
      'Forges de Lyon – Atelier 2',
      'Øresund Stål',
      'Łódź',
      '東京工場',
      'Saw 7 😀',
      'Bay\u00A012',
      'O’Connor & Sons (Nord)',
    ])
      expect(text(120).parse(fine)).toBe(fine);
  });

  it('lets notes keep line breaks and tabs, but nothing else the names refuse', () => {
    expect(notesSchema.parse('Blade ran hot.\r\nCheck coolant\tflow tomorrow.')).toBe(
      'Blade ran hot.\r\nCheck coolant\tflow tomorrow.',
    );
    for (const [label, value] of SPOOFERS.filter(([label]) => !label.startsWith('TAB'))) {
      expect(notesSchema.safeParse(value).success, label).toBe(false);
    }
    expect(notesSchema.safeParse('Ends with a bidi override\u202E').error?.issues[0]?.message).toMatch(
      /direction marks/,
    );
    expect(isPlainText('two\nlines', { multiline: true })).toBe(true);
    expect(isPlainText('two\nlines')).toBe(false);
  });
});
