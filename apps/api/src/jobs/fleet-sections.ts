import { Op, col, fn, type WhereOptions } from 'sequelize';
import { subject } from '@casl/ability';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { PEER_METRIC_INFO, peerValueText } from '@kerfline/domain/outliers/peer-review';
import { REMOVAL_REASON_LABELS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { FOLLOW_UP_STATE_LABELS } from '@kerfline/domain/follow-ups/schema';
import { addMonths, monthOf, periodLabel } from '@kerfline/domain/fleet/period';
import { minorUnitDigits } from '@kerfline/domain/money/currency';
import { scopedWhere } from '../authz/sequelize-scope.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { reviewScope } from '../modules/outliers/review.js';
import { listFollowUps } from '../modules/follow-ups/follow-ups.service.js';
import { getBudgetStatus } from '../modules/budgets/budgets.service.js';
import { getSiteStock } from '../modules/blade-stock/blade-stock.service.js';
import { appLink } from '../mail/templates.js';
import type { SectionBuilder, SectionContext } from './digest-sections.js';

/*
 * The scheduled mails' fleet sections. Each reads through the recipient's own ability (`ctx.signedIn.ability`),
 * over the sites the mail is about (`ctx.sites`, already scoped), so a region's mail holds nothing from another.
 */

const WEEK_MS = 7 * 86_400_000;
const SHOWN = 15;

/** The unit system most of the mail's sites use (metric when tied). */
function unitsOf(ctx: SectionContext): UnitSystem {
  const imperial = ctx.sites.filter((s) => s.unitSystem === 'imperial').length;
  return imperial > ctx.sites.length / 2 ? 'imperial' : 'metric';
}

function money(minor: number, currency: string): string {
  return new Intl.NumberFormat('en-US', {
    style: 'currency',
    currency,
    maximumFractionDigits: minorUnitDigits(currency),
  }).format(minor / 10 ** minorUnitDigits(currency));
}

/** The six months the digest judges saws over: the five whole months before this one and this one so far. */
function reviewPeriod(now: Date) {
  const to = monthOf(now);
  return { from: addMonths(to, -5), to };
}

/**
 * Saws flagged against their peers this week: flagged on the figures up to now and not on the same months'
 * figures as they stood a week ago. Below, how many flags still have no follow-up.
 */
export const newOutlierFlagsSection: SectionBuilder = {
  key: 'new-outlier-flags',
  async build(ctx) {
    const now = new Date();
    const period = reviewPeriod(now);
    const siteIds = ctx.sites.map((s) => s.id);
    const [current, weekAgo] = await Promise.all([
      reviewScope(ctx.signedIn.ability, period, { asOf: now, siteIds }),
      reviewScope(ctx.signedIn.ability, period, { asOf: new Date(now.getTime() - WEEK_MS), siteIds }),
    ]);
    const before = new Set(weekAgo.review.flags.map((f) => `${f.sawId}|${f.metric}`));
    const fresh = current.review.flags.filter((f) => !before.has(`${f.sawId}|${f.metric}`));
    const sawOf = new Map(current.saws.map((s) => [s.saw.id, s]));
    const units = unitsOf(ctx);
    const currency = current.reportingCurrency;
    return {
      title: 'New outlier flags this week',
      intro: `Saws compared with saws of the same kind cutting the same material, ${periodLabel(period)}; ${current.review.flags.length} flag${current.review.flags.length === 1 ? '' : 's'} in all.`,
      columns: ['Saw', 'Site', 'Figure', 'This saw', 'Peer median', 'Modified z-score'],
      rows: fresh.slice(0, SHOWN).map((f) => {
        const s = sawOf.get(f.sawId)!;
        return [
          `${s.saw.assetTag} ${s.saw.name}`,
          s.site.name,
          PEER_METRIC_INFO[f.metric].label,
          peerValueText(f.metric, f.value, currency, units),
          peerValueText(f.metric, f.peerMedian, currency, units),
          f.modifiedZ.toFixed(1),
        ];
      }),
      empty: 'No saw was newly flagged this week.',
      link: { label: 'Open the outliers in Kerfline', url: appLink(ctx.publicUrl, '/outliers') },
    };
  },
};

/** Follow-ups not done yet at the mail's sites, overdue first. */
export const openFollowUpsSection: SectionBuilder = {
  key: 'open-follow-ups',
  async build(ctx) {
    const siteIds = new Set(ctx.sites.map((s) => s.id));
    const page = await listFollowUps(ctx.signedIn.ability, { state: 'active', limit: 200, offset: 0 });
    const items = page.items.filter((f) => siteIds.has(f.siteId));
    const overdue = items.filter((f) => f.overdue).length;
    return {
      title: 'Open follow-ups',
      intro: items.length > 0 ? `${items.length} open, ${overdue} overdue.` : undefined,
      columns: ['Saw', 'Site', 'Follow-up', 'Assigned to', 'Due', 'State'],
      rows: [...items]
        .sort((a, b) => Number(b.overdue) - Number(a.overdue) || a.dueOn.localeCompare(b.dueOn))
        .slice(0, SHOWN)
        .map((f) => [
          f.sawAssetTag,
          f.siteName,
          f.title,
          f.assignee?.name ?? '',
          f.overdue ? `${f.dueOn} (overdue)` : f.dueOn,
          FOLLOW_UP_STATE_LABELS[f.state],
        ]),
      empty: 'No follow-ups are open.',
      link: { label: 'See the follow-ups', url: appLink(ctx.publicUrl, '/follow-ups') },
    };
  },
};

/** Why blades came off in the last seven days, worn-out blades (their normal end) left out. */
export const topFailureReasonsSection: SectionBuilder = {
  key: 'top-failure-reasons',
  async build(ctx) {
    const now = new Date();
    const where: WhereOptions = scopedWhere(ctx.signedIn.ability, 'read', 'BladeRun', BladeRun, {
      siteId: { [Op.in]: ctx.sites.map((s) => s.id) },
      removedAt: { [Op.gte]: new Date(now.getTime() - WEEK_MS), [Op.lt]: now },
      removalReason: { [Op.ne]: 'worn_out' },
    });
    const rows = (await BladeRun.findAll({
      attributes: ['removalReason', [fn('count', col('id')), 'n']],
      where,
      group: ['removalReason'],
      order: [[fn('count', col('id')), 'DESC']],
      raw: true,
    })) as unknown as { removalReason: RemovalReason; n: number }[];
    return {
      title: 'Top failure reasons this week',
      columns: ['Reason', 'Blades'],
      rows: rows.slice(0, 5).map((r) => [REMOVAL_REASON_LABELS[r.removalReason], String(r.n)]),
      empty: 'No blade failed this week (blades worn out at the end of their life are not counted).',
    };
  },
};

/** The month's blade spend against budget per site, in each site's currency. */
export const spendAgainstBudgetSection: SectionBuilder = {
  key: 'spend-against-budget',
  async build(ctx) {
    const month = ctx.period;
    if (!/^\d{4}-\d{2}$/.test(month)) return null;
    const status = await getBudgetStatus(ctx.signedIn.ability, {
      from: month,
      to: month,
      sites: ctx.sites.map((s) => s.id),
    });
    return {
      title: `Blade spend against budget, ${periodLabel({ from: month, to: month })}`,
      intro: status.warnings.length
        ? `Some spend is left out for want of an exchange rate (${status.warnings.join('; ')}).`
        : undefined,
      columns: ['Site', 'Budget', 'Spend', 'Variance', 'Used'],
      rows: status.sites.map((s) => {
        const m = s.months[0]!;
        const spend = `${money(m.spentMinor, s.site.currency)}${m.spendComplete ? '' : ' (incomplete)'}`;
        return [
          s.site.name,
          m.budget ? money(m.budget.amountMinor, s.site.currency) : 'No budget set',
          spend,
          m.varianceMinor === null
            ? ''
            : m.varianceMinor < 0
              ? `${money(-m.varianceMinor, s.site.currency)} over`
              : `${money(m.varianceMinor, s.site.currency)} under`,
          m.percentUsed === null ? '' : `${Math.round(m.percentUsed)} %`,
        ];
      }),
      empty: 'No sites are assigned to you yet.',
      link: { label: 'Open the budgets', url: appLink(ctx.publicUrl, '/budgets') },
    };
  },
};

/** The site's blade specs at or below their reorder point, from the stock computation (ROP = d × L + SS). */
export const lowStockSection: SectionBuilder = {
  key: 'low-stock',
  async build(ctx) {
    const rows: string[][] = [];
    for (const site of ctx.sites) {
      if (!ctx.signedIn.ability.can('read', subject('StockReceipt', { id: '', siteId: site.id }))) continue;
      const stock = await getSiteStock(ctx.signedIn.ability, site.id, { windowDays: 90 });
      for (const line of stock.items.filter((i) => i.reorderNow))
        rows.push([
          line.bladeSpec.name,
          String(line.onHand),
          String(Math.ceil(line.reorderPoint)),
          line.daysOfStockLeft === null ? 'no recent use' : `${Math.floor(line.daysOfStockLeft)} days`,
          line.reason,
        ]);
    }
    return {
      title: 'Blade specs at or below their reorder point',
      columns: ['Blade spec', 'On hand', 'Reorder point', 'Stock left', 'Why'],
      rows,
      empty: 'Nothing is below its reorder point.',
      link:
        ctx.sites.length === 1
          ? { label: 'Open the site’s stock', url: appLink(ctx.publicUrl, `/sites/${ctx.sites[0]!.id}`) }
          : undefined,
    };
  },
};
