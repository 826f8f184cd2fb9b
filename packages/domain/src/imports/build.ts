import type { z } from 'zod';
import { sawCreateSchema, type SawCreateParsed } from '../saws/schema.js';
import { stockReceiptCreateSchema } from '../blade-stock/schema.js';
import { bladeRunInstallSchema, bladeRunRemoveSchema } from '../blade-runs/schema.js';
import { stopCreateSchema } from '../stops/schema.js';
import { checkRecordCreateSchema, type CheckAnswers, type CheckQuantity } from '../site-checks/schema.js';
import { centreDistanceForBandLengthMm } from '../band/band-length.js';
import type { RemovalReason } from '../diagnosis/schema.js';
import type { MaterialGroup } from '../band-speed/schema.js';
import type { DowntimeCategory } from '../metrics/schema.js';
import { IMPORT_FIELDS, type ImportField, type ImportKind } from './fields.js';
import type { ImportPlan, RowIssue } from './schema.js';
import { UNITS, defaultUnit, unitFromText } from './units.js';
import {
  cellText,
  normaliseWord,
  parseWallTime,
  readDate,
  readMoney,
  readNumber,
  readQuantity,
  wallTimeToInstant,
  type Cell,
  type Read,
} from './values.js';
import { looseKey, matchSaw, matchSpec, suggestChoice, type SawRef } from './suggest.js';

/**
 * Turning one row of a legacy file into the record Kerfline stores, through the domain's own create schemas
 * (the same ones the forms and the API use), and screening a whole file for rows that repeat or overlap each
 * other. Runs unchanged in the browser (preview) and on the server (commit).
 */

/** The site a file is brought into, with what rows may name. */
export type ImportTarget = {
  siteId: string;
  timeZone: string;
  currency: string;
  saws: readonly SawRef[];
  specs: readonly { id: string; name: string; unitCostMinor: number; currency: string; archived: boolean }[];
  /** The site's list of checks (check sheets only). */
  checks?: readonly { id: string; name: string; quantity: CheckQuantity; retired: boolean }[];
  /** Readings without a unit are in the site's units. */
  unitSystem?: 'metric' | 'imperial';
};

export type ImportedSaw = SawCreateParsed;
export type ImportedReceipt = {
  bladeSpecId: string;
  quantity: number;
  unitCostMinor: number;
  currency: string;
  receivedOn: string;
  reference: string | null;
  notes: string | null;
};
export type ImportedRun = {
  sawId: string;
  bladeSpecId: string;
  installedAt: Date;
  removedAt: Date | null;
  removalReason: RemovalReason | null;
  tensionMpa: number | null;
  materialGroup: MaterialGroup | null;
  breakInFollowed: boolean | null;
  installNotes: string | null;
  areaCutMm2: number | null;
  cuts: number | null;
  removalNotes: string | null;
  costMinor: number;
  currency: string;
};
export type ImportedStop = {
  sawId: string;
  startedAt: Date;
  endedAt: Date | null;
  category: DowntimeCategory;
  planned: boolean;
  notes: string | null;
};

export type ImportedCheck = {
  sawId: string;
  siteCheckId: string;
  checkedAt: Date;
  /** In the check's SI unit (mm, N, MPa); null for a condition check. */
  reading: number | null;
  answers: CheckAnswers | null;
  notes: string | null;
};

export type ImportedRecord = ImportedSaw | ImportedReceipt | ImportedRun | ImportedStop | ImportedCheck;

export type BuiltRow<R = ImportedRecord> = {
  rowNumber: number;
  /** The record to store, or null when the row has errors. */
  record: R | null;
  /** The natural key: two rows with the same key are the same record. */
  key: string | null;
  issues: RowIssue[];
  /** Each mapped field as it will be stored, in words. */
  display: Record<string, string | null>;
};

/** A written saw, spec or category value nothing matched, by field and its plan key. */
export type UnmatchedTally = Map<string, { field: string; written: string; key: string; rows: number }>;

type FieldValue = string | number | boolean | Date | null;

const round = (n: number) => Number(n.toPrecision(6)).toString();
/** How a stored moment reads in the preview: `2023-01-09 12:10 UTC`. */
const utcText = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

