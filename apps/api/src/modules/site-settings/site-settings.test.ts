import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { SITE_SETTING_KEYS, settingDefinition } from '@kerfline/domain/settings/registry';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';
import { AuditEntry } from '../audit/audit-entry.model.js';
import { SiteSetting } from './site-setting.model.js';
import { settingsInForce } from './site-settings.service.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);

const KEY = 'band_tension.bimetal';
const shipped = settingDefinition(KEY)!.defaults;
const url = (siteId: string, key = KEY) => `/api/sites/${siteId}/settings/${key}`;

type Item = { key: string; value: Record<string, number>; source: string; changedByName: string | null };
const itemOf = (body: { items: Item[] }, key = KEY) => body.items.find((i) => i.key === key)!;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('who reads a site’s settings', () => {
  it.each([
    ['admin@test.example', ['A', 'B', 'C']],
    ['manager-all@test.example', ['A', 'B', 'C']],
    ['manager-ac@test.example', ['A', 'C']],
    ['lead-north@test.example', ['A', 'B']],
    ['siteadmin-a@test.example', ['A']],
    ['tech-a@test.example', ['A']],
    ['tech-c@test.example', ['C']],
  ])('%s reads the settings of exactly the sites it reads', async (email, readable) => {
    const agent = await as(email);
    for (const code of ['A', 'B', 'C'] as const) {
      const res = await agent.get(`/api/sites/${world.sites[code].id}/settings`);
      if (readable.includes(code)) {
        expect(res.status, code).toBe(200);
        expect(res.body.items.map((i: Item) => i.key)).toEqual(SITE_SETTING_KEYS);
      } else {
        // Outside the scope reads like a site that does not exist.
        expect(res.status, code).toBe(404);
        expect(res.body.error.code).toBe('NOT_FOUND');
      }
    }
  });

  it('lists every setting with its value, the shipped value and its basis, until a site changes one', async () => {
    const res = await (await as('tech-a@test.example')).get(`/api/sites/${world.sites.A.id}/settings`);
    const tension = res.body.items.find((i: Item) => i.key === KEY);
    expect(tension).toEqual({
      key: KEY,
      value: shipped,
      defaultValue: shipped,
      shippedBasis: settingDefinition(KEY)!.basis,
      source: 'shipped',
      changedById: null,
      changedByName: null,
      changedAt: null,
    });
    expect(
      (await (await as('admin@test.example')).get('/api/sites/00000000-0000-4000-8000-000000000999/settings')).status,
    ).toBe(404);
  });
});

