import { QueryTypes } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import type { UnconvertedPart } from '@kerfline/domain/money/currency';
import { monthStart, addMonths, previousPeriod, type MonthPeriod } from '@kerfline/domain/fleet/period';
import type {
  FleetOverview,
  FleetQuery,
  FleetRun,
  FleetSaw,
  FleetSite,
  PeriodQuery,
  PeriodRunsQuery,
  Practice,
  SawFigures,
  SiteFigures,
} from '@kerfline/domain/fleet/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { AppError } from '../../errors.js';
import { SqlParams, scopeSql, scopedWhere } from '../../authz/sequelize-scope.js';
import { Saw } from '../saws/saw.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { rateLookup, reportingCurrency } from '../exchange-rates/rates.js';
import { moneyRows, rawFigures, type Bucket } from './fleet-figures.js';
import {
  assembleFigures,
  fleetSite,
  fleetSites,
  indexRaw,
  periodMonths,
  periodStartsBy,
  rateWarnings,
  withStopsOf,
  type MoneyContext,
} from './assemble.js';
import { checksPractice } from './practice-checks.js';

const sequelize = () => Saw.sequelize!;

async function moneyContext(ability: AppAbility, from: string, to: string): Promise<MoneyContext> {
  const reporting = (await reportingCurrency()).currency;
  return { reporting, rateOf: await rateLookup(ability, reporting, from, to) };
}

const monthBuckets = (p: MonthPeriod): Bucket[] => periodMonths(p).map((m) => ({ key: m, from: m, to: m }));

/**
 * The manager's overview: every site in scope (or the ones asked for) with its figures for the period and the
 * one before, the fleet's totals, and each site's months. Four statements in all, whatever the number of sites.
 */
export async function getOverview(ability: AppAbility, q: FleetQuery, asOf = new Date()): Promise<FleetOverview> {
  const period = { from: q.from, to: q.to };
  const previous = previousPeriod(period);
  const choices = await fleetSites(ability, { activeFrom: periodStartsBy(previous) });
  const sites = q.sites ? choices.filter((s) => q.sites!.includes(s.id)) : choices;
  const scope = { ability, siteIds: sites.map((s) => s.id), asOf };
  const buckets: Bucket[] = [...monthBuckets(period), { key: 'current', ...period }, { key: 'previous', ...previous }];
  const [siteRows, fleetRows, money, ctx] = await Promise.all([
    rawFigures(sequelize(), 'site', scope, buckets),
    // The fleet's hours are its sites' sums (below): its own statement reads only the runs, for the medians.
    rawFigures(
      sequelize(),
      'fleet',
      scope,
      [
        { key: 'current', ...period },
        { key: 'previous', ...previous },
      ],
      { stops: false },
    ),
    moneyRows(sequelize(), 'site', scope, previous.from, period.to),
    moneyContext(ability, previous.from, period.to),
  ]);
  const raw = indexRaw([...siteRows, ...fleetRows]);
  const missing: UnconvertedPart[] = [];
  const months = periodMonths(period);
  const previousMonths = periodMonths(previous);
  return {
    period,
    previous,
    asOf: asOf.toISOString(),
    reportingCurrency: ctx.reporting,
    sites: sites.map((site) => ({
      site,
      current: assembleFigures(raw(site.id, 'current'), money, site.id, months, ctx, missing),
      previous: assembleFigures(raw(site.id, 'previous'), money, site.id, previousMonths, ctx),
    })),
    choices,
    fleet: {
      current: assembleFigures(
        withStopsOf(
          raw('fleet', 'current'),
          sites.map((s) => raw(s.id, 'current')),
        ),
        money,
        null,
        months,
        ctx,
      ),
      previous: assembleFigures(
        withStopsOf(
          raw('fleet', 'previous'),
          sites.map((s) => raw(s.id, 'previous')),
        ),
        money,
        null,
        previousMonths,
        ctx,
      ),
    },
    months: sites.flatMap((site) =>
      months.map((month) => ({
        siteId: site.id,
        month,
        figures: assembleFigures(raw(site.id, month), money, site.id, [month], ctx),
      })),
    ),
    warnings: rateWarnings(missing, ctx.reporting),
  };
}

