import { Op, fn, col, literal, type WhereOptions } from 'sequelize';
import { STOP_CATEGORY_LABELS, type StopCategory } from '@kerfline/domain/stops/schema';
import type { SignedIn } from '../modules/auth/auth.service.js';
import { scopedWhere } from '../authz/sequelize-scope.js';
import { Site } from '../modules/sites/site.model.js';
import { HAS_OPEN_STOP_SQL, OPEN_STOP_SQL, Saw } from '../modules/saws/saw.model.js';
import { appLink, type MailSection } from '../mail/templates.js';
import { subject } from '@casl/ability';
import { countsBySite, pendingPage } from '../modules/site-checks/check-status.js';
import {
  lowStockSection,
  newOutlierFlagsSection,
  openFollowUpsSection,
  spendAgainstBudgetSection,
  topFailureReasonsSection,
} from './fleet-sections.js';

/**
 * What a section of a scheduled mail is built from. `signedIn` is the RECIPIENT's own identity and ability:
 * every query a section runs goes through `scopedWhere(signedIn.ability, …)`, so a section can never put a
 * row from another site or region into a person's mail, whatever filter it adds.
 */
export type SectionContext = {
  signedIn: SignedIn;
  /** The sites the mail is about (already scoped by the recipient's ability), in display order. */
  sites: Site[];
  /** The period the mail covers: `2026-W49` for the weekly digest, `2026-11` for the monthly summary. */
  period: string;
  publicUrl: string;
};

/** One section; null leaves it out (nothing to say and no need to say so). */
export type SectionBuilder = { key: string; build: (ctx: SectionContext) => Promise<MailSection | null> };

const SAWS_DOWN_SHOWN = 25;

/** The recipient's saws at the mail's sites that are not retired, as a scoped where (plus any extra condition). */
function sawsWhere(ctx: SectionContext, ...extra: WhereOptions[]): WhereOptions {
  return scopedWhere(ctx.signedIn.ability, 'read', 'Saw', Saw, {
    [Op.and]: [{ siteId: { [Op.in]: ctx.sites.map((s) => s.id) } }, { status: { [Op.ne]: 'retired' } }, ...extra],
  });
}

/** Saws per site that are in service and down (down: an open stop); retired saws are history and not counted. */
async function sawCountsBySite(ctx: SectionContext): Promise<Map<string, { inService: number; down: number }>> {
  const countBySite = async (where: WhereOptions) =>
    (await Saw.findAll({
      attributes: ['siteId', [fn('count', col('id')), 'n']],
      where,
      group: ['siteId'],
      raw: true,
    })) as unknown as { siteId: string; n: number }[];
  const [all, down] = await Promise.all([
    countBySite(sawsWhere(ctx)),
    countBySite(sawsWhere(ctx, literal(HAS_OPEN_STOP_SQL))),
  ]);
  const counts = new Map<string, { inService: number; down: number }>();
  for (const r of all) counts.set(r.siteId, { inService: Number(r.n), down: 0 });
  for (const r of down) {
    const c = counts.get(r.siteId) ?? { inService: 0, down: 0 };
    c.down = Number(r.n);
    c.inService -= c.down;
    counts.set(r.siteId, c);
  }
  return counts;
}

/** Each site with its saws in service and down. */
export const sitesSection: SectionBuilder = {
  key: 'sites',
  async build(ctx) {
    const counts = await sawCountsBySite(ctx);
    return {
      title: 'Sites and saws',
      columns: ['Site', 'Code', 'In service', 'Down'],
      rows: ctx.sites.map((s) => {
        const c = counts.get(s.id) ?? { inService: 0, down: 0 };
        return [s.name, s.code, String(c.inService), c.down > 0 ? `${c.down} down` : '0'];
      }),
      empty: 'No sites are assigned to you yet.',
      link: { label: 'Open the sites in Kerfline', url: appLink(ctx.publicUrl, '/sites') },
    };
  },
};

