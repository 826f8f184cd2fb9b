import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { signedInAgent, startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { clearJobs, eventually, startTestMail, type TestMail } from '../test-support/mail.js';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { StockLevel, StockReceipt } from '../modules/blade-stock/stock-receipt.model.js';

/*
 * A technician draws blades from site A's stock through the API. Three received, reorder point 2 (no use in the
 * window before: lead time × use = 0, safety stock 2): the first draw leaves 2 on hand — at the reorder point —
 * and the site's admin is told; a second draw the same day tells nobody again. A spec with plenty on hand tells
 * nobody, and site C's admin never hears of site A's stock.
 */
let mail: TestMail;
let ctx: TestContext;
let world: World;

async function spec(name: string) {
  return BladeSpec.create({
    siteId: null,
    name,
    widthMm: 27,
    thicknessMm: 0.9,
    lengthMm: 3660,
    coarseTpi: 4,
    fineTpi: 6,
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 5000,
    currency: 'EUR',
    supplier: null,
  });
}

async function stock(specId: string, quantity: number, safetyStock: number) {
  await StockReceipt.create({
    siteId: world.sites.A.id,
    bladeSpecId: specId,
    quantity,
    unitCostMinor: 5000,
    currency: 'EUR',
    receivedOn: new Date(Date.now() - 30 * 86_400_000).toISOString().slice(0, 10),
    reference: null,
    notes: null,
    createdById: null,
  });
  await StockLevel.create({
    siteId: world.sites.A.id,
    bladeSpecId: specId,
    leadTimeDays: 14,
    safetyStock,
    updatedById: null,
  });
}

async function lowStockMails(): Promise<{ to_address: string; dedupe_key: string }[]> {
  return ctx.sequelize.query(
    `SELECT to_address, dedupe_key FROM mail_log WHERE kind = 'low_stock' ORDER BY created_at`,
    { type: QueryTypes.SELECT },
  );
}

beforeAll(async () => {
  mail = await startTestMail();
  ctx = startTestApp({ mail: { smtpPort: mail.port, workers: true, catcherDir: mail.dir } });
  await ctx.ready;
  world = await buildWorld(ctx.sequelize);
  await clearJobs(ctx.sequelize);
});

afterAll(async () => {
  await ctx.close();
  await mail.close();
});

describe('a blade drawn from stock that takes its spec to the reorder point', () => {
  it('tells the site’s admins once a day, and nobody for a spec with plenty on hand', async () => {
    const low = await spec('Trigger spec 27x0.9');
    const plenty = await spec('Plenty spec 27x0.9');
    await stock(low.id, 3, 2);
    await stock(plenty.id, 50, 2);
    const tech = await signedInAgent(ctx.app, 'tech-a@test.example', PASSWORD);
    const [saw1, saw2] = world.saws.A!;

    // Plenty on hand: installed and taken off, no notice.
    const first = await tech.post('/api/blade-runs').send({ sawId: saw1!.id, bladeSpecId: plenty.id });
    expect(first.status).toBe(201);
    expect(first.body.run.stockReceiptId).not.toBeNull();
    expect((await tech.post(`/api/blade-runs/${first.body.run.id}/remove`).send({ reason: 'worn_out' })).status).toBe(
      200,
    );
    expect(await lowStockMails()).toEqual([]);

    // Three received, one drawn: 2 on hand, at the reorder point of 2.
    expect((await tech.post('/api/blade-runs').send({ sawId: saw1!.id, bladeSpecId: low.id })).status).toBe(201);
    const notice = await mail.waitFor('siteadmin-a@test.example');
    expect(notice.subject).toBe('Kerfline: blade stock is low at Site A');
    expect(notice.text).toContain('Trigger spec 27x0.9');
    expect(notice.text).not.toContain('Plenty spec 27x0.9');

    // Another drawn the same day: still one notice.
    expect((await tech.post('/api/blade-runs').send({ sawId: saw2!.id, bladeSpecId: low.id })).status).toBe(201);
    await eventually(async () => (await lowStockMails()).length > 0, 'the notice is logged');
    const logged = await lowStockMails();
    expect(logged.map((m) => m.to_address)).toEqual(['siteadmin-a@test.example']);
    expect(logged[0]!.dedupe_key).toContain(low.id);
  });
});
