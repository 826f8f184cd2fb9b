import { QueryTypes } from 'sequelize';
import { defineAbilityFor, type AppAbility, type Principal } from '@kerfline/domain/authz/ability';
import type { Me } from '@kerfline/domain/auth/schema';
import { User } from '../users/user.model.js';
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

/** The signed-in person as a request carries them (never the password hash). */
export type SignedInUser = Pick<User, 'id' | 'email' | 'name' | 'role' | 'siteId' | 'regionId' | 'allSites' | 'active'>;

export type SignedIn = { user: SignedInUser; principal: Principal; ability: AppAbility; managedSiteIds: string[] };

/** The person and the lists their scope is made of, as `signedInSql` reads them. */
export type SignedInRow = SignedInUser & {
  /** A manager's assigned sites (empty for other roles). */
  managedSiteIds: string[];
  /** The regions of those sites, one entry a site (a manager limited to their sites). */
  managedRegionIds: string[];
  /** The sites of a regional lead's region. */
  regionSiteIds: string[];
  /** The region of a site admin's or technician's site, when the site exists. */
  ownSiteRegionId: string | null;
};

/**
 * The statement that reads the person whose id `userIdSql` (an SQL expression) gives, and every list their scope
 * is made of, in one round trip: every signed-in request pays it (the session store runs it in the same statement
 * as the session itself, http/session-store.ts). Each list is read only for the role that uses it; a manager's
 * regions come from the same sites as their site list.
 */
export function signedInSql(userIdSql: string): string {
  return `
  SELECT u.id, u.email, u.name, u.role, u.site_id AS "siteId", u.region_id AS "regionId",
         u.all_sites AS "allSites", u.active,
         ARRAY(SELECT us.site_id FROM user_sites us WHERE us.user_id = u.id AND u.role = 'manager')::text[]
           AS "managedSiteIds",
         ARRAY(SELECT s.region_id FROM user_sites us JOIN sites s ON s.id = us.site_id
               WHERE us.user_id = u.id AND u.role = 'manager' AND NOT u.all_sites)::text[] AS "managedRegionIds",
         ARRAY(SELECT s.id FROM sites s WHERE s.region_id = u.region_id AND u.role = 'regional_lead')::text[]
           AS "regionSiteIds",
         (SELECT s.region_id FROM sites s
          WHERE s.id = u.site_id AND u.role IN ('site_admin', 'technician'))::text AS "ownSiteRegionId"
  FROM users u
  WHERE u.id = ${userIdSql}`;
}

/**
 * Loads the signed-in user and resolves their scope (the sites and regions they may see) from the database, on
 * every request, so a change of role, sites or region, or a deactivation, applies to the next request.
 * Returns null for a user who no longer exists or was deactivated: their session no longer counts.
 */
export async function loadSignedIn(userId: string): Promise<SignedIn | null> {
  const [row] = await User.sequelize!.query<SignedInRow>(signedInSql('$1'), {
    bind: [userId],
    type: QueryTypes.SELECT,
  });
  return signedInFrom(row);
}

/** Who the person read by `signedInSql` is and what they may do; null when there is none or they were deactivated. */
export function signedInFrom(row: SignedInRow | null | undefined): SignedIn | null {
  if (!row || !row.active) return null;
  const { managedSiteIds, managedRegionIds, regionSiteIds, ownSiteRegionId, ...user } = row;

  let siteIds: Principal['siteIds'] = 'all';
  let regionIds: Principal['regionIds'] = 'all';
  if (user.role === 'manager') {
    if (!user.allSites) {
      siteIds = managedSiteIds;
      regionIds = [...new Set(managedRegionIds)];
    }
  } else if (user.role === 'regional_lead') {
    siteIds = user.regionId ? regionSiteIds : [];
    regionIds = user.regionId ? [user.regionId] : [];
  } else if (user.role === 'site_admin' || user.role === 'technician') {
    siteIds = user.siteId ? [user.siteId] : [];
    regionIds = ownSiteRegionId ? [ownSiteRegionId] : [];
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
