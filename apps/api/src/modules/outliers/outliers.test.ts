import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../../test-support/test-db.js';
import { PASSWORD, buildWorld, sawBody, type World } from '../../test-support/fixtures.js';
import { BladeSpec } from '../blade-specs/blade-spec.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';
import { CutLog } from '../cut-logs/cut-log.model.js';
import { Saw } from '../saws/saw.model.js';
import { Site } from '../sites/site.model.js';
import { ExchangeRate } from '../exchange-rates/exchange-rate.model.js';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';

/*
 * Eight horizontal saws cutting carbon steel at sites A and B (region North), January–June 2026. Seven are
 * ordinary: four finished blades each of 3.8, 4.0, 4.2 and 4.4 million mm² plus the saw's own offset, €60.00
 * a blade, one two-hour mechanical stop a month. One is planted bad (A-BAD): six blades of 1 000 000 mm², four
 * taken off for tooth strippage, break-in skipped, cut logs with 1.5 teeth in the work, and a four-hour failure
 * every other week. A-FEW has two finished blades only; V-1 is the region's one vertical saw. Site C (South)
 * has a saw as bad as A-BAD, which the North lead must never see.
 */
let ctx: TestContext;
let world: World;
const agents: Record<string, supertest.Agent> = {};
const saws: Record<string, Saw> = {};
const Q = 'from=2026-01&to=2026-06';

async function makeSaw(siteId: string, tag: string, kind: 'horizontal' | 'vertical' = 'horizontal') {
  saws[tag] = await Saw.create({
    ...(sawBody(siteId, { assetTag: tag, kind }) as ReturnType<typeof sawBody> & { kind: 'horizontal' }),
    retiredAt: null,
  });
  return saws[tag]!;
}

async function history(
  saw: Saw,
  specId: string,
  blades: { area: number; reason?: RemovalReason; breakIn?: boolean }[],
  failuresEveryDays: number,
  stopHours: number,
) {
  const start = Date.parse('2026-01-05T00:00:00Z');
  const span = (170 * 86_400_000) / blades.length;
  for (const [i, b] of blades.entries()) {
    await BladeRun.create({
      siteId: saw.siteId,
      sawId: saw.id,
      bladeSpecId: specId,
      stockReceiptId: null,
      installedAt: new Date(start + i * span),
      installedById: null,
      tensionMpa: null,
      materialGroup: 'carbon_steel',
      breakInFollowed: b.breakIn ?? true,
      installNotes: null,
      costMinor: 6000,
      currency: 'EUR',
      removedAt: new Date(start + (i + 1) * span - 3_600_000),
      removalReason: b.reason ?? 'worn_out',
      areaCutMm2: b.area,
      cuts: 100,
    });
  }
  for (let t = start + 86_400_000; t < Date.parse('2026-06-25T00:00:00Z'); t += failuresEveryDays * 86_400_000) {
    await Stop.create({
      siteId: saw.siteId,
      sawId: saw.id,
      startedAt: new Date(t),
      endedAt: new Date(t + stopHours * 3_600_000),
      category: 'mechanical',
      planned: false,
      notes: null,
      createdById: null,
      endedById: null,
    });
  }
}

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  const spec = await BladeSpec.create({
    siteId: null,
    name: 'Outlier fixture spec',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    coarseTpi: 3,
    fineTpi: 4,
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6000,
    currency: 'EUR',
    supplier: null,
  });
  const ordinary = ['A-N1', 'A-N2', 'A-N3', 'A-N4', 'B-N5', 'B-N6', 'B-N7'];
  for (const [i, tag] of ordinary.entries()) {
    const saw = await makeSaw(tag.startsWith('A') ? world.sites.A.id : world.sites.B.id, tag);
    const offset = i * 50_000;
    await history(
      saw,
      spec.id,
      [3.8e6, 4.0e6, 4.2e6, 4.4e6].map((area) => ({ area: area + offset })),
      30,
      2,
    );
  }
  const bad = await makeSaw(world.sites.A.id, 'A-BAD');
  const reasons: RemovalReason[] = [
    'tooth_strippage',
    'tooth_strippage',
    'worn_out',
    'tooth_strippage',
    'worn_out',
    'tooth_strippage',
  ];
  await history(
    bad,
    spec.id,
    reasons.map((reason) => ({ area: 1e6, reason, breakIn: false })),
    14,
    4,
  );
  for (let n = 0; n < 4; n++)
    await CutLog.create({
      siteId: bad.siteId,
      sawId: bad.id,
      bladeRunId: null,
      cutAt: new Date(Date.parse('2026-02-01T10:00:00Z') + n * 86_400_000),
      shape: { kind: 'round_tube', outsideDiameterMm: 60, wallMm: 2 } as never,
      pieceCount: 1,
      piecesAcross: 1,
      materialGroup: 'carbon_steel',
      quantity: 20,
      bandSpeedMPerMin: null,
      feedMmPerMin: null,
      cutTimeS: null,
      areaPerCutMm2: 364,
      areaCutMm2: 7280,
      teethInWorkMin: 1.5,
      teethInWorkMax: 2,
      warnings: [],
      notes: null,
      createdById: null,
    });
  await history(await makeSaw(world.sites.A.id, 'A-FEW'), spec.id, [{ area: 4e6 }, { area: 4e6 }], 30, 2);
  await history(
    await makeSaw(world.sites.B.id, 'V-1', 'vertical'),
    spec.id,
    [1, 2, 3, 4].map(() => ({ area: 6e5 })),
    30,
    2,
  );
  const southBad = await makeSaw(world.sites.C.id, 'C-BAD');
  await history(
    southBad,
    spec.id,
    reasons.map((reason) => ({ area: 1e6, reason })),
    14,
    4,
  );
  for (const [name, user] of Object.entries(world.users))
    agents[name] = await signedInAgent(ctx.app, user.email, PASSWORD);
});
afterAll(async () => ctx.close());

