import { describe, expect, it } from 'vitest';
import { auditListQuerySchema, changedFields } from './schema.js';

describe('changedFields', () => {
  it('keeps only the fields that differ, with their values before and after', () => {
    const before = { name: 'Bay 1 saw', make: null, bandWidthMm: 34, updatedAt: new Date(1) };
    const after = { name: 'Bay 1 saw', make: 'Orvik', bandWidthMm: 41, updatedAt: new Date(2) };
    expect(changedFields(before, after)).toEqual({
      before: { make: null, bandWidthMm: 34 },
      after: { make: 'Orvik', bandWidthMm: 41 },
    });
  });

  it('compares dates by their time and nested values by content', () => {
    const at = '2026-01-02T03:04:05.000Z';
    expect(changedFields({ at: new Date(at), speeds: [1, 2] }, { at: new Date(at), speeds: [1, 2] })).toEqual({
      before: {},
      after: {},
    });
    expect(changedFields({ speeds: [1, 2] }, { speeds: [1, 3] }).after).toEqual({ speeds: [1, 3] });
  });

  it('treats a missing field as null, so a field added with a value shows as a change', () => {
    expect(changedFields({}, { notes: 'new' })).toEqual({ before: { notes: null }, after: { notes: 'new' } });
    expect(changedFields({ notes: null }, {})).toEqual({ before: {}, after: {} });
  });
});

describe('audit list query', () => {
  it('applies paging defaults and refuses a site that is not an id', () => {
    expect(auditListQuerySchema.parse({})).toEqual({ limit: 100, offset: 0 });
    expect(auditListQuerySchema.safeParse({ siteId: 'x' }).success).toBe(false);
  });
});
