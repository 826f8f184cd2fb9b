import type { Transaction } from 'sequelize';
import { MailPreference } from '../modules/mail/mail-log.model.js';
import { User } from '../modules/users/user.model.js';
import type { MailQueue } from './mail-queue.js';

/**
 * Queues the low-stock notice to each active site admin of `siteId`, in the caller's transaction. For the
 * blade-stock feature to call when a spec falls below its reorder point; `occasion` (e.g. the spec id and
 * the day) keeps one notice per occasion however often stock is written. The notice's content comes from
 * `lowStockSections` in digest-sections.ts.
 */
export async function queueLowStockNotices(
  queue: MailQueue,
  transaction: Transaction,
  siteId: string,
  occasion: string,
): Promise<number> {
  const admins = await User.findAll({ where: { role: 'site_admin', siteId, active: true }, transaction });
  const optedOut = new Set(
    (
      await MailPreference.findAll({
        where: { kind: 'low_stock', enabled: false, userId: admins.map((a) => a.id) },
        transaction,
      })
    ).map((p) => p.userId),
  );
  let queued = 0;
  for (const admin of admins) {
    const id = await queue.enqueue(transaction, {
      kind: 'low_stock',
      userId: admin.id,
      toAddress: admin.email,
      dedupeKey: `low_stock:${admin.id}:${siteId}:${occasion}`,
      payload: { siteId, period: occasion },
      ...(optedOut.has(admin.id) ? { skipReason: 'turned off by the person' } : {}),
    });
    if (id) queued += 1;
  }
  return queued;
}
