import { ForbiddenError, subject } from '@casl/ability';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  assignmentIssues,
  type Assignment,
  type User as UserDto,
  type UserCreateParsed,
  type UserListQuery,
  type UserUpdate,
} from '@kerfline/domain/users/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { assertPasswordStrong } from '../../security/password-policy.js';
import { hashPassword } from '../../security/passwords.js';
import { endSessionsOf } from '../../security/sessions.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { PasswordReset } from '../auth/password-reset.model.js';
import { User, UserSite } from './user.model.js';
import { toUserDto } from './user-dto.js';
import { assertAssignmentTargets } from './assignment.js';

async function managedSitesOf(userIds: string[], transaction?: Transaction): Promise<Map<string, string[]>> {
  const map = new Map<string, string[]>();
  if (userIds.length === 0) return map;
  for (const row of await UserSite.findAll({ where: { userId: { [Op.in]: userIds } }, transaction })) {
    map.set(row.userId, [...(map.get(row.userId) ?? []), row.siteId]);
  }
  return map;
}

export async function listUsers(ability: AppAbility, q: UserListQuery): Promise<Page<UserDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.role) filter.push({ role: q.role });
  if (q.state) filter.push({ active: q.state === 'active' });
  const { rows, count } = await User.findAndCountAll({
    where: scopedWhere(ability, 'read', 'User', User, { [Op.and]: filter }),
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  const managed = await managedSitesOf(rows.map((u) => u.id));
  return {
    items: rows.map((u) => toUserDto(u, managed.get(u.id) ?? [])),
    total: count,
    limit: q.limit,
    offset: q.offset,
  };
}

/** A person the caller may read; anyone else is "not found". */
async function findReadable(ability: AppAbility, id: string, transaction?: Transaction): Promise<User> {
  const user = await User.findOne({ where: scopedWhere(ability, 'read', 'User', User, { id }), transaction });
  if (!user) throw AppError.notFound('Person');
  return user;
}

export async function getUser(ability: AppAbility, id: string): Promise<UserDto> {
  const user = await findReadable(ability, id);
  return toUserDto(user, (await managedSitesOf([user.id])).get(user.id) ?? []);
}

const userSubject = (u: { id: string; siteId: string | null; role: UserDto['role'] }) =>
  subject('User', { id: u.id, siteId: u.siteId, role: u.role });

/** The person's stored fields for the audit trail, without the password hash. */
function auditValues(user: User, managedSiteIds: string[]): Record<string, unknown> {
  const { passwordHash: _hash, ...values } = user.get({ plain: true });
  return { ...values, managedSiteIds: [...managedSiteIds].sort() };
}

/**
 * Adds a person with a typed first password. A fallback for administrators where no mail server is set up;
 * the usual way in is an invitation, where the person chooses their own password.
 */
export async function createUser({ ability, userId }: Actor, input: UserCreateParsed): Promise<UserDto> {
  ForbiddenError.from(ability)
    .setMessage('You cannot add people')
    .throwUnlessCan('create', userSubject({ id: '', siteId: input.siteId, role: input.role }));
  // Adding with a password stays with administrators; everyone else invites.
  ForbiddenError.from(ability).setMessage('Invite people by e-mail instead').throwUnlessCan('manage', 'all');
  await assertAssignmentTargets(ability, input);
  assertPasswordStrong(input.password, 'password', [input.email, input.name]);
  const uniqueManaged = [...new Set(input.managedSiteIds)];
  const passwordHash = await hashPassword(input.password);
  const user = await inTransaction(async (transaction) => {
    const created = await User.create(
      {
        email: input.email,
        name: input.name,
        role: input.role,
        passwordHash,
        siteId: input.siteId,
        regionId: input.regionId,
        allSites: input.allSites,
      },
      { transaction },
    );
    if (uniqueManaged.length > 0)
      await UserSite.bulkCreate(
        uniqueManaged.map((siteId) => ({ userId: created.id, siteId })),
        { transaction },
      );
    await writeAudit(transaction, userId, [
      {
        siteId: created.siteId,
        entity: 'User',
        entityId: created.id,
        action: 'create',
        after: auditValues(created, uniqueManaged),
      },
    ]);
    return created;
  });
  return toUserDto(user, uniqueManaged);
}

async function assertAnotherActiveAdmin(userId: string, transaction: Transaction): Promise<void> {
  const others = await User.count({
    where: { role: 'admin', active: true, id: { [Op.ne]: userId } },
    transaction,
  });
  if (others === 0)
    throw new AppError('CONFLICT', 'Kerfline needs at least one active administrator; add another first');
}

/**
 * Changes a person's name, role and where it applies. The caller must be allowed to change the person as
 * they are AND as they will be, so a site admin can neither reach someone at another site nor raise anyone
 * above site admin. Nobody changes their own role or scope.
 */
export async function updateUser({ ability, userId }: Actor, id: string, patch: UserUpdate): Promise<UserDto> {
  const user = await findReadable(ability, id);
  const forbid = ForbiddenError.from(ability).setMessage('You cannot change this person');
  forbid.throwUnlessCan('update', userSubject(user));

  const currentManaged = (await managedSitesOf([user.id])).get(user.id) ?? [];
  const roleChanged = patch.role !== undefined && patch.role !== user.role;
  // A change of role starts from an empty assignment, so what the old role had does not linger.
  const base: Assignment = roleChanged
    ? { role: patch.role!, siteId: null, regionId: null, managedSiteIds: [], allSites: false }
    : {
        role: user.role,
        siteId: user.siteId,
        regionId: user.regionId,
        managedSiteIds: currentManaged,
        allSites: user.allSites,
      };
  const merged: Assignment = {
    role: base.role,
    siteId: patch.siteId !== undefined ? patch.siteId : base.siteId,
    regionId: patch.regionId !== undefined ? patch.regionId : base.regionId,
    managedSiteIds: patch.managedSiteIds !== undefined ? [...new Set(patch.managedSiteIds)] : base.managedSiteIds,
    allSites: patch.allSites !== undefined ? patch.allSites : base.allSites,
  };
  const scopeChanged =
    merged.role !== user.role ||
    merged.siteId !== user.siteId ||
    merged.regionId !== user.regionId ||
    merged.allSites !== user.allSites ||
    [...merged.managedSiteIds].sort().join() !== [...currentManaged].sort().join();
  if (scopeChanged && user.id === userId)
    throw new AppError('FORBIDDEN', 'You cannot change your own role or sites; ask another administrator');

  const issues = assignmentIssues(merged);
  if (issues.length > 0) throw AppError.validation('Some fields need fixing', issues);
  forbid
    .setMessage('You cannot give this person that role or site')
    .throwUnlessCan('update', userSubject({ id: user.id, siteId: merged.siteId, role: merged.role }));
  if (scopeChanged) await assertAssignmentTargets(ability, merged);

  await inTransaction(async (transaction) => {
    if (user.role === 'admin' && merged.role !== 'admin' && user.active)
      await assertAnotherActiveAdmin(user.id, transaction);
    const before = auditValues(user, currentManaged);
    await user.update(
      {
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        role: merged.role,
        siteId: merged.siteId,
        regionId: merged.regionId,
        allSites: merged.allSites,
      },
      { transaction },
    );
    if (scopeChanged) {
      await UserSite.destroy({ where: { userId: user.id }, transaction });
      if (merged.managedSiteIds.length > 0)
        await UserSite.bulkCreate(
          merged.managedSiteIds.map((siteId) => ({ userId: user.id, siteId })),
          { transaction },
        );
    }
    await writeAudit(transaction, userId, [
      {
        siteId: user.siteId,
        entity: 'User',
        entityId: user.id,
        action: 'update',
        before,
        after: auditValues(user, merged.managedSiteIds),
      },
    ]);
  });
  return toUserDto(user, merged.managedSiteIds);
}

/**
 * Deactivates or reactivates a person. A deactivated person cannot sign in, their sessions end at once and
 * their open reset links stop working; everything they recorded keeps their name.
 */
export async function setUserActive({ ability, userId }: Actor, id: string, active: boolean): Promise<UserDto> {
  const user = await findReadable(ability, id);
  ForbiddenError.from(ability)
    .setMessage(active ? 'You cannot reactivate this person' : 'You cannot deactivate this person')
    .throwUnlessCan('update', userSubject(user));
  if (user.id === userId) throw new AppError('FORBIDDEN', 'You cannot deactivate yourself');
  if (user.active === active)
    throw new AppError('CONFLICT', active ? 'This person is already active' : 'This person is already deactivated');
  const managed = (await managedSitesOf([user.id])).get(user.id) ?? [];
  await inTransaction(async (transaction) => {
    if (!active && user.role === 'admin') await assertAnotherActiveAdmin(user.id, transaction);
    const before = auditValues(user, managed);
    await user.update({ active }, { transaction });
    if (!active) {
      await endSessionsOf(User.sequelize!, user.id, { transaction });
      await PasswordReset.update(
        { usedAt: new Date() },
        { where: { userId: user.id, usedAt: { [Op.is]: null } }, transaction },
      );
    }
    await writeAudit(transaction, userId, [
      {
        siteId: user.siteId,
        entity: 'User',
        entityId: user.id,
        action: 'update',
        before,
        after: auditValues(user, managed),
      },
    ]);
  });
  return toUserDto(user, managed);
}
