import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, type World } from '../test-support/fixtures.js';
import { loadSignedIn } from '../modules/auth/auth.service.js';
import { Site } from '../modules/sites/site.model.js';
import { overdueChecksSection } from './digest-sections.js';

let ctx: TestContext;
let world: World;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  // Every saw and list from 1 January 2026: each saw's bearing check, never recorded, is overdue since 2 January
  // (the saws feed hydraulically, so the head down-force check does not apply; no blade is on any saw).
  for (const table of ['saws', 'site_checks'])
    await ctx.sequelize.query(`UPDATE ${table} SET created_at = '2026-01-01T00:00:00Z'`);
});

describe('the weekly digest’s overdue checks', () => {
  it('lists the lead’s region’s overdue checks, and nothing from elsewhere, even when handed every site', async () => {
    const sites = await Site.findAll({ order: [['name', 'ASC']] });
    const lead = (await loadSignedIn(world.users.leadNorth.id))!;
    const section = await overdueChecksSection.build({
      signedIn: lead,
      sites,
      period: '2026-W10',
      publicUrl: 'http://k.test',
    });
    expect(section?.title).toBe('Checks overdue');
    // Two working saws at A and at B (A's retired saw counts for nothing): 4 in all.
    expect(section?.intro).toBe('4 checks are overdue (Site A 2, Site B 2).');
    expect(section?.rows.map((r) => [r[0], r[1], r[2]])).toEqual([
      ['A-1', 'Guide and pressure bearing wear', 'Site A'],
      ['A-2', 'Guide and pressure bearing wear', 'Site A'],
      ['B-1', 'Guide and pressure bearing wear', 'Site B'],
      ['B-2', 'Guide and pressure bearing wear', 'Site B'],
    ]);
    expect(section?.rows.every((r) => r[3] === '2026-01-02')).toBe(true);
    const techC = (await loadSignedIn(world.users.techC.id))!;
    const forC = await overdueChecksSection.build({
      signedIn: techC,
      sites,
      period: '2026-W10',
      publicUrl: 'http://k.test',
    });
    expect(new Set(forC?.rows.map((r) => r[2]))).toEqual(new Set(['Site C']));
    expect(forC?.link?.url).toBe(`http://k.test/sites/${world.sites.C.id}/checks/overdue`);
  });
});