/** The saws down right now (an open stop), the longest down first, with why and since when. */
export const sawsDownSection: SectionBuilder = {
  key: 'saws-down',
  async build(ctx) {
    const where = sawsWhere(ctx, literal(HAS_OPEN_STOP_SQL));
    const [saws, total] = await Promise.all([
      Saw.findAll({
        attributes: { include: [[literal(OPEN_STOP_SQL), 'down']] },
        where,
        order: [[literal(`(${OPEN_STOP_SQL})->>'since'`), 'ASC']],
        limit: SAWS_DOWN_SHOWN,
      }),
      Saw.count({ where }),
    ]);
    const siteName = new Map(ctx.sites.map((s) => [s.id, s.name]));
    return {
      title: 'Saws down now',
      intro:
        total > SAWS_DOWN_SHOWN
          ? `${total} saws are down; the ${SAWS_DOWN_SHOWN} that have been down longest are listed.`
          : undefined,
      columns: ['Saw', 'Name', 'Site', 'Why', 'Down since'],
      rows: saws.map((s) => {
        const down = s.get('down') as { category: StopCategory; since: string } | null;
        return [
          s.assetTag,
          s.name,
          siteName.get(s.siteId) ?? '',
          down ? STOP_CATEGORY_LABELS[down.category] : '',
          down ? new Date(down.since).toISOString().slice(0, 10) : '',
        ];
      }),
      empty: 'Every saw is in service.',
      link:
        total > 0
          ? { label: 'See the saws that are down', url: appLink(ctx.publicUrl, '/saws?status=down') }
          : undefined,
    };
  },
};

const OVERDUE_CHECKS_SHOWN = 25;

/**
 * The maintenance checks overdue now at the mail's sites (those whose checks the recipient may read), the
 * longest overdue first, from the same SQL as each site's overdue list.
 */
export const overdueChecksSection: SectionBuilder = {
  key: 'overdue-checks',
  async build(ctx) {
    const sites = ctx.sites.filter((s) =>
      ctx.signedIn.ability.can('read', subject('SiteCheck', { id: '', siteId: s.id })),
    );
    if (sites.length === 0) return null;
    const filter = { siteIds: sites.map((s) => s.id) };
    const [{ rows, total }, counts] = await Promise.all([
      pendingPage(filter, 'overdue', { limit: OVERDUE_CHECKS_SHOWN, offset: 0 }),
      countsBySite(filter),
    ]);
    const siteName = new Map(sites.map((s) => [s.id, s.name]));
    const bySite = sites
      .map((s) => ({ site: s, overdue: counts.get(s.id)?.overdue ?? 0 }))
      .filter((c) => c.overdue > 0)
      .map((c) => `${c.site.name} ${c.overdue}`);
    const only = sites.length === 1 ? sites[0]! : null;
    return {
      title: 'Checks overdue',
      intro:
        total === 0
          ? undefined
          : `${total} check${total === 1 ? ' is' : 's are'} overdue (${bySite.join(', ')})${total > OVERDUE_CHECKS_SHOWN ? `; the ${OVERDUE_CHECKS_SHOWN} overdue longest are listed` : ''}.`,
      columns: ['Saw', 'Check', 'Site', 'Overdue since'],
      rows: rows.map((r) => [
        r.asset_tag,
        r.check_name,
        siteName.get(r.site_id) ?? '',
        r.overdue_at ? r.overdue_at.toISOString().slice(0, 10) : '',
      ]),
      empty: 'No check is overdue.',
      link:
        total > 0
          ? {
              label: only ? `See ${only.name}’s overdue checks` : 'Open the sites in Kerfline',
              url: appLink(ctx.publicUrl, only ? `/sites/${only.id}/checks/overdue` : '/sites'),
            }
          : undefined,
    };
  },
};

/**
 * The weekly digest to each regional lead, section by section: the region's sites and saws down, overdue checks,
 * the saws newly flagged against their peers, open follow-ups and the week's top failure reasons
 * (`fleet-sections.ts`). Each is scoped through `ctx.signedIn.ability`, as above.
 */
export const weeklyDigestSections: SectionBuilder[] = [
  sitesSection,
  sawsDownSection,
  overdueChecksSection,
  newOutlierFlagsSection,
  openFollowUpsSection,
  topFailureReasonsSection,
];

/** The monthly summary to each manager: their sites, and the month's blade spend against budget per site. */
export const monthlySummarySections: SectionBuilder[] = [sitesSection, spendAgainstBudgetSection];

/**
 * The low-stock notice to a site's admins: the blade specs at or below their reorder point. With nothing below
 * it, a queued notice is recorded as skipped rather than sent empty.
 */
export const lowStockSections: SectionBuilder[] = [lowStockSection];
