import { describe, expect, it } from 'vitest';
import { subject } from '@casl/ability';
import { abilityFromRules, defineAbilityFor, SUBJECTS, type Principal } from './ability.js';
import type { Role } from '../users/schema.js';

const A = '00000000-0000-4000-8000-00000000000a';
const B = '00000000-0000-4000-8000-00000000000b';
const C = '00000000-0000-4000-8000-00000000000c';
const NORTH = '00000000-0000-4000-8000-0000000000f1';
const SOUTH = '00000000-0000-4000-8000-0000000000f2';
const ME = '00000000-0000-4000-8000-000000000001';
const OTHER = '00000000-0000-4000-8000-000000000002';

const principals: Record<string, Principal> = {
  admin: { id: ME, role: 'admin', siteId: null, regionId: null, siteIds: 'all', regionIds: 'all' },
  managerAll: { id: ME, role: 'manager', siteId: null, regionId: null, siteIds: 'all', regionIds: 'all' },
  managerAC: { id: ME, role: 'manager', siteId: null, regionId: null, siteIds: [A, C], regionIds: [NORTH, SOUTH] },
  leadNorth: { id: ME, role: 'regional_lead', siteId: null, regionId: NORTH, siteIds: [A, B], regionIds: [NORTH] },
  siteAdminA: { id: ME, role: 'site_admin', siteId: A, regionId: null, siteIds: [A], regionIds: [NORTH] },
  techA: { id: ME, role: 'technician', siteId: A, regionId: null, siteIds: [A], regionIds: [NORTH] },
};

const saw = (siteId: string) => subject('Saw', { id: 's', siteId });
const site = (id: string, regionId: string) => subject('Site', { id, regionId });
const user = (id: string, siteId: string | null, role: Role = 'technician') => subject('User', { id, siteId, role });
const invitation = (siteId: string | null, role: Role) => subject('Invitation', { id: 'i', siteId, role });
const mailLog = (userId: string | null) => subject('MailLog', { id: 'm', userId });
const audit = (siteId: string | null) => subject('AuditEntry', { id: 'e', siteId });
const setting = (siteId: string) => subject('SiteSetting', { id: 'k', siteId });
const spec = (siteId: string | null) => subject('BladeSpec', { id: 'b', siteId });
const run = (siteId: string) => subject('BladeRun', { id: 'r', siteId });
const stop = (siteId: string) => subject('Stop', { id: 'p', siteId });
const cutLog = (siteId: string) => subject('CutLog', { id: 'l', siteId });
const photo = (siteId: string) => subject('Photo', { id: 'f', siteId });
const receipt = (siteId: string) => subject('StockReceipt', { id: 'k', siteId });
const levels = (siteId: string) => subject('StockLevel', { id: 'v', siteId });
const budget = (siteId: string) => subject('Budget', { id: 'g', siteId });
const followUp = (siteId: string) => subject('FollowUp', { id: 'u', siteId });
const rate = subject('ExchangeRate', { id: 'x', currency: 'CAD' });
const siteCheck = (siteId: string) => subject('SiteCheck', { id: 'c', siteId });
const checkRecord = (siteId: string) => subject('CheckRecord', { id: 'x', siteId });
const batch = (siteId: string) => subject('ImportBatch', { id: 'i', siteId });
const mapping = (siteId: string) => subject('ImportMapping', { id: 'm', siteId });
const removed = (siteId: string) => subject('RemovedRecord', { id: 'z', siteId });

