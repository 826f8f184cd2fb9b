import { subject } from '@casl/ability';
import { Op, type Transaction } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { detailsFromZodError } from '@kerfline/domain/errors';
import {
  SITE_SETTINGS,
  settingDefinition,
  settingValueSchema,
  type SiteSettingDefinition,
} from '@kerfline/domain/settings/registry';
import {
  storedValueInForce,
  type SettingValues,
  type SiteSetting as SiteSettingDto,
  type SiteSettings,
} from '@kerfline/domain/settings/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { AppError } from '../../errors.js';
import { Site } from '../sites/site.model.js';
import { User } from '../users/user.model.js';
import { SiteSetting } from './site-setting.model.js';

/** The audit trail's name for a setting change; its entity id is the setting's key, its site the site. */
export const SITE_SETTING_ENTITY = 'SiteSetting';

/** A site the caller may read; any other id is "not found", so ids outside the scope reveal nothing. */
async function assertSiteReadable(ability: AppAbility, siteId: string): Promise<void> {
  const site = await Site.findOne({
    where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }),
    attributes: ['id'],
  });
  if (!site) throw AppError.notFound('Site');
}

function definitionOf(key: string): SiteSettingDefinition {
  const def = settingDefinition(key);
  if (!def) throw new AppError('NOT_FOUND', `There is no site setting named "${key}"`);
  return def;
}

/** One setting as the API returns it: the stored value when it still fits, else the shipped one. */
function toDto(def: SiteSettingDefinition, row: SiteSetting | undefined, names: Map<string, string>): SiteSettingDto {
  const stored = row ? storedValueInForce(def, row.value) : null;
  const shipped = {
    key: def.key,
    value: { ...def.defaults },
    defaultValue: { ...def.defaults },
    shippedBasis: def.basis,
    source: 'shipped' as const,
    changedById: null,
    changedByName: null,
    changedAt: null,
  };
  if (!row || !stored) return shipped;
  return {
    ...shipped,
    value: stored,
    source: 'site',
    changedById: row.changedBy,
    changedByName: names.get(row.changedBy) ?? null,
    changedAt: row.changedAt.toISOString(),
  };
}

async function namesOf(rows: readonly SiteSetting[], transaction?: Transaction): Promise<Map<string, string>> {
  const ids = [...new Set(rows.map((r) => r.changedBy))];
  if (ids.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'name'], transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

/**
 * Every setting of a site the caller may read, in the registry's order: the value in force, the shipped value
 * and its basis, and who changed it and when (names as they read now).
 */
export async function listSiteSettings(ability: AppAbility, siteId: string): Promise<SiteSettings> {
  await assertSiteReadable(ability, siteId);
  const rows = await SiteSetting.findAll({
    where: scopedWhere(ability, 'read', 'SiteSetting', SiteSetting, { siteId }),
  });
  const names = await namesOf(rows);
  const byKey = new Map(rows.map((r) => [r.key, r]));
  return { siteId, items: SITE_SETTINGS.map((def) => toDto(def, byKey.get(def.key), names)) };
}

/**
 * The values in force of every setting at a site, for computations on the server (a check's target when it
 * is recorded). Not scoped: the caller has already decided the site is theirs to read.
 */
export async function settingsInForce(siteId: string, transaction?: Transaction): Promise<Map<string, SettingValues>> {
  const rows = await SiteSetting.findAll({ where: { siteId }, transaction });
  const byKey = new Map(rows.map((r) => [r.key, r]));
  return new Map(SITE_SETTINGS.map((def) => [def.key, toDto(def, byKey.get(def.key), new Map()).value]));
}

/** Serialises writes to one site's setting, so the audit trail's "before" is the value really replaced. */
async function lockSetting(transaction: Transaction, siteId: string, key: string): Promise<void> {
  await SiteSetting.sequelize!.query('SELECT pg_advisory_xact_lock(hashtextextended(:lock, 0))', {
    replacements: { lock: `site_settings:${siteId}:${key}` },
    transaction,
  });
}

/** The audit trail's values of a setting: its numbers, and whether they are the shipped or the site's own. */
const auditValues = (dto: SiteSettingDto): Record<string, unknown> => ({ ...dto.value, source: dto.source });

/** Checks the change on the record as it will be; a reader of the site who may not change it gets a 403 that says who can. */
function assertCan(ability: AppAbility, action: 'update' | 'delete', siteId: string): void {
  if (ability.cannot(action, subject('SiteSetting', { id: '', siteId }))) {
    throw new AppError('FORBIDDEN', 'Only an administrator or this site’s admin can change its settings');
  }
}

async function readOne(siteId: string, key: string, transaction: Transaction) {
  const def = definitionOf(key);
  const row = (await SiteSetting.findOne({ where: { siteId, key }, transaction })) ?? undefined;
  return { def, row, dto: toDto(def, row, await namesOf(row ? [row] : [], transaction)) };
}

/**
 * Sets a site's own value of one setting. The value is checked with the setting's schema (a 400 names each
 * field to fix); the change and its audit entry (old and new value) commit together. Sending the value already
 * in force changes nothing and records nothing.
 */
export async function changeSiteSetting(
  { ability, userId }: Actor,
  siteId: string,
  key: string,
  value: Record<string, unknown>,
): Promise<SiteSettingDto> {
  await assertSiteReadable(ability, siteId);
  const def = definitionOf(key);
  assertCan(ability, 'update', siteId);
  const parsed = settingValueSchema(def).safeParse(value);
  if (!parsed.success) {
    const details = detailsFromZodError(parsed.error).map((d) => ({
      ...d,
      path: d.path ? `value.${d.path}` : 'value',
    }));
    throw AppError.validation(`Some values of “${def.label}” need fixing`, details);
  }
  const next = parsed.data as SettingValues;

  return inTransaction(async (transaction) => {
    await lockSetting(transaction, siteId, key);
    const before = await readOne(siteId, key, transaction);
    const unchanged =
      before.dto.source === 'site' && def.fields.every((f) => before.dto.value[f.name] === next[f.name]);
    if (unchanged) return before.dto;
    if (before.row) {
      await before.row.update({ value: next, changedBy: userId, changedAt: new Date() }, { transaction });
    } else {
      await SiteSetting.create({ siteId, key, value: next, changedBy: userId }, { transaction });
    }
    const after = await readOne(siteId, key, transaction);
    await writeAudit(transaction, userId, [
      {
        siteId,
        entity: SITE_SETTING_ENTITY,
        entityId: key,
        action: 'update',
        before: auditValues(before.dto),
        after: auditValues(after.dto),
      },
    ]);
    return after.dto;
  });
}

/**
 * Puts a site back on Kerfline's shipped value of one setting (and so on any later refinement of it). Audited
 * with the value it replaced; resetting a setting already on the shipped value records nothing.
 */
export async function resetSiteSetting(
  { ability, userId }: Actor,
  siteId: string,
  key: string,
): Promise<SiteSettingDto> {
  await assertSiteReadable(ability, siteId);
  definitionOf(key);
  assertCan(ability, 'delete', siteId);
  return inTransaction(async (transaction) => {
    await lockSetting(transaction, siteId, key);
    const before = await readOne(siteId, key, transaction);
    if (!before.row) return before.dto;
    await before.row.destroy({ transaction });
    const after = toDto(before.def, undefined, new Map());
    await writeAudit(transaction, userId, [
      {
        siteId,
        entity: SITE_SETTING_ENTITY,
        entityId: key,
        action: 'update',
        before: auditValues(before.dto),
        after: auditValues(after),
      },
    ]);
    return after;
  });
}
