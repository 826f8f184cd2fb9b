/**
 * Writing CSV for people to open in a spreadsheet: every cell that a spreadsheet would run as a formula is
 * neutralised (OWASP, "CSV Injection": a cell starting with =, +, -, @, a tab or a carriage return gets a leading
 * single quote, so it shows as text), and every cell is quoted so delimiters, quotes and line breaks stay inside it.
 */

const FORMULA_START = /^[=+\-@\t\r]/;

/** A cell made safe to open: text that could start a formula gets a leading apostrophe. */
export function neutraliseCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  const text =
    typeof value === 'string'
      ? value
      : typeof value === 'number' || typeof value === 'boolean'
        ? String(value)
        : JSON.stringify(value);
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One CSV line: each cell neutralised, quoted, quotes doubled. */
export function csvLine(cells: readonly unknown[]): string {
  return cells.map((c) => `"${neutraliseCell(c).replace(/"/g, '""')}"`).join(',');
}

/** A whole CSV file with a byte-order mark, so spreadsheets open it as UTF-8, and CRLF line ends. */
export function csvFile(header: readonly string[], rows: Iterable<readonly unknown[]>): string {
  const lines = [csvLine(header)];
  for (const row of rows) lines.push(csvLine(row));
  return `\uFEFF${lines.join('\r\n')}\r\n`;
}
