import { subject } from '@casl/ability';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { DOWNTIME_CATEGORIES } from '@kerfline/domain/metrics/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { minorUnitDigits } from '@kerfline/domain/money/currency';
import { DISPLAY_UNITS, largeAreaToDisplay, moneyPerAreaToDisplay } from '@kerfline/domain/units/display';
import type { OVERVIEW_TABLES, SITE_TABLES } from '@kerfline/domain/fleet/schema';
import type {
  Figures,
  FleetOverview,
  FleetRun,
  FleetSite,
  Practice,
  SawFigures,
  SiteFigures,
} from '@kerfline/domain/fleet/schema';
import { AppError } from '../../errors.js';
import type { CsvTable } from '../../http/csv.js';

/**
 * The fleet screens' tables as CSV, in the reader's unit system and the reporting currency, exactly the figures
 * the screen shows (the same service call feeds both). Numbers are unrounded in the stated unit, so a spreadsheet
 * can add them up; money is in major units (dollars, not cents).
 */

/** Every site in an export must be one the caller may export (managers, leads and site admins, in their scope). */
export function assertExportable(ability: AppAbility, sites: readonly Pick<FleetSite, 'id' | 'regionId'>[]): void {
  for (const site of sites)
    if (!ability.can('export', subject('Site', { id: site.id, regionId: site.regionId })))
      throw new AppError('FORBIDDEN', 'Your role does not export figures; ask a manager or your site admin');
}

export const money = (minor: number | null, currency: string): number | null =>
  minor === null ? null : minor / 10 ** minorUnitDigits(currency);

const area = (mm2: number | null, units: UnitSystem) =>
  mm2 === null ? null : largeAreaToDisplay(mm2, units, { decimals: 12 }).value;

const perArea = (minorPerMm2: number | null, currency: string, units: UnitSystem) =>
  minorPerMm2 === null ? null : (minorPerMm2 / 10 ** minorUnitDigits(currency)) * (units === 'imperial' ? 645.16 : 100);

const areaUnit = (units: UnitSystem) => DISPLAY_UNITS.largeArea[units].unit;
const perAreaUnit = (currency: string, units: UnitSystem) => moneyPerAreaToDisplay(1, currency, units).unit;

/** The columns every figures row carries, after its own leading columns. */
function figureColumns(currency: string, units: UnitSystem): string[] {
  return [
    `Blade spend (${currency})`,
    'Spend complete (all rates known)',
    'Blades used',
    'Blades finished',
    'Finished with area recorded',
    `Area cut (${areaUnit(units)})`,
    `Cost per area (${perAreaUnit(currency, units)})`,
    `Mean blade life (${areaUnit(units)} per blade)`,
    `Median blade life (${areaUnit(units)} per blade)`,
    'Mean cuts per blade',
    'Scheduled hours',
    'Stop hours',
    'Failures',
    'MTBF (h)',
    'MTTR (h)',
    'Operational availability (%)',
    'Break-in recorded',
    'Break-in followed',
  ];
}

function figureCells(f: Figures, currency: string, units: UnitSystem): unknown[] {
  return [
    money(f.spend.amountMinor, currency),
    f.spend.complete,
    f.bladesUsed,
    f.bladesRemoved,
    f.bladesWithArea,
    area(f.areaCutMm2, units),
    perArea(f.costPerAreaMinorPerMm2, currency, units),
    area(f.meanLifeMm2, units),
    area(f.medianLifeMm2, units),
    f.meanCutsPerBlade,
    f.scheduledHours,
    f.downtimeHours,
    f.failures,
    f.mtbfHours,
    f.mttrHours,
    f.operationalAvailability === null ? null : f.operationalAvailability * 100,
    f.breakInRecorded,
    f.breakInFollowed,
  ];
}