/** The saws of a site the caller may read that were in service at some time in the period. */
async function sawsOf(ability: AppAbility, siteId: string, period: MonthPeriod, sawId?: string): Promise<Saw[]> {
  const saws = await Saw.findAll({
    where: scopedWhere(ability, 'read', 'Saw', Saw, sawId ? { id: sawId, siteId } : { siteId }),
    order: [['assetTag', 'ASC']],
  });
  const starts = periodStartsBy(period).getTime();
  return saws.filter((s) => s.id === sawId || !s.retiredAt || s.retiredAt.getTime() > starts);
}

function toFleetSaw(saw: Saw, mainMaterial: MaterialGroup | null): FleetSaw {
  return {
    id: saw.id,
    siteId: saw.siteId,
    assetTag: saw.assetTag,
    name: saw.name,
    kind: saw.kind,
    retiredAt: saw.retiredAt ? saw.retiredAt.toISOString() : null,
    mainMaterial,
  };
}

/** One site's figures over the period, month by month, and each of its saws'. 404 outside the caller's scope. */
export async function getSiteFigures(
  ability: AppAbility,
  siteId: string,
  q: PeriodQuery,
  asOf = new Date(),
): Promise<SiteFigures> {
  const site = await fleetSite(ability, siteId);
  if (!site) throw AppError.notFound('Site');
  const period = { from: q.from, to: q.to };
  const saws = await sawsOf(ability, site.id, period);
  const scope = { ability, siteIds: [site.id], asOf };
  const sawScope = { ...scope, sawIds: saws.map((s) => s.id) };
  const [siteRows, sawRows, siteMoney, sawMoney, ctx] = await Promise.all([
    rawFigures(sequelize(), 'site', scope, [...monthBuckets(period), { key: 'current', ...period }]),
    saws.length ? rawFigures(sequelize(), 'saw', sawScope, [{ key: 'current', ...period }]) : [],
    moneyRows(sequelize(), 'site', scope, period.from, period.to),
    saws.length ? moneyRows(sequelize(), 'saw', sawScope, period.from, period.to) : [],
    moneyContext(ability, period.from, period.to),
  ]);
  const raw = indexRaw([...siteRows, ...sawRows]);
  const months = periodMonths(period);
  const missing: UnconvertedPart[] = [];
  return {
    period,
    asOf: asOf.toISOString(),
    reportingCurrency: ctx.reporting,
    site,
    figures: assembleFigures(raw(site.id, 'current'), siteMoney, site.id, months, ctx, missing),
    months: months.map((month) => ({
      month,
      figures: assembleFigures(raw(site.id, month), siteMoney, site.id, [month], ctx),
    })),
    saws: saws.map((saw) => {
      const r = raw(saw.id, 'current');
      return { saw: toFleetSaw(saw, r.mainMaterial), figures: assembleFigures(r, sawMoney, saw.id, months, ctx) };
    }),
    warnings: rateWarnings(missing, ctx.reporting),
  };
}

/** The saw a reader may see (404 otherwise), with its site; the two are read side by side. */
export async function readableSaw(ability: AppAbility, sawId: string): Promise<ReadableSaw> {
  const [saw, sites] = await Promise.all([
    Saw.findOne({ where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }) }),
    fleetSites(ability),
  ]);
  const site = saw ? sites.find((s) => s.id === saw.siteId) : undefined;
  if (!saw || !site) throw AppError.notFound('Saw');
  return { saw, site };
}
export type ReadableSaw = { saw: Saw; site: FleetSite };

