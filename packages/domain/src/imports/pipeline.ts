import {
  ENCODING_LABELS,
  detectDelimiter,
  sniffBytes,
  type Delimiter,
  type FileFormat,
  type TextEncoding,
} from './detect.js';
import {
  TableError,
  openWorkbook,
  readDelimited,
  readSheetRows,
  sheetsOf,
  type ReadLimits,
  type SheetInfo,
} from './read-table.js';
import {
  buildRow,
  screenRows,
  type BuiltRow,
  type ImportTarget,
  type ImportedRecord,
  type UnmatchedTally,
} from './build.js';
import { IMPORT_FIELDS, type ImportKind } from './fields.js';
import type { ImportPlan, PreviewRow, RowIssue, RowVerdict, Unmatched } from './schema.js';
import { cellText, type Cell } from './values.js';
import { nameScore, nearSaws, nearSpecs, suggestChoice } from './suggest.js';

/**
 * One import from bytes to records, the same in the browser's Web Worker (the preview) and on the server (the
 * commit): what the file is, its rows, each row built into a record, and the whole file screened.
 */

/** Where a file's bytes come from: a browser File, or the bytes a server received. */
export interface ByteSource {
  name: string;
  size: number;
  head(bytes: number): Promise<Uint8Array>;
  chunks(): AsyncIterable<Uint8Array>;
  whole(): Promise<ArrayBuffer>;
}

export function bytesSource(bytes: Uint8Array, name: string, chunkSize = 1 << 20): ByteSource {
  return {
    name,
    size: bytes.length,
    head: async (n) => bytes.subarray(0, n),
    chunks: async function* () {
      for (let o = 0; o < bytes.length; o += chunkSize) yield bytes.subarray(o, Math.min(bytes.length, o + chunkSize));
    },
    whole: async () => bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer,
  };
}

export function blobSource(blob: Blob, name: string): ByteSource {
  return {
    name,
    size: blob.size,
    head: async (n) => new Uint8Array(await blob.slice(0, n).arrayBuffer()),
    chunks: async function* () {
      const reader = blob.stream().getReader();
      for (;;) {
        const { done, value } = await reader.read();
        if (done) return;
        yield value;
      }
    },
    whole: () => blob.arrayBuffer(),
  };
}

/** A text decoder that keeps a character split across two chunks whole. */
export type ChunkDecoder = { write: (chunk: Uint8Array) => string; end: () => string };
export type DecoderFactory = (encoding: TextEncoding, fatal: boolean) => ChunkDecoder;

/** The standard TextDecoder; right in browsers for every encoding, and in Node for all but Windows-1252. */
export const standardDecoders: DecoderFactory = (encoding, fatal) => {
  const d = new TextDecoder(encoding, { fatal });
  return { write: (c) => d.decode(c, { stream: true }), end: () => d.decode() };
};

export type ReadSettings = {
  format: FileFormat | null;
  encoding: TextEncoding | null;
  delimiter: Delimiter | null;
  sheet: string | null;
};

/** How the file was read, for the user to see and change. */
export type Opened = {
  format: FileFormat;
  encoding: TextEncoding | null;
  delimiter: Delimiter | null;
  sheet: string | null;
  sheets: SheetInfo[] | null;
  header: string[];
  rowsTotal: number;
  notes: string[];
};

export type RowConsumer = {
  row: (cells: Cell[], rowNumber: number) => void;
  /** Forget every row so far: the file is read again from the start in another encoding. */
  reset: () => void;
};

/**
 * Reads every row of the file into `consumer`, streaming text files chunk by chunk and telling `onProgress` the
 * share of bytes read. Settings left null are detected. A file detected as UTF-8 that turns out not to be (the
 * strict decoder stops on a byte that cannot be UTF-8) is read again as Windows-1252, and a note says so.
 */