export function overviewTable(o: FleetOverview, table: (typeof OVERVIEW_TABLES)[number], units: UnitSystem): CsvTable {
  const cur = o.reportingCurrency;
  switch (table) {
    case 'sites':
      return {
        header: ['Site code', 'Site', 'Period', ...figureColumns(cur, units)],
        rows: o.sites.flatMap((s) => [
          [s.site.code, s.site.name, `${o.period.from} to ${o.period.to}`, ...figureCells(s.current, cur, units)],
          [s.site.code, s.site.name, `${o.previous.from} to ${o.previous.to}`, ...figureCells(s.previous, cur, units)],
        ]),
      };
    case 'months': {
      const code = new Map(o.sites.map((s) => [s.site.id, s.site]));
      return {
        header: ['Site code', 'Site', 'Month', ...figureColumns(cur, units)],
        rows: o.months.map((m) => [
          code.get(m.siteId)!.code,
          code.get(m.siteId)!.name,
          m.month,
          ...figureCells(m.figures, cur, units),
        ]),
      };
    }
    case 'stop-hours':
      return {
        header: [
          'Site code',
          'Site',
          ...DOWNTIME_CATEGORIES.map((c) => `${STOP_CATEGORY_LABELS[c]} (h)`),
          'All stops (h)',
        ],
        rows: o.sites.map((s) => [
          s.site.code,
          s.site.name,
          ...DOWNTIME_CATEGORIES.map((c) => s.current.stopHours[c]),
          s.current.downtimeHours,
        ]),
      };
    case 'blade-life':
      return {
        header: [
          'Site code',
          'Site',
          'Blades finished with area',
          `Mean blade life (${areaUnit(units)} per blade)`,
          `Median blade life (${areaUnit(units)} per blade)`,
          'Mean cuts per blade',
        ],
        rows: o.sites.map((s) => [
          s.site.code,
          s.site.name,
          s.current.bladesWithArea,
          area(s.current.meanLifeMm2, units),
          area(s.current.medianLifeMm2, units),
          s.current.meanCutsPerBlade,
        ]),
      };
  }
}

export function siteTable(s: SiteFigures, table: (typeof SITE_TABLES)[number], units: UnitSystem): CsvTable {
  const cur = s.reportingCurrency;
  if (table === 'months')
    return {
      header: ['Site code', 'Month', ...figureColumns(cur, units)],
      rows: s.months.map((m) => [s.site.code, m.month, ...figureCells(m.figures, cur, units)]),
    };
  return {
    header: ['Site code', 'Asset tag', 'Saw', 'Kind', 'Main material', ...figureColumns(cur, units)],
    rows: s.saws.map((w) => [
      s.site.code,
      w.saw.assetTag,
      w.saw.name,
      w.saw.kind,
      w.saw.mainMaterial ? MATERIAL_GROUP_LABELS[w.saw.mainMaterial] : null,
      ...figureCells(w.figures, cur, units),
    ]),
  };
}

export function sawTable(s: SawFigures, table: 'months' | 'reasons', units: UnitSystem): CsvTable {
  const cur = s.reportingCurrency;
  if (table === 'months')
    return {
      header: ['Asset tag', 'Month', ...figureColumns(cur, units)],
      rows: s.months.map((m) => [s.saw.assetTag, m.month, ...figureCells(m.figures, cur, units)]),
    };
  return {
    header: ['Asset tag', 'Reason taken off', 'Blades'],
    rows: Object.entries(s.removalReasons)
      .filter(([, n]) => n > 0)
      .map(([reason, n]) => [s.saw.assetTag, REMOVAL_REASON_LABELS[reason as keyof typeof REMOVAL_REASON_LABELS], n]),
  };
}

export function runHeader(units: UnitSystem): string[] {
  return [
    'Run id',
    'Blade spec',
    'Put on',
    'Taken off',
    'Reason',
    `Area cut (${areaUnit(units)})`,
    'Cuts',
    'Cost',
    'Currency',
    'Break-in followed',
    'Material',
  ];
}

export function runCells(r: FleetRun, units: UnitSystem): unknown[] {
  return [
    r.id,
    r.bladeSpecName,
    r.installedAt,
    r.removedAt,
    r.removalReason ? REMOVAL_REASON_LABELS[r.removalReason] : null,
    area(r.areaCutMm2, units),
    r.cuts,
    money(r.costMinor, r.currency),
    r.currency,
    r.breakInFollowed,
    r.materialGroup ? MATERIAL_GROUP_LABELS[r.materialGroup] : null,
  ];
}

export function practiceTable(p: Practice, units: UnitSystem): CsvTable {
  return {
    header: [
      'Site code',
      'Site',
      'Blades with break-in recorded',
      'Break-in followed',
      'Break-in followed (%)',
      `Median life, break-in followed (${areaUnit(units)})`,
      `Median life, break-in skipped (${areaUnit(units)})`,
      'Checks due',
      'Checks on time',
      'Checks on time (%)',
      `Median life, blade-change checks on time (${areaUnit(units)})`,
      `Median life, blade-change checks late (${areaUnit(units)})`,
    ],
    rows: p.sites.map((s) => [
      s.site.code,
      s.site.name,
      s.breakInRecorded,
      s.breakInFollowed,
      s.breakInShare === null ? null : s.breakInShare * 100,
      area(s.medianLifeFollowedMm2, units),
      area(s.medianLifeSkippedMm2, units),
      s.checksDue,
      s.checksOnTime,
      s.checksOnTimeShare === null ? null : s.checksOnTimeShare * 100,
      area(s.medianLifeChecksOnTimeMm2, units),
      area(s.medianLifeChecksLateMm2, units),
    ]),
  };
}
