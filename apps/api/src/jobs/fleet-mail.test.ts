import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { previousMonthKey } from '@kerfline/domain/mail/schema';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, sawBody, type World } from '../test-support/fixtures.js';
import { clearJobs, startTestMail, type TestMail } from '../test-support/mail.js';
import { User } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { StockLevel, StockReceipt } from '../modules/blade-stock/stock-receipt.model.js';
import { FollowUp } from '../modules/follow-ups/follow-up.model.js';
import { Budget } from '../modules/budgets/budget.model.js';
import { queueLowStockNotices } from './low-stock.js';

/*
 * The scheduled mails' fleet sections, each built with the recipient's own ability. Region North (sites A, B)
 * has seven ordinary horizontal saws and A-BAD, whose short-lived blades all came off in the last six days, so
 * its flag is new this week; region South (site C) has its own bad saw, follow-up and failures, which must never
 * reach the North lead — and the other way round.
 */
let mail: TestMail;
let ctx: TestContext;
let world: World;
let spec: BladeSpec;
const DAY = 86_400_000;
const now = Date.now();

async function saw(siteId: string, tag: string) {
  return Saw.create({
    ...(sawBody(siteId, { assetTag: tag }) as ReturnType<typeof sawBody> & { kind: 'horizontal' }),
    retiredAt: null,
  });
}

/** Blades one after another ending `endDaysAgo` days ago, each `days` long. */
async function blades(s: Saw, areas: number[], reason: RemovalReason, endDaysAgo: number, days: number) {
  let t = now - (endDaysAgo + areas.length * days) * DAY;
  for (const area of areas) {
    await BladeRun.create({
      siteId: s.siteId,
      sawId: s.id,
      bladeSpecId: spec.id,
      stockReceiptId: null,
      installedAt: new Date(t),
      installedById: null,
      tensionMpa: null,
      materialGroup: 'carbon_steel',
      breakInFollowed: true,
      installNotes: null,
      costMinor: 6000,
      currency: 'EUR',
      removedAt: new Date(t + days * DAY - 3_600_000),
      removalReason: reason,
      areaCutMm2: area,
      cuts: 100,
    });
    t += days * DAY;
  }
}

