import Papa from 'papaparse';
import readXlsxFile from 'read-excel-file/universal';
import { cellText, normaliseHeader, type Cell } from './values.js';
import type { Delimiter } from './detect.js';

/**
 * Reading a file's rows: CSV text streamed through papaparse (in the browser's Web Worker and on the server
 * alike) and workbooks through read-excel-file. Both hand over a header and then rows of cells; both stop with a
 * message a person can act on for the faults legacy files have (no rows, a repeated column name, a quote never
 * closed, too many rows).
 */

export class TableError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TableError';
  }
}

/** Spreadsheet column letters: 0 → A, 26 → AA. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/**
 * The header row, checked: names trimmed, a nameless column given its letter, and two columns with the same name
 * refused (Kerfline matches columns by name, so it could not tell them apart).
 */
export function checkHeader(raw: readonly Cell[]): string[] {
  const header = raw.map((c, i) => cellText(c) ?? `Column ${columnLetter(i)}`);
  const seen = new Map<string, number>();
  header.forEach((name, i) => {
    const key = normaliseHeader(name) || name.toLowerCase();
    const before = seen.get(key);
    if (before !== undefined)
      throw new TableError(
        `Columns ${columnLetter(before)} and ${columnLetter(i)} are both named “${name}”. Kerfline matches columns by their names: rename one of them in the file and drop it again.`,
      );
    seen.set(key, i);
  });
  // Trailing nameless columns that a spreadsheet left behind are not columns.
  while (
    header.length > 1 &&
    /^Column [A-Z]+$/.test(header[header.length - 1]!) &&
    cellText(raw[header.length - 1] ?? null) === null
  )
    header.pop();
  return header;
}

export type RowSink = (cells: Cell[], rowNumber: number) => void;

export type TableRead = {
  header: string[];
  rowsTotal: number;
};

/** Limits that protect the server and the browser; both come from the site's installation (IMPORT_MAX_ROWS). */
export type ReadLimits = { maxRows: number };

function rowsLimitMessage(maxRows: number): string {
  return `The file has more than ${maxRows.toLocaleString('en-US')} rows, the most one import takes: split it into smaller files (by year, say) and bring them in one after another`;
}

/**
 * A stand-in for a Node readable stream, which is what papaparse streams from: it hands papaparse text chunks
 * as they are decoded, so a 50 MB file is never held as one string and progress can be told as it goes.
 */
class ChunkFeed {
  readonly readable = true;
  private listeners = new Map<string, ((arg?: unknown) => void)[]>();
  read(): void {}
  pause(): void {}
  resume(): void {}
  on(event: string, fn: (arg?: unknown) => void): void {
    this.listeners.set(event, [...(this.listeners.get(event) ?? []), fn]);
  }
  removeListener(event: string, fn: (arg?: unknown) => void): void {
    this.listeners.set(
      event,
      (this.listeners.get(event) ?? []).filter((f) => f !== fn),
    );
  }
  emit(event: string, arg?: unknown): void {
    for (const fn of this.listeners.get(event) ?? []) fn(arg);
  }
}

/**
 * Streams delimited text (already decoded, chunk by chunk) into `onRow`, header first. Empty lines are skipped;
 * a row longer than the header is refused by the caller's checks, a shorter one is padded with empty cells.
 */
export async function readDelimited(
  chunks: AsyncIterable<string>,
  delimiter: Delimiter,
  limits: ReadLimits,
  onRow: RowSink,
): Promise<TableRead> {
  const feed = new ChunkFeed();
  let header: string[] | null = null;
  let rowsTotal = 0;
  let failure: Error | null = null;
  let dataRow = 0;
  const done = new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(feed as unknown as File, {
      delimiter,
      skipEmptyLines: 'greedy',
      step: (results, parser) => {
        if (failure) return;
        dataRow += 1;
        const quoteError = results.errors.find((e) => e.type === 'Quotes');
        if (quoteError) {
          failure = new TableError(
            quoteError.code === 'MissingQuotes'
              ? `A quote (") opened in or after row ${dataRow} is never closed, so the rest of the file would read as one cell. Close the quote in the file (or save it again from the spreadsheet) and drop it again.`
              : `Row ${dataRow} has a quote (") in the wrong place: a quoted cell must end with the quote right before the delimiter. Fix it in the file and drop it again.`,
          );
          parser.abort();
          return;
        }
        const row = results.data;
        if (header === null) {
          try {
            header = checkHeader(row);
          } catch (e) {
            failure = e as Error;
            parser.abort();
          }
          return;
        }
        rowsTotal += 1;
        if (rowsTotal > limits.maxRows) {
          failure = new TableError(rowsLimitMessage(limits.maxRows));
          parser.abort();
          return;
        }
        onRow(row, rowsTotal + 1);
      },
      complete: () => resolve(),
      error: (err: Error) => reject(err),
    });
  });
  void (async () => {
    try {
      for await (const chunk of chunks) {
        if (failure) break;
        feed.emit('data', chunk);
      }
      feed.emit('end');
    } catch (e) {
      feed.emit('error', e);
    }
  })();
  await done;
  if (failure) throw failure;
  if (header === null) throw new TableError('The file is empty: it has no header row and no rows');
  if (rowsTotal === 0)
    throw new TableError('The file has column names but no rows under them: there is nothing to bring in');
  return { header, rowsTotal };
}