type Flag = { sawId: string; metric: string; value: number; peerMedian: number; modifiedZ: number; method: string };

describe('GET /api/outliers (the regional lead’s home)', () => {
  it('flags the planted bad saw on each figure, and each flag explains itself', async () => {
    const res = await agents.leadNorth!.get(`/api/outliers?${Q}`).expect(200);
    const flags = res.body.flags as Flag[];
    const bad = saws['A-BAD']!.id;
    expect(new Set(flags.map((f) => f.sawId))).toEqual(new Set([bad]));
    expect(flags.map((f) => f.metric).sort()).toEqual(['blade_life', 'cost_per_area', 'failure_rate', 'stop_hours']);
    const life = flags.find((f) => f.metric === 'blade_life')!;
    // Its median life is 1 000 000 mm²; the peers' medians are 4 100 000 + offsets (0 … 300 000) and its own,
    // so the group median of the eight is the mean of the 4th and 5th: (4 200 000 + 4 250 000) / 2 = 4 225 000.
    expect(life.value).toBe(1_000_000);
    expect(life.peerMedian).toBe(4_225_000);
    expect(life.modifiedZ).toBeLessThan(-3.5);
    expect(life.method).toMatch(/^Modified z-score -\d+(\.\d+)? against 8 comparable saws, beyond the limit of ±3.5/);
    // The group is the horizontal saws cutting mostly carbon steel, judged on eight saws each.
    const group = res.body.groups.find((g: { key: string }) => g.key === 'horizontal:carbon_steel');
    expect(group.metrics.blade_life.judged).toBe(8);
  });

  it('says when a saw has too few records, or no comparable saws, instead of flagging it', async () => {
    const res = await agents.leadNorth!.get(`/api/outliers?${Q}`).expect(200);
    const reasons = (tag: string) =>
      (res.body.notJudged as { sawId: string; metric: string; reason: string }[])
        .filter((n) => n.sawId === saws[tag]!.id)
        .map((n) => `${n.metric}: ${n.reason}`);
    expect(reasons('A-FEW')).toContain(
      'blade_life: Too few records to judge: 2 finished blades with the area cut recorded; at least 3 are needed.',
    );
    expect(reasons('V-1')).toContain('blade_life: Only 1 comparable saw; at least 5 are needed before any is flagged.');
  });

  it('keeps other regions out: the South saw is neither judged nor a peer, and its page is not found', async () => {
    const res = await agents.leadNorth!.get(`/api/outliers?${Q}`).expect(200);
    expect(res.body.saws.map((s: { saw: { assetTag: string } }) => s.saw.assetTag)).not.toContain('C-BAD');
    await agents.leadNorth!.get(`/api/outliers/saws/${saws['C-BAD']!.id}?${Q}`).expect(404);
    const csv = await agents.leadNorth!.get(`/api/outliers/export?${Q}`).expect(200);
    expect(csv.text).not.toContain('C-BAD');
    expect(csv.text).toContain('A-BAD');
  });
});

