import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import { UNIT_SYSTEMS } from '../sites/schema.js';
import { IMPORT_FIELDS, IMPORT_KINDS, type ImportKind } from './fields.js';
import { DELIMITERS, TEXT_ENCODINGS } from './detect.js';
import { DATE_ORDERS, DECIMAL_MARKS, normaliseHeader } from './values.js';
import { UNITS } from './units.js';

export { IMPORT_KINDS, type ImportKind };

/** One column of the file as the user mapped it: the field it fills (null: left out) and its unit. */
/** Text of the plan as stored (JSON in PostgreSQL, which cannot hold U+0000). */
const planText = (max: number) =>
  z
    .string()
    .max(max)
    .refine((s) => !s.includes('\u0000'), 'must not hold a NUL character');

export const columnPlanSchema = z.object({
  header: planText(200),
  field: z.string().max(60).nullable(),
  unit: z.string().max(20).nullable(),
});
export type ColumnPlan = z.infer<typeof columnPlanSchema>;

/** Written value (normalised) → what it means: a category's value, a saw's or a spec's id; per field. */
export const valueMapSchema = z.record(planText(60), z.record(planText(200), planText(100)));
export type ValueMap = z.infer<typeof valueMapSchema>;

/**
 * Everything the user decided about a file: which site and kind, how to read it (format, encoding, delimiter,
 * sheet), what each column is, the decimal mark, the order of dates and what the shop's own words mean. The
 * server reads the file again with exactly this plan.
 */
export const importPlanSchema = z
  .object({
    siteId: idSchema,
    kind: z.enum(IMPORT_KINDS, { message: `Kind must be one of ${IMPORT_KINDS.join(', ')}` }),
    format: z.enum(['csv', 'xlsx'], { message: 'Format must be csv or xlsx' }),
    /** Null: detect from the bytes. */
    encoding: z.enum(TEXT_ENCODINGS).nullable().default(null),
    /** Null: detect from the first lines. */
    delimiter: z.enum(DELIMITERS).nullable().default(null),
    /** The workbook's sheet; null for the first. */
    sheet: planText(200).nullable().default(null),
    columns: z.array(columnPlanSchema).min(1, { message: 'The file must have at least one column' }).max(200),
    decimalMark: z.enum(DECIMAL_MARKS, { message: 'Decimal mark must be . or ,' }),
    dateOrder: z.enum(DATE_ORDERS, { message: 'Date order must be dmy, mdy or ymd' }),
    values: valueMapSchema.default({}),
  })
  .strict()
  .superRefine((plan, ctx) => {
    for (const issue of planIssues(plan)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });
export type ImportPlan = z.output<typeof importPlanSchema>;
export type ImportPlanInput = z.input<typeof importPlanSchema>;

/** What is wrong with a plan's columns: unknown fields, a field twice, a unit of the wrong kind, required fields missing. */
export function planIssues(plan: {
  kind: ImportKind;
  columns: ColumnPlan[];
}): { path: (string | number)[]; message: string }[] {
  const issues: { path: (string | number)[]; message: string }[] = [];
  const fields = IMPORT_FIELDS[plan.kind];
  const seen = new Map<string, number>();
  plan.columns.forEach((column, i) => {
    if (column.field === null) return;
    const field = fields.find((f) => f.key === column.field);
    if (!field) {
      issues.push({
        path: ['columns', i, 'field'],
        message: `${column.field} is not a column Kerfline takes for this kind`,
      });
      return;
    }
    const before = seen.get(field.key);
    if (before !== undefined)
      issues.push({
        path: ['columns', i, 'field'],
        message: `${field.label} is already taken by column “${plan.columns[before]!.header}”; choose one column for it`,
      });
    seen.set(field.key, i);
    if (field.quantity) {
      if (!UNITS[field.quantity].options.some((o) => o.id === column.unit))
        issues.push({
          path: ['columns', i, 'unit'],
          message: `Choose the unit of ${field.label}: ${UNITS[field.quantity].options.map((o) => o.label).join(', ')}`,
        });
    }
  });
  for (const field of fields)
    if (field.required && !seen.has(field.key))
      issues.push({ path: ['columns'], message: `No column is matched to ${field.label}, which every row needs` });
  return issues;
}

/** What Kerfline remembers of a site's last mapping for a kind: by header, and the shop's words. */
export const importMemorySchema = z.object({
  kind: z.enum(IMPORT_KINDS),
  columns: z.record(z.string(), z.object({ field: z.string(), unit: z.string().nullable() })),
  values: valueMapSchema,
  decimalMark: z.enum(DECIMAL_MARKS),
  dateOrder: z.enum(DATE_ORDERS).nullable(),
  updatedAt: z.string().nullable(),
  updatedByName: z.string().nullable(),
});
export type ImportMemory = z.infer<typeof importMemorySchema>;

/** The memory a plan leaves behind for next time. */
export function memoryFromPlan(plan: ImportPlan): Omit<ImportMemory, 'updatedAt' | 'updatedByName'> {
  const columns: ImportMemory['columns'] = {};
  for (const c of plan.columns) {
    const key = normaliseHeader(c.header);
    if (c.field && key !== '') columns[key] = { field: c.field, unit: c.unit };
  }
  return { kind: plan.kind, columns, values: plan.values, decimalMark: plan.decimalMark, dateOrder: plan.dateOrder };
}

export const ROW_VERDICTS = ['add', 'present', 'repeated', 'rejected'] as const;
export type RowVerdict = (typeof ROW_VERDICTS)[number];

export const rowIssueSchema = z.object({
  /** As a spreadsheet numbers it: the header is row 1. */
  rowNumber: z.number().int(),
  /** The file's column header, or null for the row as a whole. */
  column: z.string().nullable(),
  field: z.string().nullable(),
  level: z.enum(['error', 'warning']),
  message: z.string(),
});
export type RowIssue = z.infer<typeof rowIssueSchema>;

export const previewRowSchema = z.object({
  rowNumber: z.number().int(),
  verdict: z.enum(ROW_VERDICTS),
  /** Each field as it will be stored, in words (`31.8 mm`, `2021-03-04 07:30 America/Toronto`). */
  values: z.record(z.string(), z.string().nullable()),
  issues: z.array(rowIssueSchema),
});
export type PreviewRow = z.infer<typeof previewRowSchema>;

/** A written saw, spec or category value that matched nothing, with the rows that use it and near matches. */
export const unmatchedSchema = z.object({
  field: z.string(),
  written: z.string(),
  /** The key the plan's `values[field]` takes for it. */
  key: z.string(),
  rows: z.number().int(),
  suggestions: z.array(z.object({ value: z.string(), label: z.string() })),
});
export type Unmatched = z.infer<typeof unmatchedSchema>;

export const earlierImportSchema = z.object({
  id: idSchema,
  createdAt: z.string(),
  state: z.string(),
  createdByName: z.string().nullable(),
});

/** The server's reading of a file with a plan, before (check) or as (commit) it is written. */
export const importSummarySchema = z.object({
  fileName: z.string(),
  bytes: z.number().int(),
  sha256: z.string(),
  format: z.enum(['csv', 'xlsx']),
  encoding: z.enum(TEXT_ENCODINGS).nullable(),
  delimiter: z.enum(DELIMITERS).nullable(),
  sheet: z.string().nullable(),
  rowsTotal: z.number().int(),
  /** Rows that would be (or were) added. */
  rowsValid: z.number().int(),
  /** Rows already in Kerfline (same natural key): skipped. */
  rowsPresent: z.number().int(),
  /** Rows that repeat an earlier row of the same file: skipped. */
  rowsRepeated: z.number().int(),
  /** Rows with errors or clashing with a record: not written, downloadable with the reason. */
  rowsRejected: z.number().int(),
  preview: z.array(previewRowSchema),
  problems: z.array(rowIssueSchema),
  problemsTotal: z.number().int(),
  unmatched: z.array(unmatchedSchema),
  /** Earlier imports of the same bytes at this site. */
  earlier: z.array(earlierImportSchema),
});
export type ImportSummary = z.infer<typeof importSummarySchema>;

export const IMPORT_STATES = ['running', 'committed', 'failed', 'undone'] as const;
export type ImportState = (typeof IMPORT_STATES)[number];
export const IMPORT_STATE_LABELS: Record<ImportState, string> = {
  running: 'Writing',
  committed: 'Brought in',
  failed: 'Stopped, nothing written',
  undone: 'Taken back out',
};

export const importBatchSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  kind: z.enum(IMPORT_KINDS),
  state: z.enum(IMPORT_STATES),
  fileName: z.string(),
  bytes: z.number().int(),
  sha256: z.string(),
  sheet: z.string().nullable(),
  rowsTotal: z.number().int(),
  rowsAdded: z.number().int(),
  rowsPresent: z.number().int(),
  rowsRepeated: z.number().int(),
  rowsRejected: z.number().int(),
  /** Why a failed import stopped. */
  error: z.string().nullable(),
  createdById: idSchema.nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
  undoneAt: z.string().nullable(),
  undoneByName: z.string().nullable(),
});
export type ImportBatch = z.infer<typeof importBatchSchema>;

