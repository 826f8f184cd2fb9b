import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  INVITATION_VALID_DAYS,
  type Invitation as InvitationDto,
  type InvitationAccept,
  type InvitationCreateParsed,
  type InvitationListQuery,
  type InvitationPreview,
  type InvitationState,
} from '@kerfline/domain/invitations/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { assertPasswordStrong } from '../../security/password-policy.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { hashLinkToken, newLinkToken } from '../../security/link-tokens.js';
import { hashPassword } from '../../security/passwords.js';
import type { MailQueue } from '../../jobs/mail-queue.js';
import { User, UserSite } from '../users/user.model.js';
import { assertAssignmentTargets } from '../users/assignment.js';
import { Site } from '../sites/site.model.js';
import { Region } from '../regions/region.model.js';
import { Invitation } from './invitation.model.js';

const DAY_MS = 86_400_000;

function stateOf(i: Invitation, now = Date.now()): InvitationState {
  if (i.acceptedAt) return 'accepted';
  if (i.revokedAt) return 'revoked';
  return i.expiresAt.getTime() <= now ? 'expired' : 'pending';
}

/** The state as SQL, so lists filter and page in the database. */
function stateWhere(state: InvitationState): WhereOptions {
  const open = { acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null } };
  switch (state) {
    case 'accepted':
      return { acceptedAt: { [Op.ne]: null } };
    case 'revoked':
      return { revokedAt: { [Op.ne]: null } };
    case 'expired':
      return { ...open, expiresAt: { [Op.lte]: literal('now()') } };
    case 'pending':
      return { ...open, expiresAt: { [Op.gt]: literal('now()') } };
  }
}

function toDto(i: Invitation, inviterName: string): InvitationDto {
  return {
    id: i.id,
    email: i.email,
    name: i.name,
    role: i.role,
    siteId: i.siteId,
    regionId: i.regionId,
    managedSiteIds: i.managedSiteIds,
    allSites: i.allSites,
    state: stateOf(i),
    expiresAt: i.expiresAt.toISOString(),
    invitedById: i.invitedBy,
    invitedByName: inviterName,
    createdAt: i.createdAt.toISOString(),
    lastSentAt: i.lastSentAt.toISOString(),
    sentCount: i.sentCount,
    acceptedAt: i.acceptedAt ? i.acceptedAt.toISOString() : null,
    revokedAt: i.revokedAt ? i.revokedAt.toISOString() : null,
  };
}

