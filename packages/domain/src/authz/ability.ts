import {
  AbilityBuilder,
  createMongoAbility,
  type ForcedSubject,
  type MongoAbility,
  type RawRuleOf,
} from '@casl/ability';
import type { Role } from '../users/schema.js';
import { SITE_ADMIN_EDITABLE_FIELDS } from '../sites/schema.js';

export const ACTIONS = ['manage', 'create', 'read', 'update', 'delete', 'export'] as const;
export type Action = (typeof ACTIONS)[number];

/** Subject names equal the API's model names, so Sequelize instances and plain rows are typed alike. */
export const SUBJECTS = [
  'Region',
  'Site',
  'Saw',
  'User',
  'AuditEntry',
  'SiteSetting',
  'Invitation',
  'MailLog',
  'BladeSpec',
  'StockReceipt',
  'StockLevel',
  'BladeRun',
  'Stop',
  'CutLog',
  'Photo',
  'Budget',
  'FollowUp',
  'ExchangeRate',
  'SiteCheck',
  'CheckRecord',
  'ImportBatch',
  'ImportMapping',
  'RemovedRecord',
] as const;
export type SubjectName = (typeof SUBJECTS)[number];

/** The columns rules may test, per subject (CASL types each rule's conditions from these). */
type RegionFields = { id: string };
type SiteFields = { id: string; regionId: string };
type SawFields = { id: string; siteId: string };
type UserFields = { id: string; siteId: string | null; role: Role };
type AuditEntryFields = { id: string; siteId: string | null };
type SiteSettingFields = { id: string; siteId: string };
type InvitationFields = { id: string; siteId: string | null; role: Role };
type MailLogFields = { id: string; userId: string | null };
/** Null siteId: a fleet-wide catalogue spec. */
type BladeSpecFields = { id: string; siteId: string | null };
/** The records a site keeps: each row carries its site, so rules test the row's own column. */
type SiteRecordFields = { id: string; siteId: string };
/** Exchange rates belong to the company, not to a site. */
type ExchangeRateFields = { id: string; currency: string };

type Subjects =
  | 'all'
  | SubjectName
  | (RegionFields & ForcedSubject<'Region'>)
  | (SiteFields & ForcedSubject<'Site'>)
  | (SawFields & ForcedSubject<'Saw'>)
  | (UserFields & ForcedSubject<'User'>)
  | (AuditEntryFields & ForcedSubject<'AuditEntry'>)
  | (SiteSettingFields & ForcedSubject<'SiteSetting'>)
  | (InvitationFields & ForcedSubject<'Invitation'>)
  | (MailLogFields & ForcedSubject<'MailLog'>)
  | (BladeSpecFields & ForcedSubject<'BladeSpec'>)
  | (SiteRecordFields & ForcedSubject<'StockReceipt'>)
  | (SiteRecordFields & ForcedSubject<'StockLevel'>)
  | (SiteRecordFields & ForcedSubject<'BladeRun'>)
  | (SiteRecordFields & ForcedSubject<'Stop'>)
  | (SiteRecordFields & ForcedSubject<'CutLog'>)
  | (SiteRecordFields & ForcedSubject<'Photo'>)
  | (SiteRecordFields & ForcedSubject<'Budget'>)
  | (SiteRecordFields & ForcedSubject<'FollowUp'>)
  | (ExchangeRateFields & ForcedSubject<'ExchangeRate'>)
  | (SiteRecordFields & ForcedSubject<'SiteCheck'>)
  | (SiteRecordFields & ForcedSubject<'CheckRecord'>)
  | (SiteRecordFields & ForcedSubject<'ImportBatch'>)
  | (SiteRecordFields & ForcedSubject<'ImportMapping'>)
  | (SiteRecordFields & ForcedSubject<'RemovedRecord'>);

export type AppAbility = MongoAbility<[Action, Subjects]>;
export type AppRawRule = RawRuleOf<AppAbility>;

/** Subjects that belong to exactly one site and carry it in their own `siteId` column. */
export const SITE_RECORDS = [
  'StockReceipt',
  'StockLevel',
  'BladeRun',
  'Stop',
  'CutLog',
  'Photo',
  'SiteCheck',
  'CheckRecord',
] as const;

/**
 * Who is asking, with their scope already resolved from the database: the sites and regions they may see.
 * `'all'` means no site restriction (admins, managers assigned to every site).
 */
export type Principal = {
  id: string;
  role: Role;
  /** Home site of a site admin or technician. */
  siteId: string | null;
  /** Region of a regional lead. */
  regionId: string | null;
  siteIds: 'all' | string[];
  regionIds: 'all' | string[];
};

/** The roles a site admin may give people at their own site. */
export const SITE_ADMIN_GRANTS = ['site_admin', 'technician'] as const satisfies readonly Role[];

/**
 * The only place Kerfline's permissions are written. Conditions stay translatable to SQL: `$eq`, `$ne`,
 * `$in` and `$nin` on the subject's own columns (checked by a test), because the API turns these same
 * rules into the `WHERE` of every list query.
 */
