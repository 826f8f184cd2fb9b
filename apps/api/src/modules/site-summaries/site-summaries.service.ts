import { subject } from '@casl/ability';
import { Op, literal, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { DEFAULT_STOCK_LEVELS } from '@kerfline/domain/blade-stock/schema';
import { DEFAULT_USAGE_WINDOW_DAYS } from '@kerfline/domain/stock/schema';
import { stockStatus } from '@kerfline/domain/stock/reorder';
import type {
  SiteStockSummary,
  SiteSummaries,
  SiteSummary,
  SiteSummaryQuery,
} from '@kerfline/domain/site-summaries/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { select } from '../records/record-support.js';
import { Site } from '../sites/site.model.js';
import { Saw } from '../saws/saw.model.js';

const DAY_MS = 86_400_000;

type SawCounts = { siteId: string; inUse: number; down: number; downSince: Date | null; bladesOn: number };

/** Saws in use, down now (an open stop) and carrying a blade (an open run), per site, counted in SQL. */
async function sawCounts(ability: AppAbility, siteIds: string[]): Promise<Map<string, SawCounts>> {
  const rows = (await Saw.findAll({
    where: scopedWhere(ability, 'read', 'Saw', Saw, {
      [Op.and]: [{ siteId: { [Op.in]: siteIds } }, { status: { [Op.ne]: 'retired' } }],
    }),
    attributes: [
      'siteId',
      [literal('count(*)::int'), 'inUse'],
      [
        literal(
          `(count(*) FILTER (WHERE EXISTS (SELECT 1 FROM stops st WHERE st.saw_id = "Saw".id AND st.ended_at IS NULL)))::int`,
        ),
        'down',
      ],
      [
        literal(`min((SELECT st.started_at FROM stops st WHERE st.saw_id = "Saw".id AND st.ended_at IS NULL))`),
        'downSince',
      ],
      [
        literal(
          `(count(*) FILTER (WHERE EXISTS (SELECT 1 FROM blade_runs br WHERE br.saw_id = "Saw".id AND br.removed_at IS NULL)))::int`,
        ),
        'bladesOn',
      ],
    ],
    group: ['siteId'],
    raw: true,
  })) as unknown as SawCounts[];
  return new Map(rows.map((r) => [r.siteId, r]));
}

/**
 * Per site, the stock of each spec (received − drawn), blades put on in the window and the reorder levels, in one
 * query over every site asked for; then the domain's stock computation per spec, as the site's stock page does.
 */
async function stockSummaries(siteIds: string[], asOf: Date): Promise<Map<string, SiteStockSummary>> {
  const result = new Map<string, SiteStockSummary>();
  if (siteIds.length === 0) return result;
  const windowDays = DEFAULT_USAGE_WINDOW_DAYS;
  const rows = await select<{
    site_id: string;
    blade_spec_id: string;
    name: string;
    received: number;
    drawn: number;
    used: number;
    lead_time_days: number | null;
    safety_stock: number | null;
  }>(
    `WITH rec AS (SELECT site_id, blade_spec_id, sum(quantity)::int AS received FROM stock_receipts
                   WHERE site_id IN (:siteIds) GROUP BY site_id, blade_spec_id),
          drawn AS (SELECT site_id, blade_spec_id, count(*)::int AS drawn FROM blade_runs
                     WHERE site_id IN (:siteIds) AND stock_receipt_id IS NOT NULL GROUP BY site_id, blade_spec_id),
          used AS (SELECT site_id, blade_spec_id, count(*)::int AS used FROM blade_runs
                    WHERE site_id IN (:siteIds) AND installed_at > :windowStart AND installed_at <= :asOf
                    GROUP BY site_id, blade_spec_id),
          keys AS (SELECT site_id, blade_spec_id FROM rec
                   UNION SELECT site_id, blade_spec_id FROM stock_levels WHERE site_id IN (:siteIds)
                   UNION SELECT site_id, blade_spec_id FROM used)
     SELECT k.site_id, k.blade_spec_id, bs.name, coalesce(rec.received, 0) AS received,
            coalesce(drawn.drawn, 0) AS drawn, coalesce(used.used, 0) AS used, l.lead_time_days, l.safety_stock
       FROM keys k
       JOIN blade_specs bs ON bs.id = k.blade_spec_id
       LEFT JOIN rec ON rec.site_id = k.site_id AND rec.blade_spec_id = k.blade_spec_id
       LEFT JOIN drawn ON drawn.site_id = k.site_id AND drawn.blade_spec_id = k.blade_spec_id
       LEFT JOIN used ON used.site_id = k.site_id AND used.blade_spec_id = k.blade_spec_id
       LEFT JOIN stock_levels l ON l.site_id = k.site_id AND l.blade_spec_id = k.blade_spec_id`,
    { siteIds, windowStart: new Date(asOf.getTime() - windowDays * DAY_MS), asOf },
  );
  for (const siteId of siteIds)
    result.set(siteId, {
      specs: 0,
      toReorder: 0,
      fewestDaysLeft: null,
      fewestDaysSpecId: null,
      fewestDaysSpecName: null,
      windowDays,
    });
  for (const r of rows) {
    const status = stockStatus({
      onHand: Math.max(0, r.received - r.drawn),
      usedInWindow: r.used,
      windowDays,
      leadTimeDays: r.lead_time_days ?? DEFAULT_STOCK_LEVELS.leadTimeDays,
      safetyStock: r.safety_stock ?? DEFAULT_STOCK_LEVELS.safetyStock,
    });
    const summary = result.get(r.site_id)!;
    summary.specs += 1;
    if (status.reorderNow) summary.toReorder += 1;
    const days = status.daysOfStockLeft;
    const fewer =
      days !== null &&
      (summary.fewestDaysLeft === null ||
        days < summary.fewestDaysLeft ||
        (days === summary.fewestDaysLeft && r.name < (summary.fewestDaysSpecName ?? '')));
    if (fewer) {
      summary.fewestDaysLeft = days;
      summary.fewestDaysSpecId = r.blade_spec_id;
      summary.fewestDaysSpecName = r.name;
    }
  }
  return result;
}

/**
 * A summary of each site the caller reads: saws down now, blades on saws and the spec that runs out first. The
 * stock part is left out (null) for a site whose stock the caller may not read.
 */
export async function listSiteSummaries(ability: AppAbility, q: SiteSummaryQuery): Promise<SiteSummaries> {
  const filter: WhereOptions[] = [];
  if (q.regionId) filter.push({ regionId: q.regionId });
  if (!q.includeRetired) filter.push({ retiredAt: { [Op.is]: null } });
  const sites = await Site.findAll({
    where: scopedWhere(ability, 'read', 'Site', Site, { [Op.and]: filter }),
    attributes: ['id'],
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  const siteIds = sites.map((s) => s.id);
  const asOf = new Date();
  if (siteIds.length === 0) return { asOf: asOf.toISOString(), items: [] };
  const stockSiteIds = siteIds.filter((siteId) => ability.can('read', subject('StockReceipt', { id: '', siteId })));
  const [saws, stock] = await Promise.all([sawCounts(ability, siteIds), stockSummaries(stockSiteIds, asOf)]);
  const items: SiteSummary[] = siteIds.map((siteId) => {
    const counts = saws.get(siteId);
    return {
      siteId,
      sawsInUse: Number(counts?.inUse ?? 0),
      sawsDown: Number(counts?.down ?? 0),
      downSince: counts?.downSince ? new Date(counts.downSince).toISOString() : null,
      bladesOn: Number(counts?.bladesOn ?? 0),
      stock: stock.get(siteId) ?? null,
    };
  });
  return { asOf: asOf.toISOString(), items };
}
