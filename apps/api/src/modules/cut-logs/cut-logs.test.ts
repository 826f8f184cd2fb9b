import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let runId: string;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  const admin = await as('admin@test.example');
  // A constant 4 TPI blade on saw A-1 since 10 hours ago.
  const spec = (await admin.post('/api/blade-specs').send(specBody(null, { pitch: { kind: 'constant', tpi: 4 } }))).body
    .id;
  runId = (
    await admin
      .post('/api/blade-runs')
      .send({ sawId: world.saws.A![0]!.id, bladeSpecId: spec, installedAt: minutesAgo(600) })
  ).body.run.id;
});

const log = (agent: supertest.Agent, body: Record<string, unknown>) =>
  agent.post('/api/cut-logs').send({ sawId: world.saws.A![0]!.id, materialGroup: 'carbon_steel', ...body });

describe('logging cuts', () => {
  it('stores the cut area and teeth in the work with the pitch of the blade on the saw then', async () => {
    const tech = await as('tech-a@test.example');
    // 100 mm round bar, 3 pieces side by side, 4 cuts. Area per cut: 3 × π × 100² / 4 = 23 561.9 mm².
    // Teeth in work, 4 TPI: least over the mean chord π·D/4 × 3 = 235.6 mm → 4 × 235.6 / 25.4 = 37.1;
    // most over 3 × 100 mm → 4 × 300 / 25.4 = 47.2: both above 24, so a warning to choose a coarser pitch.
    const res = await log(tech, {
      cutAt: minutesAgo(60),
      stock: { shape: { kind: 'round_bar', diameterMm: 100 }, pieceCount: 3, piecesAcross: 3 },
      quantity: 4,
      bandSpeedMPerMin: 70,
      cutTimeS: 240,
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      bladeRunId: runId,
      pieceCount: 3,
      piecesAcross: 3,
      quantity: 4,
      bandSpeedMPerMin: 70,
      cutTimeS: 240,
    });
    expect(res.body.areaPerCutMm2).toBeCloseTo((3 * Math.PI * 100 * 100) / 4, 6);
    expect(res.body.areaCutMm2).toBeCloseTo(3 * Math.PI * 100 * 100, 6);
    expect(res.body.teethInWorkMin).toBeCloseTo((4 * 3 * (Math.PI * 100)) / 4 / 25.4, 9);
    expect(res.body.teethInWorkMax).toBeCloseTo((4 * 300) / 25.4, 9);
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['too_many_teeth']);
  });

  it('warns, without refusing, when the band speed is outside the material’s range or the saw’s', async () => {
    const tech = await as('tech-a@test.example');
    // Stainless steel 20–40 m/min at the 4 in reference length of cut (the shipped site setting), raised for the
    // 50 mm (1.97 in) length of cut by the printed change, interpolated between +10 % at 1.25 in and 0 at 4 in
    // (Machinery's Handbook, 31st ed., p. 1245): +7.39 % → 21.5–43.0 m/min. 90 m/min is above. The 50 mm square
    // bar with 4 TPI gives 4 × 50 / 25.4 = 7.9 teeth, fine.
    const fast = await log(tech, {
      materialGroup: 'stainless_steel',
      stock: { shape: { kind: 'square_bar', sideMm: 50 } },
      bandSpeedMPerMin: 90,
    });
    expect(fast.status).toBe(201);
    expect(fast.body.warnings).toEqual([
      {
        code: 'band_speed_above',
        message: '90 m/min is above the 21–43 m/min range for stainless steel; lower it to at most 43 m/min.',
      },
    ]);
  });

  it('logs a cut on a saw with no blade recorded, saying the teeth could not be worked out', async () => {
    const tech = await as('tech-a@test.example');
    const res = await tech.post('/api/cut-logs').send({
      sawId: world.saws.A![1]!.id,
      stock: { shape: { kind: 'flat_bar', widthMm: 100, heightMm: 10 } },
      materialGroup: 'aluminium',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ bladeRunId: null, teethInWorkMin: null, areaCutMm2: 1000 });
    expect(res.body.warnings[0].code).toBe('no_blade_recorded');
  });

  it('refuses impossible stock, absurd figures and future times with messages that say what to fix', async () => {
    const tech = await as('tech-a@test.example');
    const wall = await log(tech, { stock: { shape: { kind: 'round_tube', outsideDiameterMm: 50, wallMm: 30 } } });
    expect(wall.status).toBe(400);
    expect(wall.body.error.details[0]).toEqual({
      path: 'stock.shape.wallMm',
      message: 'Wall must be less than half the outside diameter (with no bore left it is a round bar)',
    });
    const absurd = await log(tech, {
      stock: { shape: { kind: 'square_bar', sideMm: 50 } },
      quantity: 0,
      bandSpeedMPerMin: -3,
      cutTimeS: 90000,
      cutAt: new Date(Date.now() + 86_400_000).toISOString(),
    });
    expect(absurd.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'bandSpeedMPerMin',
      'cutAt',
      'cutTimeS',
      'quantity',
    ]);
    const unknown = await log(tech, { stock: { shape: { kind: 'hexagon', sideMm: 50 } } });
    expect(unknown.body.error.details[0].message).toMatch(/^Choose a stock shape/);
  });

  it('keeps cut logs within their site', async () => {
    await log(await as('tech-a@test.example'), { stock: { shape: { kind: 'square_bar', sideMm: 40 } } }).expect(201);
    const techC = await as('tech-c@test.example');
    expect((await techC.get('/api/cut-logs')).body.total).toBe(0);
    expect((await log(techC, { stock: { shape: { kind: 'square_bar', sideMm: 40 } } })).status).toBe(400);
    expect(
      (await log(await as('manager-all@test.example'), { stock: { shape: { kind: 'square_bar', sideMm: 40 } } }))
        .status,
    ).toBe(403);
    const lead = (await (await as('lead-north@test.example')).get(`/api/cut-logs?bladeRunId=${runId}`)).body;
    expect(lead.total).toBe(1);
  });
});
