import { QueryTypes } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { MonthPeriod } from '@kerfline/domain/fleet/period';
import type { Figures, FleetSaw, FleetSite } from '@kerfline/domain/fleet/schema';
import {
  PEER_METRICS,
  reviewPeers,
  type PeerMetric,
  type PeerReview,
  type SawForReview,
} from '@kerfline/domain/outliers/peer-review';
import type { UnconvertedPart } from '@kerfline/domain/money/currency';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { SqlParams, scopeSql, scopedWhere } from '../../authz/sequelize-scope.js';
import { Saw } from '../saws/saw.model.js';
import { CutLog } from '../cut-logs/cut-log.model.js';
import { moneyRows, rawFigures, type MoneyRow, type RawFigures } from '../fleet/fleet-figures.js';
import {
  assembleFigures,
  fleetSites,
  indexRaw,
  periodMonths,
  periodStartsBy,
  rateWarnings,
} from '../fleet/assemble.js';
import { rateLookup, reportingCurrency } from '../exchange-rates/rates.js';

/**
 * The outlier review of the saws in a caller's scope over a period: each saw's figures from the fleet SQL, its
 * four peer figures, and the domain's peer review. Shared by the outlier screens and the weekly digest, so both
 * say the same thing.
 */
export type ReviewedSaw = {
  saw: FleetSaw;
  site: FleetSite;
  figures: Figures;
  values: Record<PeerMetric, number | null>;
  removalReasons: Record<RemovalReason, number>;
};

export type ScopeReview = {
  period: MonthPeriod;
  asOf: Date;
  reportingCurrency: string;
  saws: ReviewedSaw[];
  review: PeerReview;
  warnings: string[];
};

const per1000 = (x: number, hours: number) => (hours > 0 ? (x / hours) * 1000 : null);