export const importCommitResultSchema = z.object({ batch: importBatchSchema, summary: importSummarySchema });
export type ImportCommitResult = z.infer<typeof importCommitResultSchema>;

export const importListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  kind: z.enum(IMPORT_KINDS).optional(),
});
export type ImportListQuery = z.infer<typeof importListQuerySchema>;

export const importContextQuerySchema = z.object({
  siteId: idSchema,
  kind: z.enum(IMPORT_KINDS, { message: `Kind must be one of ${IMPORT_KINDS.join(', ')}` }),
});
export type ImportContextQuery = z.infer<typeof importContextQuerySchema>;

/** What the wizard needs to read a file for a site: its saws, specs, units, memory and the limits. */
export const importContextSchema = z.object({
  site: z.object({
    id: idSchema,
    name: z.string(),
    timeZone: z.string(),
    currency: z.string(),
    unitSystem: z.enum(UNIT_SYSTEMS),
  }),
  saws: z.array(z.object({ id: idSchema, assetTag: z.string(), name: z.string(), retired: z.boolean() })),
  specs: z.array(
    z.object({
      id: idSchema,
      name: z.string(),
      unitCostMinor: z.number().int(),
      currency: z.string(),
      archived: z.boolean(),
    }),
  ),
  /** The site's list of checks, for check sheets. */
  checks: z.array(
    z.object({
      id: idSchema,
      name: z.string(),
      quantity: z.enum(['length', 'force', 'stress', 'condition']),
      retired: z.boolean(),
    }),
  ),
  memory: importMemorySchema.nullable(),
  limits: z.object({ maxBytes: z.number().int(), maxRows: z.number().int() }),
  /** The kinds this installation can bring in (checks need the checks feature). */
  kinds: z.array(z.enum(IMPORT_KINDS)),
});
export type ImportContext = z.infer<typeof importContextSchema>;
