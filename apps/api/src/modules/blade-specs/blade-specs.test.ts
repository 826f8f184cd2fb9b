import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const names = (body: { items: { name: string }[] }) => body.items.map((s) => s.name).sort();

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('the blade-spec catalogue: fleet-wide specs and each site’s own', () => {
  it('keeps the fleet catalogue with admins and lets a site admin add specs for their own site', async () => {
    const admin = await as('admin@test.example');
    const fleet = await admin
      .post('/api/blade-specs')
      .send(specBody(null, { name: 'Fleet 34 3/4', supplier: 'Welder & Sons' }));
    expect(fleet.status).toBe(201);
    expect(fleet.body).toMatchObject({
      siteId: null,
      name: 'Fleet 34 3/4',
      pitch: { kind: 'variable', coarseTpi: 3, fineTpi: 4 },
      toothForm: 'hook',
      toothSet: 'raker',
      material: 'bimetal',
      unitCostMinor: 6450,
      currency: 'EUR',
      supplier: 'Welder & Sons',
      archived: false,
    });
    const siteAdmin = await as('siteadmin-a@test.example');
    expect((await siteAdmin.post('/api/blade-specs').send(specBody(null))).status).toBe(403);
    const own = await siteAdmin
      .post('/api/blade-specs')
      .send(
        specBody(world.sites.A.id, { name: 'A carbon 4', pitch: { kind: 'constant', tpi: 4 }, material: 'carbon' }),
      );
    expect(own.status).toBe(201);
    expect(own.body.pitch).toEqual({ kind: 'constant', tpi: 4 });
    expect((await siteAdmin.post('/api/blade-specs').send(specBody(world.sites.B.id))).status).toBe(400);
    expect((await siteAdmin.patch(`/api/blade-specs/${fleet.body.id}`).send({ unitCostMinor: 1 })).status).toBe(403);
    expect(
      (await siteAdmin.patch(`/api/blade-specs/${own.body.id}`).send({ unitCostMinor: 3900 })).body.unitCostMinor,
    ).toBe(3900);
    expect(
      (await (await as('tech-a@test.example')).post('/api/blade-specs').send(specBody(world.sites.A.id))).status,
    ).toBe(403);
    const audit = (await siteAdmin.get('/api/audit?entity=BladeSpec')).body;
    // The site admin reads their site's spec history; the fleet spec's entry (site NULL) stays with admins.
    expect(audit.items.map((e: { action: string }) => e.action)).toEqual(['update', 'create']);
  });

  it('shows each person the fleet catalogue and their sites’ own specs only', async () => {
    const admin = await as('admin@test.example');
    await admin.post('/api/blade-specs').send(specBody(null, { name: 'Fleet' }));
    await admin.post('/api/blade-specs').send(specBody(world.sites.A.id, { name: 'Only A' }));
    await admin.post('/api/blade-specs').send(specBody(world.sites.C.id, { name: 'Only C' }));
    await admin.post('/api/blade-specs').send(specBody(null, { name: 'Old fleet', archived: true }));
    expect(names((await (await as('tech-a@test.example')).get('/api/blade-specs')).body)).toEqual(['Fleet', 'Only A']);
    expect(names((await (await as('tech-c@test.example')).get('/api/blade-specs')).body)).toEqual(['Fleet', 'Only C']);
    expect(names((await (await as('lead-north@test.example')).get('/api/blade-specs')).body)).toEqual([
      'Fleet',
      'Only A',
    ]);
    expect(names((await admin.get(`/api/blade-specs?siteId=${world.sites.C.id}`)).body)).toEqual(['Fleet', 'Only C']);
    expect(names((await admin.get('/api/blade-specs?includeArchived=true&q=fleet')).body)).toEqual([
      'Fleet',
      'Old fleet',
    ]);
    const onlyC = (await admin.get('/api/blade-specs?q=only%20c')).body.items[0].id;
    expect((await (await as('tech-a@test.example')).get(`/api/blade-specs/${onlyC}`)).status).toBe(404);
  });

  it('says what to fix: a taken name, a thickness not below the width, a backwards variable pitch', async () => {
    const admin = await as('admin@test.example');
    await admin
      .post('/api/blade-specs')
      .send(specBody(null, { name: 'Same' }))
      .expect(201);
    const taken = await admin.post('/api/blade-specs').send(specBody(null, { name: 'same' }));
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toBe('Another blade spec in this catalogue already has that name');
    // The same name in a site's own catalogue is another catalogue, so it is allowed.
    expect((await admin.post('/api/blade-specs').send(specBody(world.sites.A.id, { name: 'Same' }))).status).toBe(201);
    const bad = await admin
      .post('/api/blade-specs')
      .send(
        specBody(null, { thicknessMm: 40, pitch: { kind: 'variable', coarseTpi: 6, fineTpi: 4 }, currency: 'euro' }),
      );
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual(
      expect.arrayContaining([
        { path: 'pitch.fineTpi', message: 'The fine end must have more teeth per inch than the coarse end (e.g. 4/6)' },
        { path: 'currency', message: 'must be a three-letter ISO 4217 currency code such as EUR or USD' },
        { path: 'thicknessMm', message: 'Thickness must be smaller than the width' },
      ]),
    );
  });

  it('archives a spec that blades used instead of deleting it', async () => {
    const admin = await as('admin@test.example');
    const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body;
    await admin.post('/api/blade-runs').send({ sawId: world.saws.A![0]!.id, bladeSpecId: spec.id }).expect(201);
    const del = await admin.delete(`/api/blade-specs/${spec.id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toMatch(/archive it instead/);
    expect((await admin.patch(`/api/blade-specs/${spec.id}`).send({ archived: true })).body.archived).toBe(true);
    const install = await admin.post('/api/blade-runs').send({ sawId: world.saws.A![1]!.id, bladeSpecId: spec.id });
    expect(install.status).toBe(400);
    expect(install.body.error.message).toMatch(/is archived/);
    const unused = (await admin.post('/api/blade-specs').send(specBody(null))).body;
    expect((await admin.delete(`/api/blade-specs/${unused.id}`)).status).toBe(204);
  });
});
