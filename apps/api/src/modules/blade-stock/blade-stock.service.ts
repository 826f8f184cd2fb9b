import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import {
  DEFAULT_STOCK_LEVELS,
  type SiteStock,
  type SiteStockQuery,
  type StockLevelsInput,
  type StockMovement,
  type StockMovementListQuery,
  type StockReceipt as StockReceiptDto,
  type StockReceiptCreateParsed,
  type StockReceiptListQuery,
  type StockReceiptUpdate,
} from '@kerfline/domain/blade-stock/schema';
import { stockStatus } from '@kerfline/domain/stock/reorder';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { BladeSpec } from '../blade-specs/blade-spec.model.js';
import { toBladeSpecRef } from '../blade-specs/blade-spec-dto.js';
import { auditCopy, namesOf, orderOf, pgError, select } from '../records/record-support.js';
import { StockLevel, StockReceipt } from './stock-receipt.model.js';

const DERIVED = {
  include: [
    [literal(`(SELECT name FROM blade_specs WHERE blade_specs.id = "StockReceipt".blade_spec_id)`), 'bladeSpecName'],
    [literal(`(SELECT count(*)::int FROM blade_runs WHERE blade_runs.stock_receipt_id = "StockReceipt".id)`), 'drawn'],
  ] as [ReturnType<typeof literal>, string][],
};

const auditValues = (r: StockReceipt) => auditCopy(r, ['bladeSpecName', 'drawn']);

function toDto(r: StockReceipt): StockReceiptDto {
  return {
    id: r.id,
    siteId: r.siteId,
    bladeSpecId: r.bladeSpecId,
    bladeSpecName: String(r.get('bladeSpecName') ?? ''),
    quantity: r.quantity,
    drawn: Number(r.get('drawn') ?? 0),
    unitCostMinor: r.unitCostMinor,
    currency: r.currency.trim(),
    receivedOn: r.receivedOn,
    reference: r.reference,
    notes: r.notes,
    createdById: r.createdById,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

export async function listStockReceipts(ability: AppAbility, q: StockReceiptListQuery): Promise<Page<StockReceiptDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.bladeSpecId) filter.push({ bladeSpecId: q.bladeSpecId });
  if (q.from) filter.push({ receivedOn: { [Op.gte]: q.from.toISOString().slice(0, 10) } });
  if (q.to) filter.push({ receivedOn: { [Op.lt]: q.to.toISOString().slice(0, 10) } });
  const { rows, count } = await StockReceipt.findAndCountAll({
    where: scopedWhere(ability, 'read', 'StockReceipt', StockReceipt, { [Op.and]: filter }),
    attributes: DERIVED,
    order: orderOf(q.sort),
    limit: q.limit,
    offset: q.offset,
  });
  return { items: rows.map(toDto), total: count, limit: q.limit, offset: q.offset };
}

async function findReadableReceipt(ability: AppAbility, id: string, transaction?: Transaction): Promise<StockReceipt> {
  const receipt = await StockReceipt.findOne({
    where: scopedWhere(ability, 'read', 'StockReceipt', StockReceipt, { id }),
    attributes: DERIVED,
    transaction,
  });
  if (!receipt) throw AppError.notFound('Stock receipt');
  return receipt;
}

export async function getStockReceipt(ability: AppAbility, id: string): Promise<StockReceiptDto> {
  return toDto(await findReadableReceipt(ability, id));
}

async function readableSite(ability: AppAbility, siteId: string, path?: string): Promise<Site> {
  const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }) });
  if (!site) {
    if (path) throw AppError.validation('That site does not exist', [{ path, message: 'choose one of your sites' }]);
    throw AppError.notFound('Site');
  }
  return site;
}

/** A spec this site may stock: fleet-wide or the site's own. */
async function specForSite(ability: AppAbility, siteId: string, bladeSpecId: string): Promise<BladeSpec> {
  const spec = await BladeSpec.findOne({
    where: scopedWhere(ability, 'read', 'BladeSpec', BladeSpec, { id: bladeSpecId }),
  });
  if (!spec || (spec.siteId !== null && spec.siteId !== siteId))
    throw AppError.validation('That blade spec is not in this site’s catalogue', [
      { path: 'bladeSpecId', message: 'choose a blade spec of this site’s catalogue' },
    ]);
  return spec;
}