export function defineAbilityFor(p: Principal): AppAbility {
  const { can, build } = new AbilityBuilder<AppAbility>(createMongoAbility);
  const inSites = p.siteIds === 'all' ? undefined : { $in: p.siteIds };
  const inRegions = p.regionIds === 'all' ? undefined : { $in: p.regionIds };

  /** Read-only access to the records of some sites (managers, leads): the catalogue's fleet specs included. */
  const readRecords = (sites: { $in: string[] } | undefined) => {
    if (sites) {
      can('read', [...SITE_RECORDS], { siteId: sites });
      can('read', 'BladeSpec', { siteId: { $in: [null, ...sites.$in] } });
    } else {
      can('read', [...SITE_RECORDS, 'BladeSpec']);
    }
  };

  can('read', 'User', { id: p.id });
  // Every figure in money is totalled in the reporting currency: whoever sees one may see the rates behind it.
  can('read', 'ExchangeRate');

  switch (p.role) {
    case 'admin':
      can('manage', 'all');
      break;
    case 'manager':
      if (inRegions) can('read', 'Region', { id: inRegions });
      else can('read', 'Region');
      if (inSites) {
        can(['read', 'export'], 'Site', { id: inSites });
        can('read', ['Saw', 'SiteSetting'], { siteId: inSites });
      } else {
        can(['read', 'export'], 'Site');
        can('read', ['Saw', 'SiteSetting']);
      }
      readRecords(inSites);
      // Blade budgets of their sites, and the follow-ups the leads opened there (read only).
      if (inSites) {
        can(['read', 'create', 'update', 'delete'], 'Budget', { siteId: inSites });
        can('read', 'FollowUp', { siteId: inSites });
      } else {
        can(['read', 'create', 'update', 'delete'], 'Budget');
        can('read', 'FollowUp');
      }
      break;
    case 'regional_lead':
      if (p.regionId) {
        can('read', 'Region', { id: p.regionId });
        can(['read', 'export'], 'Site', { regionId: p.regionId });
      }
      can('read', ['Saw', 'SiteSetting'], { siteId: inSites ?? { $in: [] } });
      readRecords(inSites ?? { $in: [] });
      can('read', 'Budget', { siteId: inSites ?? { $in: [] } });
      // Follow-ups are the lead's way of getting a saw looked at: opened, reassigned and closed across the region.
      can(['create', 'read', 'update'], 'FollowUp', { siteId: inSites ?? { $in: [] } });
      break;
    case 'site_admin':
      if (p.siteId) {
        can('read', 'Region', { id: inRegions ?? { $in: [] } });
        can(['read', 'export'], 'Site', { id: p.siteId });
        // Their own site's everyday details; its region and retiring it stay with administrators.
        can('update', 'Site', [...SITE_ADMIN_EDITABLE_FIELDS], { id: p.siteId });
        can(['create', 'read', 'update'], 'Saw', { siteId: p.siteId });
        can('read', 'User', { siteId: p.siteId });
        // The people of their own site, in the roles they hold themselves or below; checked on the resulting
        // record, so nobody can be moved to another site or raised above site admin by them.
        can(['create', 'update'], 'User', { siteId: p.siteId, role: { $in: [...SITE_ADMIN_GRANTS] } });
        can(['create', 'read', 'update'], 'Invitation', { siteId: p.siteId, role: { $in: [...SITE_ADMIN_GRANTS] } });
        // The history of their own site's records; fleet-wide records (siteId NULL) stay with admins.
        can('read', 'AuditEntry', { siteId: p.siteId });
        // Their site's figures with no single printed value (band speeds, tension ranges, check limits).
        can(['read', 'create', 'update', 'delete'], 'SiteSetting', { siteId: p.siteId });
        // Their site's stock, blade runs, stops, cut logs, photos, list of checks and checks recorded, and the
        // site's own blade specs; the fleet-wide catalogue (siteId NULL) is read-only to them.
        can(['create', 'read', 'update', 'delete'], [...SITE_RECORDS], { siteId: p.siteId });
        can('read', 'BladeSpec', { siteId: { $in: [null, p.siteId] } });
        can(['create', 'update', 'delete'], 'BladeSpec', { siteId: p.siteId });
        // Bringing their own site's spreadsheet logs in, and taking an import back out (update = undo).
        can(['create', 'read', 'update'], 'ImportBatch', { siteId: p.siteId });
        can(['create', 'read', 'update'], 'ImportMapping', { siteId: p.siteId });
        // The records removed at their own site (kept, not deleted): seeing them and putting them back
        // (update = put back). Nobody else but administrators sees them.
        can(['read', 'update'], 'RemovedRecord', { siteId: p.siteId });
        can('read', 'Budget', { siteId: p.siteId });
        // Follow-ups at their site: they work them (state, notes) and may hand them to another person or day.
        can(['read', 'update'], 'FollowUp', { siteId: p.siteId });
      }
      break;
    case 'technician':
      if (p.siteId) {
        can('read', 'Region', { id: inRegions ?? { $in: [] } });
        can('read', 'Site', { id: p.siteId });
        can('read', ['Saw', 'SiteSetting'], { siteId: p.siteId });
        // Technicians log work at their own site; corrections beyond that (deletes, stock, the list of checks)
        // are the site admin's.
        can('read', [...SITE_RECORDS], { siteId: p.siteId });
        can('read', 'BladeSpec', { siteId: { $in: [null, p.siteId] } });
        can(['create', 'update'], ['BladeRun', 'Stop', 'CutLog'], { siteId: p.siteId });
        can('create', ['Photo', 'CheckRecord'], { siteId: p.siteId });
        // Follow-ups at their site: they move them along and add notes; the person and the day are the site admin's.
        can('read', 'FollowUp', { siteId: p.siteId });
        can('update', 'FollowUp', ['state', 'note'], { siteId: p.siteId });
      }
      break;
  }
  return build();
}

/** Rebuilds an ability from raw rules, as the web app does with the rules from `/api/me`. */
export function abilityFromRules(rules: AppRawRule[]): AppAbility {
  return createMongoAbility<AppAbility>(rules);
}