// The permission matrix: [role, action, object, expected].
const matrix: [
  string,
  Parameters<ReturnType<typeof defineAbilityFor>['can']>[0],
  Parameters<ReturnType<typeof defineAbilityFor>['can']>[1],
  boolean,
][] = [
  ['admin', 'create', saw(C), true],
  ['admin', 'delete', site(B, NORTH), true],
  ['managerAll', 'read', saw(C), true],
  ['managerAll', 'export', site(C, SOUTH), true],
  ['managerAll', 'update', saw(C), false],
  ['managerAll', 'create', saw(A), false],
  ['managerAC', 'read', saw(A), true],
  ['managerAC', 'read', saw(B), false],
  ['managerAC', 'read', site(B, NORTH), false],
  ['managerAC', 'export', site(C, SOUTH), true],
  ['leadNorth', 'read', site(B, NORTH), true],
  ['leadNorth', 'read', site(C, SOUTH), false],
  ['leadNorth', 'read', saw(B), true],
  ['leadNorth', 'read', saw(C), false],
  ['leadNorth', 'update', saw(A), false],
  ['siteAdminA', 'create', saw(A), true],
  ['siteAdminA', 'update', saw(A), true],
  ['siteAdminA', 'create', saw(B), false],
  ['siteAdminA', 'read', saw(B), false],
  ['siteAdminA', 'delete', saw(A), false],
  ['siteAdminA', 'update', site(A, NORTH), true],
  ['siteAdminA', 'update', site(B, NORTH), false],
  ['siteAdminA', 'read', user(OTHER, A), true],
  ['siteAdminA', 'read', user(OTHER, B), false],
  // People at their own site, in the roles they hold or below: the resulting record decides.
  ['siteAdminA', 'create', user(OTHER, A, 'technician'), true],
  ['siteAdminA', 'create', user(OTHER, A, 'site_admin'), true],
  ['siteAdminA', 'update', user(OTHER, A, 'technician'), true],
  ['siteAdminA', 'create', user(OTHER, A, 'admin'), false],
  ['siteAdminA', 'update', user(OTHER, A, 'manager'), false],
  ['siteAdminA', 'create', user(OTHER, B, 'technician'), false],
  ['siteAdminA', 'update', user(OTHER, null, 'regional_lead'), false],
  ['siteAdminA', 'create', invitation(A, 'technician'), true],
  ['siteAdminA', 'update', invitation(A, 'site_admin'), true],
  ['siteAdminA', 'read', invitation(A, 'technician'), true],
  ['siteAdminA', 'create', invitation(A, 'admin'), false],
  ['siteAdminA', 'create', invitation(B, 'technician'), false],
  ['siteAdminA', 'read', invitation(B, 'technician'), false],
  ['siteAdminA', 'read', invitation(null, 'manager'), false],
  ['admin', 'create', invitation(null, 'manager'), true],
  ['admin', 'update', user(OTHER, null, 'admin'), true],
  ['managerAll', 'create', invitation(A, 'technician'), false],
  ['managerAll', 'update', user(OTHER, A, 'technician'), false],
  ['leadNorth', 'create', invitation(A, 'technician'), false],
  ['leadNorth', 'update', user(OTHER, A, 'technician'), false],
  ['techA', 'create', invitation(A, 'technician'), false],
  ['techA', 'update', user(ME, A, 'technician'), false],
  // The record of mail sent: administrators only.
  ['admin', 'read', mailLog(OTHER), true],
  ['managerAll', 'read', mailLog(ME), false],
  ['siteAdminA', 'read', mailLog(null), false],
  ['techA', 'read', saw(A), true],
  ['techA', 'read', saw(B), false],
  ['techA', 'create', saw(A), false],
  ['techA', 'update', saw(A), false],
  ['techA', 'read', site(A, NORTH), true],
  ['techA', 'read', site(B, NORTH), false],
  ['techA', 'read', user(OTHER, A), false],
  ['techA', 'read', user(ME, A), true],
  // The audit trail: admins everywhere, a site admin their own site's, nobody else.
  ['admin', 'read', audit(null), true],
  ['siteAdminA', 'read', audit(A), true],
  ['siteAdminA', 'read', audit(B), false],
  ['siteAdminA', 'read', audit(null), false],
  ['siteAdminA', 'create', audit(A), false],
  ['managerAll', 'read', audit(A), false],
  ['leadNorth', 'read', audit(A), false],
  ['techA', 'read', audit(A), false],
  // Site settings: whoever reads a site reads its settings; admins and that site's admin change them.
  ['admin', 'update', setting(C), true],
  ['managerAll', 'read', setting(C), true],
  ['managerAll', 'update', setting(C), false],
  ['managerAC', 'read', setting(A), true],
  ['managerAC', 'read', setting(B), false],
  ['leadNorth', 'read', setting(B), true],
  ['leadNorth', 'read', setting(C), false],
  ['leadNorth', 'update', setting(A), false],
  ['siteAdminA', 'read', setting(A), true],
  ['siteAdminA', 'create', setting(A), true],
  ['siteAdminA', 'update', setting(A), true],
  ['siteAdminA', 'delete', setting(A), true],
  ['siteAdminA', 'read', setting(B), false],
  ['siteAdminA', 'update', setting(B), false],
  ['techA', 'read', setting(A), true],
  ['techA', 'read', setting(B), false],
  ['techA', 'update', setting(A), false],
  ['techA', 'delete', setting(A), false],
  // Imports of legacy logs: a site admin brings files into their own site and takes them back out; admins anywhere.
  ['admin', 'create', batch(C), true],
  ['admin', 'update', batch(B), true],
  ['siteAdminA', 'create', batch(A), true],
  ['siteAdminA', 'read', batch(A), true],
  ['siteAdminA', 'update', batch(A), true],
  ['siteAdminA', 'create', batch(B), false],
  ['siteAdminA', 'read', batch(B), false],
  ['siteAdminA', 'update', batch(B), false],
  ['siteAdminA', 'delete', batch(A), false],
  ['siteAdminA', 'read', mapping(A), true],
  ['siteAdminA', 'update', mapping(A), true],
  ['siteAdminA', 'read', mapping(B), false],
  ['managerAll', 'read', batch(A), false],
  ['managerAll', 'create', batch(A), false],
  ['leadNorth', 'create', batch(A), false],
  ['techA', 'create', batch(A), false],
  ['techA', 'read', batch(A), false],
  ['techA', 'read', mapping(A), false],
  // The blade-spec catalogue: fleet-wide specs (siteId null) are the admins'; a site admin keeps their site's own.
  ['admin', 'create', spec(null), true],
  ['siteAdminA', 'read', spec(null), true],
  ['siteAdminA', 'update', spec(null), false],
  ['siteAdminA', 'create', spec(A), true],
  ['siteAdminA', 'update', spec(A), true],
  ['siteAdminA', 'delete', spec(A), true],
  ['siteAdminA', 'read', spec(B), false],
  ['siteAdminA', 'create', spec(B), false],
  ['techA', 'read', spec(null), true],
  ['techA', 'read', spec(A), true],
  ['techA', 'read', spec(C), false],
  ['techA', 'create', spec(A), false],
  ['managerAC', 'read', spec(null), true],
  ['managerAC', 'read', spec(C), true],
  ['managerAC', 'read', spec(B), false],
  ['managerAC', 'create', spec(A), false],
  ['leadNorth', 'read', spec(B), true],
  ['leadNorth', 'read', spec(C), false],
  ['leadNorth', 'read', spec(null), true],
  // Records a site keeps: technicians write runs, stops and cut logs at their own site and add photos.
  ['techA', 'create', run(A), true],
  ['techA', 'update', run(A), true],
  ['techA', 'delete', run(A), false],
  ['techA', 'create', run(B), false],
  ['techA', 'read', run(B), false],
  ['techA', 'create', stop(A), true],
  ['techA', 'update', stop(A), true],
  ['techA', 'create', stop(C), false],
  ['techA', 'create', cutLog(A), true],
  ['techA', 'create', photo(A), true],
  ['techA', 'read', photo(A), true],
  ['techA', 'read', photo(B), false],
  ['techA', 'delete', photo(A), false],
  ['techA', 'read', receipt(A), true],
  ['techA', 'create', receipt(A), false],
  ['techA', 'update', levels(A), false],
  // Site admins manage all of their site's records, stock included, and nothing elsewhere.
  ['siteAdminA', 'create', receipt(A), true],
  ['siteAdminA', 'delete', receipt(A), true],
  ['siteAdminA', 'update', levels(A), true],
  ['siteAdminA', 'delete', run(A), true],
  ['siteAdminA', 'delete', photo(A), true],
  ['siteAdminA', 'read', stop(B), false],
  ['siteAdminA', 'create', receipt(B), false],
  // Managers and leads read within their scope and write nothing.
  ['managerAll', 'read', run(B), true],
  ['managerAll', 'create', run(B), false],
  ['managerAll', 'update', stop(B), false],
  ['managerAll', 'create', receipt(B), false],
  ['managerAC', 'read', stop(A), true],
  ['managerAC', 'read', stop(B), false],
  ['managerAC', 'read', photo(C), true],
  ['leadNorth', 'read', run(B), true],
  ['leadNorth', 'read', run(C), false],
  ['leadNorth', 'read', cutLog(A), true],
  ['leadNorth', 'create', stop(A), false],
  ['leadNorth', 'update', run(A), false],
  ['leadNorth', 'read', receipt(C), false],
  ['admin', 'delete', stop(C), true],
  ['admin', 'create', receipt(C), true],
  // Blade budgets: administrators and managers set them for their sites; leads and site admins read them.
  ['admin', 'update', budget(C), true],
  ['managerAll', 'create', budget(C), true],
  ['managerAC', 'update', budget(A), true],
  ['managerAC', 'delete', budget(C), true],
  ['managerAC', 'update', budget(B), false],
  ['managerAC', 'read', budget(B), false],
  ['leadNorth', 'read', budget(B), true],
  ['leadNorth', 'update', budget(A), false],
  ['leadNorth', 'read', budget(C), false],
  ['siteAdminA', 'read', budget(A), true],
  ['siteAdminA', 'update', budget(A), false],
  ['siteAdminA', 'read', budget(B), false],
  ['techA', 'read', budget(A), false],
  // Follow-ups: leads open and steer them in their region; the site works them; managers read them.
  ['leadNorth', 'create', followUp(A), true],
  ['leadNorth', 'update', followUp(B), true],
  ['leadNorth', 'create', followUp(C), false],
  ['leadNorth', 'read', followUp(C), false],
  ['siteAdminA', 'read', followUp(A), true],
  ['siteAdminA', 'update', followUp(A), true],
  ['siteAdminA', 'create', followUp(A), false],
  ['siteAdminA', 'read', followUp(B), false],
  ['techA', 'read', followUp(A), true],
  ['techA', 'update', followUp(A), true],
  ['techA', 'update', followUp(B), false],
  ['techA', 'create', followUp(A), false],
  ['managerAC', 'read', followUp(C), true],
  ['managerAC', 'read', followUp(B), false],
  ['managerAC', 'update', followUp(A), false],
  // Exchange rates: everyone reads them; only administrators enter them.
  ['admin', 'update', rate, true],
  ['managerAll', 'read', rate, true],
  ['managerAll', 'update', rate, false],
  ['leadNorth', 'read', rate, true],
  ['techA', 'read', rate, true],
  ['siteAdminA', 'create', rate, false],
  // Exports: managers of their sites, leads of their region's, site admins of their own; never technicians.
  ['leadNorth', 'export', site(A, NORTH), true],
  ['leadNorth', 'export', site(C, SOUTH), false],
  ['siteAdminA', 'export', site(A, NORTH), true],
  ['siteAdminA', 'export', site(B, NORTH), false],
  ['techA', 'export', site(A, NORTH), false],
  ['managerAC', 'export', site(B, NORTH), false],
  // A site's list of checks: read by whoever reads the site, kept by admins and that site's admin.
  ['admin', 'update', siteCheck(C), true],
  ['siteAdminA', 'create', siteCheck(A), true],
  ['siteAdminA', 'update', siteCheck(A), true],
  ['siteAdminA', 'delete', siteCheck(A), true],
  ['siteAdminA', 'update', siteCheck(B), false],
  ['siteAdminA', 'read', siteCheck(B), false],
  ['techA', 'read', siteCheck(A), true],
  ['techA', 'update', siteCheck(A), false],
  ['techA', 'create', siteCheck(A), false],
  ['techA', 'read', siteCheck(C), false],
  ['managerAC', 'read', siteCheck(C), true],
  ['managerAC', 'read', siteCheck(B), false],
  ['managerAll', 'update', siteCheck(A), false],
  ['leadNorth', 'read', siteCheck(B), true],
  ['leadNorth', 'update', siteCheck(B), false],
  // Recorded checks: technicians and site admins record at their own site; leads and managers read.
  ['techA', 'create', checkRecord(A), true],
  ['techA', 'read', checkRecord(A), true],
  ['techA', 'create', checkRecord(B), false],
  ['techA', 'update', checkRecord(A), false],
  ['techA', 'delete', checkRecord(A), false],
  ['siteAdminA', 'create', checkRecord(A), true],
  ['siteAdminA', 'delete', checkRecord(A), true],
  ['siteAdminA', 'create', checkRecord(C), false],
  ['managerAll', 'read', checkRecord(C), true],
  ['managerAll', 'create', checkRecord(C), false],
  ['managerAC', 'read', checkRecord(B), false],
  ['leadNorth', 'read', checkRecord(A), true],
  ['leadNorth', 'create', checkRecord(A), false],
  ['leadNorth', 'read', checkRecord(C), false],
  ['admin', 'create', checkRecord(C), true],
  // Removed records (kept, not deleted): seen and put back by admins and that site's admin, nobody else.
  ['admin', 'read', removed(C), true],
  ['admin', 'update', removed(B), true],
  ['siteAdminA', 'read', removed(A), true],
  ['siteAdminA', 'update', removed(A), true],
  ['siteAdminA', 'read', removed(B), false],
  ['siteAdminA', 'update', removed(B), false],
  ['siteAdminA', 'delete', removed(A), false],
  ['techA', 'read', removed(A), false],
  ['techA', 'update', removed(A), false],
  ['managerAll', 'read', removed(A), false],
  ['managerAC', 'read', removed(C), false],
  ['leadNorth', 'read', removed(A), false],
  ['leadNorth', 'update', removed(A), false],
];

