import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import zlib from 'node:zlib';
import fc from 'fast-check';
import sharp from 'sharp';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import {
  buildRecords,
  buildWorld,
  PASSWORD,
  sawBody,
  specBody,
  type Records,
  type World,
} from '../../apps/api/src/test-support/fixtures.js';
import { listRoutes, type RouteEntry } from '../../apps/api/src/http/route-list.js';
import { User } from '../../apps/api/src/modules/users/user.model.js';

/*
 * Fuzzing every route's input: for each route the router holds, random and hostile JSON bodies, query strings and
 * path parameters (wrong types, huge numbers, NaN and Infinity as text, deep nesting, prototype keys, long strings,
 * Unicode controls and lone surrogates, arrays where objects go, and valid bodies with one part broken), sent as an
 * administrator and as a technician. Never a 5xx; and a write that is refused changes no row.
 * Then the importer, fed random, truncated, wrongly encoded and pathological files.
 *
 * FUZZ_RUNS sets the cases per route and role (default 4) and scales the importer's random files; the default
 * run takes about a minute on the 2-core development machine.
 */

const RUNS = Number(process.env.FUZZ_RUNS ?? 4);
const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined;
/** Room for a longer run: about a minute per six cases per route and role on the 2-core machine, and then some. */
const TIMEOUT = Math.max(600_000, RUNS * 30_000);

let ctx: TestContext;
let world: World;
let records: Records;
let admin: supertest.Agent;
let tech: supertest.Agent;
let targetUserId = '';
let batchId = '';
let photoId = '';
let cutLogId = '';
let invitationId = '';
let checkId = '';
let followUpId = '';
let casesRun = 0;
const statuses = new Map<number, number>();

/** The tables a refused write must leave as they were (sessions and attempt counters may move). */
const TABLES = [
  'regions',
  'sites',
  'users',
  'user_sites',
  'saws',
  'blade_specs',
  'stock_receipts',
  'stock_levels',
  'blade_runs',
  'stops',
  'cut_logs',
  'photos',
  'photo_blobs',
  'site_checks',
  'check_records',
  'site_settings',
  'invitations',
  'password_resets',
  'mail_preferences',
  'audit_entries',
  'import_batches',
  'import_mappings',
  'import_rejects',
  'budgets',
  'exchange_rates',
  'reporting_currency',
  'follow_ups',
  'follow_up_entries',
];
async function rowCounts(): Promise<string> {
  const sql = `SELECT ${TABLES.map((t) => `(SELECT count(*) FROM ${t}) AS ${t}`).join(', ')}`;
  return JSON.stringify(await ctx.sequelize.query(sql, { plain: true }));
}

