import { Op, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { AuditEntry as AuditEntryDto, AuditListQuery } from '@kerfline/domain/audit/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { User } from '../users/user.model.js';
import { AuditEntry } from './audit-entry.model.js';

/** The audit trail the caller may read (admins: all; site admins: their site's), newest first. */
export async function listAudit(ability: AppAbility, q: AuditListQuery): Promise<Page<AuditEntryDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.entity) filter.push({ entity: q.entity });
  if (q.entityId) filter.push({ entityId: q.entityId });
  const { rows, count } = await AuditEntry.findAndCountAll({
    where: scopedWhere(ability, 'read', 'AuditEntry', AuditEntry, { [Op.and]: filter }),
    order: [
      ['at', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  const actorIds = [...new Set(rows.map((r) => r.actorId).filter((id): id is string => id !== null))];
  const names = new Map(
    (await User.findAll({ where: { id: { [Op.in]: actorIds } }, attributes: ['id', 'name'] })).map((u) => [
      u.id,
      u.name,
    ]),
  );
  return {
    items: rows.map((r) => ({
      id: r.id,
      at: r.at.toISOString(),
      actorId: r.actorId,
      actorName: r.actorId ? (names.get(r.actorId) ?? null) : null,
      siteId: r.siteId,
      entity: r.entity,
      entityId: r.entityId,
      action: r.action,
      before: r.before,
      after: r.after,
    })),
    total: count,
    limit: q.limit,
    offset: q.offset,
  };
}