beforeAll(async () => {
  mail = await startTestMail();
  ctx = startTestApp({ mail: { smtpPort: mail.port, workers: true, catcherDir: mail.dir } });
  await ctx.ready;
  world = await buildWorld(ctx.sequelize);
  await clearJobs(ctx.sequelize);
  spec = await BladeSpec.create({
    siteId: null,
    name: 'Digest spec 34x1.1',
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
  await User.create({
    email: 'lead-south@test.example',
    name: 'lead-south',
    role: 'regional_lead',
    passwordHash: world.users.admin.passwordHash,
    siteId: null,
    regionId: world.regions.south.id,
  });
  for (const [i, tag] of ['A-N1', 'A-N2', 'A-N3', 'B-N4', 'B-N5', 'B-N6', 'B-N7'].entries())
    await blades(
      await saw(tag.startsWith('A') ? world.sites.A.id : world.sites.B.id, tag),
      [3.8e6, 4.0e6, 4.2e6, 4.4e6].map((a) => a + i * 50_000),
      'worn_out',
      10,
      30,
    );
  await blades(await saw(world.sites.A.id, 'A-BAD'), [1e6, 1e6, 1e6, 1e6, 1e6], 'tooth_strippage', 0, 1);
  await blades(await saw(world.sites.C.id, 'C-BAD'), [1e6, 1e6, 1e6], 'fatigue_crack', 0, 1);
  const yesterday = new Date(now - DAY).toISOString().slice(0, 10);
  await FollowUp.create({
    siteId: world.sites.A.id,
    sawId: world.saws.A![0]!.id,
    title: 'North guide check',
    flag: null,
    assigneeId: world.users.techA.id,
    dueOn: yesterday,
    createdById: world.users.leadNorth.id,
  });
  await FollowUp.create({
    siteId: world.sites.C.id,
    sawId: world.saws.C![0]!.id,
    title: 'South tension check',
    flag: null,
    assigneeId: world.users.techC.id,
    dueOn: '2099-01-01',
    createdById: world.users.admin.id,
  });
});
afterAll(async () => {
  await ctx.close();
  await mail.close();
});

describe('the weekly digest’s fleet sections', () => {
  it('gives each lead their region’s new flags, open follow-ups and failure reasons, and nothing of another region', async () => {
    await ctx.jobs.fire('mail-weekly-digest');
    const north = await mail.waitFor('lead-north@test.example');
    const south = await mail.waitFor('lead-south@test.example');
    for (const part of [north.text, north.html!]) {
      expect(part).toContain('New outlier flags this week');
      expect(part).toContain('A-BAD');
      expect(part).toContain('Blade life');
      expect(part).toContain('North guide check');
      expect(part).toContain('(overdue)');
      expect(part).toContain('Tooth strippage');
      expect(part).not.toContain('C-BAD');
      expect(part).not.toContain('South tension check');
      expect(part).not.toContain('Fatigue crack');
    }
    // The flag names its figures in the region's units (sites A and B are metric): 1 m² per blade.
    expect(north.text).toContain('1 m² per blade');
    for (const part of [south.text, south.html!]) {
      expect(part).toContain('South tension check');
      expect(part).toContain('Fatigue crack');
      // Site C's one saw has no peers: nothing is flagged in the South.
      expect(part).toContain('No saw was newly flagged this week.');
      expect(part).not.toContain('A-BAD');
      expect(part).not.toContain('North guide check');
      expect(part).not.toContain('Tooth strippage');
    }
  });
});

describe('the monthly summary’s spend against budget', () => {
  it('shows each manager their own sites’ budgets only', async () => {
    const month = previousMonthKey(new Date());
    for (const [site, amount] of [
      [world.sites.A, 123_456],
      [world.sites.B, 7_777_777],
      [world.sites.C, 654_321],
    ] as const)
      await Budget.create({
        siteId: site.id,
        month: `${month}-01`,
        amountMinor: amount,
        currency: 'EUR',
        setById: null,
      });
    await ctx.jobs.fanOut('monthly_summary', new Date());
    const ac = await mail.waitFor('manager-ac@test.example');
    expect(ac.text).toContain('Blade spend against budget');
    expect(ac.text).toContain('€1,234.56');
    expect(ac.text).toContain('€6,543.21');
    expect(ac.text).not.toContain('€77,777.77');
    const all = await mail.waitFor('manager-all@test.example');
    expect(all.text).toContain('€77,777.77');
  });
});

describe('the low-stock notice', () => {
  it('lists the specs at or below their reorder point at the admin’s site', async () => {
    // Four blades received and all four drawn for A-N1: none on hand, below any reorder point.
    const receipt = await StockReceipt.create({
      siteId: world.sites.A.id,
      bladeSpecId: spec.id,
      quantity: 4,
      unitCostMinor: 6000,
      currency: 'EUR',
      receivedOn: new Date(now - 200 * DAY).toISOString().slice(0, 10),
      reference: null,
      notes: null,
      createdById: null,
    });
    await StockLevel.create({
      siteId: world.sites.A.id,
      bladeSpecId: spec.id,
      leadTimeDays: 14,
      safetyStock: 2,
      updatedById: null,
    });
    await BladeRun.update(
      { stockReceiptId: receipt.id },
      { where: { sawId: (await Saw.findOne({ where: { assetTag: 'A-N1' } }))!.id } },
    );
    await ctx.sequelize.transaction((t) => queueLowStockNotices(ctx.jobs, t, world.sites.A.id, 'digest-test'));
    const notice = await mail.waitFor('siteadmin-a@test.example');
    expect(notice.subject).toBe('Kerfline: blade stock is low at Site A');
    expect(notice.text).toContain('Digest spec 34x1.1');
    expect(notice.text).toContain('Blade specs at or below their reorder point');
  });
});
