import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, signedInAgent, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import { buildWorld, PASSWORD, sawBody, type World } from '../../apps/api/src/test-support/fixtures.js';

// A saw's life across roles: a site admin adds it, the people of that site and those above it see it,
// nobody elsewhere does, and retiring it keeps it for history without counting it as active.

let ctx: TestContext;
let world: World;
const as = (email: string) => signedInAgent(ctx.app, email, PASSWORD);

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
});
afterAll(async () => ctx.close());

describe('a saw from purchase to retirement', () => {
  let sawId = '';

  it('is added by the site admin', async () => {
    const res = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { assetTag: 'A-NEW', name: 'New bar saw' }));
    expect(res.status).toBe(201);
    sawId = res.body.id;
  });

  it('is seen at its site and above it, and by nobody outside', async () => {
    for (const email of [
      'tech-a@test.example',
      'manager-ac@test.example',
      'lead-north@test.example',
      'admin@test.example',
    ]) {
      const agent = await as(email);
      expect((await agent.get(`/api/saws/${sawId}`)).status, email).toBe(200);
      expect((await agent.get('/api/saws?q=A-NEW')).body.total, email).toBe(1);
    }
    const outsider = await as('tech-c@test.example');
    expect((await outsider.get(`/api/saws/${sawId}`)).status).toBe(404);
    expect((await outsider.get('/api/saws?q=A-NEW&includeRetired=true')).body.total).toBe(0);
  });

  it('counts in its site’s active saws until retired', async () => {
    const manager = await as('manager-ac@test.example');
    const count = async () => (await manager.get(`/api/sites/${world.sites.A.id}`)).body.activeSawCount;
    expect(await count()).toBe(3);
    expect((await (await as('siteadmin-a@test.example')).post(`/api/saws/${sawId}/retire`)).status).toBe(200);
    expect(await count()).toBe(2);
    const history = await manager.get(`/api/saws/${sawId}`);
    expect(history.body.status).toBe('retired');
  });
});
