import type { Sequelize, Transaction } from 'sequelize';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { AuditEntry } from '../modules/audit/audit-entry.model.js';
import { SiteSetting } from '../modules/site-settings/site-setting.model.js';
import { Invitation } from '../modules/invitations/invitation.model.js';
import { PasswordReset } from '../modules/auth/password-reset.model.js';
import { MailLog, MailPreference } from '../modules/mail/mail-log.model.js';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { StockLevel, StockReceipt } from '../modules/blade-stock/stock-receipt.model.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { Stop } from '../modules/stops/stop.model.js';
import { CutLog } from '../modules/cut-logs/cut-log.model.js';
import { Photo } from '../modules/photos/photo.model.js';
import { ExchangeRate, ReportingCurrency } from '../modules/exchange-rates/exchange-rate.model.js';
import { Budget } from '../modules/budgets/budget.model.js';
import { FollowUp, FollowUpEntry } from '../modules/follow-ups/follow-up.model.js';
import { SiteCheck } from '../modules/site-checks/site-check.model.js';
import { CheckRecord } from '../modules/site-checks/check-record.model.js';
import { ImportBatch, ImportMapping } from '../modules/imports/import-batch.model.js';
import { RemovedRecord } from '../modules/removed-records/removed-record.model.js';

/** Binds every model to this Sequelize instance. Model names equal the CASL subject names. */
export function initModels(sequelize: Sequelize): void {
  bound = sequelize;
  Region.initModel(sequelize);
  Site.initModel(sequelize);
  User.initModel(sequelize);
  UserSite.initModel(sequelize);
  Saw.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  SiteSetting.initModel(sequelize);
  Invitation.initModel(sequelize);
  PasswordReset.initModel(sequelize);
  MailLog.initModel(sequelize);
  MailPreference.initModel(sequelize);
  BladeSpec.initModel(sequelize);
  StockReceipt.initModel(sequelize);
  StockLevel.initModel(sequelize);
  BladeRun.initModel(sequelize);
  Stop.initModel(sequelize);
  CutLog.initModel(sequelize);
  Photo.initModel(sequelize);
  ExchangeRate.initModel(sequelize);
  ReportingCurrency.initModel(sequelize);
  Budget.initModel(sequelize);
  FollowUp.initModel(sequelize);
  FollowUpEntry.initModel(sequelize);
  SiteCheck.initModel(sequelize);
  CheckRecord.initModel(sequelize);
  ImportBatch.initModel(sequelize);
  ImportMapping.initModel(sequelize);
  RemovedRecord.initModel(sequelize);
}

let bound: Sequelize | undefined;

/**
 * Runs `work` in one database transaction on the Sequelize instance the models are bound to: every write that
 * touches several rows (a record and its audit entry, an import) goes through here, so it commits whole or not
 * at all.
 */
export function inTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  if (!bound) throw new Error('initModels must run before a transaction');
  return bound.transaction(work);
}