// ---------------------------------------------------------------- hostile values
const LONG = 'x'.repeat(100_000);
const hostileText = fc.constantFrom(
  '',
  ' ',
  'NaN',
  'Infinity',
  '-Infinity',
  '-0',
  '1e309',
  '0x1F',
  '1_000',
  '١٢٣',
  '9'.repeat(400),
  LONG,
  '\u0000',
  '\u0007bell',
  '\u202eevil',
  '\u2028',
  '\u200b',
  '\ud800',
  '\udfff\ud800',
  'null',
  'true',
  '[]',
  '{}',
  '__proto__',
  'constructor',
  "' OR 1=1 --",
  '"; DROP TABLE saws; --',
  '../../etc/passwd',
  '%00',
  '%',
  '=HYPERLINK("http://x")',
  '<script>alert(1)</script>',
  '2026-13-45T25:61:00Z',
  '0000-00-00',
  '+275760-09-13T00:00:00.001Z',
  '1969-12-31T23:59:59Z',
  '00000000-0000-0000-0000-000000000000',
  'ffffffff-ffff-ffff-ffff-ffffffffffff',
  'not-a-uuid',
  '9999-12-31T23:59:59Z',
  '2026-13',
  '1989-12',
  '2201-01',
  '2026-09,2026-10',
  '0001-01-01T00:00:00+14:00',
  '2026-02-30',
  '1e15',
  '-1e15',
  '2147483648',
  '9223372036854775808',
  '%_\\',
);
const hostileNumber = fc.constantFrom(
  0,
  -0,
  -1,
  1e308,
  -1e308,
  5e-324,
  2 ** 31,
  2 ** 53 + 2,
  -(2 ** 63),
  Number.MAX_SAFE_INTEGER,
  0.1 + 0.2,
);
const leaf: fc.Arbitrary<unknown> = fc.oneof(
  hostileText,
  hostileNumber,
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.boolean(),
  fc.constant(null),
  fc.uuid(),
);
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: leaf },
  { weight: 1, arbitrary: fc.array(leaf, { maxLength: 5 }) },
  { weight: 1, arbitrary: fc.dictionary(fc.string({ maxLength: 12 }), leaf, { maxKeys: 5 }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
);
const POLLUTING_KEYS = ['__proto__', 'constructor', 'prototype', 'toString', 'valueOf', 'hasOwnProperty', ''];

/** JSON text with keys kept as written (so `__proto__` reaches the server as an own key). */
function toJson(value: unknown): string {
  if (value === undefined) return 'null';
  if (Array.isArray(value)) return `[${value.map(toJson).join(',')}]`;
  if (value && typeof value === 'object')
    return `{${Object.entries(value)
      .map(([k, v]) => `${JSON.stringify(k)}:${toJson(v)}`)
      .join(',')}}`;
  return JSON.stringify(value) ?? 'null';
}

/** Valid bodies to break one part of, by route. */
function seeds(): Record<string, Record<string, unknown>> {
  const siteId = world.sites.A.id;
  const sawId = world.saws.A![0]!.id;
  return {
    'POST /api/saws': sawBody(siteId),
    'PATCH /api/saws/:id': { name: 'Renamed', bandSpeedMaxMPerMin: 100 },
    'POST /api/sites': {
      code: 'FZ',
      name: 'Fuzz',
      timeZone: 'UTC',
      currency: 'EUR',
      unitSystem: 'metric',
      regionId: world.regions.north.id,
    },
    'PATCH /api/sites/:id': { name: 'Site A', city: 'Oldmoor', timeZone: 'Europe/Berlin' },
    'POST /api/regions': { name: 'Fuzz region' },
    'PATCH /api/regions/:id': { name: 'North' },
    'POST /api/blade-specs': specBody(siteId),
    'PATCH /api/blade-specs/:id': { name: 'Renamed spec', archived: false },
    'POST /api/stock-receipts': {
      siteId,
      bladeSpecId: records.fleetSpec.id,
      quantity: 2,
      unitCostMinor: 5000,
      receivedOn: '2026-01-02',
    },
    'PATCH /api/stock-receipts/:id': { quantity: 6 },
    'PUT /api/sites/:id/stock/:bladeSpecId/levels': { leadTimeDays: 10, safetyStock: 2 },
    'POST /api/blade-runs': { sawId: world.saws.A![1]!.id, bladeSpecId: records.fleetSpec.id, tensionMpa: 200 },
    'POST /api/blade-runs/:id/remove': { reason: 'worn_out', areaCutMm2: 1000, cuts: 4 },
    'PATCH /api/blade-runs/:id': { tensionMpa: 210, installNotes: 'Note' },
    'POST /api/blade-runs/:id/confirmed-cause': { cause: 'teeth_in_work_low' },
    'POST /api/stops': { sawId, category: 'mechanical', planned: false },
    'POST /api/stops/:id/end': { endedAt: new Date().toISOString() },
    'PATCH /api/stops/:id': { notes: 'Fixed', category: 'electrical' },
    'POST /api/cut-logs': {
      sawId,
      stock: { shape: { kind: 'round_bar', diameterMm: 80 } },
      materialGroup: 'carbon_steel',
      quantity: 2,
      cutTimeS: 60,
    },
    'POST /api/sites/:siteId/checks': {
      name: 'Fuzz check',
      targetRule: 'fixed',
      quantity: 'length',
      fixedTarget: 1,
      fixedMin: 0.5,
      schedule: 'periodic',
      intervalDays: 7,
    },
    'PATCH /api/site-checks/:id': { intervalDays: 10, graceHours: 12 },
    'POST /api/check-records': { sawId, siteCheckId: checkId, reading: 1.13, notes: 'ok' },
    'PUT /api/sites/:siteId/settings/:key': { value: { extraClearanceMm: 0.03, toleranceMm: 0.03 } },
    'POST /api/users': {
      email: 'fz@test.example',
      name: 'Fuzz',
      password: 'plinth-orbit-harbour-kettle',
      role: 'technician',
      siteId,
    },
    'PATCH /api/users/:id': { name: 'Fuzz person' },
    'POST /api/invitations': { email: 'inv-fz@test.example', role: 'technician', siteId },
    'POST /api/invitations/preview': { token: 'a'.repeat(43) },
    'POST /api/invitations/accept': { token: 'a'.repeat(43), name: 'X', password: 'plinth-orbit-harbour-kettle' },
    'POST /api/auth/sign-in': { email: 'nobody@test.example', password: 'wrong-password-123' },
    'POST /api/auth/password-reset/request': { email: 'nobody@test.example' },
    'POST /api/auth/password-reset': { token: 'a'.repeat(43), newPassword: 'plinth-orbit-harbour-kettle' },
    'POST /api/me/password': { currentPassword: 'wrong-password-123', newPassword: 'plinth-orbit-harbour-kettle' },
    'PATCH /api/me/mail-preferences': { kind: 'weekly_digest', enabled: false },
    'PUT /api/budgets/:siteId/:month': { amountMinor: 250_000 },
    'PUT /api/exchange-rates/:currency/:month': { rate: 0.93 },
    'PUT /api/reporting-currency': { currency: 'EUR' },
    'POST /api/follow-ups': { sawId, title: 'Look at it', assigneeId: targetUserId, dueOn: '2099-01-01' },
    'PATCH /api/follow-ups/:id': { state: 'in_progress', note: 'Started' },
  };
}

/** A body: a seed with one part broken, hostile JSON, or text that is not JSON at all. */
function bodyFor(route: string): fc.Arbitrary<string> {
  const seed = seeds()[route] ?? {};
  const keys = Object.keys(seed);
  const broken = fc
    .tuple(
      fc.constantFrom(...(keys.length ? keys : ['x'])),
      fc.constantFrom('replace', 'delete', 'pollute', 'wrap'),
      hostileValue,
      fc.constantFrom(...POLLUTING_KEYS),
    )
    .map(([key, how, value, polluting]) => {
      const body: Record<string, unknown> = { ...seed };
      if (how === 'replace') body[key] = value;
      else if (how === 'delete') delete body[key];
      else if (how === 'pollute') return toJson({ ...body, [polluting]: value ?? { isAdmin: true } });
      else return toJson([body]);
      return toJson(body);
    });
  const deep = fc
    .tuple(fc.integer({ min: 1, max: 150_000 }), fc.constantFrom('[', '{"a":'))
    .map(([depth, open]) => open.repeat(depth) + '1' + (open === '[' ? ']' : '}').repeat(depth));
  return fc.oneof(
    { weight: 6, arbitrary: broken },
    { weight: 3, arbitrary: hostileValue.map(toJson) },
    { weight: 1, arbitrary: deep },
    { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 60 }) },
    { weight: 1, arbitrary: fc.constantFrom('', 'NaN', '{"a":NaN}', '{"a":1,}', '{"a":1e999}', '\uFEFF{}', '{"a"') },
  );
}