/** One saw's figures over the period, month by month, and its finished blades by reason. */
export async function getSawFigures(
  ability: AppAbility,
  sawId: string,
  q: PeriodQuery,
  asOf = new Date(),
): Promise<SawFigures> {
  const { saw, site } = await readableSaw(ability, sawId);
  const period = { from: q.from, to: q.to };
  const scope = { ability, siteIds: [site.id], sawIds: [saw.id], asOf };
  const [rows, money, ctx] = await Promise.all([
    rawFigures(sequelize(), 'saw', scope, [...monthBuckets(period), { key: 'current', ...period }]),
    moneyRows(sequelize(), 'saw', scope, period.from, period.to),
    moneyContext(ability, period.from, period.to),
  ]);
  const raw = indexRaw(rows);
  const months = periodMonths(period);
  const missing: UnconvertedPart[] = [];
  const current = raw(saw.id, 'current');
  return {
    period,
    asOf: asOf.toISOString(),
    reportingCurrency: ctx.reporting,
    site,
    saw: toFleetSaw(saw, current.mainMaterial),
    figures: assembleFigures(current, money, saw.id, months, ctx, missing),
    months: months.map((month) => ({
      month,
      figures: assembleFigures(raw(saw.id, month), money, saw.id, [month], ctx),
    })),
    removalReasons: current.removalReasons,
    warnings: rateWarnings(missing, ctx.reporting),
  };
}

type RunRow = {
  id: string;
  site_id: string;
  saw_id: string;
  blade_spec_id: string;
  spec_name: string;
  installed_at: Date;
  removed_at: Date | null;
  removal_reason: RemovalReason | null;
  area_cut_mm2: number | null;
  cuts: number | null;
  cost_minor: number;
  currency: string;
  break_in_followed: boolean | null;
  material_group: MaterialGroup | null;
};

const toFleetRun = (r: RunRow): FleetRun => ({
  id: r.id,
  siteId: r.site_id,
  sawId: r.saw_id,
  bladeSpecId: r.blade_spec_id,
  bladeSpecName: r.spec_name,
  installedAt: new Date(r.installed_at).toISOString(),
  removedAt: r.removed_at ? new Date(r.removed_at).toISOString() : null,
  removalReason: r.removal_reason,
  areaCutMm2: r.area_cut_mm2 === null ? null : Number(r.area_cut_mm2),
  cuts: r.cuts,
  costMinor: Number(r.cost_minor),
  currency: r.currency.trim(),
  breakInFollowed: r.break_in_followed,
  materialGroup: r.material_group,
});

/**
 * The SQL of a saw's blade runs that were on it at some time in the period (newest first), through the
 * exclusion constraint's GiST index on (saw_id, tstzrange(installed_at, removed_at)). `after` continues from a
 * run (keyset paging, for streamed exports); `offset` pages for the screen.
 */
