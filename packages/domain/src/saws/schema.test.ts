import { describe, expect, it } from 'vitest';
import { sawCreateSchema, sawListQuerySchema, sawUpdateSchema } from './schema.js';
import { siteCreateSchema, siteUpdateSchema } from '../sites/schema.js';

const site = '00000000-0000-4000-8000-00000000000a';
const base = {
  siteId: site,
  assetTag: 'S-1',
  name: 'Bar saw',
  kind: 'horizontal',
  wheelDiameterMm: 455,
  centreDistanceMm: 1343,
  bandWidthMm: 34,
  bandThicknessMm: 1.1,
  bandLengthMm: 4115,
  bandSpeedMinMPerMin: 18,
  bandSpeedMaxMPerMin: 110,
};

describe('saw inputs', () => {
  it('fills a new saw’s optional details with "not recorded" and takes no status: down comes from a stop', () => {
    const parsed = sawCreateSchema.parse({ ...base, status: 'down' });
    expect(parsed).toMatchObject({ make: null, model: null, capacityRoundMm: null });
    expect(parsed).not.toHaveProperty('status');
    expect(sawUpdateSchema.safeParse({ status: 'down' }).success).toBe(false);
  });

  it('keeps an update to the fields it names, so nothing else is reset', () => {
    expect(sawUpdateSchema.parse({ name: 'Renamed' })).toEqual({ name: 'Renamed' });
  });

  it('keeps a saw’s own head-force limits optional (null: the site’s setting) and refuses crossed or negative ones', () => {
    expect(sawCreateSchema.parse(base)).toMatchObject({ minHeadForceN: null, maxHeadForceN: null });
    expect(sawUpdateSchema.parse({ maxHeadForceN: 30 })).toEqual({ maxHeadForceN: 30 });
    expect(sawUpdateSchema.parse({ maxHeadForceN: null })).toEqual({ maxHeadForceN: null });
    const crossed = sawCreateSchema.safeParse({ ...base, minHeadForceN: 20, maxHeadForceN: 10 });
    expect(crossed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['maxHeadForceN', 'Largest head force must not be below the least'],
    ]);
    const negative = sawUpdateSchema.safeParse({ minHeadForceN: -1 });
    expect(negative.error?.issues[0]?.message).toBe('Least head force must not be negative');
    expect(sawUpdateSchema.safeParse({ maxHeadForceN: 0 }).error?.issues[0]?.message).toBe(
      'Largest head force must be greater than 0',
    );
  });

  it('refuses unknown fields on update and crossed ranges on both', () => {
    expect(sawUpdateSchema.safeParse({ colour: 'red' }).success).toBe(false);
    const crossed = sawCreateSchema.safeParse({ ...base, bandSpeedMinMPerMin: 200 });
    expect(crossed.success).toBe(false);
    expect(crossed.error?.issues[0]?.path).toEqual(['bandSpeedMaxMPerMin']);
    const thick = sawUpdateSchema.safeParse({ bandWidthMm: 1, bandThicknessMm: 2 });
    expect(thick.error?.issues[0]?.path).toEqual(['bandThicknessMm']);
  });

  it('reads list filters from a query string', () => {
    expect(sawListQuerySchema.parse({ includeRetired: 'true', limit: '20' })).toMatchObject({
      includeRetired: true,
      limit: 20,
      offset: 0,
    });
    expect(sawListQuerySchema.parse({})).toMatchObject({ includeRetired: false, limit: 100 });
  });
});

describe('site inputs', () => {
  it('leaves a site’s city alone when an update does not name it', () => {
    expect(siteUpdateSchema.parse({ unitSystem: 'imperial' })).toEqual({ unitSystem: 'imperial' });
    expect(
      siteCreateSchema.parse({
        regionId: site,
        code: 'X-1',
        name: 'X',
        timeZone: 'UTC',
        currency: 'eur',
        unitSystem: 'metric',
      }),
    ).toMatchObject({
      city: null,
      currency: 'EUR',
    });
  });
});