/** Receives blades into a site's stock. The currency is the site's unless the receipt names another. */
export async function createStockReceipt(
  { ability, userId }: Actor,
  input: StockReceiptCreateParsed,
): Promise<StockReceiptDto> {
  const site = await readableSite(ability, input.siteId, 'siteId');
  ForbiddenError.from(ability)
    .setMessage('You cannot receive stock at this site')
    .throwUnlessCan('create', subject('StockReceipt', { id: '', siteId: site.id }));
  await specForSite(ability, site.id, input.bladeSpecId);
  const receipt = await inTransaction(async (transaction) => {
    const created = await StockReceipt.create(
      { ...input, currency: input.currency ?? site.currency, createdById: userId },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      {
        siteId: created.siteId,
        entity: 'StockReceipt',
        entityId: created.id,
        action: 'create',
        after: auditValues(created),
      },
    ]);
    return created;
  });
  return getStockReceipt(ability, receipt.id);
}

async function receiptForWrite(
  ability: AppAbility,
  id: string,
  action: 'update' | 'delete',
  transaction?: Transaction,
) {
  const receipt = await findReadableReceipt(ability, id, transaction);
  ForbiddenError.from(ability)
    .setMessage('You cannot change this stock receipt')
    .throwUnlessCan(action, subject('StockReceipt', auditValues(receipt) as { id: string; siteId: string }));
  return receipt;
}

/**
 * Corrects a receipt. The row is locked first, so the count of blades drawn from it cannot change under us:
 * the quantity may not fall below what is already on saws, and a receipt with blades drawn keeps its spec.
 * Blade runs keep the cost they were given at install.
 */
export async function updateStockReceipt(
  { ability, userId }: Actor,
  id: string,
  patch: StockReceiptUpdate,
): Promise<StockReceiptDto> {
  await receiptForWrite(ability, id, 'update');
  if (patch.bladeSpecId) {
    const current = await findReadableReceipt(ability, id);
    await specForSite(ability, current.siteId, patch.bladeSpecId);
  }
  await inTransaction(async (transaction) => {
    await select('SELECT id FROM stock_receipts WHERE id = :id FOR UPDATE', { id }, transaction);
    const receipt = await findReadableReceipt(ability, id, transaction);
    const drawn = Number(receipt.get('drawn') ?? 0);
    if (patch.quantity !== undefined && patch.quantity < drawn)
      throw new AppError(
        'CONFLICT',
        `${drawn} blades of this receipt are already on saws; the quantity cannot go below ${drawn}`,
        [{ path: 'quantity', message: `must be at least ${drawn}` }],
      );
    if (patch.bladeSpecId && patch.bladeSpecId !== receipt.bladeSpecId && drawn > 0)
      throw new AppError('CONFLICT', 'Blades of this receipt are already on saws, so its blade spec cannot change', [
        { path: 'bladeSpecId', message: 'keep the spec of the blades already drawn' },
      ]);
    const before = auditValues(receipt);
    await receipt.update(patch, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: receipt.siteId,
        entity: 'StockReceipt',
        entityId: receipt.id,
        action: 'update',
        before,
        after: auditValues(receipt),
      },
    ]);
  });
  return getStockReceipt(ability, id);
}

export async function deleteStockReceipt({ ability, userId }: Actor, id: string): Promise<void> {
  const receipt = await receiptForWrite(ability, id, 'delete');
  await inTransaction(async (transaction) => {
    const before = auditValues(receipt);
    await receipt.destroy({ transaction }).catch((err: unknown) => {
      if (pgError(err).code === '23503')
        throw new AppError(
          'CONFLICT',
          'Blades of this receipt are already on saws; correct its quantity instead of deleting it',
        );
      throw err;
    });
    await writeAudit(transaction, userId, [
      { siteId: receipt.siteId, entity: 'StockReceipt', entityId: receipt.id, action: 'delete', before },
    ]);
  });
}

const DAY_MS = 86_400_000;

/**
 * A site's blade stock per spec, worked out in SQL over receipts and runs (never by loading them): on hand =
 * blades received − blades drawn for runs; use in the window = runs of the spec put on the site's saws; days
 * left and the reorder point from the domain's stock computation (ROP = d × L + SS).
 */