/** A workbook's sheets, with how many rows each holds (header included). */
export type SheetInfo = { name: string; rows: number };

/** Text for a workbook cell: dates as their wall-clock time (`2021-03-04T07:30:00`), the rest as they are. */
function workbookCell(value: unknown): Cell {
  if (value === null || value === undefined) return null;
  if (value instanceof Date) {
    if (Number.isNaN(value.getTime())) return null;
    // read-excel-file gives a workbook's date as that wall-clock time in UTC (the site's zone is applied later),
    // from a fraction of a day that lands a millisecond off: rounded to the second.
    return new Date(Math.round(value.getTime() / 1000) * 1000).toISOString().replace(/\.000Z$/, '');
  }
  if (typeof value === 'number' || typeof value === 'boolean' || typeof value === 'string') return value;
  return String(value as string);
}

export type Workbook = { sheets: { name: string; rows: Cell[][] }[] };

/** Opens an .xlsx workbook; a file that is not one is refused in words. */
export async function openWorkbook(bytes: ArrayBuffer | Blob): Promise<Workbook> {
  try {
    const sheets = await readXlsxFile(bytes);
    return {
      sheets: sheets.map((s) => ({ name: s.sheet, rows: s.data.map((row) => row.map(workbookCell)) })),
    };
  } catch {
    throw new TableError(
      'This file could not be opened as an .xlsx workbook: it may be damaged or password-protected. Open it in the spreadsheet and save it again as .xlsx or CSV.',
    );
  }
}

/** The sheets of a workbook with their sizes, for choosing one. */
export function sheetsOf(book: Workbook): SheetInfo[] {
  return book.sheets.map((s) => ({ name: s.name, rows: s.rows.length }));
}

/** Hands one sheet's rows to `onRow`, header first, with the same checks as delimited text. */
export function readSheetRows(book: Workbook, sheet: string | null, limits: ReadLimits, onRow: RowSink): TableRead {
  const found = sheet === null ? book.sheets[0] : book.sheets.find((s) => s.name === sheet);
  if (!found)
    throw new TableError(
      `The workbook has no sheet called “${sheet}”; it has ${book.sheets.map((s) => `“${s.name}”`).join(', ')}`,
    );
  const rows = found.rows.filter((r) => r.some((c) => cellText(c) !== null));
  if (rows.length === 0) throw new TableError(`Sheet “${found.name}” is empty`);
  const header = checkHeader(rows[0]!);
  if (rows.length === 1)
    throw new TableError(`Sheet “${found.name}” has column names but no rows under them: there is nothing to bring in`);
  if (rows.length - 1 > limits.maxRows) throw new TableError(rowsLimitMessage(limits.maxRows));
  for (let i = 1; i < rows.length; i += 1) onRow(rows[i]!, i + 1);
  return { header, rowsTotal: rows.length - 1 };
}

/**
 * Decoded text chunks of `bytes`, `size` bytes at a time, through a decoder that keeps characters split across
 * chunks whole (TextDecoder in a browser; iconv-lite for Windows-1252 on the server).
 */
export async function* decodeInChunks(
  bytes: Uint8Array,
  decoder: { write: (chunk: Uint8Array) => string; end: () => string },
  size = 1 << 20,
): AsyncGenerator<string> {
  for (let offset = 0; offset < bytes.length; offset += size) {
    const text = decoder.write(bytes.subarray(offset, Math.min(bytes.length, offset + size)));
    if (text) yield text;
  }
  const rest = decoder.end();
  if (rest) yield rest;
}