type MappedColumn = { index: number; header: string; unit: string | null; field: ImportField };

/**
 * The plan's mapped columns with their fields, and which column each field came from, worked out once per plan:
 * a file of 100 000 rows would otherwise redo it for every row.
 */
const mappedColumns = new WeakMap<ImportPlan, { mapped: MappedColumn[]; columnOf: Map<string, string> }>();
function columnsOf(kind: ImportKind, plan: ImportPlan) {
  let found = mappedColumns.get(plan);
  if (!found) {
    const fields = IMPORT_FIELDS[kind];
    const mapped: MappedColumn[] = [];
    plan.columns.forEach((column, index) => {
      const field = column.field ? fields.find((x) => x.key === column.field) : undefined;
      if (field) mapped.push({ index, header: column.header, unit: column.unit, field });
    });
    found = { mapped, columnOf: new Map(mapped.map((m) => [m.field.key, m.header])) };
    mappedColumns.set(plan, found);
  }
  return found;
}

/** Reads each mapped cell of a row into field values, collecting issues and unmatched words. */
function readFields(
  kind: ImportKind,
  cells: readonly Cell[],
  rowNumber: number,
  plan: ImportPlan,
  target: ImportTarget,
  unmatched: UnmatchedTally | null,
  wantDisplay: boolean,
) {
  const values = new Map<string, FieldValue>();
  const display: Record<string, string | null> = {};
  const issues: RowIssue[] = [];
  const { mapped, columnOf } = columnsOf(kind, plan);

  for (const { index, header, unit, field } of mapped) {
    const cell = cells[index] ?? null;
    const r = readCell(field, cell, unit, plan, target, wantDisplay);
    if (!r.ok) {
      issues.push({
        rowNumber,
        column: header,
        field: field.key,
        level: 'error',
        message: `${field.label}: ${r.message}`,
      });
      if (r.unmatched && unmatched) {
        const tallyKey = `${field.key}|${r.unmatched.key}`;
        const t = unmatched.get(tallyKey);
        if (t) t.rows += 1;
        else unmatched.set(tallyKey, { field: field.key, written: r.unmatched.written, key: r.unmatched.key, rows: 1 });
      }
      if (wantDisplay) display[field.key] = cellText(cell);
      continue;
    }
    if (r.warning)
      issues.push({
        rowNumber,
        column: header,
        field: field.key,
        level: 'warning',
        message: `${field.label}: ${r.warning}`,
      });
    values.set(field.key, r.value);
    if (wantDisplay) display[field.key] = r.display;
  }
  return { values, display, issues, columnOf };
}

type CellRead =
  | { ok: true; value: FieldValue; display: string | null; warning?: string }
  | { ok: false; message: string; unmatched?: { written: string; key: string } };

