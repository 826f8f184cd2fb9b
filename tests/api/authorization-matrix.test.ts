import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { CAUSE_IDS } from '@kerfline/domain/diagnosis/likely-causes';
import { startTestApp, signedInAgent, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import {
  buildRecords,
  buildSiteRecords,
  buildWorld,
  PASSWORD,
  sawBody,
  specBody,
  type Records,
  type SiteRecords,
  type World,
} from '../../apps/api/src/test-support/fixtures.js';
import { listRoutes } from '../../apps/api/src/http/route-list.js';
import { hashPassword } from '../../apps/api/src/security/passwords.js';
import { User, UserSite } from '../../apps/api/src/modules/users/user.model.js';
import { Saw } from '../../apps/api/src/modules/saws/saw.model.js';
import { Site } from '../../apps/api/src/modules/sites/site.model.js';
import { BladeSpec } from '../../apps/api/src/modules/blade-specs/blade-spec.model.js';
import { StockReceipt } from '../../apps/api/src/modules/blade-stock/stock-receipt.model.js';
import { BladeRun } from '../../apps/api/src/modules/blade-runs/blade-run.model.js';
import { Stop } from '../../apps/api/src/modules/stops/stop.model.js';
import { CutLog } from '../../apps/api/src/modules/cut-logs/cut-log.model.js';
import { SiteCheck } from '../../apps/api/src/modules/site-checks/site-check.model.js';
import { CheckRecord } from '../../apps/api/src/modules/site-checks/check-record.model.js';
import { RemovedRecord } from '../../apps/api/src/modules/removed-records/removed-record.model.js';

/*
 * The authorization matrix: every API route the router holds × every role × scope → the status it must answer,
 * and for every answer that carries data, that nothing of a site outside the caller's scope is in it (no id, name
 * or asset tag of a foreign site's records; totals equal to the rows of the caller's own sites).
 *
 * Roles: an administrator, an operations manager of site A, the regional lead of North (sites A and B), site A's
 * site admin and technician, and nobody signed in. Scopes: A (own site), B (another site in the same region),
 * C (a site in region South). Routes that belong to no site are asked once per role ("-"); lists are also asked
 * unfiltered ("*"). A write is sent at a record made for that one case, so the cases never depend on each other.
 *
 * The table must list exactly the router's routes: a route added without a row fails here.
 */

type Role = 'admin' | 'manager' | 'lead' | 'siteAdmin' | 'tech' | 'anon';
type Code = 'A' | 'B' | 'C';
/** A site code; '-' a route of no site; '*' a list asked for without a site filter. */
type Scope = Code | '-' | '*';
const ROLES: Role[] = ['admin', 'manager', 'lead', 'siteAdmin', 'tech', 'anon'];
const CODES: Code[] = ['A', 'B', 'C'];

/** Expected status per role: one number for every scope, or [A, B, C] (and, for lists, the unfiltered one). */
type Expect = Record<Role, number | [number, number, number] | [number, number, number, number]>;
type Req = {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  url: string;
  body?: unknown;
  upload?: { field: string; bytes: Buffer; name: string; fields?: Record<string, string> };
};
type Row = {
  route: string;
  /** Roles that may read none of these rows: their answer must hold no rows at all. */
  emptyFor?: Role[];
  /** A figure-by-figure check of an aggregate's answer; returns what is wrong. */
  check?: (body: never, role: Role, scope: Scope) => Promise<string | undefined>;
  expect: Expect;
  /** 'site': asked at A, B and C; 'list': also unfiltered; 'none': once. */
  scopes: 'site' | 'list' | 'none';
  req: (scope: Scope, role: Role) => Req | Promise<Req>;
  /** For page-shaped lists asked unfiltered: the rows the caller may see, as SQL over `:sites`. */
  total?: string;
  after?: (scope: Scope, role: Role) => Promise<void>;
};

// ---------------------------------------------------------------- expectations
const each = (n: number): [number, number, number] => [n, n, n];
/** Read by whoever reads the site: the manager of A, the lead of North, A's people; 404 outside. */
const READ = (ok = 200): Expect => ({
  admin: each(ok),
  manager: [ok, 404, 404],
  lead: [ok, ok, 404],
  siteAdmin: [ok, 404, 404],
  tech: [ok, 404, 404],
  anon: 401,
});
/** Changed by an administrator or the site's site admin; readers who may not change it 403, others 404. */
const SITE_ADMIN = (ok = 200): Expect => ({
  admin: each(ok),
  manager: [403, 404, 404],
  lead: [403, 403, 404],
  siteAdmin: [ok, 404, 404],
  tech: [403, 404, 404],
  anon: 401,
});
/** What only administrators and the site's own site admin see at all: everyone else is answered as if it did not exist. */
const KEEPERS = (ok = 200): Expect => ({
  admin: each(ok),
  manager: [404, 404, 404],
  lead: [404, 404, 404],
  siteAdmin: [ok, 404, 404],
  tech: [404, 404, 404],
  anon: 401,
});
/** Work logged by the site's technicians as well. */
const TECH = (ok = 200): Expect => ({ ...SITE_ADMIN(ok), tech: [ok, 404, 404] });
/** Site-scoped, but administrators only. */
const ADMIN_AT_SITE = (ok = 200): Expect => ({ ...SITE_ADMIN(ok), siteAdmin: [403, 404, 404] });
/** Read and changed by administrators and the site's site admin only; to everyone else it does not exist. */
const ADMINS = (ok = 200): Expect => ({
  admin: each(ok),
  manager: 404,
  lead: 404,
  siteAdmin: [ok, 404, 404],
  tech: 404,
  anon: 401,
});
/**
 * Made by naming its site (or saw) in the body: a site the caller reads but may not change 403; one they cannot
 * see is not a site they can name, 400 "That site does not exist" (the same words as an id that exists nowhere).
 */
const CREATE = (ok: number, tech = false): Expect => ({
  admin: each(ok),
  manager: [403, 400, 400],
  lead: [403, 403, 400],
  siteAdmin: [ok, 400, 400],
  tech: [tech ? ok : 403, 400, 400],
  anon: 401,
});
/** A region's (North holds A and B): administrators change it; readers of it 403, everyone else 404. */
const REGION_ADMIN: Expect = {
  admin: each(200),
  manager: [403, 403, 404],
  lead: [403, 403, 404],
  siteAdmin: [403, 403, 404],
  tech: [403, 403, 404],
  anon: 401,
};
/** Read at a site, and asked for every site in the caller's scope ('*'). */
const READ_ALL = (ok = 200): Expect => ({
  admin: [ok, ok, ok, ok],
  manager: [ok, 404, 404, ok],
  lead: [ok, ok, 404, ok],
  siteAdmin: [ok, 404, 404, ok],
  tech: [ok, 404, 404, ok],
  anon: 401,
});
const EXPORT_SITE: Expect = { ...READ(), tech: [403, 404, 404] };
/** A site's blade budget: administrators and the site's operations manager set it. */
const BUDGET = (ok = 200): Expect => ({ ...SITE_ADMIN(ok), manager: [ok, 404, 404], siteAdmin: [403, 404, 404] });
/** A list filtered by site: never an error, simply nothing outside the scope (checked by the leak check). */
const LIST: Expect = {
  admin: 200,
  manager: 200,
  lead: 200,
  siteAdmin: 200,
  tech: 200,
  anon: 401,
};
/**
 * The fleet's screens take the sites to show as a filter: a site outside the scope is simply not shown (the leak
 * check holds them to it). Their CSV exports likewise, but never for technicians, whose role exports nothing.
 */
const EXPORT: Expect = { ...LIST, tech: 403 };
const SIGNED_IN = (ok = 200): Expect => ({ admin: ok, manager: ok, lead: ok, siteAdmin: ok, tech: ok, anon: 401 });
const ADMIN_ONLY = (ok = 200): Expect => ({
  admin: ok,
  manager: 403,
  lead: 403,
  siteAdmin: 403,
  tech: 403,
  anon: 401,
});
const ANYONE = (status: number): Expect => ({
  admin: status,
  manager: status,
  lead: status,
  siteAdmin: status,
  tech: status,
  anon: status,
});

// ---------------------------------------------------------------- the world
let ctx: TestContext;
let world: World;
let records: Records & { B: SiteRecords };
const agents = {} as Record<Role, supertest.Agent>;
const EMAIL: Record<Exclude<Role, 'anon'>, string> = {
  admin: 'admin@test.example',
  manager: 'manager-a@test.example',
  lead: 'lead-north@test.example',
  siteAdmin: 'siteadmin-a@test.example',
  tech: 'tech-a@test.example',
};
const VISIBLE: Record<Role, Code[]> = {
  admin: ['A', 'B', 'C'],
  manager: ['A'],
  lead: ['A', 'B'],
  siteAdmin: ['A'],
  tech: ['A'],
  anon: [],
};
/** Per site: the strings that name it or its records (ids, names, asset tags, its people's addresses). */
const markers: Record<Code, Set<string>> = { A: new Set(), B: new Set(), C: new Set() };
/** Per site: a photo of a run and of a check (with bytes), an import batch, a person, a pending invitation. */
const extra = {} as Record<
  Code,
  {
    photoId: string;
    checkPhotoId: string;
    batchId: string;
    userId: string;
    invitationId: string;
    guideId: string;
    followUpId: string;
  }
>;
let passwordHash = '';
let png: Buffer;
let serial = 0;
const next = () => `${Date.now().toString(36)}${(serial++).toString(36)}`;
const site = (c: Code) => world.sites[c];
const region = (c: Code) => (c === 'C' ? world.regions.south : world.regions.north);
const codeOf = (s: Scope): Code => {
  if (s === '-' || s === '*') throw new Error('a site route asked without a site');
  return s;
};

const IMPORT_CSV = (code: Code) =>
  [
    'Saw;Blade;Put on;Taken off;Why',
    `${code}-2;Fleet 34x1.1 3/4;03.01.2023 07:00;02.02.2023 15:00;worn`,
    `NOPE;Fleet 34x1.1 3/4;03.02.2023 07:00;04.02.2023 15:00;worn`,
  ].join('\r\n');
const importPlan = (code: Code) => ({
  siteId: site(code).id,
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
});
const importUpload = (code: Code, year = 2023): Req['upload'] => ({
  field: 'file',
  bytes: Buffer.from(IMPORT_CSV(code).replaceAll('2023', String(year))),
  name: 'log.csv',
  fields: { plan: JSON.stringify(importPlan(code)) },
});

async function send(agent: supertest.Agent | supertest.Agent, req: Req) {
  const method = req.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let test = agent[method](req.url);
  if (req.upload) {
    for (const [k, v] of Object.entries(req.upload.fields ?? {})) test = test.field(k, v);
    return test.attach(req.upload.field, req.upload.bytes, req.upload.name);
  }
  return req.body === undefined ? test : test.send(req.body as object);
}

// Fresh records for one case, written straight to the tables.
const freshSaw = async (c: Code, retired = false) =>
  Saw.create({
    ...(sawBody(site(c).id, { assetTag: `Z-${next()}` }) as ReturnType<typeof sawBody> & { kind: 'horizontal' }),
    make: null,
    model: null,
    ...(retired ? { status: 'retired', retiredAt: new Date() } : { retiredAt: null }),
  });
const freshRun = async (c: Code, removed = false) => {
  const saw = await freshSaw(c);
  return BladeRun.create({
    siteId: site(c).id,
    sawId: saw.id,
    bladeSpecId: records.fleetSpec.id,
    stockReceiptId: null,
    installedAt: new Date(Date.now() - 3 * 86_400_000),
    installedById: null,
    tensionMpa: null,
    materialGroup: 'carbon_steel',
    breakInFollowed: null,
    installNotes: null,
    costMinor: 6000,
    currency: 'EUR',
    ...(removed ? { removedAt: new Date(Date.now() - 86_400_000), removalReason: 'tooth_strippage' as const } : {}),
  });
};
const freshStop = async (c: Code, open = false) => {
  const saw = await freshSaw(c);
  return Stop.create({
    siteId: site(c).id,
    sawId: saw.id,
    startedAt: new Date(Date.now() - 3 * 3600_000),
    endedAt: open ? null : new Date(Date.now() - 3600_000),
    category: 'mechanical',
    planned: false,
    notes: null,
    createdById: null,
    endedById: null,
  });
};
const freshCutLog = async (c: Code) =>
  CutLog.create({
    siteId: site(c).id,
    sawId: world.saws[c]![0]!.id,
    bladeRunId: null,
    cutAt: new Date(Date.now() - 3600_000),
    shape: { kind: 'round_bar', diameterMm: 50 },
    pieceCount: 1,
    piecesAcross: 1,
    materialGroup: 'carbon_steel',
    quantity: 1,
    bandSpeedMPerMin: null,
    feedMmPerMin: null,
    cutTimeS: null,
    areaPerCutMm2: 1963,
    areaCutMm2: 1963,
    teethInWorkMin: null,
    teethInWorkMax: null,
    warnings: [],
    notes: null,
    createdById: null,
  });
const freshCheck = async (c: Code, retired = false) =>
  SiteCheck.create({
    siteId: site(c).id,
    name: `Coolant ${next()}`,
    measures: null,
    quantity: 'stress',
    targetRule: 'fixed',
    fixedTarget: 0.3,
    fixedMin: 0.2,
    fixedMax: null,
    schedule: 'periodic',
    intervalDays: 7,
    graceHours: 24,
    position: 20,
    retiredAt: retired ? new Date() : null,
    updatedById: null,
  });
const freshCheckRecord = async (c: Code) =>
  CheckRecord.create({
    siteId: site(c).id,
    sawId: world.saws[c]![0]!.id,
    siteCheckId: extra[c].guideId,
    bladeRunId: null,
    checkedAt: new Date(Date.now() - 3600_000),
    checkedById: null,
    targetRule: 'guide_clearance',
    quantity: 'length',
    reading: 1.13,
    answers: null,
    target: 1.1254,
    minValue: 1.1254,
    maxValue: 1.1508,
    passed: true,
    basis: null,
    explanation: 'Matrix',
    notes: null,
  });
const freshReceipt = async (c: Code) =>
  StockReceipt.create({
    siteId: site(c).id,
    bladeSpecId: records.fleetSpec.id,
    quantity: 2,
    unitCostMinor: 6100,
    currency: 'EUR',
    receivedOn: '2026-01-05',
    reference: null,
    notes: null,
    createdById: null,
  });
const freshSpec = async (c: Code) =>
  BladeSpec.create({
    siteId: site(c).id,
    name: `Own ${next()}`,
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
const freshUser = async (c: Code, active = true) =>
  User.create({
    email: `z-${next()}@test.example`,
    name: 'Fresh person',
    role: 'technician',
    passwordHash,
    siteId: site(c).id,
    regionId: null,
    allSites: false,
    active,
  });
const adminSends = async (req: Req, status: number) => {
  const res = await send(agents.admin, req);
  if (res.status !== status) throw new Error(`${req.method} ${req.url}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: string; batch?: { id: string } };
};
/** A stop at the site removed by an administrator (with its reason): the id of its kept record. */
const freshRemoved = async (c: Code): Promise<string> => {
  const stop = await freshStop(c);
  await adminSends(del(`/api/stops/${stop.id}?reason=Entered%20twice`), 204);
  const kept = await RemovedRecord.findOne({ where: { recordId: stop.id } });
  return kept!.id;
};
const freshPhoto = async (c: Code) =>
  (
    await adminSends(
      {
        method: 'POST',
        url: `/api/blade-runs/${records[c].run.id}/photos`,
        upload: { field: 'photo', bytes: png, name: 'p.png' },
      },
      201,
    )
  ).id;
const freshBatch = async (c: Code) =>
  (await adminSends({ method: 'POST', url: '/api/imports', upload: importUpload(c, 2010 + (serial++ % 10)) }, 201))
    .batch!.id;
const freshInvitation = async (c: Code) =>
  (
    await adminSends(
      {
        method: 'POST',
        url: '/api/invitations',
        body: { email: `inv-${next()}@test.example`, role: 'technician', siteId: site(c).id },
      },
      201,
    )
  ).id;

const countRows = async (from: string, sites: string[]) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${from}`, { plain: true, replacements: { sites } }))!
    .n as number;
/** The sites an aggregate gives figures for must be exactly the caller's sites in use (an admin's: every one). */
async function sameSites(shown: string[], role: Role): Promise<string | undefined> {
  const [rows] = await ctx.sequelize.query(`SELECT id, region_id FROM sites WHERE retired_at IS NULL`);
  const inUse = rows as { id: string; region_id: string }[];
  // The lead reads every site of North, the ones added during the run included.
  const expected = inUse
    .filter((r) =>
      role === 'admin'
        ? true
        : role === 'lead'
          ? r.region_id === world.regions.north.id
          : VISIBLE[role].some((c) => site(c).id === r.id),
    )
    .map((r) => r.id);
  return [...shown].sort().join() === [...expected].sort().join()
    ? undefined
    : `figures for ${shown.length} sites, the caller's sites in use are ${expected.length}`;
}

const tomorrow = () => new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
const freshFollowUp = async (c: Code) =>
  (
    await adminSends(
      post('/api/follow-ups', {
        sawId: world.saws[c]![0]!.id,
        title: `Look at the guides ${next()}`,
        assigneeId: extra[c].userId,
        dueOn: tomorrow(),
      }),
      201,
    )
  ).id;
const freshBudget = async (c: Code) => {
  await adminSends(put(`/api/budgets/${site(c).id}/2026-09`, { amountMinor: 500_000 }), 200);
  return `/api/budgets/${site(c).id}/2026-09`;
};
/** A fleet screen's address: `sites=` the scope's site, or none (every site in the caller's scope). */
const fleetUrl = (path: string, s: Scope, extraQuery = '') => {
  const q = [s === '*' ? '' : `sites=${site(codeOf(s)).id}`, extraQuery].filter(Boolean).join('&');
  return q ? `${path}?${q}` : path;
};
/** The fleet's totals must be the sum of the sites shown: no foreign site's blades hide in them. */
const fleetSums = async (body: {
  sites: { site: { id: string }; current: { bladesUsed: number; failures: number } }[];
  fleet: { current: { bladesUsed: number; failures: number } };
}) => {
  for (const key of ['bladesUsed', 'failures'] as const) {
    const sum = body.sites.reduce((n, x) => n + x.current[key], 0);
    if (sum !== body.fleet.current[key]) return `fleet ${key} ${body.fleet.current[key]}, its sites sum to ${sum}`;
  }
  return undefined;
};

// ---------------------------------------------------------------- the table
/** One route: its expected status per role, where it is asked, and the request for a scope. */
const row = (
  route: string,
  expect: Expect,
  scopes: Row['scopes'],
  req: Row['req'],
  more: Pick<Row, 'emptyFor' | 'check' | 'total' | 'after'> = {},
): Row => ({ route, expect, scopes, req, ...more });
const get = (url: string): Req => ({ method: 'GET', url });
const post = (url: string, body: unknown = {}): Req => ({ method: 'POST', url, body });
const patch = (url: string, body: unknown): Req => ({ method: 'PATCH', url, body });
const put = (url: string, body: unknown): Req => ({ method: 'PUT', url, body });
const del = (url: string): Req => ({ method: 'DELETE', url });
const listUrl = (path: string, s: Scope, extraQuery = '') => {
  const q = [s === '*' ? '' : `siteId=${site(codeOf(s)).id}`, extraQuery].filter(Boolean).join('&');
  return q ? `${path}?${q}` : path;
};
const saw0 = (s: Scope) => world.saws[codeOf(s)]![0]!.id;

const TABLE: Row[] = [
  // Public and one's own
  row('GET /api/health', ANYONE(200), 'none', () => get('/api/health')),
  // A malformed body is refused before anything is counted, signed in or not.
  row('POST /api/auth/sign-in', ANYONE(400), 'none', () => post('/api/auth/sign-in', {})),
  // Signing out without a session is harmless, so nobody is refused.
  row('POST /api/auth/sign-out', ANYONE(204), 'none', () => post('/api/auth/sign-out'), {
    after: async (_s, role) => {
      if (role !== 'anon') agents[role] = await signedInAgent(ctx.app, EMAIL[role], PASSWORD);
    },
  }),
  row('POST /api/auth/password-reset/request', ANYONE(202), 'none', (_s, role) =>
    post('/api/auth/password-reset/request', { email: `nobody-${role}@test.example` }),
  ),
  row('POST /api/auth/password-reset', ANYONE(400), 'none', () => post('/api/auth/password-reset', {})),
  row('GET /api/me', SIGNED_IN(), 'none', () => get('/api/me')),
  // Refused for its body, after the session is checked: a change of password is one's own.
  row('POST /api/me/password', SIGNED_IN(400), 'none', () => post('/api/me/password')),
  row('GET /api/me/mail-preferences', SIGNED_IN(), 'none', () => get('/api/me/mail-preferences')),
  row('PATCH /api/me/mail-preferences', SIGNED_IN(400), 'none', () => patch('/api/me/mail-preferences', {})),

  // Invitations
  row('POST /api/invitations/preview', ANYONE(400), 'none', () => post('/api/invitations/preview')),
  row('POST /api/invitations/accept', ANYONE(400), 'none', () => post('/api/invitations/accept')),
  row('GET /api/invitations', LIST, 'list', (s) => get(listUrl('/api/invitations', s)), {
    emptyFor: ['manager', 'lead', 'tech'],
  }),
  // The same refusal whether or not the site is the caller's to see: it names no site.
  row('POST /api/invitations', { ...ADMIN_ONLY(201), siteAdmin: [201, 403, 403] }, 'site', (s) =>
    post('/api/invitations', { email: `i-${next()}@test.example`, role: 'technician', siteId: site(codeOf(s)).id }),
  ),
  row('POST /api/invitations/:id/resend', ADMINS(), 'site', async (s) =>
    post(`/api/invitations/${await freshInvitation(codeOf(s))}/resend`),
  ),
  row('POST /api/invitations/:id/revoke', ADMINS(), 'site', async (s) =>
    post(`/api/invitations/${await freshInvitation(codeOf(s))}/revoke`),
  ),

  // Regions and sites (a region's scope: A and B are in North, C in South)
  row('GET /api/regions', SIGNED_IN(), 'none', () => get('/api/regions')),
  row('POST /api/regions', ADMIN_ONLY(201), 'none', () => post('/api/regions', { name: `Region ${next()}` })),
  row('PATCH /api/regions/:id', REGION_ADMIN, 'site', (s) =>
    patch(`/api/regions/${region(codeOf(s)).id}`, { name: region(codeOf(s)).name }),
  ),
  row('GET /api/sites', SIGNED_IN(), 'none', () => get('/api/sites?includeRetired=true')),
  row('GET /api/sites/:id', READ(), 'site', (s) => get(`/api/sites/${site(codeOf(s)).id}`)),
  row('POST /api/sites', ADMIN_ONLY(201), 'site', (s) =>
    post('/api/sites', {
      code: `N${serial++}`,
      name: `New site ${next()}`,
      timeZone: 'Europe/Berlin',
      currency: 'EUR',
      unitSystem: 'metric',
      regionId: region(codeOf(s)).id,
    }),
  ),
  row('PATCH /api/sites/:id', SITE_ADMIN(), 'site', (s) =>
    patch(`/api/sites/${site(codeOf(s)).id}`, { city: 'Oldmoor' }),
  ),
  row('POST /api/sites/:id/retire', ADMIN_AT_SITE(), 'site', (s) => post(`/api/sites/${site(codeOf(s)).id}/retire`), {
    after: async (s) => {
      await Site.update({ retiredAt: null }, { where: { id: site(codeOf(s)).id } });
    },
  }),
  row(
    'POST /api/sites/:id/restore',
    ADMIN_AT_SITE(),
    'site',
    async (s) => {
      await Site.update({ retiredAt: new Date() }, { where: { id: site(codeOf(s)).id } });
      return post(`/api/sites/${site(codeOf(s)).id}/restore`);
    },
    {
      after: async (s) => {
        await Site.update({ retiredAt: null }, { where: { id: site(codeOf(s)).id } });
      },
    },
  ),
  row('GET /api/sites/:siteId/settings', READ(), 'site', (s) => get(`/api/sites/${site(codeOf(s)).id}/settings`)),
  row('PUT /api/sites/:siteId/settings/:key', SITE_ADMIN(), 'site', (s) =>
    put(`/api/sites/${site(codeOf(s)).id}/settings/guide_clearance`, {
      value: { extraClearanceMm: 0.03, toleranceMm: 0.03 },
    }),
  ),
  row('DELETE /api/sites/:siteId/settings/:key', SITE_ADMIN(), 'site', (s) =>
    del(`/api/sites/${site(codeOf(s)).id}/settings/guide_clearance`),
  ),

  // Saws
  row('GET /api/saws', LIST, 'list', (s) => get(listUrl('/api/saws', s)), {
    total: `saws WHERE status <> 'retired' AND site_id IN (:sites)`,
  }),
  row('GET /api/saws/:id', READ(), 'site', (s) => get(`/api/saws/${saw0(s)}`)),
  row('POST /api/saws', CREATE(201), 'site', (s) =>
    post('/api/saws', sawBody(site(codeOf(s)).id, { assetTag: `N-${next()}` })),
  ),
  row('PATCH /api/saws/:id', SITE_ADMIN(), 'site', async (s) =>
    patch(`/api/saws/${(await freshSaw(codeOf(s))).id}`, { name: 'Renamed' }),
  ),
  row('POST /api/saws/:id/retire', SITE_ADMIN(), 'site', async (s) =>
    post(`/api/saws/${(await freshSaw(codeOf(s))).id}/retire`),
  ),
  row('POST /api/saws/:id/restore', SITE_ADMIN(), 'site', async (s) =>
    post(`/api/saws/${(await freshSaw(codeOf(s), true)).id}/restore`),
  ),

  // People
  // Everyone reads themselves; only administrators and site admins read others (checked by the leak check).
  row('GET /api/users', LIST, 'list', (s) => get(listUrl('/api/users', s))),
  row('GET /api/users/:id', ADMINS(), 'site', (s) => get(`/api/users/${extra[codeOf(s)].userId}`)),
  row('POST /api/users', ADMIN_ONLY(201), 'site', (s) =>
    post('/api/users', {
      email: `u-${next()}@test.example`,
      name: 'New person',
      password: 'plinth-orbit-harbour-kettle',
      role: 'technician',
      siteId: site(codeOf(s)).id,
    }),
  ),
  row('PATCH /api/users/:id', ADMINS(), 'site', async (s) =>
    patch(`/api/users/${(await freshUser(codeOf(s))).id}`, { name: 'Renamed' }),
  ),
  row('POST /api/users/:id/deactivate', ADMINS(), 'site', async (s) =>
    post(`/api/users/${(await freshUser(codeOf(s))).id}/deactivate`),
  ),
  row('POST /api/users/:id/reactivate', ADMINS(), 'site', async (s) =>
    post(`/api/users/${(await freshUser(codeOf(s), false)).id}/reactivate`),
  ),
  row('GET /api/audit', LIST, 'list', (s) => get(listUrl('/api/audit', s)), { emptyFor: ['manager', 'lead', 'tech'] }),

  // Mail
  row('GET /api/mail-log', SIGNED_IN(), 'none', () => get('/api/mail-log'), {
    emptyFor: ['manager', 'lead', 'siteAdmin', 'tech'],
  }),
  row('GET /api/outbox', ADMIN_ONLY(), 'none', () => get('/api/outbox')),
  row('POST /api/mail/schedules/:schedule/run', ADMIN_ONLY(202), 'none', () =>
    post('/api/mail/schedules/weekly-digest/run'),
  ),

  // Blade specs (the fleet catalogue is read by everyone; a site's own specs by its readers)
  row('GET /api/blade-specs', LIST, 'list', (s) => get(listUrl('/api/blade-specs', s))),
  row('GET /api/blade-specs/:id', READ(), 'site', async (s) =>
    get(`/api/blade-specs/${(await freshSpec(codeOf(s))).id}`),
  ),
  row('POST /api/blade-specs', CREATE(201), 'site', (s) => post('/api/blade-specs', specBody(site(codeOf(s)).id))),
  row('PATCH /api/blade-specs/:id', SITE_ADMIN(), 'site', async (s) =>
    patch(`/api/blade-specs/${(await freshSpec(codeOf(s))).id}`, { archived: true }),
  ),
  row('DELETE /api/blade-specs/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/blade-specs/${(await freshSpec(codeOf(s))).id}`),
  ),

  // Stock
  row('GET /api/stock-receipts', LIST, 'list', (s) => get(listUrl('/api/stock-receipts', s)), {
    total: `stock_receipts WHERE site_id IN (:sites)`,
  }),
  row('GET /api/stock-receipts/:id', READ(), 'site', (s) =>
    get(`/api/stock-receipts/${records[codeOf(s)].receipt.id}`),
  ),
  row('POST /api/stock-receipts', CREATE(201), 'site', (s) =>
    post('/api/stock-receipts', {
      siteId: site(codeOf(s)).id,
      bladeSpecId: records.fleetSpec.id,
      quantity: 1,
      unitCostMinor: 6000,
      receivedOn: '2026-02-01',
    }),
  ),
  row('PATCH /api/stock-receipts/:id', SITE_ADMIN(), 'site', async (s) =>
    patch(`/api/stock-receipts/${(await freshReceipt(codeOf(s))).id}`, { quantity: 3 }),
  ),
  row('DELETE /api/stock-receipts/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/stock-receipts/${(await freshReceipt(codeOf(s))).id}`),
  ),
  row('GET /api/sites/:id/stock', READ(), 'site', (s) => get(`/api/sites/${site(codeOf(s)).id}/stock`)),
  row('GET /api/sites/:id/stock/movements', READ(), 'site', (s) =>
    get(`/api/sites/${site(codeOf(s)).id}/stock/movements`),
  ),
  row('GET /api/sites/:id/stock/movements/export', EXPORT_SITE, 'site', (s) =>
    get(`/api/sites/${site(codeOf(s)).id}/stock/movements/export`),
  ),
  row('PUT /api/sites/:id/stock/:bladeSpecId/levels', SITE_ADMIN(), 'site', (s) =>
    put(`/api/sites/${site(codeOf(s)).id}/stock/${records.fleetSpec.id}/levels`, { leadTimeDays: 12, safetyStock: 1 }),
  ),

  // Blade runs
  row('GET /api/blade-runs', LIST, 'list', (s) => get(listUrl('/api/blade-runs', s)), {
    total: `blade_runs WHERE site_id IN (:sites)`,
  }),
  // A site's table as CSV: a site outside the scope is 404 (not an empty file), a technician 403.
  row('GET /api/blade-runs/export', EXPORT_SITE, 'site', (s) =>
    get(`/api/blade-runs/export?siteId=${site(codeOf(s)).id}`),
  ),
  row('GET /api/blade-runs/:id', READ(), 'site', (s) => get(`/api/blade-runs/${records[codeOf(s)].run.id}`)),
  row('POST /api/blade-runs', CREATE(201, true), 'site', async (s) =>
    post('/api/blade-runs', { sawId: (await freshSaw(codeOf(s))).id, bladeSpecId: records.fleetSpec.id }),
  ),
  row('POST /api/blade-runs/:id/remove', TECH(), 'site', async (s) =>
    post(`/api/blade-runs/${(await freshRun(codeOf(s))).id}/remove`, { reason: 'worn_out' }),
  ),
  row('PATCH /api/blade-runs/:id', TECH(), 'site', async (s) =>
    patch(`/api/blade-runs/${(await freshRun(codeOf(s))).id}`, { installNotes: 'Corrected' }),
  ),
  row('DELETE /api/blade-runs/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/blade-runs/${(await freshRun(codeOf(s))).id}?reason=Entered%20twice`),
  ),
  row('GET /api/blade-runs/:id/likely-causes', READ(), 'site', (s) =>
    get(`/api/blade-runs/${records[codeOf(s)].run.id}/likely-causes?reason=tooth_strippage`),
  ),
  row('POST /api/blade-runs/:id/confirmed-cause', TECH(), 'site', async (s) =>
    post(`/api/blade-runs/${(await freshRun(codeOf(s), true)).id}/confirmed-cause`, { cause: CAUSE_IDS[0] }),
  ),
  row('GET /api/saws/:id/break-in-plan', READ(), 'site', (s) =>
    get(`/api/saws/${saw0(s)}/break-in-plan?bladeSpecId=${records.fleetSpec.id}&materialGroup=carbon_steel`),
  ),

  // Stops
  row('GET /api/stops', LIST, 'list', (s) => get(listUrl('/api/stops', s)), {
    total: `stops WHERE site_id IN (:sites)`,
  }),
  row('GET /api/stops/export', EXPORT_SITE, 'site', (s) => get(`/api/stops/export?siteId=${site(codeOf(s)).id}`)),
  row('GET /api/stops/:id', READ(), 'site', (s) => get(`/api/stops/${records[codeOf(s)].stop.id}`)),
  row('POST /api/stops', CREATE(201, true), 'site', async (s) =>
    post('/api/stops', { sawId: (await freshSaw(codeOf(s))).id, category: 'electrical' }),
  ),
  row('POST /api/stops/:id/end', TECH(), 'site', async (s) =>
    post(`/api/stops/${(await freshStop(codeOf(s), true)).id}/end`),
  ),
  row('PATCH /api/stops/:id', TECH(), 'site', async (s) =>
    patch(`/api/stops/${(await freshStop(codeOf(s))).id}`, { notes: 'Fixed' }),
  ),
  row('DELETE /api/stops/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/stops/${(await freshStop(codeOf(s))).id}?reason=Entered%20twice`),
  ),

  // Cut logs
  row('GET /api/cut-logs', LIST, 'list', (s) => get(listUrl('/api/cut-logs', s)), {
    total: `cut_logs WHERE site_id IN (:sites)`,
  }),
  row('GET /api/cut-logs/:id', READ(), 'site', async (s) => get(`/api/cut-logs/${(await freshCutLog(codeOf(s))).id}`)),
  row('POST /api/cut-logs', CREATE(201, true), 'site', (s) =>
    post('/api/cut-logs', {
      sawId: saw0(s),
      stock: { shape: { kind: 'round_bar', diameterMm: 60 } },
      materialGroup: 'carbon_steel',
    }),
  ),
  row('DELETE /api/cut-logs/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/cut-logs/${(await freshCutLog(codeOf(s))).id}?reason=Entered%20twice`),
  ),

  // Photos
  row('POST /api/blade-runs/:id/photos', TECH(201), 'site', (s) => ({
    method: 'POST',
    url: `/api/blade-runs/${records[codeOf(s)].run.id}/photos`,
    upload: { field: 'photo', bytes: png, name: 'p.png' },
  })),
  row('GET /api/blade-runs/:id/photos', READ(), 'site', (s) =>
    get(`/api/blade-runs/${records[codeOf(s)].run.id}/photos`),
  ),
  row('POST /api/check-records/:id/photos', TECH(201), 'site', (s) => ({
    method: 'POST',
    url: `/api/check-records/${records[codeOf(s)].checkRecord.id}/photos`,
    upload: { field: 'photo', bytes: png, name: 'p.png' },
  })),
  row('GET /api/check-records/:id/photos', READ(), 'site', (s) =>
    get(`/api/check-records/${records[codeOf(s)].checkRecord.id}/photos`),
  ),
  row('GET /api/photos/:id', READ(), 'site', (s) => get(`/api/photos/${extra[codeOf(s)].photoId}`)),
  row('GET /api/photos/:id/image', READ(), 'site', (s) => get(`/api/photos/${extra[codeOf(s)].checkPhotoId}/image`)),
  row('GET /api/photos/:id/thumbnail', READ(), 'site', (s) => get(`/api/photos/${extra[codeOf(s)].photoId}/thumbnail`)),
  row('DELETE /api/photos/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/photos/${await freshPhoto(codeOf(s))}?reason=Entered%20twice`),
  ),

  // The site's checks and the checks recorded
  row('GET /api/sites/:siteId/checks', READ(), 'site', (s) => get(`/api/sites/${site(codeOf(s)).id}/checks`)),
  row('POST /api/sites/:siteId/checks', SITE_ADMIN(201), 'site', (s) =>
    post(`/api/sites/${site(codeOf(s)).id}/checks`, {
      name: `Feed pressure ${next()}`,
      targetRule: 'fixed',
      quantity: 'stress',
      fixedTarget: 3,
      fixedMin: 2,
      schedule: 'periodic',
      intervalDays: 7,
    }),
  ),
  row('GET /api/sites/:siteId/checks/overdue', READ(), 'site', (s) =>
    get(`/api/sites/${site(codeOf(s)).id}/checks/overdue`),
  ),
  row('GET /api/sites/:siteId/checks/counts', READ(), 'site', (s) =>
    get(`/api/sites/${site(codeOf(s)).id}/checks/counts`),
  ),
  row('GET /api/check-counts', READ_ALL(), 'list', (s) => get(listUrl('/api/check-counts', s)), {
    check: async (body: { items: { siteId: string }[] }, role, scope) =>
      scope === '*'
        ? sameSites(
            body.items.map((i) => i.siteId),
            role,
          )
        : undefined,
  }),
  row('GET /api/site-checks/:id', READ(), 'site', (s) => get(`/api/site-checks/${extra[codeOf(s)].guideId}`)),
  row('PATCH /api/site-checks/:id', SITE_ADMIN(), 'site', async (s) =>
    patch(`/api/site-checks/${(await freshCheck(codeOf(s))).id}`, { intervalDays: 14 }),
  ),
  row('POST /api/site-checks/:id/retire', SITE_ADMIN(), 'site', async (s) =>
    post(`/api/site-checks/${(await freshCheck(codeOf(s))).id}/retire`),
  ),
  row('POST /api/site-checks/:id/restore', SITE_ADMIN(), 'site', async (s) =>
    post(`/api/site-checks/${(await freshCheck(codeOf(s), true)).id}/restore`),
  ),
  row('DELETE /api/site-checks/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/site-checks/${(await freshCheck(codeOf(s))).id}`),
  ),
  row('GET /api/saws/:id/checks', READ(), 'site', (s) => get(`/api/saws/${saw0(s)}/checks`)),
  row('GET /api/check-records/export', EXPORT_SITE, 'site', (s) =>
    get(`/api/check-records/export?siteId=${site(codeOf(s)).id}`),
  ),
  row('GET /api/check-records', LIST, 'list', (s) => get(listUrl('/api/check-records', s)), {
    total: `check_records WHERE site_id IN (:sites)`,
  }),
  row('GET /api/check-records/:id', READ(), 'site', (s) =>
    get(`/api/check-records/${records[codeOf(s)].checkRecord.id}`),
  ),
  row('POST /api/check-records', TECH(201), 'site', (s) =>
    post('/api/check-records', { sawId: saw0(s), siteCheckId: extra[codeOf(s)].guideId, reading: 1.13 }),
  ),
  row('DELETE /api/check-records/:id', SITE_ADMIN(204), 'site', async (s) =>
    del(`/api/check-records/${(await freshCheckRecord(codeOf(s))).id}?reason=Entered%20twice`),
  ),

  // Removed entries: kept with their reason; only administrators and the site's own admins see or put them back.
  row('GET /api/removed-records', LIST, 'list', (s) => get(listUrl('/api/removed-records', s))),
  row('GET /api/removed-records/:id', KEEPERS(), 'site', async (s) =>
    get(`/api/removed-records/${await freshRemoved(codeOf(s))}`),
  ),
  row('POST /api/removed-records/:id/restore', KEEPERS(), 'site', async (s) =>
    post(`/api/removed-records/${await freshRemoved(codeOf(s))}/restore`),
  ),

  // A saw's story and the sites' tiles
  row('GET /api/saws/:id/timeline', READ(), 'site', (s) => get(`/api/saws/${saw0(s)}/timeline`)),
  row('GET /api/site-summaries', SIGNED_IN(), 'none', () => get('/api/site-summaries'), {
    check: async (body: { items: { siteId: string; sawsInUse: number }[] }, role) => {
      const wrong = await sameSites(
        body.items.map((i) => i.siteId),
        role,
      );
      if (wrong) return wrong;
      const sites = body.items.map((i) => i.siteId);
      const saws = sites.length ? await countRows(`saws WHERE status <> 'retired' AND site_id IN (:sites)`, sites) : 0;
      const shown = body.items.reduce((sum, i) => sum + i.sawsInUse, 0);
      return shown === saws ? undefined : `saws in use ${shown}, the caller's sites hold ${saws}`;
    },
  }),

  // Imports
  row('GET /api/imports/context', SITE_ADMIN(), 'site', (s) =>
    get(`/api/imports/context?siteId=${site(codeOf(s)).id}&kind=blade_runs`),
  ),
  row('GET /api/imports', LIST, 'list', (s) => get(listUrl('/api/imports', s)), {
    emptyFor: ['manager', 'lead', 'tech'],
    total: `import_batches WHERE site_id IN (:sites)`,
  }),
  row('POST /api/imports/check', SITE_ADMIN(), 'site', (s) => ({
    method: 'POST',
    url: '/api/imports/check',
    upload: importUpload(codeOf(s)),
  })),
  row('POST /api/imports', SITE_ADMIN(201), 'site', (s) => ({
    method: 'POST',
    url: '/api/imports',
    upload: importUpload(codeOf(s), 2000 + (serial++ % 9)),
  })),
  row('GET /api/imports/:id', ADMINS(), 'site', (s) => get(`/api/imports/${extra[codeOf(s)].batchId}`)),
  row('GET /api/imports/:id/rejected.csv', ADMINS(), 'site', (s) =>
    get(`/api/imports/${extra[codeOf(s)].batchId}/rejected.csv`),
  ),
  row('POST /api/imports/:id/undo', ADMINS(), 'site', async (s) =>
    post(`/api/imports/${await freshBatch(codeOf(s))}/undo`),
  ),
  // The fleet's figures (its own screens take `sites=`; a site's, a saw's and a run's take the id)
  row('GET /api/fleet/overview', LIST, 'list', (s) => get(fleetUrl('/api/fleet/overview', s)), {
    check: async (body: Parameters<typeof fleetSums>[0], role, scope) =>
      (scope === '*'
        ? await sameSites(
            body.sites.map((x) => x.site.id),
            role,
          )
        : undefined) ?? fleetSums(body),
  }),
  row('GET /api/fleet/overview/export', EXPORT, 'list', (s) =>
    get(fleetUrl('/api/fleet/overview/export', s, 'table=sites')),
  ),
  row('GET /api/fleet/practice', LIST, 'list', (s) => get(fleetUrl('/api/fleet/practice', s))),
  row('GET /api/fleet/practice/export', EXPORT, 'list', (s) => get(fleetUrl('/api/fleet/practice/export', s))),
  row('GET /api/fleet/sites/:siteId', READ(), 'site', (s) => get(`/api/fleet/sites/${site(codeOf(s)).id}`)),
  row('GET /api/fleet/sites/:siteId/export', EXPORT_SITE, 'site', (s) =>
    get(`/api/fleet/sites/${site(codeOf(s)).id}/export?table=saws`),
  ),
  row('GET /api/fleet/saws/:sawId', READ(), 'site', (s) => get(`/api/fleet/saws/${saw0(s)}`)),
  row('GET /api/fleet/saws/:sawId/runs', READ(), 'site', (s) => get(`/api/fleet/saws/${saw0(s)}/runs`)),
  row('GET /api/fleet/saws/:sawId/export', EXPORT_SITE, 'site', (s) =>
    get(`/api/fleet/saws/${saw0(s)}/export?table=runs`),
  ),
  row('GET /api/fleet/runs/:runId', READ(), 'site', (s) => get(`/api/fleet/runs/${records[codeOf(s)].run.id}`)),

  // Money: the company's rates and reporting currency, the sites' budgets
  row('GET /api/exchange-rates', SIGNED_IN(), 'none', () => get('/api/exchange-rates')),
  row('PUT /api/exchange-rates/:currency/:month', ADMIN_ONLY(), 'none', () =>
    put('/api/exchange-rates/USD/2026-09', { rate: 0.92 }),
  ),
  row('DELETE /api/exchange-rates/:currency/:month', ADMIN_ONLY(204), 'none', async () => {
    await adminSends(put('/api/exchange-rates/GBP/2026-09', { rate: 1.17 }), 200);
    return del('/api/exchange-rates/GBP/2026-09');
  }),
  // Put back as it was (EUR), so no figure changes currency during the run.
  row('PUT /api/reporting-currency', ADMIN_ONLY(), 'none', () => put('/api/reporting-currency', { currency: 'EUR' })),
  row('GET /api/budgets', LIST, 'list', (s) => get(fleetUrl('/api/budgets', s))),
  row('GET /api/budgets/export', EXPORT, 'list', (s) => get(fleetUrl('/api/budgets/export', s))),
  row('PUT /api/budgets/:siteId/:month', BUDGET(), 'site', (s) =>
    put(`/api/budgets/${site(codeOf(s)).id}/2026-10`, { amountMinor: 400_000 }),
  ),
  row('DELETE /api/budgets/:siteId/:month', BUDGET(204), 'site', async (s) => del(await freshBudget(codeOf(s)))),

  // Saws that stand out among their peers, and the follow-ups opened on them
  row('GET /api/outliers', LIST, 'list', (s) => get(fleetUrl('/api/outliers', s))),
  row('GET /api/outliers/export', EXPORT, 'list', (s) => get(fleetUrl('/api/outliers/export', s))),
  row('GET /api/outliers/saws/:sawId', READ(), 'site', (s) => get(`/api/outliers/saws/${saw0(s)}`)),
  row('GET /api/follow-ups', LIST, 'list', (s) => get(listUrl('/api/follow-ups', s)), {
    total: `follow_ups WHERE site_id IN (:sites)`,
  }),
  row('GET /api/follow-ups/assignees', READ(), 'site', (s) => get(listUrl('/api/follow-ups/assignees', s))),
  row('GET /api/follow-ups/export', EXPORT, 'list', (s) => get(listUrl('/api/follow-ups/export', s))),
  row('GET /api/follow-ups/:id', READ(), 'site', (s) => get(`/api/follow-ups/${extra[codeOf(s)].followUpId}`)),
  row('POST /api/follow-ups', { ...CREATE(201), lead: [201, 201, 400], siteAdmin: [403, 400, 400] }, 'site', (s) =>
    post('/api/follow-ups', {
      sawId: saw0(s),
      title: 'Check the band tracking',
      assigneeId: extra[codeOf(s)].userId,
      dueOn: tomorrow(),
    }),
  ),
  row('PATCH /api/follow-ups/:id', { ...TECH(), lead: [200, 200, 404] }, 'site', async (s) =>
    patch(`/api/follow-ups/${await freshFollowUp(codeOf(s))}`, { note: 'Guides adjusted' }),
  ),
];
// ---------------------------------------------------------------- running it
beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  const built = await buildRecords(world);
  records = { ...built, B: await buildSiteRecords(world, 'B', built.fleetSpec) };
  passwordHash = await hashPassword(PASSWORD);
  // An operations manager of site A alone (the fixture's managers span two regions or every site).
  const managerA = await User.create({
    email: EMAIL.manager,
    name: 'manager-a',
    role: 'manager',
    passwordHash,
    siteId: null,
    regionId: null,
    allSites: false,
  });
  await UserSite.create({ userId: managerA.id, siteId: world.sites.A.id });
  for (const role of ROLES)
    agents[role] = role === 'anon' ? supertest.agent(ctx.app) : await signedInAgent(ctx.app, EMAIL[role], PASSWORD);
  png = await sharp({ create: { width: 32, height: 24, channels: 3, background: '#5a6' } })
    .png()
    .toBuffer();

  for (const c of CODES) {
    const guide = await SiteCheck.findOne({ where: { siteId: site(c).id, targetRule: 'guide_clearance' } });
    const person = c === 'C' ? world.users.techC : await freshUser(c);
    extra[c] = {
      guideId: guide!.id,
      photoId: await freshPhoto(c),
      checkPhotoId: (
        await adminSends(
          {
            method: 'POST',
            url: `/api/check-records/${records[c].checkRecord.id}/photos`,
            upload: { field: 'photo', bytes: png, name: 'c.png' },
          },
          201,
        )
      ).id,
      batchId: await freshBatch(c),
      userId: person.id,
      invitationId: await freshInvitation(c),
      followUpId: '',
    };
    extra[c].followUpId = await freshFollowUp(c);
  }
  // What names each site, gathered once: every id of its rows in the tables a site keeps, and its words.
  for (const c of CODES) {
    const [rows] = await ctx.sequelize.query(
      `SELECT id::text FROM saws WHERE site_id = :s UNION ALL SELECT id::text FROM blade_runs WHERE site_id = :s
       UNION ALL SELECT id::text FROM stops WHERE site_id = :s UNION ALL SELECT id::text FROM cut_logs WHERE site_id = :s
       UNION ALL SELECT id::text FROM photos WHERE site_id = :s UNION ALL SELECT id::text FROM check_records WHERE site_id = :s
       UNION ALL SELECT id::text FROM site_checks WHERE site_id = :s UNION ALL SELECT id::text FROM stock_receipts WHERE site_id = :s
       UNION ALL SELECT id::text FROM import_batches WHERE site_id = :s UNION ALL SELECT id::text FROM users WHERE site_id = :s
       UNION ALL SELECT email FROM users WHERE site_id = :s UNION ALL SELECT id::text FROM invitations WHERE site_id = :s
       UNION ALL SELECT email FROM invitations WHERE site_id = :s`,
      { replacements: { s: site(c).id } },
    );
    for (const r of rows as { id?: string; email?: string }[]) markers[c].add(String(r.id ?? r.email));
    for (const m of [site(c).id, site(c).name, `${c}-1`, `${c}-2`]) markers[c].add(m);
  }
  markers.C.add(world.regions.south.id);
});
afterAll(async () => ctx.close());

type Case = { route: string; role: Role; scope: Scope; expected: number; got: number; why?: string };

describe('the authorization matrix', () => {
  it('lists exactly the routes the router holds', () => {
    const routes = listRoutes(ctx.app).map((r) => `${r.method} ${r.path}`);
    const listed = TABLE.map((r) => r.route);
    expect(new Set(listed).size, 'a route is listed twice').toBe(listed.length);
    expect(
      routes.filter((r) => !listed.includes(r)),
      'routes the table does not list',
    ).toEqual([]);
    expect(
      listed.filter((r) => !routes.includes(r)),
      'rows for routes the router lacks',
    ).toEqual([]);
  });

  it('knows each site by its records, and would see a foreign one shown', async () => {
    for (const c of CODES) expect(markers[c].size, c).toBeGreaterThan(15);
    const all = (await agents.admin.get('/api/blade-runs?limit=100')).text;
    expect([...markers.C].some((m) => all.includes(m))).toBe(true);
  });

  it('answers every route × role × scope as the table says, and never shows what lies outside the scope', async () => {
    const failures: Case[] = [];
    let cases = 0;
    for (const row of TABLE) {
      const scopes: Scope[] = row.scopes === 'none' ? ['-'] : row.scopes === 'site' ? CODES : [...CODES, '*'];
      for (const role of ROLES) {
        for (const [i, scope] of scopes.entries()) {
          const spec = row.expect[role];
          const expected = typeof spec === 'number' ? spec : (spec[i] ?? spec[0]!);
          const res = await send(agents[role], await row.req(scope, role));
          cases++;
          const fail = (why?: string) =>
            failures.push({ route: row.route, role, scope, expected, got: res.status, why });
          if (res.status !== expected) fail(JSON.stringify(res.body?.error?.message ?? '').slice(0, 120));
          else if (res.status < 300) {
            const type = String(res.headers['content-type'] ?? '');
            const text = /json|text|csv/.test(type) ? res.text : '';
            const foreign = CODES.filter((c) => !VISIBLE[role].includes(c));
            for (const c of foreign) {
              const seen = [...markers[c]].find((m) => text.includes(m));
              if (seen) fail(`shows ${seen} of site ${c}`);
            }
            if (row.emptyFor?.includes(role)) {
              if (res.body.total !== 0 || res.body.items?.length !== 0) fail(`shows ${res.body.total} rows`);
            } else if (row.total && scope === '*') {
              const sites = VISIBLE[role].map((c) => site(c).id);
              const n = sites.length ? await countRows(row.total, sites) : 0;
              if (res.body.total !== n) fail(`total ${res.body.total}, the caller's sites hold ${n}`);
            }
            const wrong = await row.check?.(res.body as never, role, scope);
            if (wrong) fail(wrong);
          }
          await row.after?.(scope, role);
        }
      }
    }
    console.log(`authorization matrix: ${cases} route × role × scope cases over ${TABLE.length} routes`);
    expect(
      failures.map((f) => `${f.route} as ${f.role} at ${f.scope}: ${f.got}, expected ${f.expected} ${f.why ?? ''}`),
    ).toEqual([]);
  }, 300_000);
});
