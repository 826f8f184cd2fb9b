import { describe, expect, it } from 'vitest';
import { numberFormat } from './number-format.js';

describe('numberFormat', () => {
  it('gives the same formatter for the same locale and options, and formats as Intl does', () => {
    const a = numberFormat('en-US', { style: 'currency', currency: 'EUR', maximumFractionDigits: 0 });
    expect(numberFormat('en-US', { style: 'currency', currency: 'EUR', maximumFractionDigits: 0 })).toBe(a);
    expect(a.format(1234.5)).toBe(
      new Intl.NumberFormat('en-US', { style: 'currency', currency: 'EUR', maximumFractionDigits: 0 }).format(1234.5),
    );
    expect(numberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0 })).not.toBe(a);
  });
});