function readCell(
  field: ImportField,
  cell: Cell,
  unit: string | null,
  plan: ImportPlan,
  target: ImportTarget,
  wantDisplay: boolean,
): CellRead {
  // Words for the preview are made only for the rows it shows: a file of 100 000 rows needs 20 of them.
  const pass = <T extends FieldValue>(r: Read<T>, show: (v: NonNullable<T>) => string | null): CellRead =>
    r.ok
      ? { ok: true, value: r.value, display: r.value === null || !wantDisplay ? null : show(r.value as NonNullable<T>) }
      : r;
  switch (field.type) {
    case 'text':
    case 'notes':
    case 'currency': {
      const t = cellText(cell);
      return { ok: true, value: t, display: t };
    }
    case 'quantity': {
      const q = field.quantity!;
      return pass(
        readQuantity(cell, q, unit ?? UNITS[q].options[0]!.id, plan.decimalMark),
        (v) => `${round(v)} ${UNITS[q].stored}`,
      );
    }
    case 'integer':
      return pass(readNumber(cell, plan.decimalMark), (v) => String(v));
    case 'money':
      return pass(readMoney(cell, target.currency, plan.decimalMark), (v) => `${v} minor units ${target.currency}`);
    case 'date':
      return pass(readDate(cell, plan.dateOrder), (v) => v);
    case 'datetime': {
      const r = parseWallTime(cell, plan.dateOrder);
      if (!r.ok) return r;
      if (r.value === null) return { ok: true, value: null, display: null };
      const at = wallTimeToInstant(r.value, target.timeZone);
      const warning =
        typeof cell === 'number' ? `${cell} was read as a spreadsheet date: ${at.toISOString()}` : undefined;
      return { ok: true, value: at, display: wantDisplay ? utcText(at) : null, ...(warning ? { warning } : {}) };
    }
    case 'choice': {
      const t = cellText(cell);
      if (t === null) return { ok: true, value: null, display: null };
      const key = normaliseWord(t);
      const chosen = plan.values[field.key]?.[key] ?? suggestChoice(field.choice!, t);
      if (!chosen || !field.choice!.values.includes(chosen))
        return {
          ok: false,
          message: `“${t}” is not one of ${field.choice!.values.map((v) => field.choice!.labels[v]).join(', ')}; say what it means in the value step`,
          unmatched: { written: t, key },
        };
      return { ok: true, value: chosen, display: field.choice!.labels[chosen] ?? chosen };
    }
    case 'saw': {
      const t = cellText(cell);
      if (t === null) return { ok: true, value: null, display: null };
      const key = looseKey(t);
      const chosenId = plan.values[field.key]?.[key];
      const saw = chosenId ? target.saws.find((s) => s.id === chosenId) : matchSaw(target.saws, t);
      if (!saw) return { ok: false, message: `no saw of this site is called “${t}”`, unmatched: { written: t, key } };
      if (saw.retired)
        return { ok: false, message: `saw ${saw.assetTag} is retired; its records are kept as they are` };
      return { ok: true, value: saw.id, display: `${saw.assetTag} · ${saw.name}` };
    }
    case 'check': {
      const t = cellText(cell);
      if (t === null) return { ok: true, value: null, display: null };
      const key = looseKey(t);
      const chosenId = plan.values[field.key]?.[key];
      const checks = target.checks ?? [];
      const check = chosenId
        ? checks.find((c) => c.id === chosenId)
        : (checks.find((c) => !c.retired && looseKey(c.name) === key) ?? checks.find((c) => looseKey(c.name) === key));
      if (!check)
        return { ok: false, message: `no check on this site’s list is called “${t}”`, unmatched: { written: t, key } };
      if (check.retired) return { ok: false, message: `“${check.name}” is retired from the site’s list` };
      return { ok: true, value: check.id, display: check.name };
    }
    case 'reading': {
      // Read once the row's check says what it measures.
      const t = typeof cell === 'number' ? cell : cellText(cell);
      return { ok: true, value: t, display: t === null ? null : String(t) };
    }
    case 'spec': {
      const t = cellText(cell);
      if (t === null) return { ok: true, value: null, display: null };
      const key = looseKey(t);
      const chosenId = plan.values[field.key]?.[key];
      const spec = chosenId ? target.specs.find((s) => s.id === chosenId) : matchSpec(target.specs, t);
      if (!spec)
        return {
          ok: false,
          message: `no blade spec of this site’s catalogue is called “${t}”`,
          unmatched: { written: t, key },
        };
      return { ok: true, value: spec.id, display: spec.name };
    }
  }
}

/** Zod's issues as row issues, each on the column its field came from. */
function schemaIssues(
  error: z.ZodError,
  rowNumber: number,
  kind: ImportKind,
  columnOf: Map<string, string>,
  pathToField: Record<string, string>,
): RowIssue[] {
  return error.issues.map((i) => {
    const path = String(i.path[0] ?? '');
    const fieldKey = pathToField[path] ?? path;
    const field = IMPORT_FIELDS[kind].find((x) => x.key === fieldKey);
    const label = field?.label ?? fieldKey;
    const message =
      i.message === 'is required'
        ? `${label}: a value is needed`
        : i.message.startsWith(label)
          ? i.message
          : `${label}: ${i.message}`;
    return {
      rowNumber,
      column: columnOf.get(fieldKey) ?? null,
      field: field ? fieldKey : null,
      level: 'error' as const,
      message,
    };
  });
}

