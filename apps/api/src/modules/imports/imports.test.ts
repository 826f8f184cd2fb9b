import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import pg from 'pg';
import Papa from 'papaparse';
import type { ImportPlanInput } from '@kerfline/domain/imports/schema';
import { startTestApp, signedInAgent, testDatabaseUrl, type TestContext } from '../../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';
import { CutLog } from '../cut-logs/cut-log.model.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (sql: string, replacements: Record<string, unknown> = {}) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${sql}`, { plain: true, replacements }))!.n as number;

/**
 * A site A blade log as a shop keeps it: semicolons, day.month.year, decimal commas, area in cm², a shop word
 * ("snapped"), a formula someone typed in a note, a saw of another site, a retired saw, a row typed twice, and a
 * blade that was "still on" in 2023 (which clashes with the runs Kerfline already has for that saw).
 */
const LOG = [
  'Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;Notes',
  'A-1;Fleet 34x1.1 3/4;03.01.2023 07:00;02.02.2023 15:00;worn;9120;702;',
  'A-1;Fleet 34x1.1 3/4;02.02.2023 15:30;13.03.2023 11:00;cracked;5230,5;410;"=HYPERLINK(""http://x"";""y"")"',
  'A-2;A own 34x1.1 2/3;04.01.2023 06:00;05.03.2023 14:00;snapped;8800;655;',
  'A-2;A own 34x1.1 2/3;04.01.2023 06:00;05.03.2023 14:00;snapped;8800;655;typed twice',
  'A-1;Fleet 34x1.1 3/4;14.03.2023 07:00;;;;;still on',
  'B-1;Fleet 34x1.1 3/4;14.03.2023 07:00;15.04.2023 07:00;worn;100;10;',
  'A-OLD;Fleet 34x1.1 3/4;14.01.2022 07:00;15.04.2022 07:00;worn;100;10;',
].join('\r\n');

function planFor(siteId: string, overrides: Partial<ImportPlanInput> = {}): ImportPlanInput {
  return {
    siteId,
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
      { header: 'Area (cm2)', field: 'areaCutMm2', unit: 'cm2' },
      { header: 'Cuts', field: 'cuts', unit: null },
      { header: 'Notes', field: 'notes', unit: null },
    ],
    decimalMark: ',',
    dateOrder: 'dmy',
    values: { reason: { snapped: 'broken' } },
    ...overrides,
  };
}

const send = (agent: supertest.Agent, path: string, plan: unknown, bytes: Buffer | string = LOG, name = 'log.csv') =>
  agent
    .post(path)
    .field('plan', JSON.stringify(plan))
    .attach('file', typeof bytes === 'string' ? Buffer.from(bytes) : bytes, {
      filename: name,
      contentType: 'text/csv',
    });

beforeAll(() => {
  ctx = startTestApp({ importLimits: { maxBytes: 64 * 1024, maxRows: 50 } });
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  await buildRecords(world);
});

describe('what the wizard is given', () => {
  it('gives a site admin their site’s saws, specs and limits; another site is not found; others may not import', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const res = await siteAdmin.get('/api/imports/context').query({ siteId: world.sites.A.id, kind: 'blade_runs' });
    expect(res.status).toBe(200);
    expect(res.body.saws.map((s: { assetTag: string }) => s.assetTag).sort()).toEqual(['A-1', 'A-2', 'A-OLD']);
    expect(res.body.specs.map((s: { name: string }) => s.name).sort()).toEqual([
      'A own 34x1.1 2/3',
      'Fleet 34x1.1 3/4',
    ]);
    expect(res.body).toMatchObject({
      limits: { maxBytes: 65536, maxRows: 50 },
      memory: null,
      site: { currency: 'EUR' },
    });
    expect(res.body.kinds).toEqual(['saws', 'blade_stock', 'blade_runs', 'stops', 'checks']);
    expect(
      (await siteAdmin.get('/api/imports/context').query({ siteId: world.sites.B.id, kind: 'stops' })).status,
    ).toBe(404);
    const tech = await as('tech-a@test.example');
    expect((await tech.get('/api/imports/context').query({ siteId: world.sites.A.id, kind: 'stops' })).status).toBe(
      403,
    );
    const manager = await as('manager-all@test.example');
    expect((await manager.get('/api/imports/context').query({ siteId: world.sites.A.id, kind: 'stops' })).status).toBe(
      403,
    );
  });
});

