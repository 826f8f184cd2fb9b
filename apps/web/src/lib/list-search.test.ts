import { describe, expect, it } from 'vitest';
import { bladeRunListQuerySchema } from '@kerfline/domain/blade-runs/schema';
import { offsetOf, parseListQuery, sortOf, sortingOf, withFilters } from './list-search';

const SAW = 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55';

describe('a record table’s state in the URL', () => {
  it('parses the URL’s filters with the domain schema, defaults applied', () => {
    const q = parseListQuery(bladeRunListQuerySchema, { sawId: SAW, reason: 'broken', limit: 25, offset: 50 });
    expect(q).toEqual({ sawId: SAW, reason: 'broken', limit: 25, offset: 50, sort: '-installedAt' });
  });

  it('drops a value the list does not understand instead of failing, keeping the rest', () => {
    const q = parseListQuery(bladeRunListQuerySchema, {
      sawId: 'not-a-saw',
      reason: 'melted',
      open: 'false',
      sort: 'removedAt',
      from: '2026-13-45',
    });
    expect(q).toEqual({ open: false, sort: 'removedAt', limit: 100, offset: 0 });
  });

  it('drops a date range whose end is not after its start', () => {
    const q = parseListQuery(bladeRunListQuerySchema, { from: '2026-03-04', to: '2026-03-01' });
    expect(q.to).toBeUndefined();
    expect(q.from?.toISOString()).toBe('2026-03-04T00:00:00.000Z');
  });

  it('turns the API’s sort into the table’s and back', () => {
    expect(sortingOf('-installedAt')).toEqual([{ id: 'installedAt', desc: true }]);
    expect(sortingOf('removedAt')).toEqual([{ id: 'removedAt', desc: false }]);
    expect(sortOf([{ id: 'startedAt', desc: true }])).toBe('-startedAt');
    expect(sortOf([])).toBeUndefined();
  });

  it('goes back to the first page when a filter or the sort changes, and drops blank filters', () => {
    const next = withFilters(new URLSearchParams('reason=broken&offset=75&saw=' + SAW), {
      reason: 'worn_out',
      saw: '',
    });
    expect(next.toString()).toBe('reason=worn_out');
    expect(offsetOf(new URLSearchParams('offset=-3'))).toBe(0);
    expect(offsetOf(new URLSearchParams('offset=50'))).toBe(50);
  });
});