const str = (v: FieldValue | undefined) => (typeof v === 'string' ? v : null);
const num = (v: FieldValue | undefined) => (typeof v === 'number' ? v : null);
const date = (v: FieldValue | undefined) => (v instanceof Date ? v : null);
const yes = (v: FieldValue | undefined) => (v === 'yes' ? true : v === 'no' ? false : null);

/** Builds one row of a file into the record it stands for. `unmatched` collects unknown saws, specs and words. */
export function buildRow(
  kind: ImportKind,
  cells: readonly Cell[],
  rowNumber: number,
  plan: ImportPlan,
  target: ImportTarget,
  unmatched: UnmatchedTally | null = null,
  options: { display?: boolean } = {},
): BuiltRow {
  const read = readFields(kind, cells, rowNumber, plan, target, unmatched, options.display ?? true);
  const { values, display, columnOf } = read;
  const issues = [...read.issues];
  const result = (record: ImportedRecord | null, key: string | null): BuiltRow => ({
    rowNumber,
    record: issues.some((i) => i.level === 'error') ? null : record,
    key: issues.some((i) => i.level === 'error') ? null : key,
    issues,
    display,
  });
  if (read.issues.some((i) => i.level === 'error')) return result(null, null);

  switch (kind) {
    case 'saws': {
      let centre = num(values.get('centreDistanceMm'));
      const band = num(values.get('bandLengthMm'));
      const wheel = num(values.get('wheelDiameterMm'));
      if (centre === null && band !== null && wheel !== null) {
        try {
          centre = centreDistanceForBandLengthMm({
            bandLengthMm: band,
            driveWheelDiameterMm: wheel,
            idlerWheelDiameterMm: wheel,
          });
          display.centreDistanceMm = `${round(centre)} mm`;
          issues.push({
            rowNumber,
            column: null,
            field: 'centreDistanceMm',
            level: 'warning',
            message: `Centre distance worked out from the band length and wheel diameter (equal wheels): ${round(centre)} mm`,
          });
        } catch (e) {
          issues.push({
            rowNumber,
            column: columnOf.get('bandLengthMm') ?? null,
            field: 'bandLengthMm',
            level: 'error',
            message: (e as Error).message,
          });
          return result(null, null);
        }
      }
      const parsed = sawCreateSchema.safeParse({
        siteId: target.siteId,
        assetTag: str(values.get('assetTag')) ?? undefined,
        name: str(values.get('name')) ?? undefined,
        kind: str(values.get('kind')) ?? undefined,
        ...(values.get('headFeed') ? { headFeed: values.get('headFeed') } : {}),
        make: str(values.get('make')),
        model: str(values.get('model')),
        wheelDiameterMm: wheel ?? undefined,
        centreDistanceMm: centre ?? undefined,
        bandWidthMm: num(values.get('bandWidthMm')) ?? undefined,
        bandThicknessMm: num(values.get('bandThicknessMm')) ?? undefined,
        bandLengthMm: band ?? undefined,
        bandSpeedMinMPerMin: num(values.get('bandSpeedMinMPerMin')) ?? undefined,
        bandSpeedMaxMPerMin: num(values.get('bandSpeedMaxMPerMin')) ?? undefined,
        capacityRoundMm: num(values.get('capacityRoundMm')),
        capacityRectWidthMm: num(values.get('capacityRectWidthMm')),
        capacityRectHeightMm: num(values.get('capacityRectHeightMm')),
      });
      if (!parsed.success) {
        issues.push(...schemaIssues(parsed.error, rowNumber, kind, columnOf, {}));
        return result(null, null);
      }
      return result(parsed.data, `saw|${parsed.data.assetTag.toLowerCase()}`);
    }
    case 'blade_stock': {
      const currency = str(values.get('currency'))?.toUpperCase() ?? target.currency;
      if (currency !== target.currency) {
        issues.push({
          rowNumber,
          column: columnOf.get('currency') ?? null,
          field: 'currency',
          level: 'error',
          message: `Currency: ${currency} is not the site’s currency (${target.currency}); convert the cost first`,
        });
        return result(null, null);
      }
      const parsed = stockReceiptCreateSchema.safeParse({
        siteId: target.siteId,
        bladeSpecId: str(values.get('spec')) ?? undefined,
        quantity: num(values.get('quantity')) ?? undefined,
        unitCostMinor: num(values.get('unitCost')) ?? undefined,
        currency,
        receivedOn: str(values.get('receivedOn')) ?? undefined,
        reference: str(values.get('reference')),
        notes: str(values.get('notes')),
      });
      if (!parsed.success) {
        issues.push(
          ...schemaIssues(parsed.error, rowNumber, kind, columnOf, { bladeSpecId: 'spec', unitCostMinor: 'unitCost' }),
        );
        return result(null, null);
      }
      const d = parsed.data;
      const record: ImportedReceipt = {
        bladeSpecId: d.bladeSpecId,
        quantity: d.quantity,
        unitCostMinor: d.unitCostMinor,
        currency: d.currency ?? target.currency,
        receivedOn: d.receivedOn,
        reference: d.reference,
        notes: d.notes,
      };
      const key = [
        'receipt',
        record.bladeSpecId,
        record.receivedOn,
        record.quantity,
        record.unitCostMinor,
        record.currency,
        (record.reference ?? '').toLowerCase(),
      ].join('|');
      return result(record, key);
    }
    case 'blade_runs': {
      const installedAt = date(values.get('installedAt'));
      const removedAt = date(values.get('removedAt'));
      const reason = str(values.get('reason'));
      const install = bladeRunInstallSchema.safeParse({
        sawId: str(values.get('saw')) ?? undefined,
        bladeSpecId: str(values.get('spec')) ?? undefined,
        installedAt: installedAt?.toISOString(),
        tensionMpa: num(values.get('tensionMpa')),
        materialGroup: str(values.get('materialGroup')),
        breakInFollowed: yes(values.get('breakInFollowed')),
        notes: str(values.get('notes')),
      });
      const map = { sawId: 'saw', bladeSpecId: 'spec' };
      if (!installedAt)
        issues.push({
          rowNumber,
          column: columnOf.get('installedAt') ?? null,
          field: 'installedAt',
          level: 'error',
          message: 'Put on: a date is needed',
        });
      if (!install.success)
        issues.push(
          ...schemaIssues(install.error, rowNumber, kind, columnOf, map).filter(
            (i) => i.field !== 'installedAt' || installedAt,
          ),
        );
      const area = num(values.get('areaCutMm2'));
      const cuts = num(values.get('cuts'));
      const removalNotes = str(values.get('removalNotes'));
      let removal: z.output<typeof bladeRunRemoveSchema> | null = null;
      if (removedAt || reason) {
        if (!removedAt)
          issues.push({
            rowNumber,
            column: columnOf.get('removedAt') ?? null,
            field: 'removedAt',
            level: 'error',
            message: 'Taken off: a reason is given but no date; give the date the blade came off',
          });
        const parsed = bladeRunRemoveSchema.safeParse({
          removedAt: removedAt?.toISOString() ?? new Date().toISOString(),
          reason: reason ?? undefined,
          areaCutMm2: area,
          cuts,
          notes: removalNotes,
        });
        if (!parsed.success) {
          issues.push(
            ...schemaIssues(parsed.error, rowNumber, kind, columnOf, { notes: 'removalNotes' }).map((i) =>
              i.field === 'reason' && reason === null
                ? { ...i, message: 'Why taken off: a blade that came off needs a reason' }
                : i,
            ),
          );
        } else removal = parsed.data;
        if (removedAt && installedAt && removedAt.getTime() < installedAt.getTime())
          issues.push({
            rowNumber,
            column: columnOf.get('removedAt') ?? null,
            field: 'removedAt',
            level: 'error',
            message: 'Taken off: the date is before the blade was put on',
          });
      } else if (area !== null || cuts !== null || removalNotes !== null) {
        issues.push({
          rowNumber,
          column: columnOf.get(area !== null ? 'areaCutMm2' : cuts !== null ? 'cuts' : 'removalNotes') ?? null,
          field: area !== null ? 'areaCutMm2' : cuts !== null ? 'cuts' : 'removalNotes',
          level: 'error',
          message:
            'Area cut, cuts and removal notes belong to a blade that came off, but this row has no date taken off',
        });
      }
      if (!install.success || issues.some((i) => i.level === 'error')) return result(null, null);
      const i = install.data;
      const spec = target.specs.find((s) => s.id === i.bladeSpecId)!;
      const cost = num(values.get('cost'));
      const record: ImportedRun = {
        sawId: i.sawId,
        bladeSpecId: i.bladeSpecId,
        installedAt: i.installedAt!,
        removedAt: removal?.removedAt ?? null,
        removalReason: removal?.reason ?? null,
        tensionMpa: i.tensionMpa,
        materialGroup: i.materialGroup,
        breakInFollowed: i.breakInFollowed,
        installNotes: i.notes,
        areaCutMm2: removal?.areaCutMm2 ?? null,
        cuts: removal?.cuts ?? null,
        removalNotes: removal?.notes ?? null,
        costMinor: cost ?? spec.unitCostMinor,
        currency: cost !== null ? target.currency : spec.currency.trim(),
      };
      return result(record, `run|${record.sawId}|${record.installedAt.toISOString()}`);
    }
    case 'stops': {
      const startedAt = date(values.get('startedAt'));
      let endedAt = date(values.get('endedAt'));
      const minutes = num(values.get('duration'));
      if (!endedAt && minutes !== null && startedAt) {
        endedAt = new Date(startedAt.getTime() + Math.round(minutes * 60_000));
        display.endedAt = utcText(endedAt);
      }
      if (!startedAt)
        issues.push({
          rowNumber,
          column: columnOf.get('startedAt') ?? null,
          field: 'startedAt',
          level: 'error',
          message: 'Start: a date and time is needed',
        });
      const parsed = stopCreateSchema.safeParse({
        sawId: str(values.get('saw')) ?? undefined,
        startedAt: startedAt?.toISOString(),
        endedAt: endedAt?.toISOString() ?? null,
        category: str(values.get('category')) ?? undefined,
        planned: yes(values.get('planned')) ?? false,
        notes: str(values.get('notes')),
      });
      if (!parsed.success) {
        issues.push(
          ...schemaIssues(parsed.error, rowNumber, kind, columnOf, { sawId: 'saw' })
            .filter((i) => i.field !== 'startedAt' || startedAt)
            .map((i) =>
              i.field === 'endedAt' && !columnOf.has('endedAt')
                ? { ...i, column: columnOf.get('duration') ?? null, field: 'duration' }
                : i,
            ),
        );
      }
      if (!parsed.success || issues.some((x) => x.level === 'error')) return result(null, null);
      const d = parsed.data;
      const record: ImportedStop = {
        sawId: d.sawId,
        startedAt: d.startedAt!,
        endedAt: d.endedAt,
        category: d.category,
        planned: d.planned,
        notes: d.notes,
      };
      return result(record, `stop|${record.sawId}|${record.startedAt.toISOString()}`);
    }
    case 'checks': {
      const checkedAt = date(values.get('checkedAt'));
      const check = (target.checks ?? []).find((c) => c.id === values.get('check'));
      const raw = values.get('reading');
      let reading: number | null = null;
      const problem = (key: string, message: string) =>
        issues.push({ rowNumber, column: columnOf.get(key) ?? null, field: key, level: 'error', message });
      if (!checkedAt) problem('checkedAt', 'Checked at: a date and time is needed');
      if (check && check.quantity !== 'condition') {
        if (raw === null || raw === undefined) problem('reading', `Reading: ${check.name} needs a reading`);
        else {
          const quantity = check.quantity;
          const unitText = str(values.get('readingUnit'));
          const unit = unitText ? unitFromText(quantity, unitText) : undefined;
          if (unitText && !unit)
            problem(
              'readingUnit',
              `Unit of the reading: “${unitText}” is not a unit of ${quantity} (${UNITS[quantity].options.map((o) => o.label).join(', ')})`,
            );
          else {
            const r = readQuantity(
              raw as Cell,
              quantity,
              unit?.id ?? defaultUnit(quantity, target.unitSystem ?? 'metric'),
              plan.decimalMark,
            );
            if (!r.ok) problem('reading', `Reading: ${r.message}`);
            else {
              reading = r.value;
              if (reading !== null) display.reading = `${round(reading)} ${UNITS[quantity].stored}`;
            }
          }
        }
      }
      let answers: CheckAnswers | null = null;
      if (check?.quantity === 'condition') {
        const reaches = yes(values.get('reachesGullets'));
        const worn = yes(values.get('brushWorn'));
        if (reaches === null || worn === null)
          problem(
            reaches === null ? 'reachesGullets' : 'brushWorn',
            `${check.name}: say yes or no to both “brush reaches the gullets” and “brush worn”`,
          );
        else answers = { reachesGullets: reaches, worn };
      }
      const parsed = checkRecordCreateSchema.safeParse({
        sawId: str(values.get('saw')) ?? undefined,
        siteCheckId: check?.id ?? undefined,
        checkedAt: checkedAt?.toISOString(),
        reading,
        answers,
        notes: str(values.get('notes')),
      });
      if (!parsed.success)
        issues.push(
          ...schemaIssues(parsed.error, rowNumber, kind, columnOf, { sawId: 'saw', siteCheckId: 'check' }).filter(
            (i) => i.field !== 'checkedAt' || checkedAt,
          ),
        );
      if (!parsed.success || issues.some((x) => x.level === 'error')) return result(null, null);
      const d = parsed.data;
      const record: ImportedCheck = {
        sawId: d.sawId,
        siteCheckId: d.siteCheckId,
        checkedAt: d.checkedAt!,
        reading: d.reading,
        answers: d.answers,
        notes: d.notes,
      };
      return result(record, `check|${record.sawId}|${record.siteCheckId}|${record.checkedAt.toISOString()}`);
    }
  }
}

