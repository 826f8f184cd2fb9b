import type { AppAbility } from '@kerfline/domain/authz/ability';
import { DOWNTIME_CATEGORIES, type DowntimeCategory } from '@kerfline/domain/metrics/schema';
import { REMOVAL_REASONS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { costPerAreaCut } from '@kerfline/domain/metrics/blade-economics';
import {
  convertTotal,
  missingRateWords,
  type MoneyPart,
  type RateLookup,
  type UnconvertedPart,
} from '@kerfline/domain/money/currency';
import { monthsOf, type Month, type MonthPeriod } from '@kerfline/domain/fleet/period';
import type { Figures, FleetSite } from '@kerfline/domain/fleet/schema';
import { siteMarkSlots } from '@kerfline/domain/fleet/site-marks';
import { literal } from 'sequelize';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { Site } from '../sites/site.model.js';
import type { MoneyRow, RawFigures } from './fleet-figures.js';

/**
 * Turning the SQL sums into the figures the screens show: money converted month by month into the reporting
 * currency (a missing rate marks the total), and the ratios (cost per area, MTBF, MTTR, availability) worked
 * out from the sums. Shared by the fleet, budget and outlier features and the scheduled mail.
 */

export type MoneyContext = { reporting: string; rateOf: RateLookup };

const zeroStops = () => Object.fromEntries(DOWNTIME_CATEGORIES.map((c) => [c, 0])) as Record<DowntimeCategory, number>;

export function emptyRaw(groupId: string, bucket: string): RawFigures {
  return {
    groupId,
    bucket,
    bladesUsed: 0,
    breakInRecorded: 0,
    breakInFollowed: 0,
    mainMaterial: null,
    bladesRemoved: 0,
    bladesWithArea: 0,
    areaCutMm2: 0,
    meanLifeMm2: null,
    medianLifeMm2: null,
    meanCutsPerBlade: null,
    lifeFollowed: { blades: 0, medianMm2: null },
    lifeSkipped: { blades: 0, medianMm2: null },
    removalReasons: Object.fromEntries(REMOVAL_REASONS.map((r) => [r, 0])) as Record<RemovalReason, number>,
    moneyCurrency: null,
    spendMinor: 0,
    finishedCostMinor: 0,
    scheduledHours: 0,
    downtimeHours: 0,
    unplannedStopHours: 0,
    stopHours: zeroStops(),
    failures: 0,
    failureDowntimeHours: 0,
  };
}

/**
 * A group's figures with its hours taken as the sum of its parts' (the fleet's from its sites'): hours and failures
 * add up, so the fleet's statement can leave the stops out and read each stop once, through its site.
 */
export function withStopsOf(raw: RawFigures, parts: RawFigures[]): RawFigures {
  const sum = (pick: (r: RawFigures) => number) => parts.reduce((t, r) => t + pick(r), 0);
  return {
    ...raw,
    scheduledHours: sum((r) => r.scheduledHours),
    downtimeHours: sum((r) => r.downtimeHours),
    unplannedStopHours: sum((r) => r.unplannedStopHours),
    failures: sum((r) => r.failures),
    failureDowntimeHours: sum((r) => r.failureDowntimeHours),
    stopHours: Object.fromEntries(
      DOWNTIME_CATEGORIES.map((c) => [c, sum((r) => r.stopHours[c])]),
    ) as RawFigures['stopHours'],
  };
}

/** Index raw rows by `group|bucket`. */
export function indexRaw(rows: RawFigures[]): (groupId: string, bucket: string) => RawFigures {
  const map = new Map(rows.map((r) => [`${r.groupId}|${r.bucket}`, r]));
  return (groupId, bucket) => map.get(`${groupId}|${bucket}`) ?? emptyRaw(groupId, bucket);
}

/** Money rows by group, worked out once per list (a fleet-wide review asks for 1 500 saws' money in turn). */
const byGroup = new WeakMap<MoneyRow[], Map<string, MoneyRow[]>>();
function rowsOf(rows: MoneyRow[], groupId: string): MoneyRow[] {
  let index = byGroup.get(rows);
  if (!index) {
    index = new Map();
    for (const row of rows) {
      const list = index.get(row.groupId);
      if (list) list.push(row);
      else index.set(row.groupId, [row]);
    }
    byGroup.set(rows, index);
  }
  return index.get(groupId) ?? [];
}

/**
 * A group's money rows of one kind inside some months. A money row is itself a part (amount, currency, month), so
 * the rows are handed on as they are, not copied.
 */
export function moneyParts(
  rows: MoneyRow[],
  groupId: string | null,
  kind: MoneyRow['kind'],
  months: Set<Month>,
): MoneyPart[] {
  const parts: MoneyPart[] = [];
  for (const r of groupId === null ? rows : rowsOf(rows, groupId))
    if (r.kind === kind && months.has(r.month)) parts.push(r);
  return parts;
}

/** The figures of one group over the months of a bucket. `groupId` null: every group's money together. */
export function assembleFigures(
  raw: RawFigures,
  money: MoneyRow[],
  groupId: string | null,
  months: Month[],
  ctx: MoneyContext,
  missing?: UnconvertedPart[],
): Figures {
  const set = new Set(months);
  const spend = convertTotal(moneyParts(money, groupId, 'spend', set), ctx.reporting, ctx.rateOf);
  const finished = convertTotal(moneyParts(money, groupId, 'finished', set), ctx.reporting, ctx.rateOf);
  missing?.push(...spend.missing, ...finished.missing);
  const costPerArea =
    finished.complete && raw.areaCutMm2 > 0
      ? costPerAreaCut({ currency: ctx.reporting, costMinor: finished.amountMinor, areaCutMm2: raw.areaCutMm2 })
          .minorPerMm2
      : null;
  const uptimeHours = Math.max(0, raw.scheduledHours - raw.downtimeHours);
  return {
    bladesUsed: raw.bladesUsed,
    spend,
    bladesRemoved: raw.bladesRemoved,
    bladesWithArea: raw.bladesWithArea,
    areaCutMm2: raw.areaCutMm2,
    costPerAreaMinorPerMm2: costPerArea,
    costPerAreaComplete: finished.complete,
    meanLifeMm2: raw.meanLifeMm2,
    medianLifeMm2: raw.medianLifeMm2,
    meanCutsPerBlade: raw.meanCutsPerBlade,
    stopHours: raw.stopHours,
    scheduledHours: raw.scheduledHours,
    downtimeHours: raw.downtimeHours,
    uptimeHours,
    failures: raw.failures,
    failureDowntimeHours: raw.failureDowntimeHours,
    mtbfHours: raw.failures > 0 ? uptimeHours / raw.failures : null,
    mttrHours: raw.failures > 0 ? raw.failureDowntimeHours / raw.failures : null,
    operationalAvailability: raw.scheduledHours > 0 ? uptimeHours / raw.scheduledHours : null,
    breakInRecorded: raw.breakInRecorded,
    breakInFollowed: raw.breakInFollowed,
  };
}

/** Warnings for the rates a set of figures lacked, one line per currency. */
export function rateWarnings(missing: UnconvertedPart[], reporting: string): string[] {
  return missingRateWords(missing, reporting);
}

export const periodMonths = (p: MonthPeriod): Month[] => monthsOf(p);

/**
 * The sites the caller may read, in code order, with a mark slot each (`siteMarkSlots`): from the site's place
 * among all the company's sites in the order they were added, so every reader sees a site with the same colour and
 * shape, and slots are given over the caller's whole list (retired sites included) so a filter never repaints a site.
 * Only the place's count is read of sites outside the caller's scope. `only` narrows to the sites asked for; sites
 * retired before `activeFrom` are left out.
 */
/** How many of the company's sites were added before this one (sites added together in code order). */
const ADDED_PLACE = `(SELECT count(*)::int FROM sites o
  WHERE (o.created_at, o.code, o.id) < ("Site"."created_at", "Site"."code", "Site"."id"))`;

export async function fleetSites(
  ability: AppAbility,
  options: { only?: string[] | undefined; activeFrom?: Date } = {},
): Promise<FleetSite[]> {
  // Plain rows of the columns used: every fleet read starts here, and 60 model instances a request add up.
  const all = await Site.findAll({
    where: scopedWhere(ability, 'read', 'Site', Site),
    attributes: [
      'id',
      'code',
      'name',
      'regionId',
      'currency',
      'unitSystem',
      'timeZone',
      'retiredAt',
      [literal(ADDED_PLACE), 'place'],
    ],
    order: [
      ['code', 'ASC'],
      ['id', 'ASC'],
    ],
    raw: true,
  });
  const slots = siteMarkSlots(all.map((s) => (s as typeof s & { place: number }).place));
  return all
    .map((s, i) => ({ s, i: slots[i]! }))
    .filter(({ s }) => !options.only || options.only.includes(s.id))
    .filter(({ s }) => !s.retiredAt || !options.activeFrom || s.retiredAt.getTime() > options.activeFrom.getTime())
    .map(({ s, i }) => ({
      id: s.id,
      code: s.code,
      name: s.name,
      regionId: s.regionId,
      currency: s.currency.trim(),
      unitSystem: s.unitSystem,
      timeZone: s.timeZone,
      colourIndex: i,
    }));
}

/** One readable site by id, or null (the caller answers 404). */
export async function fleetSite(ability: AppAbility, siteId: string): Promise<FleetSite | null> {
  const sites = await fleetSites(ability);
  return sites.find((s) => s.id === siteId) ?? null;
}

/** The earliest instant a period can start anywhere (UTC−12 is the furthest behind). */
export function periodStartsBy(p: MonthPeriod): Date {
  return new Date(Date.parse(`${p.from}-01T00:00:00Z`) - 14 * 3_600_000);
}
