import { describe, expect, it } from 'vitest';
import { recordExportPath } from './record-export';

describe('recordExportPath', () => {
  it('keeps every filter and the sort of the table’s query, writes times as ISO 8601 and leaves the paging out', () => {
    const path = recordExportPath('/stops/export', {
      siteId: 'site-1',
      category: 'hydraulic',
      planned: false,
      from: new Date('2026-03-01T06:00:00.000Z'),
      to: undefined,
      sort: '-startedAt',
      limit: 25,
      offset: 50,
    });
    const [base, search] = path.split('?');
    expect(base).toBe('/stops/export');
    expect(Object.fromEntries(new URLSearchParams(search))).toEqual({
      siteId: 'site-1',
      category: 'hydraulic',
      planned: 'false',
      from: '2026-03-01T06:00:00.000Z',
      sort: '-startedAt',
    });
  });

  it('is the bare path when nothing narrows the table', () => {
    expect(recordExportPath('/sites/s/stock/movements/export', { limit: 25, offset: 0 })).toBe(
      '/sites/s/stock/movements/export',
    );
  });
});
