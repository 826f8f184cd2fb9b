import { Op } from 'sequelize';
import { PASSWORD_RESET_VALID_MINUTES, type PasswordReset as PasswordResetInput } from '@kerfline/domain/auth/schema';
import { AppError } from '../../errors.js';
import { assertPasswordStrong } from '../../security/password-policy.js';
import { writeAudit } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { hashLinkToken, newLinkToken } from '../../security/link-tokens.js';
import { hashPassword } from '../../security/passwords.js';
import { endSessionsOf } from '../../security/sessions.js';
import type { MailQueue } from '../../jobs/mail-queue.js';
import { User } from '../users/user.model.js';
import { PasswordReset } from './password-reset.model.js';

/**
 * Starts a password reset for `email`. The caller answers the same whatever happens here (and the router
 * holds every answer to the same minimum time), so nobody can learn from it whether an address has an
 * account. Only the newest link of a person works.
 */
export async function requestPasswordReset(email: string, mail: MailQueue): Promise<void> {
  const user = await User.findOne({ where: { email, active: true } });
  if (!user) return;
  const { token, tokenHash } = newLinkToken();
  await inTransaction(async (transaction) => {
    await PasswordReset.update(
      { usedAt: new Date() },
      { where: { userId: user.id, usedAt: { [Op.is]: null } }, transaction },
    );
    const reset = await PasswordReset.create(
      { userId: user.id, tokenHash, expiresAt: new Date(Date.now() + PASSWORD_RESET_VALID_MINUTES * 60_000) },
      { transaction },
    );
    await mail.enqueue(transaction, {
      kind: 'password_reset',
      toAddress: user.email,
      userId: user.id,
      dedupeKey: `password_reset:${reset.id}`,
      payload: { resetId: reset.id },
      secret: token,
    });
  });
}

/**
 * Sets a new password from a reset link, uses the link up and ends every session of that person, in one
 * transaction: whoever knew the old password is signed out everywhere.
 */
export async function completePasswordReset(input: PasswordResetInput): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.newPassword);
  return inTransaction(async (transaction) => {
    const reset = await PasswordReset.findOne({
      where: { tokenHash: hashLinkToken(input.token) },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!reset)
      throw new AppError(
        'NOT_FOUND',
        'This reset link is not valid. Open the whole link from the newest e-mail, or ask for a new link on the sign-in page.',
      );
    if (reset.usedAt)
      throw new AppError(
        'CONFLICT',
        'This reset link was already used, or a newer one was sent. Ask for a new link on the sign-in page.',
      );
    if (reset.expiresAt.getTime() <= Date.now())
      throw new AppError(
        'CONFLICT',
        `This reset link expired (links work for ${PASSWORD_RESET_VALID_MINUTES} minutes). Ask for a new one on the sign-in page.`,
      );
    const user = await User.findByPk(reset.userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || !user.active)
      throw new AppError('CONFLICT', 'This account is not active. Ask your site admin or an administrator.');
    assertPasswordStrong(input.newPassword, 'newPassword', [user.email, user.name]);
    const before = { passwordChangedAt: user.passwordChangedAt };
    const now = new Date();
    await user.update({ passwordHash, passwordChangedAt: now }, { transaction });
    await PasswordReset.update({ usedAt: now }, { where: { userId: user.id, usedAt: { [Op.is]: null } }, transaction });
    await endSessionsOf(User.sequelize!, user.id, { transaction });
    await writeAudit(transaction, user.id, [
      {
        siteId: user.siteId,
        entity: 'User',
        entityId: user.id,
        action: 'update',
        before,
        after: { passwordChangedAt: now, passwordChangedBy: 'reset link' },
      },
    ]);
    return { email: user.email };
  });
}
