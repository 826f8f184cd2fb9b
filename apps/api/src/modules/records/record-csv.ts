import type { BladeRun } from '@kerfline/domain/blade-runs/schema';
import type { StockMovement } from '@kerfline/domain/blade-stock/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { CAUSES } from '@kerfline/domain/diagnosis/likely-causes';
import { minorUnitDigits } from '@kerfline/domain/money/currency';
import type { CheckQuantity, CheckRecord } from '@kerfline/domain/site-checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { STOP_CATEGORY_LABELS, type Stop } from '@kerfline/domain/stops/schema';
import { DISPLAY_UNITS, quantityToDisplay, type DisplayQuantityKind } from '@kerfline/domain/units/display';

/**
 * A site's record tables as CSV rows, in the unit system asked for (the site's own by default) with the unit in
 * each header. Numbers are unrounded in the stated unit so a spreadsheet can add them up; money is in major units
 * beside its currency; times are ISO 8601 in UTC, which every spreadsheet reads the same way.
 */

/** A quantity stored in SI, in the display unit of `units`, unrounded; null stays empty. */
const inUnits = (kind: DisplayQuantityKind, si: number | null, units: UnitSystem): number | null =>
  si === null ? null : quantityToDisplay(kind, si, units, { decimals: 12 }).value;

const unitOf = (kind: DisplayQuantityKind, units: UnitSystem) => DISPLAY_UNITS[kind][units].unit;

const money = (minor: number, currency: string) => minor / 10 ** minorUnitDigits(currency);

export function bladeRunHeader(units: UnitSystem): string[] {
  return [
    'Run id',
    'Saw',
    'Blade spec',
    'Put on (UTC)',
    'Put on by',
    `Tension (${unitOf('stress', units)})`,
    'Material',
    'Break-in followed',
    'Cost',
    'Currency',
    'Taken off (UTC)',
    'Taken off by',
    'Why it came off',
    `Area cut (${unitOf('area', units)})`,
    'Cuts',
    'Area from',
    'Confirmed cause',
    'Notes when put on',
    'Notes when taken off',
    'Photos',
  ];
}

export function bladeRunCells(r: BladeRun, units: UnitSystem): unknown[] {
  return [
    r.id,
    r.sawAssetTag,
    r.bladeSpecName,
    r.installedAt,
    r.installedByName,
    // Tension is kept in MPa; the display policy takes pascals.
    inUnits('stress', r.tensionMpa === null ? null : r.tensionMpa * 1e6, units),
    r.materialGroup ? MATERIAL_GROUP_LABELS[r.materialGroup] : null,
    r.breakInFollowed,
    money(r.costMinor, r.currency),
    r.currency,
    r.removedAt,
    r.removedByName,
    r.removalReason ? REMOVAL_REASON_LABELS[r.removalReason] : null,
    inUnits('area', r.areaCutMm2, units),
    r.cuts,
    r.areaSource === null ? null : r.areaSource === 'cut_logs' ? 'cut logs' : 'entered',
    r.confirmedCause ? CAUSES[r.confirmedCause].label : null,
    r.installNotes,
    r.removalNotes,
    r.photoCount,
  ];
}

export const STOP_HEADER = [
  'Stop id',
  'Saw',
  'Category',
  'Planned',
  'Started (UTC)',
  'Ended (UTC)',
  'Duration (h; to the export for a stop still going on)',
  'Logged by',
  'Notes',
] as const;

export function stopCells(s: Stop): unknown[] {
  return [
    s.id,
    s.sawAssetTag,
    STOP_CATEGORY_LABELS[s.category],
    s.planned,
    s.startedAt,
    s.endedAt,
    s.durationMin / 60,
    s.createdByName,
    s.notes,
  ];
}

/**
 * How a check's figures show, as on screen: a length read with feelers in thousandths of an inch or hundredths of
 * a millimetre, a force in lbf or N, a stress or pressure in psi or MPa. Stored in mm, N and MPa.
 */
const CHECK_SHOWN: Record<Exclude<CheckQuantity, 'condition'>, { kind: DisplayQuantityKind; toSi: number }> = {
  length: { kind: 'smallLength', toSi: 1 },
  force: { kind: 'force', toSi: 1 },
  stress: { kind: 'stress', toSi: 1e6 },
};

/**
 * Checks of different kinds read different quantities, so one column cannot carry one unit: the reading, target
 * and limits are in the row's `Unit`, which the headers say.
 */
export const CHECK_RECORD_HEADER = [
  'Record id',
  'Saw',
  'Check',
  'Checked (UTC)',
  'Checked by',
  'Reading (in Unit)',
  'Target (in Unit)',
  'Least (in Unit)',
  'Most (in Unit)',
  'Unit',
  'Brush reaches the gullets',
  'Brush worn',
  'Passed',
  'Target and verdict as shown',
  'Notes',
  'Photos',
] as const;

export function checkRecordCells(c: CheckRecord, units: UnitSystem): unknown[] {
  const shown = c.quantity === 'condition' ? null : CHECK_SHOWN[c.quantity];
  const figure = (v: number | null) => (shown && v !== null ? inUnits(shown.kind, v * shown.toSi, units) : null);
  return [
    c.id,
    c.sawAssetTag,
    c.checkName,
    c.checkedAt,
    c.checkedByName,
    figure(c.reading),
    figure(c.target),
    figure(c.min),
    figure(c.max),
    shown ? unitOf(shown.kind, units) : null,
    c.answers?.reachesGullets ?? null,
    c.answers?.worn ?? null,
    c.passed,
    c.explanation,
    c.notes,
    c.photoCount,
  ];
}

export const STOCK_MOVEMENT_HEADER = [
  'When (UTC)',
  'Movement',
  'Blade spec',
  'Blades (+ received, − drawn)',
  'Delivery reference',
  'Saw',
  'Blade run id',
  'Unit cost',
  'Currency',
] as const;

export function stockMovementCells(m: StockMovement): unknown[] {
  return [
    m.at,
    m.kind === 'receipt' ? 'received' : 'drawn for a blade',
    m.bladeSpecName,
    m.quantity,
    m.reference,
    m.sawAssetTag,
    m.bladeRunId,
    money(m.unitCostMinor, m.currency),
    m.currency,
  ];
}