export async function reviewScope(
  ability: AppAbility,
  period: MonthPeriod,
  options: { asOf?: Date; siteIds?: string[] } = {},
): Promise<ScopeReview> {
  const asOf = options.asOf ?? new Date();
  const sites = await fleetSites(ability, { only: options.siteIds, activeFrom: periodStartsBy(period) });
  const siteById = new Map(sites.map((s) => [s.id, s]));
  const starts = periodStartsBy(period).getTime();
  // Plain rows of the few columns the review reads: 1 500 full model instances were ~15 ms before any figure.
  const saws = (
    (await Saw.findAll({
      attributes: ['id', 'siteId', 'assetTag', 'name', 'kind', 'retiredAt'],
      where: scopedWhere(ability, 'read', 'Saw', Saw, { siteId: sites.map((s) => s.id) }),
      order: [['assetTag', 'ASC']],
      raw: true,
    })) as Pick<Saw, 'id' | 'siteId' | 'assetTag' | 'name' | 'kind' | 'retiredAt'>[]
  ).filter((s) => !s.retiredAt || s.retiredAt.getTime() > starts);
  const reporting = (await reportingCurrency()).currency;
  const scope = { ability, siteIds: sites.map((s) => s.id), sawIds: saws.map((s) => s.id), asOf };
  // Money month by month and currency (to convert each part at its month's rate) only where it may need converting:
  // the saws of sites keeping another currency, read beside the figures; any other saw whose runs turn out not to
  // be all in the reporting currency, read after them. The rest take the figures' own sums, which is what
  // converting their parts at 1 would give (18 000 money rows fewer for a single-currency fleet's year).
  const foreignSites = new Set(sites.filter((s) => s.currency !== reporting).map((s) => s.id));
  const readMoney = (sawIds: string[]) =>
    sawIds.length ? moneyRows(Saw.sequelize!, 'saw', { ...scope, sawIds }, period.from, period.to) : [];
  const [rows, foreignMoney, rateOf] = await Promise.all([
    saws.length ? rawFigures(Saw.sequelize!, 'saw', scope, [{ key: 'period', ...period }]) : [],
    readMoney(saws.filter((s) => foreignSites.has(s.siteId)).map((s) => s.id)),
    rateLookup(ability, reporting, period.from, period.to),
  ]);
  const raw = indexRaw(rows);
  const inReporting = (r: RawFigures) =>
    r.moneyCurrency === reporting || (r.bladesUsed === 0 && r.bladesWithArea === 0);
  const money = [
    ...foreignMoney,
    ...(await readMoney(
      saws.filter((s) => !foreignSites.has(s.siteId) && !inReporting(raw(s.id, 'period'))).map((s) => s.id),
    )),
  ];
  const ownMoney = (sawId: string, r: RawFigures): MoneyRow[] => {
    const own: MoneyRow[] = [];
    const part = { groupId: sawId, month: period.from, currency: reporting };
    if (r.bladesUsed > 0) own.push({ ...part, kind: 'spend', amountMinor: r.spendMinor });
    if (r.bladesWithArea > 0) own.push({ ...part, kind: 'finished', amountMinor: r.finishedCostMinor });
    return own;
  };
  const months = periodMonths(period);
  const missing: UnconvertedPart[] = [];
  const reviewed: ReviewedSaw[] = saws.map((saw) => {
    const r = raw(saw.id, 'period');
    const ctx = { reporting, rateOf };
    const figures =
      foreignSites.has(saw.siteId) || !inReporting(r)
        ? assembleFigures(r, money, saw.id, months, ctx, missing)
        : assembleFigures(r, ownMoney(saw.id, r), null, months, ctx, missing);
    return {
      saw: {
        id: saw.id,
        siteId: saw.siteId,
        assetTag: saw.assetTag,
        name: saw.name,
        kind: saw.kind,
        retiredAt: saw.retiredAt ? saw.retiredAt.toISOString() : null,
        mainMaterial: r.mainMaterial,
      },
      site: siteById.get(saw.siteId)!,
      figures,
      values: {
        cost_per_area: figures.costPerAreaMinorPerMm2,
        blade_life: figures.medianLifeMm2,
        stop_hours: per1000(r.unplannedStopHours, r.scheduledHours),
        failure_rate: per1000(r.failures, r.scheduledHours),
      },
      removalReasons: r.removalReasons,
    };
  });
  const forReview: SawForReview[] = reviewed.map((s) => ({
    id: s.saw.id,
    kind: s.saw.kind,
    mainMaterial: s.saw.mainMaterial,
    bladesWithArea: s.figures.bladesWithArea,
    scheduledHours: s.figures.scheduledHours,
    values: s.values,
    missingReason: s.figures.costPerAreaComplete
      ? {}
      : { cost_per_area: `No exchange rate for some of its blades' currencies in the period, so no cost per area.` },
  }));
  return {
    period,
    asOf,
    reportingCurrency: reporting,
    saws: reviewed,
    review: reviewPeers(forReview),
    warnings: rateWarnings(missing, reporting),
  };
}

export { PEER_METRICS };

/** The saw's cut logs in the period (newest 200), as the diagnosis reads them. */
export async function sawCutLogs(ability: AppAbility, sawId: string, from: Date, to: Date) {
  const params = new SqlParams();
  const scope = scopeSql(ability, 'read', 'CutLog', CutLog, 'l', params);
  return CutLog.sequelize!.query<{
    teeth_in_work_min: number | null;
    teeth_in_work_max: number | null;
    band_speed_m_per_min: number | null;
    material_group: MaterialGroup;
  }>(
    `SELECT l.teeth_in_work_min, l.teeth_in_work_max, l.band_speed_m_per_min, l.material_group
       FROM cut_logs l
      WHERE l.saw_id = ${params.add(sawId)}::uuid AND l.cut_at >= ${params.add(from)}::timestamptz
        AND l.cut_at < ${params.add(to)}::timestamptz AND ${scope}
      ORDER BY l.cut_at DESC LIMIT 200`,
    { bind: params.values, type: QueryTypes.SELECT },
  );
}
