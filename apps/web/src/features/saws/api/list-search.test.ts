import { describe, expect, it } from 'vitest';
import { sawListQueryFromSearch } from './list-search';

const SITE = '3c9d7e2a-51b4-4f0a-8e6c-2d1b9a7f4e10';

describe('sawListQueryFromSearch', () => {
  it('gives the saws in use by default, with the paging defaults applied', () => {
    expect(sawListQueryFromSearch(new URLSearchParams(), SITE)).toEqual({
      siteId: SITE,
      includeRetired: false,
      limit: 100,
      offset: 0,
    });
  });

  it('asks for retired saws when the status filter names them or asks for all', () => {
    expect(sawListQueryFromSearch(new URLSearchParams('status=retired'), SITE)).toMatchObject({
      status: 'retired',
      includeRetired: true,
    });
    const all = sawListQueryFromSearch(new URLSearchParams('status=all'), SITE);
    expect(all.includeRetired).toBe(true);
    expect(all.status).toBeUndefined();
  });

  it('drops values the list does not understand instead of failing', () => {
    const q = sawListQueryFromSearch(new URLSearchParams('status=melted&kind=diagonal&offset=-5&q=%20HS-0%20'), SITE);
    expect(q).toEqual({ siteId: SITE, q: 'HS-0', includeRetired: false, limit: 100, offset: 0 });
  });

  it('gives equal queries (and so equal cache keys) for equal filters written in a different order', () => {
    const a = sawListQueryFromSearch(new URLSearchParams('kind=vertical&status=down'), SITE);
    const b = sawListQueryFromSearch(new URLSearchParams('status=down&kind=vertical'), SITE);
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
  });

  it('reads the site from ?site= on the fleet list, ignoring a malformed one', () => {
    expect(sawListQueryFromSearch(new URLSearchParams(`site=${SITE}`)).siteId).toBe(SITE);
    expect(sawListQueryFromSearch(new URLSearchParams('site=not-an-id')).siteId).toBeUndefined();
  });
});
