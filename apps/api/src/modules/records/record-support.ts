import { ForbiddenError, subject } from '@casl/ability';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { Action, AppAbility, SubjectName } from '@kerfline/domain/authz/ability';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { Saw } from '../saws/saw.model.js';
import { Site } from '../sites/site.model.js';
import { User } from '../users/user.model.js';
import { SiteSetting } from '../site-settings/site-setting.model.js';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { storedValueInForce } from '@kerfline/domain/settings/schema';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';

/**
 * Helpers shared by the services of the records a site keeps (blade runs, stops, cut logs, photos, stock).
 */

/**
 * The saw a record is written for. A saw the caller cannot read is "not found" (404), like a missing one; a
 * saw they can read but not write records for answers 403; a retired saw answers 409, since its history is
 * kept as it is. Pass a transaction to lock the saw's row for the rest of the write.
 */
export async function sawForWrite(
  ability: AppAbility,
  sawId: string,
  action: Action,
  record: SubjectName,
  options: { transaction?: Transaction; path?: string } = {},
): Promise<Saw> {
  const saw = await Saw.findOne({
    where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }),
    transaction: options.transaction,
  });
  if (!saw) {
    if (options.path)
      throw AppError.validation('That saw does not exist', [
        { path: options.path, message: 'choose one of your saws' },
      ]);
    throw AppError.notFound('Saw');
  }
  ForbiddenError.from(ability)
    .setMessage('You cannot record this at that saw’s site')
    .throwUnlessCan(action, subject(record, { id: '', siteId: saw.siteId }) as never);
  if (saw.status === 'retired')
    throw new AppError('CONFLICT', `Saw ${saw.assetTag} is retired; its records are kept as they are`);
  return saw;
}

/** People's names by id, for "who" columns; one query for a whole page. */
export async function namesOf(ids: (string | null | undefined)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((id): id is string => typeof id === 'string'))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] });
  return new Map(users.map((u) => [u.id, u.name]));
}

/** A site's time zone, for times in messages. */
export async function siteTimeZone(siteId: string): Promise<string> {
  const site = await Site.findByPk(siteId, { attributes: ['timeZone'] });
  return site?.timeZone ?? 'UTC';
}

/** "4 Mar 2026, 07:30" in the site's time zone, with the zone named. */
export function formatAt(at: Date, timeZone: string): string {
  const text = new Intl.DateTimeFormat('en-GB', { timeZone, dateStyle: 'medium', timeStyle: 'short' }).format(at);
  return `${text} (${timeZone})`;
}

/** The SQL error code under a Sequelize error, and the constraint it names. */
export function pgError(err: unknown): { code?: string; constraint?: string } {
  const parent = (err as { parent?: { code?: string; constraint?: string } } | null)?.parent;
  return { code: parent?.code, constraint: parent?.constraint };
}

/** Runs a SELECT and returns its rows. */
export async function select<T>(sql: string, replacements: Record<string, unknown>, transaction?: Transaction) {
  return (await Saw.sequelize!.query(sql, { replacements, type: QueryTypes.SELECT, transaction })) as T[];
}

/** `ORDER BY` terms from a `sort` like `-installedAt`, mapped to a model attribute, newest id last for ties. */
export function orderOf(sort: string): [string, 'ASC' | 'DESC'][] {
  const desc = sort.startsWith('-');
  const field = desc ? sort.slice(1) : sort;
  return [
    [field, desc ? 'DESC' : 'ASC'],
    ['id', desc ? 'DESC' : 'ASC'],
  ];
}

/** A copy of a row's stored values for the audit trail (never the instance's own object, which updates change). */
export function auditCopy(row: { get: (options: { plain: true }) => unknown }, omit: string[] = []) {
  const values = { ...(row.get({ plain: true }) as Record<string, unknown>) };
  for (const key of omit) delete values[key];
  return values;
}

/**
 * A site's own settings as the trade's computations take them (who changed each and when), so a figure the
 * records' screens show (the band speed of a break-in plan, say) uses the site's value and says whose it is.
 * A stored value that no longer fits its setting is left out: the computation then uses the shipped value.
 * Not scoped: the caller has already decided the site is theirs to read.
 */
export async function siteEffectiveSettings(siteId: string, transaction?: Transaction): Promise<EffectiveSettings> {
  const rows = await SiteSetting.findAll({ where: { siteId }, transaction });
  const names = await namesOf(rows.map((r) => r.changedBy));
  const settings: Record<string, EffectiveSettings[string]> = {};
  for (const row of rows) {
    const def = settingDefinition(row.key);
    const values = def ? storedValueInForce(def, row.value) : null;
    if (!values) continue;
    settings[row.key] = {
      key: row.key,
      values,
      changedByName: names.get(row.changedBy) ?? null,
      changedAt: row.changedAt.toISOString(),
    };
  }
  return settings;
}