/** Percent-encodes text byte by byte (a lone surrogate goes as the bytes Node writes for it). */
const percent = (text: string) =>
  [...Buffer.from(text, 'utf8')]
    .map((b) =>
      /[A-Za-z0-9_.~-]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).padStart(2, '0')}`,
    )
    .join('');

const QUERY_KEYS = [
  'siteId',
  'sawId',
  'bladeSpecId',
  'bladeRunId',
  'regionId',
  'limit',
  'offset',
  'from',
  'to',
  'sort',
  'q',
  'includeRetired',
  'includeArchived',
  'status',
  'kind',
  'state',
  'reason',
  'open',
  'planned',
  'category',
  'windowDays',
  'materialGroup',
  'material',
  'before',
  'entity',
  'entityId',
  'role',
  'check',
  'schedule',
  'sites',
  'table',
  'units',
];
const rawPiece = fc.oneof(
  hostileText.map(percent),
  fc.string({ maxLength: 20 }).map(percent),
  fc.constantFrom('%', '%E0%A4%A', '%FF', '%00', '%2e%2e', 'a%20b', '1e999', '-1', '99999999999999999999'),
);
const queryString = fc
  .array(
    fc.tuple(
      fc.oneof(
        fc.constantFrom(...QUERY_KEYS),
        fc.constantFrom('__proto__', 'constructor', 'a[b]', 'siteId[]'),
        rawPiece,
      ),
      rawPiece,
    ),
    { maxLength: 6 },
  )
  .map((pairs) => pairs.map(([k, v]) => `${k}=${v}`).join('&'));

/** A real id for a path parameter (so the handler is reached), or a hostile one. */
function realParam(route: string, name: string): string {
  const seg = route.split('/')[2];
  if (name === 'siteId') return world.sites.A.id;
  if (name === 'key') return 'guide_clearance';
  if (name === 'bladeSpecId') return records.fleetSpec.id;
  if (name === 'schedule') return 'weekly-digest';
  if (name === 'sawId') return world.saws.A![0]!.id;
  if (name === 'runId') return records.A.run.id;
  if (name === 'currency') return 'USD';
  if (name === 'month') return '2026-09';
  const byFirst: Record<string, string> = {
    saws: world.saws.A![0]!.id,
    sites: world.sites.A.id,
    regions: world.regions.north.id,
    users: targetUserId,
    invitations: invitationId,
    'blade-specs': records.siteSpec.id,
    'stock-receipts': records.A.receipt.id,
    'blade-runs': records.A.openRun.id,
    stops: records.A.stop.id,
    'cut-logs': cutLogId,
    photos: photoId,
    'site-checks': checkId,
    'check-records': records.A.checkRecord.id,
    imports: batchId,
    'follow-ups': followUpId,
  };
  return byFirst[seg!] ?? world.sites.A.id;
}
const pathFor = (route: RouteEntry): fc.Arbitrary<string> => {
  const names = [...route.path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!);
  if (names.length === 0) return fc.constant(route.path);
  return fc
    .array(fc.oneof({ weight: 3, arbitrary: fc.constant(null) }, { weight: 2, arbitrary: rawPiece }), {
      minLength: names.length,
      maxLength: names.length,
    })
    .map((pieces) =>
      names.reduce((path, name, i) => path.replace(`:${name}`, pieces[i] ?? realParam(route.path, name)), route.path),
    );
};

/** Routes the fuzz leaves out: signing out ends the agent's own session (it takes no input). */
const SKIP = new Set(['POST /api/auth/sign-out']);

async function sendOne(agent: supertest.Agent, method: string, url: string, body: string | null) {
  const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const test = agent[m](url);
  return body === null ? test : test.set('Content-Type', 'application/json').send(body);
}

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  records = await buildRecords(world);
  admin = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
  tech = await signedInAgent(ctx.app, 'tech-a@test.example', PASSWORD);
  targetUserId = (
    await User.create({
      email: 'fuzz-target@test.example',
      name: 'Fuzz target',
      role: 'technician',
      passwordHash: 'x',
      siteId: world.sites.A.id,
      regionId: null,
      allSites: false,
    })
  ).id;
  const [ids] = await ctx.sequelize.query(
    `SELECT (SELECT id FROM cut_logs WHERE site_id = :s LIMIT 1) AS cut, (SELECT id FROM photos WHERE site_id = :s LIMIT 1) AS photo,
            (SELECT id FROM site_checks WHERE site_id = :s AND target_rule = 'guide_clearance') AS check`,
    { replacements: { s: world.sites.A.id } },
  );
  const row = (ids as { cut: string; photo: string; check: string }[])[0]!;
  cutLogId = row.cut;
  photoId = row.photo;
  checkId = row.check;
  invitationId = (
    await admin
      .post('/api/invitations')
      .send({ email: 'fz-inv@test.example', role: 'technician', siteId: world.sites.A.id })
  ).body.id;
  followUpId = (
    await admin.post('/api/follow-ups').send({
      sawId: world.saws.A![0]!.id,
      title: 'Fuzz follow-up',
      assigneeId: targetUserId,
      dueOn: new Date(Date.now() + 86_400_000).toISOString().slice(0, 10),
    })
  ).body.id;
  batchId = (
    await admin
      .post('/api/imports')
      .field('plan', JSON.stringify(importPlan()))
      .attach('file', Buffer.from(IMPORT_CSV), 'log.csv')
  ).body.batch.id;
});
afterAll(async () => ctx.close());

// ---------------------------------------------------------------- the importer's files
const IMPORT_CSV = 'Saw;Blade;Put on;Taken off;Why\r\nA-2;Fleet 34x1.1 3/4;03.01.2023 07:00;02.02.2023 15:00;worn\r\n';
function importPlan(overrides: Record<string, unknown> = {}) {
  return {
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
  };
}
const logRows = (n: number, year: number) =>
  Array.from(
    { length: n },
    (_, i) => `A-${1 + (i % 2)};Fleet 34x1.1 3/4;0${1 + (i % 9)}.0${1 + (i % 9)}.${year} 07:00;;worn`,
  ).join('\r\n');

/** Files no shop should send, each named. */
function pathologicalFiles(): { name: string; bytes: Buffer; plan?: Record<string, unknown> }[] {
  const header = 'Saw;Blade;Put on;Taken off;Why\r\n';
  return [
    { name: 'empty', bytes: Buffer.alloc(0) },
    { name: 'only a header', bytes: Buffer.from(header) },
    { name: 'a million columns', bytes: Buffer.from(`${'c;'.repeat(1_000_000)}\r\n${'1;'.repeat(1_000_000)}`) },
    { name: 'a million columns, one line', bytes: Buffer.from(';'.repeat(1_000_000)) },
    {
      name: 'unbalanced quotes',
      bytes: Buffer.from(`${header}"A-1;Fleet 34x1.1 3/4;03.01.2023 07:00;;worn\r\nA-2;"x;"`),
    },
    { name: 'a quote never closed over many lines', bytes: Buffer.from(`${header}"${'A-1;x\r\n'.repeat(20_000)}`) },
    { name: 'a huge single cell', bytes: Buffer.from(`${header}A-1;${'x'.repeat(8 * 1024 * 1024)};03.01.2023;;worn`) },
    { name: 'binary', bytes: Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256)) },
    { name: 'UTF-16LE without BOM', bytes: Buffer.from(header + IMPORT_CSV.split('\r\n')[1], 'utf16le') },
    { name: 'UTF-16BE without BOM', bytes: Buffer.from(Buffer.from(header + 'A-1;x', 'utf16le')).swap16() },
    {
      name: 'UTF-16 declared, odd length',
      bytes: Buffer.from([0x41, 0, 0x2d, 0, 0x31]),
      plan: { encoding: 'utf-16le' },
    },
    { name: 'NUL bytes in cells', bytes: Buffer.from(`${header}A-1\u0000;Fleet\u0000;03.01.2023 07:00;;worn`) },
    { name: 'lone CR line ends', bytes: Buffer.from(IMPORT_CSV.replaceAll('\r\n', '\r')) },
    { name: 'a BOM and nothing else', bytes: Buffer.from([0xef, 0xbb, 0xbf]) },
    { name: 'CSV sent as xlsx', bytes: Buffer.from(IMPORT_CSV), plan: { format: 'xlsx' } },
    {
      name: 'a zip that is not a workbook',
      bytes: Buffer.from('PK\u0003\u0004' + 'x'.repeat(200)),
      plan: { format: 'xlsx' },
    },
    {
      name: 'a truncated zip',
      bytes: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0, 8, 0]),
      plan: { format: 'xlsx' },
    },
    { name: '10 000 rows', bytes: Buffer.from(header + logRows(10_000, 2019)) },
    {
      name: 'Windows-1252 bytes',
      bytes: Buffer.from([...Buffer.from(header), 0x41, 0x2d, 0x31, 0x3b, 0xe9, 0xfc, 0x80, 0x3b]),
    },
  ];
}