export async function getSiteStock(ability: AppAbility, siteId: string, q: SiteStockQuery): Promise<SiteStock> {
  const site = await readableSite(ability, siteId);
  if (!ability.can('read', subject('StockReceipt', { id: '', siteId: site.id }))) throw AppError.notFound('Site');
  const asOf = new Date();
  const windowStart = new Date(asOf.getTime() - q.windowDays * DAY_MS);
  const rows = await select<{
    blade_spec_id: string;
    received: number;
    drawn: number;
    used: number;
    lead_time_days: number | null;
    safety_stock: number | null;
    levels_at: Date | null;
    levels_by: string | null;
  }>(
    `WITH specs AS (
       SELECT blade_spec_id FROM stock_receipts WHERE site_id = :siteId
       UNION SELECT blade_spec_id FROM stock_levels WHERE site_id = :siteId
       UNION SELECT blade_spec_id FROM blade_runs WHERE site_id = :siteId AND installed_at > :windowStart
     )
     SELECT s.blade_spec_id,
       (SELECT coalesce(sum(r.quantity), 0)::int FROM stock_receipts r
         WHERE r.site_id = :siteId AND r.blade_spec_id = s.blade_spec_id) AS received,
       (SELECT count(*)::int FROM blade_runs b
         WHERE b.site_id = :siteId AND b.blade_spec_id = s.blade_spec_id AND b.stock_receipt_id IS NOT NULL) AS drawn,
       (SELECT count(*)::int FROM blade_runs b
         WHERE b.site_id = :siteId AND b.blade_spec_id = s.blade_spec_id
           AND b.installed_at > :windowStart AND b.installed_at <= :asOf) AS used,
       l.lead_time_days, l.safety_stock, l.updated_at AS levels_at, l.updated_by_id AS levels_by
     FROM specs s LEFT JOIN stock_levels l ON l.site_id = :siteId AND l.blade_spec_id = s.blade_spec_id`,
    { siteId: site.id, windowStart, asOf },
  );
  const specs = new Map(
    (await BladeSpec.findAll({ where: { id: { [Op.in]: rows.map((r) => r.blade_spec_id) } } })).map((s) => [s.id, s]),
  );
  const names = await namesOf(rows.map((r) => r.levels_by));
  const items = rows
    .map((r) => {
      const spec = specs.get(r.blade_spec_id)!;
      const leadTimeDays = r.lead_time_days ?? DEFAULT_STOCK_LEVELS.leadTimeDays;
      const safetyStock = r.safety_stock ?? DEFAULT_STOCK_LEVELS.safetyStock;
      const onHand = r.received - r.drawn;
      const status = stockStatus({ onHand, usedInWindow: r.used, windowDays: q.windowDays, leadTimeDays, safetyStock });
      return {
        bladeSpec: toBladeSpecRef(spec),
        received: r.received,
        drawn: r.drawn,
        onHand,
        usedInWindow: r.used,
        leadTimeDays,
        safetyStock,
        levelsSetAt: r.levels_at ? new Date(r.levels_at).toISOString() : null,
        levelsSetByName: r.levels_by ? (names.get(r.levels_by) ?? null) : null,
        dailyUsage: status.dailyUsage,
        daysOfStockLeft: status.daysOfStockLeft,
        reorderPoint: status.reorderPoint,
        reorderNow: status.reorderNow,
        reason: status.reason,
        formula: status.formula,
      };
    })
    // Most urgent first: reorder now, then fewest days left, then by name.
    .sort(
      (a, b) =>
        Number(b.reorderNow) - Number(a.reorderNow) ||
        (a.daysOfStockLeft ?? Infinity) - (b.daysOfStockLeft ?? Infinity) ||
        a.bladeSpec.name.localeCompare(b.bladeSpec.name),
    );
  return { siteId: site.id, asOf: asOf.toISOString(), windowDays: q.windowDays, items };
}