export async function readRows(
  source: ByteSource,
  settings: ReadSettings,
  decoders: DecoderFactory,
  limits: ReadLimits,
  consumer: RowConsumer,
  onProgress: (share: number) => void = () => {},
): Promise<Opened> {
  const head = await source.head(64 * 1024);
  const sniffed = sniffBytes(head, source.name);
  if (sniffed.kind === 'unreadable') throw new TableError(sniffed.message);
  const notes: string[] = [];

  if (sniffed.kind === 'xlsx') {
    if (settings.format === 'csv')
      throw new TableError('This is an .xlsx workbook, not a CSV file; choose the workbook reading');
    const book = await openWorkbook(await source.whole());
    onProgress(0.5);
    const sheets = sheetsOf(book);
    const sheet = settings.sheet ?? sheets[0]?.name ?? null;
    const read = readSheetRows(book, sheet, limits, consumer.row);
    onProgress(1);
    return { format: 'xlsx', encoding: null, delimiter: null, sheet, sheets, ...read, notes };
  }
  if (settings.format === 'xlsx')
    throw new TableError('This file is text, not an .xlsx workbook: name it .csv, or save it again as .xlsx');

  const detected = sniffed.encoding;
  let encoding = settings.encoding ?? detected;
  const sampleText = decoders(encoding, false).write(head);
  if (sampleText.trim() === '') throw new TableError('The file is empty');
  const delimiter = settings.delimiter ?? detectDelimiter(sampleText);

  const attempt = async (enc: TextEncoding) => {
    let done = 0;
    const decoder = decoders(enc, enc === 'utf-8' && settings.encoding === null);
    async function* text() {
      for await (const chunk of source.chunks()) {
        const t = decoder.write(chunk);
        if (t.includes('\u0000')) throw new TableError(NUL_IN_FILE);
        done += chunk.length;
        onProgress(source.size === 0 ? 1 : done / source.size);
        if (t) yield t;
      }
      const rest = decoder.end();
      if (rest) yield rest;
    }
    return readDelimited(text(), delimiter, limits, consumer.row);
  };
  let read;
  try {
    read = await attempt(encoding);
  } catch (e) {
    if (e instanceof TableError || encoding !== 'utf-8' || settings.encoding !== null) throw e;
    consumer.reset();
    encoding = 'windows-1252';
    notes.push(
      `Parts of the file are not UTF-8, so it was read as ${ENCODING_LABELS['windows-1252']}; check that accented letters look right`,
    );
    read = await attempt(encoding);
  }
  return { format: 'csv', encoding, delimiter, sheet: null, sheets: null, ...read, notes };
}

/**
 * The sniffing looks at the first 64 KiB only, so a NUL character further on is found while reading. It is never
 * text a spreadsheet writes, and PostgreSQL's text and JSON cannot hold it (the rejected rows keep their cells).
 */
export const NUL_IN_FILE =
  'This file holds NUL characters, so it is not plain text: save it again from the spreadsheet as CSV or .xlsx';

/** A compact row kept for the whole file: its record, or the reason it is not written, and its cells. */
export type CollectedRow = {
  rowNumber: number;
  record: ImportedRecord | null;
  key: string | null;
  /** Errors in words, joined; null for a row that built. */
  error: string | null;
  /** The row's cells as JSON (kept on the server for the rejected-rows file). */
  cellsJson: string | null;
};

export type CollectOptions = {
  /** Rows shown in full as the preview. */
  previewRows: number;
  /** Issues listed (all are counted). */
  maxProblems: number;
  /** Keep each row's cells (the server needs them for the rejected rows). */
  keepCells: boolean;
};

/**
 * Builds and screens every row of a file for one kind, keeping what the commit needs (records and, for rejected
 * rows, the cells) and what the preview shows (the first rows in full, the first issues, the unmatched words).
 */
export class ImportCollector {
  rows: CollectedRow[] = [];
  private previewBuilt: BuiltRow[] = [];
  private problems: RowIssue[] = [];
  private problemsTotal = 0;
  private unmatched: UnmatchedTally = new Map();
  private width = 0;
  private verdicts: { verdict: RowVerdict; message: string | null }[] | null = null;

  constructor(
    readonly kind: ImportKind,
    readonly plan: ImportPlan,
    readonly target: ImportTarget,
    readonly options: CollectOptions,
  ) {
    this.width = plan.columns.length;
  }

  readonly consumer: RowConsumer = {
    row: (cells, rowNumber) => this.add(cells, rowNumber),
    reset: () => {
      this.rows = [];
      this.previewBuilt = [];
      this.problems = [];
      this.problemsTotal = 0;
      this.unmatched = new Map();
    },
  };

  private note(issue: RowIssue) {
    this.problemsTotal += 1;
    if (this.problems.length < this.options.maxProblems) this.problems.push(issue);
  }

  add(cells: Cell[], rowNumber: number): void {
    // A workbook's cell can hold U+0000 too (written as _x0000_); no record or rejected row can keep it.
    if (cells.some((c) => typeof c === 'string' && c.includes('\u0000'))) throw new TableError(NUL_IN_FILE);
    let built: BuiltRow;
    const extra = cells.slice(this.width).filter((c) => cellText(c) !== null).length;
    if (extra > 0) {
      built = {
        rowNumber,
        record: null,
        key: null,
        display: {},
        issues: [
          {
            rowNumber,
            column: null,
            field: null,
            level: 'error',
            message: `This row has ${cells.length} cells but the header names ${this.width} columns; a delimiter inside a cell needs quotes around the cell`,
          },
        ],
      };
    } else
      built = buildRow(this.kind, cells, rowNumber, this.plan, this.target, this.unmatched, {
        display: this.previewBuilt.length < this.options.previewRows,
      });
    for (const issue of built.issues) this.note(issue);
    if (this.previewBuilt.length < this.options.previewRows) this.previewBuilt.push(built);
    const errors = built.issues.filter((i) => i.level === 'error').map((i) => i.message);
    this.rows.push({
      rowNumber,
      record: built.record,
      key: built.key,
      error: errors.length > 0 ? errors.join('; ') : null,
      cellsJson: this.options.keepCells ? JSON.stringify(cells) : null,
    });
  }

