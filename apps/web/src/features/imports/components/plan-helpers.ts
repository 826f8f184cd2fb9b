import { IMPORT_FIELDS, type ImportKind } from '@kerfline/domain/imports/fields';
import {
  importPlanSchema,
  planIssues,
  type ColumnPlan,
  type ImportContext,
  type ImportPlan,
  type ValueMap,
} from '@kerfline/domain/imports/schema';
import { detectDateOrder, detectDecimalMark, type DateOrderGuess } from '@kerfline/domain/imports/detect';
import type { ReadSettings } from '@kerfline/domain/imports/pipeline';
import type { ImportTarget } from '@kerfline/domain/imports/build';
import type { Cell, DateOrder, DecimalMark } from '@kerfline/domain/imports/values';
import type { ScanResult } from '../worker/read-file';

/** The cells of the columns mapped to date fields, for working out the order of their dates. */
export function dateCells(kind: ImportKind, columns: ColumnPlan[], scan: ScanResult): Cell[] {
  const dateFields = new Set(
    IMPORT_FIELDS[kind].filter((f) => f.type === 'date' || f.type === 'datetime').map((f) => f.key),
  );
  return columns.flatMap((c, i) => (c.field && dateFields.has(c.field) ? (scan.distinct[i] ?? []) : []));
}

export function dateOrderGuess(kind: ImportKind, columns: ColumnPlan[], scan: ScanResult): DateOrderGuess {
  return detectDateOrder(dateCells(kind, columns, scan));
}

/** The decimal mark of the file's numbers, unless this site said otherwise last time. */
export function decimalMarkOf(scan: ScanResult, remembered: DecimalMark | null): DecimalMark {
  const detected = detectDecimalMark(scan.distinct.flat());
  return remembered && detected === '.' ? remembered : detected;
}

/** What is left to answer before the rows can be checked: missing fields, units, the order of dates. */
export function mappingProblems(
  kind: ImportKind,
  columns: ColumnPlan[],
  dateOrder: DateOrder | null,
  needsDate: boolean,
) {
  const problems = planIssues({ kind, columns }).map((i) => i.message);
  if (needsDate && dateOrder === null) problems.push('Say how the dates are written (the question above)');
  return problems;
}

export function buildPlan(args: {
  siteId: string;
  kind: ImportKind;
  settings: ReadSettings;
  scan: ScanResult;
  columns: ColumnPlan[];
  decimalMark: DecimalMark;
  dateOrder: DateOrder;
  values: ValueMap;
}): ImportPlan {
  return importPlanSchema.parse({
    siteId: args.siteId,
    kind: args.kind,
    format: args.scan.opened.format,
    encoding: args.scan.opened.encoding,
    delimiter: args.scan.opened.delimiter,
    sheet: args.scan.opened.sheet,
    columns: args.columns,
    decimalMark: args.decimalMark,
    dateOrder: args.dateOrder,
    values: args.values,
  });
}

export function targetOf(context: ImportContext): ImportTarget {
  return {
    siteId: context.site.id,
    timeZone: context.site.timeZone,
    currency: context.site.currency,
    saws: context.saws,
    specs: context.specs,
    checks: context.checks,
    unitSystem: context.site.unitSystem,
  };
}

/** A numeric date read both ways, for the question: "3 April 2023" or "March 4, 2023". */
export function bothReadings(example: string): { dmy: string; mdy: string } | null {
  const m = /^(\d{1,2})[./-](\d{1,2})[./-](\d{2,4})/.exec(example.trim());
  if (!m) return null;
  const year = m[3]!.length === 2 ? `20${m[3]}` : m[3]!;
  const month = (n: number) =>
    new Intl.DateTimeFormat('en-GB', { month: 'long', timeZone: 'UTC' }).format(new Date(Date.UTC(2000, n - 1, 1)));
  const a = Number(m[1]);
  const b = Number(m[2]);
  return { dmy: `${a} ${month(b)} ${year}`, mdy: `${month(a)} ${b}, ${year}` };
}
