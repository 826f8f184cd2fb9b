import { ForbiddenError } from '@casl/ability';
import { Op, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  MAIL_KIND_INFO,
  optionalMailKindsFor,
  type MailLogEntry,
  type MailLogQuery,
  type MailPreference as MailPreferenceDto,
  type MailPreferenceUpdate,
  type Outbox,
} from '@kerfline/domain/mail/schema';
import type { Page } from '@kerfline/domain/common/schema';
import type { Role } from '@kerfline/domain/users/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { readCaughtMail } from '../../mail/catcher.js';
import { User } from '../users/user.model.js';
import { MailLog, MailPreference } from './mail-log.model.js';

/** The optional mail a person's role gets, each with their own choice (on unless they turned it off). */
export async function getMailPreferences(person: { id: string; role: Role }): Promise<MailPreferenceDto[]> {
  const kinds = optionalMailKindsFor(person.role);
  const rows = await MailPreference.findAll({ where: { userId: person.id } });
  const chosen = new Map(rows.map((r) => [r.kind, r.enabled]));
  return kinds.map((kind) => ({
    kind,
    label: MAIL_KIND_INFO[kind].label,
    description: MAIL_KIND_INFO[kind].description,
    enabled: chosen.get(kind) ?? true,
  }));
}

/** A person turns one kind of their own optional mail on or off. */
export async function setMailPreference(
  person: { id: string; role: Role },
  input: MailPreferenceUpdate,
): Promise<MailPreferenceDto[]> {
  if (!optionalMailKindsFor(person.role).includes(input.kind)) {
    const info = MAIL_KIND_INFO[input.kind];
    throw AppError.validation(
      info.optional
        ? `${info.label} mail is not sent to your role, so there is nothing to turn off`
        : `${info.label} mail answers something you asked for and cannot be turned off`,
      [{ path: 'kind', message: 'not one of your optional mails' }],
    );
  }
  await MailPreference.upsert({ userId: person.id, kind: input.kind, enabled: input.enabled });
  return getMailPreferences(person);
}

/** The record of mail sent (administrators), newest first. */
export async function listMailLog(ability: AppAbility, q: MailLogQuery): Promise<Page<MailLogEntry>> {
  const filter: WhereOptions[] = [];
  if (q.kind) filter.push({ kind: q.kind });
  if (q.status) filter.push({ status: q.status });
  const { rows, count } = await MailLog.findAndCountAll({
    where: scopedWhere(ability, 'read', 'MailLog', MailLog, { [Op.and]: filter }),
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  const ids = [...new Set(rows.map((r) => r.userId).filter((id): id is string => id !== null))];
  const names = new Map(
    (await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]),
  );
  return {
    items: rows.map((r) => ({
      id: r.id,
      kind: r.kind,
      toAddress: r.toAddress,
      userId: r.userId,
      userName: r.userId ? (names.get(r.userId) ?? null) : null,
      subject: r.subject,
      status: r.status,
      attempts: r.attempts,
      lastError: r.lastError,
      createdAt: r.createdAt.toISOString(),
      sentAt: r.sentAt ? r.sentAt.toISOString() : null,
    })),
    total: count,
    limit: q.limit,
    offset: q.offset,
  };
}

/** What the local mail catcher caught (administrators; only where a catcher folder is configured). */
export async function readOutbox(
  ability: AppAbility,
  catcherDir: string | undefined,
  page: { limit: number; offset: number },
): Promise<Outbox> {
  ForbiddenError.from(ability).setMessage('The outbox is for administrators').throwUnlessCan('read', 'MailLog');
  if (!catcherDir) return { enabled: false, items: [], total: 0, limit: page.limit, offset: page.offset };
  const { items, total } = await readCaughtMail(catcherDir, page);
  return { enabled: true, items, total, limit: page.limit, offset: page.offset };
}

/** Administrators may start a scheduled mail run by hand (it still sends each person one per period). */
export function assertMayRunSchedules(ability: AppAbility): void {
  ForbiddenError.from(ability)
    .setMessage('Only an administrator can send scheduled mail now')
    .throwUnlessCan('create', 'MailLog');
}
