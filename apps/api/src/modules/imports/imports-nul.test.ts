import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';

// Found by the fuzz (tests/api/fuzz.test.ts): a NUL character past the first 64 KiB of a file (which the sniffing
// reads) reached PostgreSQL in a rejected row's cells and the import answered 503; one in the plan would have too.

let ctx: TestContext;
let world: World;
beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  await buildRecords(world);
});
afterAll(async () => ctx.close());

const plan = (overrides: Record<string, unknown> = {}) => ({
  siteId: world.sites.A.id,
  kind: 'blade_runs',
  format: 'csv',
  encoding: null,
  delimiter: null,
  sheet: null,
  columns: [
    { header: 'Saw', field: 'saw', unit: null },
    { header: 'Blade', field: 'spec', unit: null },
    { header: 'Put on', field: 'installedAt', unit: null },
    { header: 'Taken off', field: 'removedAt', unit: null },
    { header: 'Why', field: 'reason', unit: null },
  ],
  decimalMark: ',',
  dateOrder: 'dmy',
  values: {},
  ...overrides,
});

describe('a NUL character in an import', () => {
  it('is refused with a 400 that says what to do, wherever it is in the file, and nothing is written', async () => {
    const admin = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
    const batches = async () =>
      (await ctx.sequelize.query('SELECT count(*)::int AS n FROM import_batches', { plain: true }))!.n;
    const before = await batches();
    const late = `Saw;Blade;Put on;Taken off;Why\r\n${'A-1;x;03.01.2023 07:00;;worn\r\n'.repeat(3000)}A-1;x\u0000y;1;2;3\r\n`;
    expect(Buffer.byteLength(late)).toBeGreaterThan(64 * 1024);
    for (const path of ['/api/imports/check', '/api/imports']) {
      const res = await admin
        .post(path)
        .field('plan', JSON.stringify(plan()))
        .attach('file', Buffer.from(late), 'log.csv');
      expect(res.status, path).toBe(400);
      expect(res.body.error.message).toMatch(/holds NUL characters, so it is not plain text: save it again/);
    }
    const inPlan = await admin
      .post('/api/imports')
      .field('plan', JSON.stringify(plan({ values: { reason: { x: 'worn_out\u0000' } } })))
      .attach('file', Buffer.from('Saw;Blade;Put on;Taken off;Why\r\nA-1;x;03.01.2023 07:00;;worn\r\n'), 'log.csv');
    expect(inPlan.status).toBe(400);
    expect(inPlan.body.error.details[0].message).toMatch(/NUL/);
    expect(await batches()).toBe(before);
  });
});