/** Sets a spec's lead time and safety stock at a site (site admins); audited like any record. */
export async function putStockLevels(
  { ability, userId }: Actor,
  siteId: string,
  bladeSpecId: string,
  input: StockLevelsInput,
): Promise<SiteStock['items'][number] | null> {
  const site = await readableSite(ability, siteId);
  ForbiddenError.from(ability)
    .setMessage('You cannot change stock levels at this site')
    .throwUnlessCan('update', subject('StockLevel', { id: '', siteId: site.id }));
  await specForSite(ability, site.id, bladeSpecId);
  await inTransaction(async (transaction) => {
    const existing = await StockLevel.findOne({ where: { siteId: site.id, bladeSpecId }, transaction, lock: true });
    if (existing) {
      const before = auditCopy(existing);
      await existing.update({ ...input, updatedById: userId }, { transaction });
      await writeAudit(transaction, userId, [
        {
          siteId: site.id,
          entity: 'StockLevel',
          entityId: existing.id,
          action: 'update',
          before,
          after: auditCopy(existing),
        },
      ]);
    } else {
      const created = await StockLevel.create(
        { siteId: site.id, bladeSpecId, ...input, updatedById: userId },
        { transaction },
      );
      await writeAudit(transaction, userId, [
        { siteId: site.id, entity: 'StockLevel', entityId: created.id, action: 'create', after: auditCopy(created) },
      ]);
    }
  });
  const stock = await getSiteStock(ability, site.id, { windowDays: 90 });
  return stock.items.find((i) => i.bladeSpec.id === bladeSpecId) ?? null;
}

/** Receipts (+quantity) and draws for runs (−1) at a site, newest first, paged in SQL. */
export async function listStockMovements(
  ability: AppAbility,
  siteId: string,
  q: StockMovementListQuery,
): Promise<Page<StockMovement>> {
  const site = await readableSite(ability, siteId);
  if (!ability.can('read', subject('StockReceipt', { id: '', siteId: site.id }))) throw AppError.notFound('Site');
  const cond = (at: string, spec: string) =>
    [q.bladeSpecId ? `${spec} = :bladeSpecId` : '', q.from ? `${at} >= :from` : '', q.to ? `${at} < :to` : '']
      .filter(Boolean)
      .map((c) => ` AND ${c}`)
      .join('');
  const receiptAt = `(r.received_on::timestamp AT TIME ZONE 'UTC')`;
  const movements = `
    SELECT 'receipt' AS kind, ${receiptAt} AS at, r.blade_spec_id, r.quantity, r.id AS stock_receipt_id, r.reference,
           NULL::uuid AS blade_run_id, NULL::uuid AS saw_id, r.unit_cost_minor, r.currency, r.created_at AS tie
      FROM stock_receipts r WHERE r.site_id = :siteId${cond(receiptAt, 'r.blade_spec_id')}
    UNION ALL
    SELECT 'draw', b.installed_at, b.blade_spec_id, -1, b.stock_receipt_id, rr.reference,
           b.id, b.saw_id, b.cost_minor, b.currency, b.created_at
      FROM blade_runs b JOIN stock_receipts rr ON rr.id = b.stock_receipt_id
     WHERE b.site_id = :siteId${cond('b.installed_at', 'b.blade_spec_id')}`;
  const replacements = { siteId: site.id, bladeSpecId: q.bladeSpecId, from: q.from, to: q.to };
  const [total] = await select<{ n: number }>(`SELECT count(*)::int AS n FROM (${movements}) m`, replacements);
  const rows = await select<{
    kind: 'receipt' | 'draw';
    at: Date;
    blade_spec_id: string;
    quantity: number;
    stock_receipt_id: string;
    reference: string | null;
    blade_run_id: string | null;
    saw_id: string | null;
    unit_cost_minor: number;
    currency: string;
    spec_name: string;
    asset_tag: string | null;
  }>(
    `SELECT m.*, bs.name AS spec_name, s.asset_tag FROM (${movements}) m
       JOIN blade_specs bs ON bs.id = m.blade_spec_id LEFT JOIN saws s ON s.id = m.saw_id
      ORDER BY m.at DESC, m.tie DESC LIMIT :limit OFFSET :offset`,
    { ...replacements, limit: q.limit, offset: q.offset },
  );
  return {
    items: rows.map((r) => ({
      kind: r.kind,
      at: new Date(r.at).toISOString(),
      bladeSpecId: r.blade_spec_id,
      bladeSpecName: r.spec_name,
      quantity: r.quantity,
      stockReceiptId: r.stock_receipt_id,
      reference: r.reference,
      bladeRunId: r.blade_run_id,
      sawId: r.saw_id,
      sawAssetTag: r.asset_tag,
      unitCostMinor: r.unit_cost_minor,
      currency: r.currency.trim(),
    })),
    total: total?.n ?? 0,
    limit: q.limit,
    offset: q.offset,
  };
}
