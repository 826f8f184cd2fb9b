import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type Records, type World } from '../../test-support/fixtures.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';

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

type Entry = { kind: string; id: string; startedAt: string; endedAt: string | null };

/** Every page of a saw's timeline, following `nextBefore`, with the page size given. */
async function allPages(agent: supertest.Agent, sawId: string, limit: number) {
  const pages: Entry[][] = [];
  let before: string | null = null;
  let total = 0;
  for (let guard = 0; guard < 100; guard += 1) {
    const res = await agent.get(`/api/saws/${sawId}/timeline`).query({ limit, ...(before ? { before } : {}) });
    expect(res.status).toBe(200);
    pages.push(res.body.items);
    total = res.body.total;
    before = res.body.nextBefore;
    if (!before) break;
  }
  return { pages, total };
}

describe('a saw’s timeline', () => {
  it('puts its blade runs, stops and checks on one list, newest first, with what each entry needs on screen', async () => {
    const tech = await as('tech-a@test.example');
    const [saw1, saw2] = world.saws.A!;
    const res = await tech.get(`/api/saws/${saw1!.id}/timeline`);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(3);
    expect(res.body.nextBefore).toBeNull();
    // The fixture's guide check (19 days ago) came a day after the open run went on (20 days ago).
    expect(res.body.items.map((e: Entry) => [e.kind, e.id])).toEqual([
      ['check', records.A.checkRecord.id],
      ['blade_run', records.A.openRun.id],
      ['blade_run', records.A.run.id],
    ]);
    expect(res.body.items[0]).toMatchObject({ checkName: 'Guide bearing clearance', passed: true, photoCount: 1 });
    expect(res.body.items[2]).toMatchObject({
      bladeSpecName: 'Fleet 34x1.1 3/4',
      removalReason: 'worn_out',
      photoCount: 1,
      endedAt: records.A.run.removedAt!.toISOString(),
    });

    const stops = (await tech.get(`/api/saws/${saw2!.id}/timeline`)).body;
    expect(stops.items.map((e: Entry & { category: string }) => [e.kind, e.category, e.endedAt === null])).toEqual([
      ['stop', 'hydraulic', true],
      ['stop', 'mechanical', false],
    ]);
    expect(stops.items[1].durationMin).toBeCloseTo(24 * 60, 3);
  });

  it('pages by a cursor through interleaved runs and stops, every entry once, in order, whatever the page size', async () => {
    const saw = world.saws.A![1]!;
    const day = 86_400_000;
    const base = Date.now() - 400 * day;
    // 30 runs and 30 stops on alternating days, two of them starting at the same moment (ties go by id).
    for (let i = 0; i < 30; i += 1) {
      await BladeRun.create({
        siteId: saw.siteId,
        sawId: saw.id,
        bladeSpecId: records.fleetSpec.id,
        stockReceiptId: null,
        installedAt: new Date(base + i * 2 * day),
        installedById: null,
        tensionMpa: null,
        materialGroup: null,
        breakInFollowed: null,
        installNotes: null,
        costMinor: 6000,
        currency: 'EUR',
        removedAt: new Date(base + (i * 2 + 1) * day),
        removalReason: 'worn_out',
      });
      await Stop.create({
        siteId: saw.siteId,
        sawId: saw.id,
        startedAt: new Date(base + (i === 7 ? i * 2 : i * 2 + 1) * day + (i === 7 ? 0 : 3_600_000)),
        endedAt: new Date(base + (i * 2 + 1) * day + 7_200_000),
        category: 'blade_change',
        planned: true,
        notes: null,
        createdById: null,
        endedById: null,
      });
    }
    const tech = await as('tech-a@test.example');
    const whole = (await tech.get(`/api/saws/${saw.id}/timeline`).query({ limit: 100 })).body;
    expect(whole.total).toBe(62);
    expect(whole.items).toHaveLength(62);
    const times = whole.items.map((e: Entry) => Date.parse(e.startedAt));
    expect(times).toEqual([...times].sort((a, b) => b - a));

    for (const limit of [1, 7, 20, 61]) {
      const { pages, total } = await allPages(tech, saw.id, limit);
      expect(total).toBe(62);
      expect(pages.flat().map((e) => e.id)).toEqual(whole.items.map((e: Entry) => e.id));
      expect(pages.slice(0, -1).every((p) => p.length === limit)).toBe(true);
    }
  });

  it('shows nothing of a saw outside the caller’s sites; readers of the site see the same entries', async () => {
    const sawA = world.saws.A![0]!.id;
    expect((await (await as('tech-c@test.example')).get(`/api/saws/${sawA}/timeline`)).status).toBe(404);
    const lead = (await (await as('lead-north@test.example')).get(`/api/saws/${sawA}/timeline`)).body;
    expect(lead.total).toBe(3);
    const managerAC = (await (await as('manager-ac@test.example')).get(`/api/saws/${world.saws.B![0]!.id}/timeline`))
      .status;
    expect(managerAC).toBe(404);
  });

  it('answers a malformed cursor or page size with a 400 that says what to send', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const bad = await tech.get(`/api/saws/${sawId}/timeline?before=yesterday`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error.details)).toContain('nextBefore of the previous page');
    expect((await tech.get(`/api/saws/${sawId}/timeline?limit=500`)).status).toBe(400);
  });
});