  /** Screens the whole file (repeats, overlaps); call once after the last row. */
  finish(): void {
    const screened = screenRows(
      this.kind,
      this.rows.map((r) => ({ rowNumber: r.rowNumber, record: r.record, key: r.key, issues: [], display: {} })),
    );
    this.verdicts = screened.map((s) => ({ verdict: s.verdict, message: s.message }));
    screened.forEach((s, i) => {
      const row = this.rows[i]!;
      if (s.verdict === 'rejected' && s.message) {
        row.error = s.message;
        this.note({ rowNumber: row.rowNumber, column: null, field: null, level: 'error', message: s.message });
      }
      if (s.verdict !== 'add') row.record = s.verdict === 'repeated' ? row.record : null;
    });
    this.problems.sort((a, b) => a.rowNumber - b.rowNumber);
  }

  verdictOf(index: number): { verdict: RowVerdict; message: string | null } {
    if (!this.verdicts) throw new Error('finish() first');
    return this.verdicts[index]!;
  }

  /** Counts, preview and issues; `present` and `conflicting` are the rows the database already settles. */
  summary(settled: Map<number, { verdict: RowVerdict; message: string | null }> = new Map()) {
    if (!this.verdicts) throw new Error('finish() first');
    let rowsValid = 0;
    let rowsPresent = 0;
    let rowsRepeated = 0;
    let rowsRejected = 0;
    const verdictAt = (i: number) => settled.get(this.rows[i]!.rowNumber) ?? this.verdicts![i]!;
    this.rows.forEach((_, i) => {
      const v = verdictAt(i).verdict;
      if (v === 'add') rowsValid += 1;
      else if (v === 'present') rowsPresent += 1;
      else if (v === 'repeated') rowsRepeated += 1;
      else rowsRejected += 1;
    });
    const extraProblems: RowIssue[] = [];
    for (const [rowNumber, s] of settled)
      if (s.verdict === 'rejected' && s.message)
        extraProblems.push({ rowNumber, column: null, field: null, level: 'error', message: s.message });
    const problems = [...this.problems, ...extraProblems]
      .sort((a, b) => a.rowNumber - b.rowNumber)
      .slice(0, this.options.maxProblems);
    const preview: PreviewRow[] = this.previewBuilt.map((b, i) => {
      const v = verdictAt(i);
      const issues = [...b.issues];
      if (v.message && !issues.some((x) => x.message === v.message))
        issues.push({
          rowNumber: b.rowNumber,
          column: null,
          field: null,
          level: v.verdict === 'rejected' ? 'error' : 'warning',
          message: v.message,
        });
      return { rowNumber: b.rowNumber, verdict: v.verdict, values: b.display, issues };
    });
    return {
      rowsTotal: this.rows.length,
      rowsValid,
      rowsPresent,
      rowsRepeated,
      rowsRejected,
      preview,
      problems,
      problemsTotal: this.problemsTotal + extraProblems.length,
      unmatched: this.unmatchedList(),
    };
  }

  /** Written saws, specs and category words that matched nothing, most used first, with near matches. */
  unmatchedList(): Unmatched[] {
    const fields = IMPORT_FIELDS[this.kind];
    return [...this.unmatched.values()]
      .sort((a, b) => b.rows - a.rows)
      .slice(0, 200)
      .map((u) => {
        const field = fields.find((f) => f.key === u.field);
        let suggestions: { value: string; label: string }[] = [];
        if (field?.type === 'saw')
          suggestions = nearSaws(
            this.target.saws.filter((s) => !s.retired),
            u.written,
          ).map((s) => ({
            value: s.id,
            label: `${s.assetTag} · ${s.name}`,
          }));
        else if (field?.type === 'check')
          suggestions = (this.target.checks ?? [])
            .filter((c) => !c.retired)
            .map((c) => ({ c, score: nameScore(u.written, c.name) }))
            .filter((x) => x.score >= 0.5)
            .sort((a, b) => b.score - a.score)
            .slice(0, 3)
            .map((x) => ({ value: x.c.id, label: x.c.name }));
        else if (field?.type === 'spec')
          suggestions = nearSpecs(
            this.target.specs.filter((s) => !s.archived),
            u.written,
          ).map((s) => ({ value: s.id, label: s.name }));
        else if (field?.choice) {
          const guess = suggestChoice(field.choice, u.written);
          suggestions = guess ? [{ value: guess, label: field.choice.labels[guess] ?? guess }] : [];
        }
        return { ...u, suggestions };
      });
  }
}

export { TableError };
