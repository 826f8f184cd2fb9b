import type { MigrationContext } from '../umzug.js';
import * as foundation from './20261201-0001-foundation.js';
import * as audit from './20261202-0001-audit.js';
import * as siteSettings from './20261203-0201-site-settings.js';
import * as sawHeadFeed from './20261203-0202-saw-head-feed.js';
import * as peopleAndMail from './20261203-0001-people-and-mail.js';
import * as siteRecords from './20261203-0001-site-records.js';
import * as siteChecks from './20261204-0101-site-checks.js';
import * as imports from './20261204-0901-imports.js';
import * as importChecks from './20261204-0902-import-checks.js';
import * as fleetFigures from './20261204-1001-fleet-figures.js';
import * as sawHeadForce from './20261205-0301-saw-head-force.js';
import * as removedRecords from './20261206-0101-removed-records.js';
import * as fleetWideListIndexes from './20261206-1101-fleet-wide-list-indexes.js';
import * as monthlyRollup from './20261207-0101-monthly-rollup.js';
import * as siteMonthLives from './20261208-0101-site-month-lives.js';
import * as siteMonthSums from './20261208-0102-site-month-sums.js';
import * as bladeCheckFirsts from './20261209-0101-blade-check-firsts.js';

type Migration = {
  name: string;
  up: (ctx: MigrationContext) => Promise<void>;
  down: (ctx: MigrationContext) => Promise<void>;
};

/** Append-only, in order. A migration's name never changes once it has run anywhere. */
export const migrations: Migration[] = [
  { name: '20261201-0001-foundation', ...foundation },
  { name: '20261202-0001-audit', ...audit },
  { name: '20261203-0201-site-settings', ...siteSettings },
  { name: '20261203-0202-saw-head-feed', ...sawHeadFeed },
  { name: '20261203-0001-people-and-mail', ...peopleAndMail },
  { name: '20261203-0001-site-records', ...siteRecords },
  { name: '20261204-0101-site-checks', ...siteChecks },
  { name: '20261204-0901-imports', ...imports },
  { name: '20261204-0902-import-checks', ...importChecks },
  { name: '20261204-1001-fleet-figures', ...fleetFigures },
  { name: '20261205-0301-saw-head-force', ...sawHeadForce },
  { name: '20261206-0101-removed-records', ...removedRecords },
  { name: '20261206-1101-fleet-wide-list-indexes', ...fleetWideListIndexes },
  { name: '20261207-0101-monthly-rollup', ...monthlyRollup },
  { name: '20261208-0101-site-month-lives', ...siteMonthLives },
  { name: '20261208-0102-site-month-sums', ...siteMonthSums },
  { name: '20261209-0101-blade-check-firsts', ...bladeCheckFirsts },
];