async function sendImport(path: string, bytes: Buffer, plan: unknown, planText?: string) {
  return admin
    .post(path)
    .field('plan', planText ?? JSON.stringify(plan))
    .attach('file', bytes, { filename: 'log.csv', contentType: 'text/csv' });
}

const importFile: fc.Arbitrary<Buffer> = fc.oneof(
  fc.uint8Array({ maxLength: 2000 }).map((a) => Buffer.from(a)),
  fc.nat({ max: IMPORT_CSV.length }).map((n) => Buffer.from(IMPORT_CSV.slice(0, n))),
  fc
    .array(
      fc.array(fc.oneof(hostileText, fc.string({ maxLength: 12 }), fc.constantFrom('"', '""', ';', '\r\n', '\n')), {
        maxLength: 8,
      }),
      {
        maxLength: 20,
      },
    )
    .map((rows) => Buffer.from('Saw;Blade;Put on;Taken off;Why\r\n' + rows.map((r) => r.join(';')).join('\r\n'))),
  fc
    .tuple(fc.constantFrom('utf16le', 'latin1', 'ucs2'), fc.nat({ max: 40 }))
    .map(([enc, cut]) => Buffer.from(IMPORT_CSV, enc as BufferEncoding).subarray(0, IMPORT_CSV.length * 2 - cut)),
);
const importPlanArb: fc.Arbitrary<{ plan: unknown; text?: string }> = fc.oneof(
  { weight: 4, arbitrary: fc.constant({ plan: null }).map(() => ({ plan: importPlan() })) },
  {
    weight: 3,
    arbitrary: fc
      .tuple(
        fc.constantFrom(
          'kind',
          'format',
          'encoding',
          'delimiter',
          'sheet',
          'columns',
          'decimalMark',
          'dateOrder',
          'values',
          'siteId',
        ),
        hostileValue,
      )
      .map(([k, v]) => ({ plan: importPlan({ [k]: v }) })),
  },
  {
    weight: 1,
    arbitrary: fc
      .constantFrom('{', '', 'null', '[]', '{"__proto__":{"siteId":1}}')
      .map((text) => ({ plan: null, text })),
  },
);

