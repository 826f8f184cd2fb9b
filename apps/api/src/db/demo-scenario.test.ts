import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, resetData, type TestContext } from '../test-support/test-db.js';
import { initModels } from './models.js';
import { loadDemoScenario } from './demo-scenario.js';
import { Saw } from '../modules/saws/saw.model.js';
import { SiteSetting } from '../modules/site-settings/site-setting.model.js';
import { AuditEntry } from '../modules/audit/audit-entry.model.js';

let ctx: TestContext;

beforeAll(async () => {
  ctx = startTestApp();
  initModels(ctx.sequelize);
  await resetData(ctx.sequelize);
  expect(await loadDemoScenario(ctx.sequelize)).toBe(true);
});
afterAll(async () => ctx.close());

/** Words real saw models use for their kind of machine, which invented names must not borrow. */
const TRADE_MODEL_WORDS = /\b(twin|miter|mitre|contour|auto|cnc|plus|pro|dual|duo|max|xl)\b/i;

describe('the demo scenario', () => {
  it('names its saws’ makers and models with invented words: no digits, no model-number patterns', async () => {
    const saws = await Saw.findAll();
    expect(saws.length).toBeGreaterThan(20);
    for (const saw of saws) {
      for (const name of [saw.make, saw.model]) {
        expect(name, saw.assetTag).toMatch(/^[A-Z][a-z]+$/);
        expect(name).not.toMatch(TRADE_MODEL_WORDS);
      }
    }
  });

  it('has saws of both head feeds, so the spring-balance check shows on some and not others', async () => {
    const feeds = new Set((await Saw.findAll()).map((s) => s.headFeed));
    expect([...feeds].sort()).toEqual(['gravity_spring', 'hydraulic']);
  });

  it('keeps one site’s own setting, with its entry in the audit trail', async () => {
    const settings = await SiteSetting.findAll();
    expect(settings).toHaveLength(1);
    const entry = await AuditEntry.findOne({ where: { entity: 'SiteSetting' } });
    expect(entry).toMatchObject({ siteId: settings[0]!.siteId, entityId: settings[0]!.key, action: 'update' });
    expect(entry!.after).toMatchObject({ source: 'site' });
  });

  it('loads only into an empty database', async () => {
    expect(await loadDemoScenario(ctx.sequelize)).toBe(false);
  });
});
