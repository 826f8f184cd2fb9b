import type { Response } from 'express';
import { once } from 'node:events';

/**
 * CSV exports: RFC 4180 (fields separated by commas, records by CRLF, a field with a comma, quote or line break
 * quoted and its quotes doubled; here every text field is quoted) and OWASP's CSV-injection guidance: a text cell
 * that begins with `=`, `+`, `-`, `@`, a tab or a carriage return gets a leading apostrophe, so a spreadsheet
 * shows it as text instead of running it as a formula. Numbers the product computed are written as plain numbers
 * (a negative variance stays a number).
 */

const FORMULA_START = /^[=+\-@\t\r]/;

/** One cell: numbers as they are, empty for null, text quoted and neutralised. */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  let text = value instanceof Date ? value.toISOString() : String(value);
  if (FORMULA_START.test(text)) text = `'${text}`;
  return `"${text.replace(/"/g, '""')}"`;
}

export const csvRecord = (cells: readonly unknown[]): string => `${cells.map(csvCell).join(',')}\r\n`;

/** A file name safe for Content-Disposition: letters, digits, dots, dashes. */
export const csvFileName = (name: string): string => `${name.replace(/[^A-Za-z0-9._-]+/g, '-')}.csv`;

export type CsvTable = { header: readonly string[]; rows: readonly (readonly unknown[])[] };

/**
 * Streams a CSV answer: the header line, then the rows batch by batch, waiting for the socket to drain so a large
 * export never sits in memory. `X-Row-Count` says up front how many rows follow, for the progress bar. A UTF-8
 * byte-order mark lets spreadsheet programs read mm², € and accents.
 */
export async function streamCsv(
  res: Response,
  name: string,
  header: readonly string[],
  total: number,
  batches: AsyncIterable<readonly (readonly unknown[])[]> | Iterable<readonly (readonly unknown[])[]>,
): Promise<void> {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${csvFileName(name)}"`);
  res.setHeader('X-Row-Count', String(total));
  res.setHeader('Cache-Control', 'no-store');
  res.write(`\uFEFF${csvRecord(header)}`);
  for await (const batch of batches) {
    let chunk = '';
    for (const row of batch) chunk += csvRecord(row);
    if (!res.write(chunk)) await once(res, 'drain');
  }
  res.end();
}

/** A table already in memory (aggregates: a few thousand rows at most), sent the same way. */
export function sendCsv(res: Response, name: string, table: CsvTable): Promise<void> {
  return streamCsv(res, name, table.header, table.rows.length, [table.rows]);
}