describe('checking a file without writing', () => {
  it('counts rows to add, repeated and rejected, shows the first rows as stored, and writes nothing', async () => {
    const before = await count('blade_runs');
    const res = await send(await as('siteadmin-a@test.example'), '/api/imports/check', planFor(world.sites.A.id));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      rowsTotal: 7,
      rowsValid: 3,
      rowsPresent: 0,
      rowsRepeated: 1,
      rowsRejected: 3,
      encoding: 'utf-8',
      delimiter: ';',
    });
    expect(res.body.preview[0]).toMatchObject({ rowNumber: 2, verdict: 'add' });
    expect(res.body.preview[0].values).toMatchObject({
      saw: 'A-1 · Test bar saw',
      areaCutMm2: '912000 mm²',
      reason: 'Worn out',
    });
    const messages = res.body.problems.map(
      (p: { rowNumber: number; message: string }) => `${p.rowNumber}: ${p.message}`,
    );
    expect(messages).toEqual(
      expect.arrayContaining([
        expect.stringMatching(
          /^6: Overlaps a blade run already recorded on this saw \(put on .*Europe\/Berlin.*\); a saw carries one blade at a time/,
        ),
        '7: Saw: no saw of this site is called “B-1”',
        '8: Saw: saw A-OLD is retired; its records are kept as they are',
      ]),
    );
    expect(res.body.unmatched).toEqual([expect.objectContaining({ field: 'saw', written: 'B-1', rows: 1 })]);
    expect(await count('blade_runs')).toBe(before);
    expect(await count('import_batches')).toBe(0);
  });
});