describe('GET /api/outliers/saws/:sawId', () => {
  it('sets the saw’s failure reasons beside its peers’ and ranks the likely causes with their evidence', async () => {
    const res = await agents.leadNorth!.get(`/api/outliers/saws/${saws['A-BAD']!.id}?${Q}`).expect(200);
    // Its six blades: 4 tooth strippage, 2 worn out; its peers' 30 blades (7 × 4, and A-FEW's 2) all worn out.
    expect(res.body.reasonMix).toEqual([
      { reason: 'worn_out', saw: 2, sawShare: 2 / 6, peers: 30, peerShare: 1 },
      { reason: 'tooth_strippage', saw: 4, sawShare: 4 / 6, peers: 0, peerShare: 0 },
    ]);
    expect(res.body.standoutReason).toBe('tooth_strippage');
    const causes = res.body.likelyCauses;
    expect(causes.modeLabel).toBe('Tooth strippage');
    expect(causes.evidenceUsed).toEqual({ cutLogs: 4, breakInSkippedShare: 1 });
    // All four cut logs had fewer than 3 teeth in the work: the first cause, with that evidence.
    expect(causes.causes[0].cause).toBe('teeth_in_work_low');
    expect(causes.causes[0].evidence[0].text).toBe('4 of 4 cut logs had fewer than 3 teeth in the work.');
    expect(causes.causes.map((c: { cause: string }) => c.cause)).toContain('break_in_skipped');
    expect(res.body.flags).toHaveLength(4);
    // Its peers: the seven ordinary saws and A-FEW (in the group, though too new to be judged on blade life).
    expect(res.body.peers).toHaveLength(8);
  });
});

describe('money in other currencies', () => {
  type Review = { saws: { saw: { id: string }; values: { cost_per_area: number | null } }[]; warnings: string[] };
  const review = async () => (await agents.leadNorth!.get(`/api/outliers?${Q}`).expect(200)).body as Review;
  const costPerArea = (body: Review, tag: string) =>
    body.saws.find((s) => s.saw.id === saws[tag]!.id)!.values.cost_per_area;

  it('converts a saw’s foreign blades month by month, whichever currency its site keeps', async () => {
    const before = await review();
    // A-N1's four blades at €60.00 over 3.8 + 4.0 + 4.2 + 4.4 million mm².
    expect(costPerArea(before, 'A-N1')).toBeCloseTo(24_000 / 16.4e6, 15);

    // Site B keeps dollars from now on (its blades were still bought in euros): the same figures.
    await Site.update({ currency: 'USD' }, { where: { id: world.sites.B.id } });
    const siteInDollars = await review();
    for (const tag of ['B-N5', 'B-N6', 'B-N7', 'V-1'])
      expect(costPerArea(siteInDollars, tag)).toBe(costPerArea(before, tag));

    // One of A-N1's blades was bought for US$70.00 (on in January, off in February). Without February's rate
    // there is no cost per area, and the warning says which rate is missing.
    const first = (await BladeRun.findOne({ where: { sawId: saws['A-N1']!.id }, order: [['installedAt', 'ASC']] }))!;
    await first.update({ currency: 'USD', costMinor: 7000 });
    const noRate = await review();
    expect(costPerArea(noRate, 'A-N1')).toBeNull();
    expect(noRate.warnings.join(' ')).toContain('USD');
    // With February's rate: 7 000 × 0.9 = 6 300 cents beside the other three blades' 18 000.
    await ExchangeRate.create({
      month: '2026-02-01',
      currency: 'USD',
      reportingCurrency: 'EUR',
      rate: 0.9,
      setById: null,
    });
    expect(costPerArea(await review(), 'A-N1')).toBeCloseTo(24_300 / 16.4e6, 15);

    await ExchangeRate.destroy({ where: {} });
    await first.update({ currency: 'EUR', costMinor: 6000 });
    await Site.update({ currency: 'EUR' }, { where: { id: world.sites.B.id } });
  });
});