/** How a row fared when the whole file was screened: kept, repeating an earlier row, or clashing with one. */
export type Screened = { verdict: 'add' | 'repeated' | 'rejected'; message: string | null };

/**
 * Screens the rows that built into records against each other: a row whose natural key repeats an earlier row is
 * skipped (`repeated`), and a blade run or stop that overlaps an earlier-starting one of the same saw is rejected,
 * since a saw carries one blade at a time and stops of a saw never overlap. Returns one verdict per row, in order.
 */
export function screenRows(kind: ImportKind, rows: readonly BuiltRow[]): Screened[] {
  const out: Screened[] = rows.map((r) =>
    r.record ? { verdict: 'add', message: null } : { verdict: 'rejected', message: null },
  );
  const firstRowOfKey = new Map<string, number>();
  rows.forEach((r, i) => {
    if (!r.key) return;
    const first = firstRowOfKey.get(r.key);
    if (first === undefined) firstRowOfKey.set(r.key, i);
    else out[i] = { verdict: 'repeated', message: `Same record as row ${rows[first]!.rowNumber}; skipped` };
  });
  if (kind !== 'blade_runs' && kind !== 'stops') return out;

  const span = (r: BuiltRow): [string, number, number] => {
    if (kind === 'blade_runs') {
      const run = r.record as ImportedRun;
      return [run.sawId, run.installedAt.getTime(), run.removedAt?.getTime() ?? Infinity];
    }
    const stop = r.record as ImportedStop;
    return [stop.sawId, stop.startedAt.getTime(), stop.endedAt?.getTime() ?? Infinity];
  };
  const bySaw = new Map<string, { i: number; from: number; to: number }[]>();
  rows.forEach((r, i) => {
    if (out[i]!.verdict !== 'add') return;
    const [saw, from, to] = span(r);
    const list = bySaw.get(saw) ?? [];
    list.push({ i, from, to });
    bySaw.set(saw, list);
  });
  const noun = kind === 'blade_runs' ? 'blade run' : 'stop';
  for (const list of bySaw.values()) {
    list.sort((a, b) => a.from - b.from || a.i - b.i);
    let last: { i: number; from: number; to: number } | null = null;
    for (const item of list) {
      // Ranges are [from, to): a run that comes off as the next goes on does not overlap it.
      if (last && item.from < last.to) {
        out[item.i] = {
          verdict: 'rejected',
          message: `Overlaps the ${noun} in row ${rows[last.i]!.rowNumber} on the same saw; ${kind === 'blade_runs' ? 'a saw carries one blade at a time' : 'stops of a saw do not overlap'}`,
        };
        continue;
      }
      last = item;
    }
  }
  return out;
}