describe('who can do what', () => {
  it.each(matrix)('%s %s %o → %s', (who, action, object, expected) => {
    expect(defineAbilityFor(principals[who]!).can(action, object)).toBe(expected);
  });

  it('gives a manager assigned to no sites nothing to read but the fleet-wide catalogue', () => {
    const ability = defineAbilityFor({ ...principals.managerAC!, siteIds: [], regionIds: [] });
    expect(ability.can('read', saw(A))).toBe(false);
    expect(ability.can('read', site(A, NORTH))).toBe(false);
    expect(ability.can('read', run(A))).toBe(false);
    expect(ability.can('read', spec(A))).toBe(false);
    expect(ability.can('read', spec(null))).toBe(true);
  });

  it('gives a site admin or technician without a home site nothing beyond themselves', () => {
    for (const role of ['site_admin', 'technician'] as const) {
      const ability = defineAbilityFor({ id: ME, role, siteId: null, regionId: null, siteIds: [], regionIds: [] });
      expect(ability.can('read', saw(A))).toBe(false);
      expect(ability.can('read', user(ME, null))).toBe(true);
      expect(ability.can('create', run(A))).toBe(false);
      expect(ability.can('read', spec(null))).toBe(false);
    }
  });

  it('rebuilds the same answers from the raw rules the browser receives', () => {
    for (const [who, action, object, expected] of matrix) {
      const rebuilt = abilityFromRules(JSON.parse(JSON.stringify(defineAbilityFor(principals[who]!).rules)));
      expect(rebuilt.can(action, object)).toBe(expected);
    }
  });
});

