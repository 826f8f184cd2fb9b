import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type supertest from 'supertest';
import type { Page } from '@kerfline/domain/common/schema';
import { signedInAgent, startTestApp, type TestContext } from '../../test-support/test-db.js';
import { PASSWORD, buildRecords, buildWorld, type Records, type World } from '../../test-support/fixtures.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';
import { streamListCsv } from './record-export.js';

let ctx: TestContext;
let world: World;
let records: Records;
const agents: Record<string, supertest.Agent> = {};
/** Stops logged at site B for the paging test: more than one page of a thousand. */
const B_STOPS = 1_205;

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  records = await buildRecords(world);
  // Text a spreadsheet would run as a formula, and text that needs RFC 4180 quoting.
  await BladeRun.update(
    { installNotes: '=HYPERLINK("http://evil.example","click")', removalNotes: 'Teeth gone, "all of them"\nsee photo' },
    { where: { id: records.A.run.id } },
  );
  // Site B: B_STOPS one-hour stops two hours apart on saw B-1, the newest ending an hour before now.
  const [b1] = world.saws.B!;
  const first = Date.now() - B_STOPS * 2 * 3_600_000;
  await Stop.bulkCreate(
    Array.from({ length: B_STOPS }, (_, i) => ({
      siteId: world.sites.B.id,
      sawId: b1!.id,
      startedAt: new Date(first + i * 2 * 3_600_000),
      endedAt: new Date(first + i * 2 * 3_600_000 + 3_600_000),
      category: 'blade_change' as const,
      planned: true,
      notes: null,
      createdById: null,
      endedById: null,
    })),
  );
  for (const [name, user] of Object.entries(world.users))
    agents[name] = await signedInAgent(ctx.app, user.email, PASSWORD);
});
afterAll(async () => ctx.close());

/** Parses a CSV answer with papaparse (an RFC 4180 reader), dropping the byte-order mark. */
function csv(text: string): string[][] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true, delimiter: ',' });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

/** The rows as objects keyed by the header. */
function rowsOf(text: string): Record<string, string>[] {
  const [header, ...rows] = csv(text);
  return rows.map((r) => Object.fromEntries(header!.map((h, i) => [h, r[i]!])));
}

const exportsOf = (siteId: string) => [
  `/api/blade-runs/export?siteId=${siteId}`,
  `/api/stops/export?siteId=${siteId}`,
  `/api/check-records/export?siteId=${siteId}`,
  `/api/sites/${siteId}/stock/movements/export`,
];

describe('CSV exports of a site’s record tables', () => {
  it('exports blade runs in the site’s units, the unit in each header, with X-Row-Count up front', async () => {
    const res = await agents.siteAdminA!.get(`/api/blade-runs/export?siteId=${world.sites.A.id}`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="A-blade-runs-\d{4}-\d{2}-\d{2}\.csv"$/);
    expect(res.headers['x-row-count']).toBe('2');
    const [header] = csv(res.text);
    // Site A keeps metric units: tension in MPa, area in cm².
    expect(header).toContain('Tension (MPa)');
    expect(header).toContain('Area cut (cm²)');
    const rows = rowsOf(res.text);
    expect(rows.map((r) => r['Run id'])).toEqual([records.A.openRun.id, records.A.run.id]);
    expect(rows[0]).toMatchObject({ Saw: 'A-1', 'Tension (MPa)': '220', Material: 'carbon steel', Cost: '60' });
    expect(rows[0]!['Break-in followed']).toBe('yes');
    expect(rows[1]).toMatchObject({ 'Why it came off': 'Worn out', Currency: 'EUR', Cost: '61' });
  });

  it('converts to the units asked for: 220 MPa is 31,908.3 psi (1 psi = 6,894.757 Pa, NIST SP 811 B.8)', async () => {
    const res = await agents.siteAdminA!.get(
      `/api/blade-runs/export?siteId=${world.sites.A.id}&open=true&units=imperial`,
    );
    expect(res.status).toBe(200);
    // The filter is the list's: only the blade on the saw now.
    expect(res.headers['x-row-count']).toBe('1');
    const [run] = rowsOf(res.text);
    expect(run!['Run id']).toBe(records.A.openRun.id);
    expect(Number(run!['Tension (psi)'])).toBeCloseTo(31_908.3, 1);
  });

  it('quotes text as RFC 4180 asks and neutralises a cell that would run as a formula', async () => {
    const res = await agents.managerAll!.get(`/api/blade-runs/export?siteId=${world.sites.A.id}`).expect(200);
    // On the wire: quoted, inner quotes doubled, the formula behind an apostrophe; the line break kept inside quotes.
    expect(res.text).toContain(`"'=HYPERLINK(""http://evil.example"",""click"")"`);
    expect(res.text).toContain('"Teeth gone, ""all of them""\nsee photo"');
    const removed = rowsOf(res.text).find((r) => r['Run id'] === records.A.run.id)!;
    expect(removed['Notes when put on']).toBe(`'=HYPERLINK("http://evil.example","click")`);
    expect(removed['Notes when taken off']).toBe('Teeth gone, "all of them"\nsee photo');
  });

  it('writes stock movements with a drawn blade as the number −1, not as text', async () => {
    const res = await agents.siteAdminA!.get(`/api/sites/${world.sites.A.id}/stock/movements/export`).expect(200);
    expect(res.headers['x-row-count']).toBe('2');
    const rows = rowsOf(res.text);
    expect(rows.map((r) => [r.Movement, r['Blades (+ received, − drawn)']])).toEqual([
      ['drawn for a blade', '-1'],
      ['received', '5'],
    ]);
    expect(rows[1]).toMatchObject({ 'Delivery reference': 'LOT-1', 'Unit cost': '61', Currency: 'EUR' });
    expect(res.text).toMatch(/,-1,/);
  });

  it('states each recorded check in its own unit: 1.13 mm of guide clearance is 0.04449 in (1 in = 25.4 mm)', async () => {
    const metric = rowsOf(
      (await agents.siteAdminA!.get(`/api/check-records/export?siteId=${world.sites.A.id}`).expect(200)).text,
    );
    expect(metric).toHaveLength(1);
    expect(metric[0]).toMatchObject({
      'Record id': records.A.checkRecord.id,
      Saw: 'A-1',
      'Reading (in Unit)': '1.13',
      Unit: 'mm',
      Passed: 'yes',
    });
    const imperial = rowsOf(
      (await agents.siteAdminA!.get(`/api/check-records/export?siteId=${world.sites.A.id}&units=imperial`).expect(200))
        .text,
    );
    expect(imperial[0]!.Unit).toBe('in');
    expect(Number(imperial[0]!['Reading (in Unit)'])).toBeCloseTo(1.13 / 25.4, 9);
    expect(Number(imperial[0]!['Least (in Unit)'])).toBeCloseTo(1.1254 / 25.4, 9);
  });

  it('pages through more than a thousand stops and sends each once, newest first, as many as X-Row-Count said', async () => {
    const res = await agents.leadNorth!.get(`/api/stops/export?siteId=${world.sites.B.id}`).expect(200);
    expect(res.headers['x-row-count']).toBe(String(B_STOPS));
    const rows = rowsOf(res.text);
    expect(rows).toHaveLength(B_STOPS);
    expect(new Set(rows.map((r) => r['Stop id'])).size).toBe(B_STOPS);
    const starts = rows.map((r) => Date.parse(r['Started (UTC)']!));
    expect(starts).toEqual([...starts].sort((a, b) => b - a));
    // Each stop lasted an hour.
    expect(rows[0]).toMatchObject({
      Category: 'Blade change',
      Planned: 'yes',
      'Duration (h; to the export for a stop still going on)': '1',
    });
  });
});

