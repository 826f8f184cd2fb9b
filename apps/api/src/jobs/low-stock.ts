import { subject } from '@casl/ability';
import type { Transaction } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { inTransaction } from '../db/models.js';
import { getSiteStock } from '../modules/blade-stock/blade-stock.service.js';
import { MailPreference } from '../modules/mail/mail-log.model.js';
import { User } from '../modules/users/user.model.js';
import type { MailQueue } from './mail-queue.js';

/**
 * Queues the low-stock notice to each active site admin of `siteId`, in the caller's transaction (called by
 * `noticeIfBelowReorderPoint` when a blade drawn from stock takes its spec to its reorder point); `occasion` (e.g. the spec id and
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

/**
 * After a blade is drawn from a site's stock: when its spec is now at or below its reorder point (the site's stock
 * computation, as the stock page shows it), queues the low-stock notice to the site's admins — at most one per spec
 * and day, however many blades are drawn. Reads the stock as the person who drew the blade; someone who may not
 * read the site's stock triggers nothing. Returns how many notices were queued.
 */
export async function noticeIfBelowReorderPoint(
  queue: MailQueue,
  ability: AppAbility,
  siteId: string,
  bladeSpecId: string,
  now = new Date(),
): Promise<number> {
  if (!ability.can('read', subject('StockReceipt', { id: '', siteId }))) return 0;
  const stock = await getSiteStock(ability, siteId, { windowDays: 90 });
  const line = stock.items.find((i) => i.bladeSpec.id === bladeSpecId);
  if (!line?.reorderNow) return 0;
  const day = now.toISOString().slice(0, 10);
  return inTransaction((transaction) => queueLowStockNotices(queue, transaction, siteId, `${bladeSpecId}:${day}`));
}