describe('which fields of a site a site admin may change', () => {
  it('lets them change their own site’s details, but not its region, retirement or another site', () => {
    const ability = defineAbilityFor(principals.siteAdminA!);
    for (const field of ['name', 'city', 'timeZone', 'currency', 'unitSystem'])
      expect(ability.can('update', site(A, NORTH), field), field).toBe(true);
    expect(ability.can('update', site(A, NORTH), 'regionId')).toBe(false);
    expect(ability.can('update', site(A, NORTH), 'retiredAt')).toBe(false);
    expect(ability.can('update', site(B, NORTH), 'name')).toBe(false);
    const admin = defineAbilityFor(principals.admin!);
    expect(admin.can('update', site(A, NORTH), 'regionId')).toBe(true);
    expect(admin.can('update', site(A, NORTH), 'retiredAt')).toBe(true);
  });
});

describe('which fields of a follow-up a technician may change', () => {
  it('lets them move it along and add notes, but not hand it to someone else or change its day', () => {
    const tech = defineAbilityFor(principals.techA!);
    expect(tech.can('update', followUp(A), 'state')).toBe(true);
    expect(tech.can('update', followUp(A), 'note')).toBe(true);
    expect(tech.can('update', followUp(A), 'assigneeId')).toBe(false);
    expect(tech.can('update', followUp(A), 'dueOn')).toBe(false);
    const siteAdmin = defineAbilityFor(principals.siteAdminA!);
    expect(siteAdmin.can('update', followUp(A), 'assigneeId')).toBe(true);
  });
});

