import type { Sequelize, Transaction } from 'sequelize';

/**
 * Ends a person's sessions (all of them, or all but `exceptSessionId`) in the sessions table the session
 * store keeps: used after a password change or reset and when someone is deactivated, so every device
 * they were signed in on has to sign in again.
 */
export async function endSessionsOf(
  sequelize: Sequelize,
  userId: string,
  options: { transaction?: Transaction; exceptSessionId?: string } = {},
): Promise<void> {
  await sequelize.query(`DELETE FROM sessions WHERE (sess -> 'passport' ->> 'user') = :userId AND sid <> :except`, {
    replacements: { userId, except: options.exceptSessionId ?? '' },
    transaction: options.transaction,
  });
}
