import { describe, expect, it } from 'vitest';
import theme from '../../../../tailwind.config';

/**
 * Text contrast of the theme's pairs, by the definitions of WCAG 2.1 (W3C Recommendation): relative luminance
 * (§ "relative luminance") and contrast ratio (L1 + 0.05) / (L2 + 0.05); level AA asks at least 4.5:1 for
 * body text (Success Criterion 1.4.3).
 */
function channel(value: number): number {
  const c = value / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16));
  return 0.2126 * channel(r!) + 0.7152 * channel(g!) + 0.0722 * channel(b!);
}

function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

const c = theme.theme.extend.colors;

describe('the theme’s text contrast (WCAG 2.1 AA)', () => {
  it('computes the ratio as the standard defines it', () => {
    // Black on white is 21:1 and a colour on itself 1:1, by the formula's own bounds.
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 6);
    expect(contrast('#777777', '#777777')).toBe(1);
  });

  it.each([
    ['ink on paper', c.ink.DEFAULT, c.paper.DEFAULT],
    ['ink on card', c.ink.DEFAULT, c.card],
    ['muted ink on paper', c.ink.muted, c.paper.DEFAULT],
    ['muted ink on card', c.ink.muted, c.card],
    ['muted ink on the deeper paper', c.ink.muted, c.paper.deep],
    ['card-white on copper (primary buttons)', c.card, c.accent.DEFAULT],
    ['copper on card (calculator numerals)', c.accent.DEFAULT, c.card],
    ['dark copper on copper wash (current page)', c.accent.dark, c.accent.soft],
    ['stop red on its wash (down)', c.signal.stop, c.signal['stop-soft']],
    ['stop red on card (danger buttons)', c.signal.stop, c.card],
    ['safe green on its wash (running)', c.signal.safe, c.signal['safe-soft']],
    ['caution ochre on its wash', c.signal.caution, c.signal['caution-soft']],
    ['ink on the caution yellow', c.ink.DEFAULT, c.signal['caution-soft']],
    ['instruction blue on its wash', c.signal.info, c.signal['info-soft']],
  ])('%s passes 4.5:1', (_name, text, background) => {
    expect(contrast(text, background)).toBeGreaterThanOrEqual(4.5);
  });
});