describe('rules stay translatable to SQL', () => {
  const allowed = new Set(['$eq', '$ne', '$in', '$nin']);
  const columns: Record<string, Set<string>> = {
    Region: new Set(['id']),
    Site: new Set(['id', 'regionId']),
    Saw: new Set(['id', 'siteId']),
    User: new Set(['id', 'siteId', 'role']),
    AuditEntry: new Set(['id', 'siteId']),
    SiteSetting: new Set(['id', 'siteId']),
    Invitation: new Set(['id', 'siteId', 'role']),
    MailLog: new Set(['id', 'userId']),
    BladeSpec: new Set(['id', 'siteId']),
    StockReceipt: new Set(['id', 'siteId']),
    StockLevel: new Set(['id', 'siteId']),
    BladeRun: new Set(['id', 'siteId']),
    Stop: new Set(['id', 'siteId']),
    CutLog: new Set(['id', 'siteId']),
    Photo: new Set(['id', 'siteId']),
    Budget: new Set(['id', 'siteId']),
    FollowUp: new Set(['id', 'siteId']),
    ExchangeRate: new Set(['id', 'currency']),
    SiteCheck: new Set(['id', 'siteId']),
    CheckRecord: new Set(['id', 'siteId']),
    ImportBatch: new Set(['id', 'siteId']),
    ImportMapping: new Set(['id', 'siteId']),
    RemovedRecord: new Set(['id', 'siteId']),
  };

  it('uses only $eq, $ne, $in and $nin on the subject’s own columns, for every role', () => {
    for (const principal of Object.values(principals)) {
      for (const rule of defineAbilityFor(principal).rules) {
        const subjects = ([] as string[]).concat(rule.subject as string | string[]);
        for (const [field, condition] of Object.entries(rule.conditions ?? {})) {
          expect(field.startsWith('$'), `top-level operator ${field}`).toBe(false);
          for (const s of subjects) if (s !== 'all') expect(columns[s]?.has(field), `${s}.${field}`).toBe(true);
          if (condition !== null && typeof condition === 'object' && !Array.isArray(condition)) {
            for (const op of Object.keys(condition)) expect(allowed.has(op), op).toBe(true);
          }
        }
      }
    }
    expect(SUBJECTS).toEqual(Object.keys(columns));
  });
});