function sawRunsSql(ability: AppAbility, sawId: string, timeZone: string, period: MonthPeriod) {
  const params = new SqlParams();
  const scope = scopeSql(ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const saw = params.add(sawId);
  const tz = params.add(timeZone);
  const m0 = params.add(`${monthStart(period.from)} 00:00:00`);
  const m1 = params.add(`${monthStart(addMonths(period.to, 1))} 00:00:00`);
  const where = `r.saw_id = ${saw}::uuid
     AND tstzrange(r.installed_at, r.removed_at, '[)') && tstzrange(${m0}::timestamp AT TIME ZONE ${tz}, ${m1}::timestamp AT TIME ZONE ${tz}, '[)')
     AND ${scope}`;
  return { params, where };
}

export async function listSawRuns(ability: AppAbility, sawId: string, q: PeriodRunsQuery): Promise<Page<FleetRun>> {
  const readable = await readableSaw(ability, sawId);
  const { params, where } = sawRunsSql(ability, readable.saw.id, readable.site.timeZone, q);
  const limit = params.add(q.limit);
  const offset = params.add(q.offset);
  // The count (its own statement and values, as the export's) and the page side by side.
  const [total, rows] = await Promise.all([
    countSawRuns(ability, readable, q),
    sequelize().query<RunRow>(
      `SELECT r.*, b.name AS spec_name FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
        WHERE ${where} ORDER BY r.installed_at DESC, r.id DESC LIMIT ${limit} OFFSET ${offset}`,
      { bind: params.values, type: QueryTypes.SELECT },
    ),
  ]);
  return { items: rows.map(toFleetRun), total, limit: q.limit, offset: q.offset };
}

/** Every run of a readable saw in the period, a batch at a time (for the streamed export). */
export async function* eachSawRun(ability: AppAbility, { saw, site }: ReadableSaw, period: MonthPeriod, batch = 1000) {
  let after: { at: Date; id: string } | null = null;
  for (;;) {
    const { params, where } = sawRunsSql(ability, saw.id, site.timeZone, period);
    const keyset: string = after
      ? ` AND (r.installed_at, r.id) < (${params.add(after.at)}::timestamptz, ${params.add(after.id)}::uuid)`
      : '';
    const rows: RunRow[] = await sequelize().query<RunRow>(
      `SELECT r.*, b.name AS spec_name FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
        WHERE ${where}${keyset} ORDER BY r.installed_at DESC, r.id DESC LIMIT ${params.add(batch)}`,
      { bind: params.values, type: QueryTypes.SELECT },
    );
    if (rows.length === 0) return;
    yield rows.map(toFleetRun);
    const last: RunRow = rows[rows.length - 1]!;
    after = { at: new Date(last.installed_at), id: last.id };
    if (rows.length < batch) return;
  }
}

/** How many runs a readable saw had in the period (for the list's total and the export's progress). */
export async function countSawRuns(
  ability: AppAbility,
  { saw, site }: ReadableSaw,
  period: MonthPeriod,
): Promise<number> {
  const { params, where } = sawRunsSql(ability, saw.id, site.timeZone, period);
  const [count] = await sequelize().query<{ n: number }>(`SELECT count(*)::int AS n FROM blade_runs r WHERE ${where}`, {
    bind: params.values,
    type: QueryTypes.SELECT,
  });
  return count?.n ?? 0;
}

/** One blade run for the drill-down (404 outside the scope). */
export async function getFleetRun(ability: AppAbility, runId: string): Promise<FleetRun> {
  const params = new SqlParams();
  const scope = scopeSql(ability, 'read', 'BladeRun', BladeRun, 'r', params);
  const rows = await sequelize().query<RunRow>(
    `SELECT r.*, b.name AS spec_name FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
      WHERE r.id = ${params.add(runId)}::uuid AND ${scope}`,
    { bind: params.values, type: QueryTypes.SELECT },
  );
  if (!rows[0]) throw AppError.notFound('Blade run');
  return toFleetRun(rows[0]);
}

/**
 * Practice compared, per site: the share of blades put on with their break-in followed, and the blade life of
 * finished blades with and without it; the share of maintenance checks done on time where checks are recorded.
 */
export async function getPractice(ability: AppAbility, q: FleetQuery, asOf = new Date()): Promise<Practice> {
  const period = { from: q.from, to: q.to };
  const sites = await fleetSites(ability, { only: q.sites, activeFrom: periodStartsBy(period) });
  const scope = { ability, siteIds: sites.map((s) => s.id), asOf };
  const [rows, checks] = await Promise.all([
    // Practice reads no stop: the figures leave the stops out.
    rawFigures(sequelize(), 'site', scope, [{ key: 'current', ...period }], { breakInMedians: true, stops: false }),
    checksPractice(sequelize(), scope, period),
  ]);
  const raw = indexRaw(rows);
  return {
    period,
    sites: sites.map((site) => {
      const r = raw(site.id, 'current');
      const c = checks.get(site.id) ?? null;
      return {
        site,
        breakInRecorded: r.breakInRecorded,
        breakInFollowed: r.breakInFollowed,
        breakInShare: r.breakInRecorded > 0 ? r.breakInFollowed / r.breakInRecorded : null,
        medianLifeFollowedMm2: r.lifeFollowed.medianMm2,
        medianLifeSkippedMm2: r.lifeSkipped.medianMm2,
        bladesFollowed: r.lifeFollowed.blades,
        bladesSkipped: r.lifeSkipped.blades,
        checksDue: c?.due ?? null,
        checksOnTime: c?.onTime ?? null,
        checksOnTimeShare: c && c.due > 0 ? c.onTime / c.due : null,
        medianLifeChecksOnTimeMm2: c?.medianLifeOnTimeMm2 ?? null,
        medianLifeChecksLateMm2: c?.medianLifeLateMm2 ?? null,
      };
    }),
  };
}
