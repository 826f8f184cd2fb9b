import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { pageQuerySchema, text } from './schema.js';

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
});
