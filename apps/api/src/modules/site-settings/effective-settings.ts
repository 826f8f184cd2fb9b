import { Op, type Transaction } from 'sequelize';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { storedValueInForce } from '@kerfline/domain/settings/schema';
import { User } from '../users/user.model.js';
import { SiteSetting } from './site-setting.model.js';

/**
 * A site's own settings as the trade's computations take them (`EffectiveSettings`): each value the site keeps,
 * with who changed it and when; settings on the shipped value are left out, so a computation uses and names the
 * shipped value. A stored value that no longer fits its setting counts as shipped. Not scoped: the caller has
 * already decided the site is the user's to read.
 */
export async function effectiveSettingsAt(siteId: string, transaction?: Transaction): Promise<EffectiveSettings> {
  const rows = await SiteSetting.findAll({ where: { siteId }, transaction });
  const ids = [...new Set(rows.map((r) => r.changedBy))];
  const names =
    ids.length === 0
      ? new Map<string, string>()
      : new Map(
          (await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'name'], transaction })).map(
            (u) => [u.id, u.name],
          ),
        );
  const settings: Record<string, EffectiveSettings[string]> = {};
  for (const row of rows) {
    const def = settingDefinition(row.key);
    const value = def ? storedValueInForce(def, row.value) : null;
    if (!value) continue;
    settings[row.key] = {
      key: row.key,
      values: value,
      changedByName: names.get(row.changedBy) ?? null,
      changedAt: row.changedAt.toISOString(),
    };
  }
  return settings;
}