describe('bringing a file in', () => {
  it('writes the valid rows once: the same file twice adds nothing, and says it was brought in before', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const before = await count('blade_runs');
    const first = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id));
    expect(first.status).toBe(201);
    expect(first.body.batch).toMatchObject({
      state: 'committed',
      kind: 'blade_runs',
      fileName: 'log.csv',
      rowsTotal: 7,
      rowsAdded: 3,
      rowsPresent: 0,
      rowsRepeated: 1,
      rowsRejected: 3,
      createdByName: 'siteadmin-a',
    });
    expect(first.body.batch.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(await count('blade_runs')).toBe(before + 3);
    expect(await count('blade_runs WHERE import_batch_id = :id', { id: first.body.batch.id })).toBe(3);
    const [run] = (await ctx.sequelize.query(
      `SELECT installed_at, area_cut_mm2, removal_reason, stock_receipt_id, cost_minor, currency, area_source
         FROM blade_runs WHERE import_batch_id = :id ORDER BY installed_at LIMIT 1`,
      { replacements: { id: first.body.batch.id }, type: 'SELECT' },
    )) as { installed_at: Date; area_cut_mm2: number; stock_receipt_id: string | null }[];
    // 03.01.2023 07:00 in Europe/Berlin (CET) is 06:00 UTC; 9 120 cm² = 912 000 mm². History does not draw stock.
    expect(run).toMatchObject({
      area_cut_mm2: 912000,
      removal_reason: 'worn_out',
      stock_receipt_id: null,
      cost_minor: 6000,
      currency: 'EUR',
      area_source: 'entered',
    });
    expect(run!.installed_at.toISOString()).toBe('2023-01-03T06:00:00.000Z');

    const second = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id));
    expect(second.status).toBe(201);
    expect(second.body.batch).toMatchObject({ rowsAdded: 0, rowsPresent: 3, rowsRepeated: 1, rowsRejected: 3 });
    expect(second.body.summary.earlier).toEqual([
      expect.objectContaining({ id: first.body.batch.id, state: 'committed', createdByName: 'siteadmin-a' }),
    ]);
    expect(await count('blade_runs')).toBe(before + 3);

    // One audit entry per import, in the same transaction as its rows.
    const audit = await siteAdmin.get('/api/audit').query({ siteId: world.sites.A.id, entity: 'ImportBatch' });
    expect(audit.body.items).toHaveLength(2);
    expect(audit.body.items[1]).toMatchObject({
      action: 'create',
      entityId: first.body.batch.id,
      after: { rowsAdded: 3 },
    });

    // The mapping is remembered for the site and kind.
    const context = await siteAdmin.get('/api/imports/context').query({ siteId: world.sites.A.id, kind: 'blade_runs' });
    expect(context.body.memory).toMatchObject({
      columns: { area: { field: 'areaCutMm2', unit: 'cm2' }, 'put on': { field: 'installedAt', unit: null } },
      values: { reason: { snapped: 'broken' } },
      decimalMark: ',',
      dateOrder: 'dmy',
      updatedByName: 'siteadmin-a',
    });
  });

  it('gives the rejected rows back as CSV with the reason, formulas neutralised', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const commit = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id, { values: {} }));
    const res = await siteAdmin.get(`/api/imports/${commit.body.batch.id}/rejected.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    expect(res.headers['content-disposition']).toContain('log-rejected-rows.csv');
    const rows = Papa.parse<string[]>(res.text.replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    expect(rows[0]).toEqual([
      'Row',
      'Saw',
      'Blade',
      'Put on',
      'Taken off',
      'Why',
      'Area (cm2)',
      'Cuts',
      'Notes',
      'Why Kerfline did not bring it in',
    ]);
    expect(rows.map((r) => r[0])).toEqual(['Row', '4', '5', '6', '7', '8']);
    expect(rows[1]![9]).toContain('“snapped” is not one of');
    expect(rows[3]![9]).toMatch(/Overlaps a blade run already recorded/);
    // Without the value mapping both "snapped" rows are rejected (a rejected row has no key to repeat).
    expect(commit.body.batch).toMatchObject({ rowsAdded: 2, rowsRepeated: 0, rowsRejected: 5 });
  });

  it('neutralises a formula in a rejected row’s cells', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const file =
      "Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;Notes\r\n=cmd|' /C calc'!A0;Fleet 34x1.1 3/4;03.01.2023 07:00;;;;;@SUM(1)\r\n";
    const commit = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id), file);
    expect(commit.body.batch.rowsRejected).toBe(1);
    const res = await siteAdmin.get(`/api/imports/${commit.body.batch.id}/rejected.csv`);
    const rows = Papa.parse<string[]>(res.text.replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    expect(rows[1]![1]).toBe("'=cmd|' /C calc'!A0");
    expect(rows[1]![8]).toBe("'@SUM(1)");
  });
});

describe('scope', () => {
  it('a site admin cannot import into another site (404), nor see or undo its imports', async () => {
    const before = await count('blade_runs');
    const siteAdmin = await as('siteadmin-a@test.example');
    for (const path of ['/api/imports', '/api/imports/check']) {
      const res = await send(siteAdmin, path, planFor(world.sites.B.id));
      expect(res.status, path).toBe(404);
    }
    expect(await count('blade_runs')).toBe(before);
    expect(await count('import_batches')).toBe(0);

    const admin = await as('admin@test.example');
    const cPlan = planFor(world.sites.C.id, {
      columns: planFor(world.sites.C.id).columns,
    });
    const atC = await send(admin, '/api/imports', cPlan, LOG.replace(/A-1/g, 'C-1').replace(/A-2/g, 'C-2'));
    expect(atC.status).toBe(201);
    const cId = atC.body.batch.id;
    expect((await siteAdmin.get(`/api/imports/${cId}`)).status).toBe(404);
    expect((await siteAdmin.get(`/api/imports/${cId}/rejected.csv`)).status).toBe(404);
    expect((await siteAdmin.post(`/api/imports/${cId}/undo`)).status).toBe(404);
    const list = await siteAdmin.get('/api/imports');
    expect(list.body.total).toBe(0);
    expect((await admin.get('/api/imports').query({ siteId: world.sites.C.id })).body.total).toBe(1);
    // A technician reads nothing of imports and sends none.
    const tech = await as('tech-a@test.example');
    expect((await tech.get('/api/imports')).body.total).toBe(0);
    expect((await send(tech, '/api/imports', planFor(world.sites.A.id))).status).toBe(403);
  });
});

describe('undoing an import', () => {
  it('takes out only what the import wrote, in one go; the batch and its audit entries stay', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const before = await count('blade_runs');
    const batch = (await send(siteAdmin, '/api/imports', planFor(world.sites.A.id))).body.batch;
    expect(await count('blade_runs')).toBe(before + 3);
    const res = await siteAdmin.post(`/api/imports/${batch.id}/undo`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: 'undone', undoneByName: 'siteadmin-a', rowsAdded: 3 });
    expect(await count('blade_runs')).toBe(before);
    expect(await count('blade_runs WHERE import_batch_id IS NOT NULL')).toBe(0);
    const audit = await siteAdmin.get('/api/audit').query({ entity: 'ImportBatch', entityId: batch.id });
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(['undo', 'create']);
    expect(audit.body.items[0].before).toMatchObject({ removed: { bladeRuns: 3 } });
    const again = await siteAdmin.post(`/api/imports/${batch.id}/undo`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already taken back out/);
    // After undoing, the same file brings the rows in again.
    expect((await send(siteAdmin, '/api/imports', planFor(world.sites.A.id))).body.batch.rowsAdded).toBe(3);
  });

  it('refuses (409) while later records depend on the imported ones, and says which', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const batch = (await send(siteAdmin, '/api/imports', planFor(world.sites.A.id))).body.batch;
    const [run] = (await ctx.sequelize.query(
      `SELECT id, saw_id FROM blade_runs WHERE import_batch_id = :id ORDER BY installed_at LIMIT 1`,
      { replacements: { id: batch.id }, type: 'SELECT' },
    )) as { id: string; saw_id: string }[];
    await CutLog.create({
      siteId: world.sites.A.id,
      sawId: run!.saw_id,
      bladeRunId: run!.id,
      cutAt: new Date('2023-01-10T10:00:00Z'),
      shape: { kind: 'round', diameterMm: 50 },
      pieceCount: 1,
      piecesAcross: 1,
      materialGroup: 'carbon_steel',
      quantity: 3,
      areaPerCutMm2: 1963.5,
      areaCutMm2: 5890.5,
      warnings: [],
    } as never);
    const refused = await siteAdmin.post(`/api/imports/${batch.id}/undo`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/the blade run on A-1 put on .*2023.* has 1 cut log/);
    expect(await count('blade_runs WHERE import_batch_id = :id', { id: batch.id })).toBe(3);

    // A run changed after the import (a correction through the API) blocks it too.
    await CutLog.destroy({ where: { bladeRunId: run!.id } });
    const patched = await siteAdmin.patch(`/api/blade-runs/${run!.id}`).send({ removalNotes: 'corrected later' });
    expect(patched.status).toBe(200);
    const changed = await siteAdmin.post(`/api/imports/${batch.id}/undo`);
    expect(changed.status).toBe(409);
    expect(changed.body.error.message).toMatch(/was changed on/);
  });

  it('refuses to take out saws that have records since, naming them', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const saws = [
      'Asset tag,Name,Kind,Wheel (mm),Width (mm),Thickness (mm),Length (mm),Min speed (m/min),Max speed (m/min)',
      'A-9,New bar saw,horizontal,455,34,1.1,4115,18,110',
      'a-1,Test bar saw,horizontal,455,34,1.1,4115,18,110',
    ].join('\n');
    const plan = {
      siteId: world.sites.A.id,
      kind: 'saws',
      format: 'csv',
      columns: [
        { header: 'Asset tag', field: 'assetTag', unit: null },
        { header: 'Name', field: 'name', unit: null },
        { header: 'Kind', field: 'kind', unit: null },
        { header: 'Wheel (mm)', field: 'wheelDiameterMm', unit: 'mm' },
        { header: 'Width (mm)', field: 'bandWidthMm', unit: 'mm' },
        { header: 'Thickness (mm)', field: 'bandThicknessMm', unit: 'mm' },
        { header: 'Length (mm)', field: 'bandLengthMm', unit: 'mm' },
        { header: 'Min speed (m/min)', field: 'bandSpeedMinMPerMin', unit: 'm/min' },
        { header: 'Max speed (m/min)', field: 'bandSpeedMaxMPerMin', unit: 'm/min' },
      ],
      decimalMark: '.',
      dateOrder: 'ymd',
    };
    const res = await send(siteAdmin, '/api/imports', plan, saws, 'saws.csv');
    expect(res.status).toBe(201);
    expect(res.body.batch).toMatchObject({ rowsAdded: 1, rowsPresent: 1 });
    const saw = (await siteAdmin.get('/api/saws').query({ siteId: world.sites.A.id, q: 'A-9' })).body.items[0];
    expect(saw).toMatchObject({ assetTag: 'A-9', name: 'New bar saw' });
    expect(saw.centreDistanceMm).toBeCloseTo((4115 - Math.PI * 455) / 2, 6);
    const stop = await siteAdmin
      .post('/api/stops')
      .send({ sawId: saw.id, category: 'mechanical', startedAt: new Date(Date.now() - 3600_000).toISOString() });
    expect(stop.status).toBe(201);
    const refused = await siteAdmin.post(`/api/imports/${res.body.batch.id}/undo`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain('saw A-9 has 1 stop recorded since');
  });
});

describe('bad files and bad plans get a clear 400 or 413, never a 500', () => {
  const cases: [string, Buffer | string, string, RegExp][] = [
    ['empty', '', 'empty.csv', /Choose a file|The file is empty/],
    ['header only', 'Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;Notes\r\n', 'h.csv', /column names but no rows/],
    ['binary', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 'log.csv', /picture/],
    [
      'duplicated headers',
      'Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;saw\r\nA-1;x;1;2;3;4;5;6\r\n',
      'd.csv',
      /both named/,
    ],
    [
      'unbalanced quotes',
      'Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;Notes\r\nA-1;"Fleet;x;y;z;1;2;3\r\n',
      'q.csv',
      /never closed/,
    ],
    [
      'another file’s columns',
      'Asset tag;Name;Kind\r\nA-9;x;horizontal\r\n',
      's.csv',
      /not the ones the mapping was made for/,
    ],
    [
      'too many rows',
      `Saw;Blade;Put on;Taken off;Why;Area (cm2);Cuts;Notes\r\n${'A-1;x;1;2;3;4;5;6\r\n'.repeat(51)}`,
      'r.csv',
      /more than 50 rows/,
    ],
  ];
  it.each(cases)('%s', async (_name, bytes, fileName, message) => {
    const siteAdmin = await as('siteadmin-a@test.example');
    for (const path of ['/api/imports/check', '/api/imports']) {
      const res = await send(siteAdmin, path, planFor(world.sites.A.id), bytes, fileName);
      expect(res.status, path).toBe(400);
      expect(res.body.error.message, path).toMatch(message);
    }
    expect(await count('import_batches')).toBe(0);
  });

  it('a file over the size limit is a 413 that says the limit', async () => {
    const res = await send(
      await as('siteadmin-a@test.example'),
      '/api/imports',
      planFor(world.sites.A.id),
      Buffer.alloc(70 * 1024, 65),
    );
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/larger than 0 MB|larger than/);
  });

  it('a plan for the wrong kind names the columns it misses; a plan that is not JSON says so', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const wrong = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id, { kind: 'stops' }));
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details.map((d: { message: string }) => d.message)).toEqual(
      expect.arrayContaining(['No column is matched to Start, which every row needs']),
    );
    const notJson = await siteAdmin
      .post('/api/imports')
      .field('plan', '{nope')
      .attach('file', Buffer.from(LOG), 'x.csv');
    expect(notJson.status).toBe(400);
    const checks = await send(
      siteAdmin,
      '/api/imports',
      planFor(world.sites.A.id, { kind: 'checks', columns: [{ header: 'Saw', field: null, unit: null }] }),
      'Saw\nA-1\n',
    );
    expect(checks.status).toBe(400);
  });
});

describe('a failure part way through a commit', () => {
  it('rolls everything back, marks the batch failed, and a retry succeeds', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const before = await count('blade_runs');
    // A second connection holds the blade-run table so the import waits at its insert; then its backend is ended.
    const blocker = new pg.Client({ connectionString: testDatabaseUrl() });
    await blocker.connect();
    try {
      await blocker.query('BEGIN');
      await blocker.query('LOCK TABLE blade_runs IN EXCLUSIVE MODE');
      const pending = send(siteAdmin, '/api/imports', planFor(world.sites.A.id)).then((r) => r);
      let pid: number | null = null;
      for (let i = 0; i < 200 && pid === null; i += 1) {
        // Inside a transaction the activity view is a snapshot taken once: clear it before each look.
        await blocker.query('SELECT pg_stat_clear_snapshot()');
        const found = await blocker.query<{ pid: number }>(
          `SELECT pid FROM pg_stat_activity
            WHERE wait_event_type = 'Lock' AND query ILIKE '%INSERT INTO blade_runs%' AND pid <> pg_backend_pid()`,
        );
        pid = found.rows[0]?.pid ?? null;
        if (pid === null) await new Promise((r) => setTimeout(r, 25));
      }
      expect(pid).not.toBeNull();
      await blocker.query('SELECT pg_terminate_backend($1)', [pid]);
      await blocker.query('ROLLBACK');
      const res = await pending;
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/stopped before it finished .*nothing from this file was written/);
    } finally {
      await blocker.end();
    }
    expect(await count('blade_runs')).toBe(before);
    const batches = (await siteAdmin.get('/api/imports')).body.items;
    expect(batches).toHaveLength(1);
    expect(batches[0]).toMatchObject({
      state: 'failed',
      rowsAdded: 0,
      error: expect.stringMatching(/connection was lost/),
    });
    expect(await count('import_rejects')).toBe(0);

    const retry = await send(siteAdmin, '/api/imports', planFor(world.sites.A.id));
    expect(retry.status).toBe(201);
    expect(retry.body.batch).toMatchObject({ state: 'committed', rowsAdded: 3 });
    expect(retry.body.summary.earlier[0]).toMatchObject({ state: 'failed' });
    expect(await count('blade_runs')).toBe(before + 3);
  });
});

describe('check sheets', () => {
  const sheet = [
    'Saw,Check,Date,Reading,Unit,Reaches,Worn',
    // A-1 carries its open run from 20 days ago: the guide opening is judged against the run's spec (1.1 mm).
    `A-1,Guide bearing clearance,${new Date(Date.now() - 5 * 86_400_000).toISOString().slice(0, 16).replace('T', ' ')},0.0472,in,,`,
    `A-1,Chip brush,2023-02-20 16:20,,,yes,no`,
    // A hydraulic head's down-force is set by its valve: the check does not apply to A-2.
    `A-2,Head down-force,2023-02-20 16:25,7,lbf,,`,
  ].join('\n');
  const plan = (siteId: string) => ({
    siteId,
    kind: 'checks',
    format: 'csv',
    columns: [
      { header: 'Saw', field: 'saw', unit: null },
      { header: 'Check', field: 'check', unit: null },
      { header: 'Date', field: 'checkedAt', unit: null },
      { header: 'Reading', field: 'reading', unit: null },
      { header: 'Unit', field: 'readingUnit', unit: null },
      { header: 'Reaches', field: 'reachesGullets', unit: null },
      { header: 'Worn', field: 'brushWorn', unit: null },
    ],
    decimalMark: '.',
    dateOrder: 'ymd',
  });

  it('judges each reading on the server against the blade on the saw then, once, and undoes', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const context = await siteAdmin.get('/api/imports/context').query({ siteId: world.sites.A.id, kind: 'checks' });
    expect(context.body.kinds).toContain('checks');
    expect(context.body.checks.map((c: { name: string }) => c.name)).toContain('Guide bearing clearance');
    const first = await send(siteAdmin, '/api/imports', plan(world.sites.A.id), sheet, 'checks.csv');
    expect(first.status).toBe(201);
    expect(first.body.batch).toMatchObject({ rowsAdded: 2, rowsRejected: 1 });
    expect(first.body.summary.problems.map((p: { message: string }) => p.message)).toEqual([
      expect.stringMatching(/^Head down-force: This check does not apply/),
    ]);
    const records = (await ctx.sequelize.query(
      `SELECT r.reading, r.passed, r.target, r.blade_run_id, r.answers, c.name
         FROM check_records r JOIN site_checks c ON c.id = r.site_check_id
        WHERE r.import_batch_id = :id ORDER BY c.name`,
      { replacements: { id: first.body.batch.id }, type: 'SELECT' },
    )) as {
      reading: number | null;
      passed: boolean;
      target: number | null;
      blade_run_id: string | null;
      answers: unknown;
      name: string;
    }[];
    expect(records[0]).toMatchObject({
      name: 'Chip brush',
      reading: null,
      passed: true,
      answers: { reachesGullets: true, worn: false },
    });
    // 0.0472 in = 1.19888 mm; the target is the band's 1.1 mm plus the site's tolerance, worked out here.
    expect(records[1]!.reading).toBeCloseTo(1.19888, 9);
    expect(records[1]!.blade_run_id).not.toBeNull();
    expect(records[1]!.target).toBeGreaterThan(1.1);
    const again = await send(siteAdmin, '/api/imports', plan(world.sites.A.id), sheet, 'checks.csv');
    expect(again.body.batch).toMatchObject({ rowsAdded: 0, rowsPresent: 2 });
    const undone = await siteAdmin.post(`/api/imports/${first.body.batch.id}/undo`);
    expect(undone.status).toBe(200);
    expect(await count('check_records WHERE import_batch_id IS NOT NULL')).toBe(0);
  });
});