async function inviterNames(ids: string[]): Promise<Map<string, string>> {
  const unique = [...new Set(ids)];
  if (unique.length === 0) return new Map();
  return new Map(
    (await User.findAll({ where: { id: { [Op.in]: unique } }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]),
  );
}

async function withNames(rows: Invitation[]): Promise<InvitationDto[]> {
  const names = await inviterNames(rows.map((r) => r.invitedBy));
  return rows.map((r) => toDto(r, names.get(r.invitedBy) ?? ''));
}

/** The audit trail's copy: everything but the link's hash. */
function auditValues(i: Invitation): Record<string, unknown> {
  const { tokenHash: _hash, ...values } = i.get({ plain: true });
  return { ...values };
}

const invitationSubject = (i: { id: string; siteId: string | null; role: Invitation['role'] }) =>
  subject('Invitation', { id: i.id, siteId: i.siteId, role: i.role });

export async function listInvitations(ability: AppAbility, q: InvitationListQuery): Promise<Page<InvitationDto>> {
  const filter: WhereOptions[] = [];
  if (q.state) filter.push(stateWhere(q.state));
  if (q.siteId) filter.push({ siteId: q.siteId });
  const { rows, count } = await Invitation.findAndCountAll({
    where: scopedWhere(ability, 'read', 'Invitation', Invitation, { [Op.and]: filter }),
    order: [
      ['createdAt', 'DESC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await withNames(rows), total: count, limit: q.limit, offset: q.offset };
}

async function queueInvitationMail(mail: MailQueue, transaction: Transaction, i: Invitation, token: string) {
  await mail.enqueue(transaction, {
    kind: 'invitation',
    toAddress: i.email,
    userId: null,
    invitationId: i.id,
    dedupeKey: `invitation:${i.id}:${i.sentCount}`,
    secret: token,
  });
}

/**
 * Invites someone by e-mail with a role and scope no wider than the inviter's own (CASL checks the
 * invitation as it will be stored: a site admin may invite technicians and site admins of their own site).
 * The link's secret goes out in the mail and is stored only as its hash.
 */
export async function createInvitation(
  { ability, userId }: Actor,
  input: InvitationCreateParsed,
  mail: MailQueue,
): Promise<InvitationDto> {
  ForbiddenError.from(ability)
    .setMessage('You cannot invite someone with that role or at that site')
    .throwUnlessCan('create', invitationSubject({ id: '', siteId: input.siteId, role: input.role }));
  await assertAssignmentTargets(ability, input);
  if (await User.findOne({ where: { email: input.email }, attributes: ['id'] }))
    throw new AppError('CONFLICT', 'Someone already has an account with that e-mail address', [
      { path: 'email', message: 'already has an account' },
    ]);
  const { token, tokenHash } = newLinkToken();
  const created = await inTransaction(async (transaction) => {
    const open = await Invitation.findOne({
      where: { email: input.email, acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null } },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (open && stateOf(open) === 'pending')
      throw new AppError('CONFLICT', 'That address already has an invitation waiting; send it again or withdraw it', [
        { path: 'email', message: 'already invited' },
      ]);
    if (open) {
      // An expired invitation to the same address gives way to the new one.
      const before = auditValues(open);
      await open.update({ revokedAt: new Date(), revokedBy: userId }, { transaction });
      await writeAudit(transaction, userId, [
        {
          siteId: open.siteId,
          entity: 'Invitation',
          entityId: open.id,
          action: 'update',
          before,
          after: auditValues(open),
        },
      ]);
    }
    const invitation = await Invitation.create(
      {
        email: input.email,
        name: input.name,
        role: input.role,
        siteId: input.siteId,
        regionId: input.regionId,
        managedSiteIds: [...new Set(input.managedSiteIds)],
        allSites: input.allSites,
        tokenHash,
        expiresAt: new Date(Date.now() + INVITATION_VALID_DAYS * DAY_MS),
        invitedBy: userId,
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      {
        siteId: invitation.siteId,
        entity: 'Invitation',
        entityId: invitation.id,
        action: 'create',
        after: auditValues(invitation),
      },
    ]);
    await queueInvitationMail(mail, transaction, invitation, token);
    return invitation;
  });
  return (await withNames([created]))[0]!;
}

async function findReadable(ability: AppAbility, id: string, transaction: Transaction): Promise<Invitation> {
  const invitation = await Invitation.findOne({
    where: scopedWhere(ability, 'read', 'Invitation', Invitation, { id }),
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (!invitation) throw AppError.notFound('Invitation');
  return invitation;
}

function assertOpen(i: Invitation): void {
  if (i.acceptedAt) throw new AppError('CONFLICT', 'This invitation was already accepted');
  if (i.revokedAt) throw new AppError('CONFLICT', 'This invitation was withdrawn; invite the person again');
}

/** Sends the invitation again with a new link and a new term; the old link stops working. */
export async function resendInvitation(
  { ability, userId }: Actor,
  id: string,
  mail: MailQueue,
): Promise<InvitationDto> {
  const updated = await inTransaction(async (transaction) => {
    const invitation = await findReadable(ability, id, transaction);
    ForbiddenError.from(ability)
      .setMessage('You cannot send this invitation again')
      .throwUnlessCan('update', invitationSubject(invitation));
    assertOpen(invitation);
    const { token, tokenHash } = newLinkToken();
    const before = auditValues(invitation);
    await invitation.update(
      {
        tokenHash,
        expiresAt: new Date(Date.now() + INVITATION_VALID_DAYS * DAY_MS),
        sentCount: invitation.sentCount + 1,
        lastSentAt: new Date(),
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      {
        siteId: invitation.siteId,
        entity: 'Invitation',
        entityId: invitation.id,
        action: 'update',
        before,
        after: auditValues(invitation),
      },
    ]);
    await queueInvitationMail(mail, transaction, invitation, token);
    return invitation;
  });
  return (await withNames([updated]))[0]!;
}

/** Withdraws an invitation: its link stops working at once. */
export async function revokeInvitation({ ability, userId }: Actor, id: string): Promise<InvitationDto> {
  const updated = await inTransaction(async (transaction) => {
    const invitation = await findReadable(ability, id, transaction);
    ForbiddenError.from(ability)
      .setMessage('You cannot withdraw this invitation')
      .throwUnlessCan('update', invitationSubject(invitation));
    assertOpen(invitation);
    const before = auditValues(invitation);
    await invitation.update({ revokedAt: new Date(), revokedBy: userId }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: invitation.siteId,
        entity: 'Invitation',
        entityId: invitation.id,
        action: 'update',
        before,
        after: auditValues(invitation),
      },
    ]);
    return invitation;
  });
  return (await withNames([updated]))[0]!;
}

const NOT_VALID =
  'This invitation link is not valid. Open the whole link from the e-mail; if the invitation was sent again, only the newest link works.';

/** Why a link cannot be used, in words the invited person can act on; null when it can. */
async function problemWith(i: Invitation): Promise<AppError | null> {
  switch (stateOf(i)) {
    case 'accepted':
      return new AppError(
        'CONFLICT',
        `This invitation was already used to set up an account. Sign in as ${i.email}; if you forgot the password, ask for a new one on the sign-in page.`,
      );
    case 'revoked':
      return new AppError('CONFLICT', 'This invitation was withdrawn. Ask whoever invited you for a new one.');
    case 'expired': {
      const inviter = (await inviterNames([i.invitedBy])).get(i.invitedBy) ?? 'whoever invited you';
      return new AppError(
        'CONFLICT',
        `This invitation link expired on ${i.expiresAt.toISOString().slice(0, 10)}. Ask ${inviter} to send it again.`,
      );
    }
    case 'pending':
      return null;
  }
}

/** What the accept page shows before the person answers. */
export async function previewInvitation(token: string): Promise<InvitationPreview> {
  const invitation = await Invitation.findOne({ where: { tokenHash: hashLinkToken(token) } });
  if (!invitation) throw new AppError('NOT_FOUND', NOT_VALID);
  const problem = await problemWith(invitation);
  if (problem) throw problem;
  const [site, region, names] = await Promise.all([
    invitation.siteId ? Site.findByPk(invitation.siteId, { attributes: ['name'] }) : null,
    invitation.regionId ? Region.findByPk(invitation.regionId, { attributes: ['name'] }) : null,
    inviterNames([invitation.invitedBy]),
  ]);
  return {
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    siteName: site?.name ?? null,
    regionName: region?.name ?? null,
    invitedByName: names.get(invitation.invitedBy) ?? '',
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/**
 * Accepts an invitation: makes the account with the role and scope it names, the name and password the
 * person chose, and uses the link up, all in one transaction. Returns the new account's e-mail.
 */
export async function acceptInvitation(input: InvitationAccept): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password);
  return inTransaction(async (transaction) => {
    const invitation = await Invitation.findOne({
      where: { tokenHash: hashLinkToken(input.token) },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!invitation) throw new AppError('NOT_FOUND', NOT_VALID);
    const problem = await problemWith(invitation);
    if (problem) throw problem;
    if (await User.findOne({ where: { email: invitation.email }, attributes: ['id'], transaction }))
      throw new AppError('CONFLICT', `An account for ${invitation.email} exists already; sign in with it instead.`);
    assertPasswordStrong(input.password, 'password', [invitation.email, input.name]);
    const user = await User.create(
      {
        email: invitation.email,
        name: input.name,
        role: invitation.role,
        passwordHash,
        siteId: invitation.siteId,
        regionId: invitation.regionId,
        allSites: invitation.allSites,
        passwordChangedAt: new Date(),
      },
      { transaction },
    );
    if (invitation.managedSiteIds.length > 0)
      await UserSite.bulkCreate(
        invitation.managedSiteIds.map((siteId) => ({ userId: user.id, siteId })),
        { transaction },
      );
    const before = auditValues(invitation);
    await invitation.update({ acceptedAt: new Date(), acceptedUserId: user.id }, { transaction });
    const { passwordHash: _hash, ...userValues } = user.get({ plain: true });
    // The new person is the actor: they accepted; the invitation names who invited them.
    await writeAudit(transaction, user.id, [
      {
        siteId: user.siteId,
        entity: 'User',
        entityId: user.id,
        action: 'create',
        after: { ...userValues, managedSiteIds: invitation.managedSiteIds },
      },
      {
        siteId: invitation.siteId,
        entity: 'Invitation',
        entityId: invitation.id,
        action: 'update',
        before,
        after: auditValues(invitation),
      },
    ]);
    return { email: user.email };
  });
}