describe('who may export a site’s records', () => {
  it('answers 404 to a site admin asking for another site, as for any id out of scope', async () => {
    for (const path of exportsOf(world.sites.C.id)) {
      const res = await agents.siteAdminA!.get(path);
      expect([path, res.status]).toEqual([path, 404]);
    }
  });

  it('refuses a technician with 403, at their own site and across sites', async () => {
    for (const path of [...exportsOf(world.sites.A.id), '/api/blade-runs/export', '/api/stops/export']) {
      const res = await agents.techA!.get(path);
      expect([path, res.status]).toEqual([path, 403]);
      expect(res.body.error.message).toMatch(/does not export/);
    }
  });

  it('gives a regional lead only their region: site C is 404, and an export of every site holds none of C', async () => {
    for (const path of exportsOf(world.sites.C.id)) {
      const res = await agents.leadNorth!.get(path);
      expect([path, res.status]).toEqual([path, 404]);
    }
    const runs = await agents.leadNorth!.get('/api/blade-runs/export').expect(200);
    expect(runs.headers['content-disposition']).toMatch(/filename="all-sites-blade-runs-/);
    const saws = rowsOf(runs.text).map((r) => r.Saw);
    expect(saws).toEqual(['A-1', 'A-1']);
    expect(runs.headers['x-row-count']).toBe('2');
    const stops = rowsOf((await agents.leadNorth!.get('/api/stops/export').expect(200)).text);
    expect(stops).toHaveLength(2 + B_STOPS);
    expect(stops.some((r) => r.Saw!.startsWith('C-'))).toBe(false);
  });

  it('lets a manager of sites A and C export both, and nothing of B', async () => {
    const rows = rowsOf((await agents.managerAC!.get('/api/stops/export').expect(200)).text);
    expect([...new Set(rows.map((r) => r.Saw!.slice(0, 1)))].sort()).toEqual(['A', 'C']);
    await agents.managerAC!.get(`/api/stops/export?siteId=${world.sites.B.id}`).expect(404);
  });

  it('refuses units it does not know with a 400 that says what to send', async () => {
    const res = await agents.siteAdminA!.get(`/api/blade-runs/export?siteId=${world.sites.A.id}&units=cubits`);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toMatch(/metric or imperial/);
  });
});

describe('streamListCsv', () => {
  it('asks the list a page at a time and never for more than a page', async () => {
    const items = Array.from({ length: 7 }, (_, i) => ({ n: i }));
    const asked: [number, number][] = [];
    const page = async (limit: number, offset: number): Promise<Page<{ n: number }>> => {
      asked.push([limit, offset]);
      return { items: items.slice(offset, offset + limit), total: items.length, limit, offset };
    };
    const chunks: string[] = [];
    const headers: Record<string, string> = {};
    const res = {
      status: () => res,
      setHeader: (k: string, v: string) => (headers[k] = v),
      write: (chunk: string) => chunks.push(chunk) > 0,
      end: () => undefined,
    };
    await streamListCsv(res as never, 'test', ['n'], page, (item) => [item.n], 3);
    expect(asked).toEqual([
      [3, 0],
      [3, 3],
      [3, 6],
    ]);
    expect(headers['X-Row-Count']).toBe('7');
    expect(csv(chunks.join(''))).toEqual([['n'], ['0'], ['1'], ['2'], ['3'], ['4'], ['5'], ['6']]);
  });
});
