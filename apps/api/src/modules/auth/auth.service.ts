import { Op } from 'sequelize';
import { defineAbilityFor, type AppAbility, type Principal } from '@kerfline/domain/authz/ability';
import type { Me } from '@kerfline/domain/auth/schema';
import { User, UserSite } from '../users/user.model.js';
import { Site } from '../sites/site.model.js';
import { toUserDto } from '../users/user-dto.js';
import { hashPassword, verifyPassword } from '../../security/passwords.js';
import { AppError } from '../../errors.js';
import { assertPasswordStrong } from '../../security/password-policy.js';
import { inTransaction } from '../../db/models.js';
import { endSessionsOf } from '../../security/sessions.js';

// Verified against when the e-mail is unknown, so both failures take the same time.
let dummyHash: Promise<string> | undefined;

/** Returns the user when the e-mail and password match an active account, otherwise null (one answer for both). */
export async function checkCredentials(email: string, password: string): Promise<User | null> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  if (!user || !user.active) {
    dummyHash ??= hashPassword('not-a-real-password-only-for-timing');
    await verifyPassword(await dummyHash, password);
    return null;
  }
  return (await verifyPassword(user.passwordHash, password)) ? user : null;
}

export type SignedIn = { user: User; principal: Principal; ability: AppAbility; managedSiteIds: string[] };

/**
 * Loads the signed-in user and resolves their scope (the sites and regions they may see) from the database.
 * Returns null for a user who no longer exists or was deactivated: their session no longer counts.
 */
export async function loadSignedIn(userId: string): Promise<SignedIn | null> {
  const user = await User.findByPk(userId);
  if (!user || !user.active) return null;

  let siteIds: Principal['siteIds'] = 'all';
  let regionIds: Principal['regionIds'] = 'all';
  let managedSiteIds: string[] = [];

  if (user.role === 'manager') {
    managedSiteIds = (await UserSite.findAll({ where: { userId }, attributes: ['siteId'] })).map((r) => r.siteId);
    if (!user.allSites) siteIds = managedSiteIds;
  } else if (user.role === 'regional_lead') {
    siteIds = user.regionId
      ? (await Site.findAll({ where: { regionId: user.regionId }, attributes: ['id'] })).map((s) => s.id)
      : [];
    regionIds = user.regionId ? [user.regionId] : [];
  } else if (user.role === 'site_admin' || user.role === 'technician') {
    siteIds = user.siteId ? [user.siteId] : [];
  }
  if (siteIds !== 'all' && user.role !== 'regional_lead') {
    const sites = siteIds.length
      ? await Site.findAll({ where: { id: { [Op.in]: siteIds } }, attributes: ['regionId'] })
      : [];
    regionIds = [...new Set(sites.map((s) => s.regionId))];
  }

  const principal: Principal = {
    id: user.id,
    role: user.role,
    siteId: user.siteId,
    regionId: user.regionId,
    siteIds,
    regionIds,
  };
  return { user, principal, ability: defineAbilityFor(principal), managedSiteIds };
}

/** What `/api/me` and sign-in answer: the user, the sites in scope and the rules the web app mirrors. */
export async function toMe(signedIn: SignedIn): Promise<Me> {
  const siteIds =
    signedIn.principal.siteIds === 'all'
      ? (await Site.findAll({ attributes: ['id'], order: [['code', 'ASC']] })).map((s) => s.id)
      : signedIn.principal.siteIds;
  return {
    user: toUserDto(signedIn.user, signedIn.managedSiteIds),
    siteIds,
    rules: signedIn.ability.rules as Me['rules'],
  };
}

/**
 * Changes the signed-in user's password after checking the current one, and ends their other sessions so a
 * password someone else learned stops working everywhere at once.
 */
export async function changePassword(
  userId: string,
  currentSessionId: string,
  input: { currentPassword: string; newPassword: string },
): Promise<void> {
  const user = await User.findByPk(userId);
  if (!user || !(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw AppError.validation('The current password is not right', [{ path: 'currentPassword', message: 'not right' }]);
  }
  assertPasswordStrong(input.newPassword, 'newPassword', [user.email, user.name]);
  const passwordHash = await hashPassword(input.newPassword);
  await inTransaction(async (transaction) => {
    await user.update({ passwordHash, passwordChangedAt: new Date() }, { transaction });
    await endSessionsOf(User.sequelize!, userId, { transaction, exceptSessionId: currentSessionId });
  });
}