// ---------------------------------------------------------------- the properties
describe('fuzzing every route', () => {
  it(
    'never answers 5xx to any input, and a refused write changes no row',
    async () => {
      const routes = listRoutes(ctx.app).filter((r) => !SKIP.has(`${r.method} ${r.path}`));
      expect(routes.length).toBeGreaterThan(100);
      for (const route of routes) {
        const key = `${route.method} ${route.path}`;
        const hasBody = route.method !== 'GET';
        for (const [who, agent] of [
          ['admin', admin],
          ['technician', tech],
        ] as const) {
          await fc.assert(
            fc.asyncProperty(
              pathFor(route),
              queryString,
              hasBody ? bodyFor(key) : fc.constant(null),
              async (path, query, body) => {
                const url = query ? `${path}?${query}` : path;
                const before = hasBody ? await rowCounts() : '';
                const res = await sendOne(agent, route.method, url, body);
                casesRun++;
                statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
                const said = `${key} as ${who}: ${route.method} ${url.slice(0, 200)} ${String(body).slice(0, 300)} → ${res.status} ${res.text.slice(0, 300)}`;
                expect(res.status, said).toBeLessThan(500);
                if (hasBody && res.status >= 400) expect(await rowCounts(), said).toBe(before);
              },
            ),
            { numRuns: RUNS, seed: SEED, endOnFailure: true },
          );
        }
      }
      const byClass = [...statuses.entries()].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`);
      console.log(
        `fuzz: ${casesRun} route cases over ${routes.length} routes × 2 roles (${RUNS} each): ${byClass.join(' ')}`,
      );
      // The fuzz reaches the handlers, not only the guards: some of it is valid enough to be taken.
      expect([...statuses.keys()].some((s) => s < 300)).toBe(true);
    },
    TIMEOUT,
  );
});

describe('fuzzing the importer', () => {
  it(
    'reads pathological files into a 4xx or a whole import, never a 5xx or a partial write',
    async () => {
      let cases = 0;
      for (const file of pathologicalFiles()) {
        for (const path of ['/api/imports/check', '/api/imports']) {
          const before = await rowCounts();
          const res = await sendImport(path, file.bytes, importPlan(file.plan));
          cases++;
          const said = `${file.name} to ${path} → ${res.status} ${res.text.slice(0, 300)}`;
          expect(res.status, said).toBeLessThan(500);
          if (path === '/api/imports') await wholeOrNothing(res, before, said);
        }
      }
      // Forms no browser sends: cut off, without a boundary, two files, the wrong field, the plan as a file.
      const plan = JSON.stringify(importPlan());
      const part = (name: string, value: string, file = false) =>
        `--b\r\nContent-Disposition: form-data; name="${name}"${file ? '; filename="x.csv"' : ''}\r\n\r\n${value}\r\n`;
      const forms: [string, string][] = [
        ['multipart/form-data; boundary=b', `${part('plan', plan)}${part('file', IMPORT_CSV, true)}`],
        [
          'multipart/form-data; boundary=b',
          `${part('plan', plan)}--b\r\nContent-Disposition: form-data; name="file"; filename="x.csv"\r\n\r\nA-1;`,
        ],
        ['multipart/form-data', `${part('plan', plan)}${part('file', IMPORT_CSV, true)}--b--`],
        ['multipart/form-data; boundary=', '--\r\n'],
        [
          'multipart/form-data; boundary=b',
          `${part('plan', plan)}${part('file', 'x', true)}${part('file', 'y', true)}--b--`,
        ],
        ['multipart/form-data; boundary=b', `${part('plan', plan)}${part('photo', IMPORT_CSV, true)}--b--`],
        ['multipart/form-data; boundary=b', `${part('plan', plan, true)}${part('file', IMPORT_CSV, true)}--b--`],
        [
          'multipart/form-data; boundary=b',
          `${part('plan', plan)}${part('a', '1')}${part('b', '2')}${part('file', IMPORT_CSV, true)}--b--`,
        ],
        [
          'multipart/form-data; boundary=b',
          `${part('plan', 'x'.repeat(2 * 1024 * 1024))}${part('file', IMPORT_CSV, true)}--b--`,
        ],
        ['multipart/form-data; boundary=b', '--b--'],
        ['multipart/form-data; boundary=b', ''],
      ];
      const failed: string[] = [];
      for (const [i, [type, text]] of forms.entries()) {
        for (const path of ['/api/imports/check', '/api/imports']) {
          const before = await rowCounts();
          const res = await admin.post(path).set('Content-Type', type).send(text);
          cases++;
          if (res.status >= 500) failed.push(`form ${i} to ${path} → ${res.status}`);
          else if (path === '/api/imports') await wholeOrNothing(res, before, `form ${i} → ${res.status} ${res.text}`);
        }
      }
      expect(failed).toEqual([]);
      await fc.assert(
        fc.asyncProperty(importFile, importPlanArb, fc.boolean(), async (bytes, { plan, text }, commit) => {
          const path = commit ? '/api/imports' : '/api/imports/check';
          const before = await rowCounts();
          const res = await sendImport(path, bytes, plan, text);
          cases++;
          const said = `${path} ${JSON.stringify(plan)?.slice(0, 200)} ${bytes.toString('latin1').slice(0, 200)} → ${res.status} ${res.text.slice(0, 300)}`;
          expect(res.status, said).toBeLessThan(500);
          if (commit) await wholeOrNothing(res, before, said);
        }),
        { numRuns: RUNS * 8, seed: SEED, endOnFailure: true },
      );
      casesRun += cases;
      console.log(
        `fuzz: ${cases} importer cases (${pathologicalFiles().length} pathological files and ${forms.length} malformed forms, each to both routes; ${RUNS * 8} random)`,
      );
    },
    TIMEOUT,
  );
});

describe('fuzzing the photo uploads', () => {
  /** A PNG whose header claims `width` × `height` pixels, with one tiny compressed row behind it. */
  function pngClaiming(width: number, height: number): Buffer {
    const chunk = (type: string, data: Buffer) => {
      const len = Buffer.alloc(4);
      len.writeUInt32BE(data.length);
      const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
      const crc = Buffer.alloc(4);
      crc.writeUInt32BE(zlib.crc32(body));
      return Buffer.concat([len, body, crc]);
    };
    const ihdr = Buffer.alloc(13);
    ihdr.writeUInt32BE(width, 0);
    ihdr.writeUInt32BE(height, 4);
    ihdr.set([8, 2, 0, 0, 0], 8);
    return Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk('IHDR', ihdr),
      chunk('IDAT', zlib.deflateSync(Buffer.alloc(1 + width * 3 > 4096 ? 4096 : 1 + width * 3))),
      chunk('IEND', Buffer.alloc(0)),
    ]);
  }

  it(
    'refuses what is not a picture it can read with a 4xx, keeping no photo, and takes a good one',
    async () => {
      const good = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#468' } })
        .png()
        .toBuffer();
      const files: fc.Arbitrary<Buffer> = fc.oneof(
        fc.uint8Array({ maxLength: 3000 }).map((a) => Buffer.from(a)),
        fc.nat({ max: good.length - 1 }).map((n) => good.subarray(0, n)),
        fc
          .tuple(
            fc.constantFrom([0xff, 0xd8, 0xff, 0xe0], [0x52, 0x49, 0x46, 0x46], [0x47, 0x49, 0x46, 0x38]),
            fc.uint8Array({ maxLength: 500 }),
          )
          .map(([magic, rest]) => Buffer.from([...magic, ...rest])),
        fc
          .tuple(fc.integer({ min: 0, max: 2 ** 31 - 1 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }))
          .map(([w, h]) => pngClaiming(w, h)),
        fc.constantFrom(
          pngClaiming(100_000, 100_000),
          pngClaiming(1, 1),
          Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="1" height="1"/>'),
          Buffer.alloc(0),
        ),
      );
      let cases = 0;
      const photos = async () =>
        (await ctx.sequelize.query('SELECT count(*)::int AS n FROM photos', { plain: true }))!.n as number;
      await fc.assert(
        fc.asyncProperty(files, fc.option(hostileText), fc.boolean(), async (bytes, caption, asTech) => {
          const before = await photos();
          let req = (asTech ? tech : admin).post(`/api/blade-runs/${records.A.run.id}/photos`);
          if (caption !== null) req = req.field('caption', caption);
          const res = await req.attach('photo', bytes, 'p.png');
          cases++;
          const said = `${bytes.subarray(0, 40).toString('hex')} (${bytes.length} bytes) → ${res.status} ${res.text.slice(0, 300)}`;
          expect(res.status, said).toBeLessThan(500);
          expect(await photos(), said).toBe(before + (res.status === 201 ? 1 : 0));
        }),
        { numRuns: RUNS * 6, seed: SEED, endOnFailure: true },
      );
      const taken = await admin.post(`/api/blade-runs/${records.A.run.id}/photos`).attach('photo', good, 'good.png');
      expect(taken.status).toBe(201);
      casesRun += cases + 1;
      console.log(`fuzz: ${cases + 1} photo upload cases`);
    },
    TIMEOUT,
  );
});

/** A refused import writes nothing; a taken one writes exactly its valid rows, and its batch says so. */
async function wholeOrNothing(res: supertest.Response, before: string, said: string) {
  const after = JSON.parse(await rowCounts()) as Record<string, string>;
  const was = JSON.parse(before) as Record<string, string>;
  if (res.status >= 400) {
    expect(after, said).toEqual(was);
    return;
  }
  expect(res.status, said).toBe(201);
  const written = Number(after.blade_runs) - Number(was.blade_runs);
  expect(written, said).toBe(res.body.summary.rowsValid);
  expect(Number(after.import_batches) - Number(was.import_batches), said).toBe(1);
}