describe('changing a setting', () => {
  it('lets the site’s admin change it, names who and when, and audits the old and new value together', async () => {
    const agent = await as('siteadmin-a@test.example');
    const res = await agent.put(url(world.sites.A.id)).send({ value: { minMPa: 210, maxMPa: 245 } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      key: KEY,
      value: { minMPa: 210, maxMPa: 245 },
      defaultValue: shipped,
      source: 'site',
      changedById: world.users.siteAdminA.id,
      changedByName: 'siteadmin-a',
    });
    expect(Date.now() - Date.parse(res.body.changedAt)).toBeLessThan(60_000);

    // Everyone at the site reads the new value; another site keeps the shipped one.
    const tech = await as('tech-a@test.example');
    expect(itemOf((await tech.get(`/api/sites/${world.sites.A.id}/settings`)).body)).toMatchObject({
      value: { minMPa: 210, maxMPa: 245 },
      source: 'site',
      changedByName: 'siteadmin-a',
    });
    const admin = await as('admin@test.example');
    expect(itemOf((await admin.get(`/api/sites/${world.sites.B.id}/settings`)).body).source).toBe('shipped');

    // The audit trail has the change, from the shipped value to the site's own.
    const audit = await agent.get(`/api/audit?siteId=${world.sites.A.id}&entity=SiteSetting`);
    expect(audit.body.items).toHaveLength(1);
    expect(audit.body.items[0]).toMatchObject({
      entity: 'SiteSetting',
      entityId: KEY,
      action: 'update',
      actorName: 'siteadmin-a',
      siteId: world.sites.A.id,
      before: { ...shipped, source: 'shipped' },
      after: { minMPa: 210, maxMPa: 245, source: 'site' },
    });

    // A second change records only what changed; the same value again records nothing.
    await agent
      .put(url(world.sites.A.id))
      .send({ value: { minMPa: 210, maxMPa: 250 } })
      .expect(200);
    await agent
      .put(url(world.sites.A.id))
      .send({ value: { minMPa: 210, maxMPa: 250 } })
      .expect(200);
    const entries = (await agent.get(`/api/audit?siteId=${world.sites.A.id}&entity=SiteSetting`)).body.items;
    expect(entries).toHaveLength(2);
    expect(entries[0]).toMatchObject({ before: { maxMPa: 245 }, after: { maxMPa: 250 } });
    expect(Object.keys(entries[0].after)).toEqual(['maxMPa']);
    expect(await SiteSetting.count()).toBe(1);
  });

  it('lets an admin change any site’s setting', async () => {
    const res = await (
      await as('admin@test.example')
    )
      .put(url(world.sites.C.id, 'head_force'))
      .send({ value: { minN: 5, maxN: 40 } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ source: 'site', changedByName: 'admin' });
    expect((await settingsInForce(world.sites.C.id)).get('head_force')).toEqual({ minN: 5, maxN: 40 });
    expect((await settingsInForce(world.sites.A.id)).get('head_force')).toEqual(
      settingDefinition('head_force')!.defaults,
    );
  });

  it.each([
    ['manager-all@test.example', 'A', 403],
    ['lead-north@test.example', 'A', 403],
    ['tech-a@test.example', 'A', 403],
    ['siteadmin-a@test.example', 'B', 404],
    ['tech-c@test.example', 'A', 404],
  ])('refuses %s at site %s (%i), writing nothing', async (email, code, status) => {
    const agent = await as(email);
    const siteId = world.sites[code as 'A' | 'B'].id;
    const change = await agent.put(url(siteId)).send({ value: { minMPa: 210, maxMPa: 245 } });
    expect(change.status).toBe(status);
    expect((await agent.delete(url(siteId))).status).toBe(status);
    if (status === 403) expect(change.body.error.message).toMatch(/administrator or this site’s admin/);
    expect(await SiteSetting.count()).toBe(0);
    expect(await AuditEntry.count()).toBe(0);
  });

  it('says which field needs fixing, and writes nothing', async () => {
    const agent = await as('siteadmin-a@test.example');
    const put = (value: unknown) => agent.put(url(world.sites.A.id)).send({ value });

    const low = await put({ minMPa: 5, maxMPa: 240 });
    expect(low.status).toBe(400);
    expect(low.body.error.message).toMatch(/Band tension, bi-metal bands/);
    expect(low.body.error.details).toEqual([{ path: 'value.minMPa', message: expect.stringMatching(/^Lowest/) }]);

    const crossed = await put({ minMPa: 250, maxMPa: 240 });
    expect(crossed.body.error.details).toEqual([
      { path: 'value.maxMPa', message: 'The highest tension must not be below the lowest' },
    ]);
    expect((await put({ minMPa: 200, maxMPa: 240, colour: 1 })).status).toBe(400);
    expect((await put({ minMPa: '200', maxMPa: 240 })).body.error.details[0].path).toBe('value.minMPa');
    expect((await put({ maxMPa: 240 })).body.error.details[0].path).toBe('value.minMPa');
    expect((await agent.put(url(world.sites.A.id)).send({ minMPa: 200 })).status).toBe(400);
    expect((await agent.put(url(world.sites.A.id)).send({ value: 3 })).status).toBe(400);

    const unknown = await agent.put(url(world.sites.A.id, 'band_speed.unobtainium')).send({ value: {} });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/no site setting named "band_speed.unobtainium"/);

    expect(await SiteSetting.count()).toBe(0);
    expect(await AuditEntry.count()).toBe(0);
  });

  it('uses the shipped value when a stored value no longer fits the setting', async () => {
    await SiteSetting.create({
      siteId: world.sites.A.id,
      key: KEY,
      value: { minMPa: 900, maxMPa: 100 },
      changedBy: world.users.admin.id,
    });
    const res = await (await as('tech-a@test.example')).get(`/api/sites/${world.sites.A.id}/settings`);
    expect(itemOf(res.body)).toMatchObject({ value: shipped, source: 'shipped', changedByName: null });
  });
});

describe('resetting a setting to the shipped value', () => {
  it('removes the site’s own value, audits it, and does nothing when there is none', async () => {
    const agent = await as('siteadmin-a@test.example');
    await agent
      .put(url(world.sites.A.id))
      .send({ value: { minMPa: 210, maxMPa: 245 } })
      .expect(200);
    const reset = await agent.delete(url(world.sites.A.id));
    expect(reset.status).toBe(200);
    expect(reset.body).toMatchObject({ value: shipped, source: 'shipped', changedByName: null, changedAt: null });
    expect(await SiteSetting.count()).toBe(0);

    const entries = (await agent.get(`/api/audit?siteId=${world.sites.A.id}&entity=SiteSetting`)).body.items;
    expect(entries).toHaveLength(2);
    expect(entries[0]).toMatchObject({
      entityId: KEY,
      actorName: 'siteadmin-a',
      before: { minMPa: 210, maxMPa: 245, source: 'site' },
      after: { ...shipped, source: 'shipped' },
    });

    await agent.delete(url(world.sites.A.id)).expect(200);
    expect(await AuditEntry.count()).toBe(2);
  });

  it('keeps technicians, managers and leads out of the settings history', async () => {
    await (
      await as('siteadmin-a@test.example')
    )
      .put(url(world.sites.A.id))
      .send({ value: { minMPa: 210, maxMPa: 245 } })
      .expect(200);
    for (const email of ['tech-a@test.example', 'manager-all@test.example', 'lead-north@test.example']) {
      const res = await (await as(email)).get(`/api/audit?siteId=${world.sites.A.id}&entity=SiteSetting`);
      expect(res.body.items, email).toEqual([]);
    }
  });
});
