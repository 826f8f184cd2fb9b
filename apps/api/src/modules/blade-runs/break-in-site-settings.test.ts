import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type Records, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let records: Records;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  records = await buildRecords(world);
});

describe('the break-in plan uses the site’s own band speeds', () => {
  it('gives the site’s range for the material, saying who set it, and Kerfline’s value elsewhere', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const changed = await siteAdmin
      .put(`/api/sites/${world.sites.A.id}/settings/band_speed.carbon_steel`)
      .send({ value: { minMPerMin: 40, maxMPerMin: 70 } });
    expect(changed.status).toBe(200);

    const sawA = world.saws.A![1]!.id;
    const planA = (
      await (
        await as('tech-a@test.example')
      ).get(`/api/saws/${sawA}/break-in-plan?bladeSpecId=${records.fleetSpec.id}&materialGroup=carbon_steel`)
    ).body;
    expect(planA.bandSpeed.recommended).toMatchObject({ minMPerMin: 40, maxMPerMin: 70 });
    expect(planA.bandSpeed.recommended.basis).toMatchObject({
      kind: 'site_setting',
      settingKey: 'band_speed.carbon_steel',
      changedByName: 'siteadmin-a',
    });
    // The first step runs at the break-in share of the site's range, in the plan's own words.
    expect(planA.plan.bandSpeed.normal).toMatchObject({ minMPerMin: 40, maxMPerMin: 70 });
    expect(planA.plan.steps[planA.plan.steps.length - 1].note).toContain('40–70 m/min');

    const sawC = world.saws.C![1]!.id;
    const planC = (
      await (
        await as('tech-c@test.example')
      ).get(`/api/saws/${sawC}/break-in-plan?bladeSpecId=${records.fleetSpec.id}&materialGroup=carbon_steel`)
    ).body;
    expect(planC.bandSpeed.recommended.basis.changedAt ?? null).toBeNull();
    expect(planC.bandSpeed.recommended.minMPerMin).not.toBe(40);
  });

  it('answers the install with the same site range', async () => {
    await (
      await as('siteadmin-a@test.example')
    )
      .put(`/api/sites/${world.sites.A.id}/settings/band_speed.carbon_steel`)
      .send({ value: { minMPerMin: 40, maxMPerMin: 70 } })
      .expect(200);
    const res = await (
      await as('tech-a@test.example')
    )
      .post('/api/blade-runs')
      .send({ sawId: world.saws.A![1]!.id, bladeSpecId: records.fleetSpec.id, materialGroup: 'carbon_steel' });
    expect(res.status).toBe(201);
    expect(res.body.breakIn.bandSpeed.recommended).toMatchObject({ minMPerMin: 40, maxMPerMin: 70 });
  });
});
