import Papa from 'papaparse';
import { numericDateParts, parsePlainNumber, cellText, type Cell, type DateOrder, type DecimalMark } from './values.js';

/**
 * Working out how a legacy file is written: its encoding, whether it is text at all, the delimiter, the decimal
 * mark and the order of its dates. Each guess is shown to the user, who may change it.
 */

export const TEXT_ENCODINGS = ['utf-8', 'utf-16le', 'utf-16be', 'windows-1252'] as const;
export type TextEncoding = (typeof TEXT_ENCODINGS)[number];

export const ENCODING_LABELS: Record<TextEncoding, string> = {
  'utf-8': 'UTF-8',
  'utf-16le': 'UTF-16 (little-endian)',
  'utf-16be': 'UTF-16 (big-endian)',
  'windows-1252': 'Windows-1252 (Western European)',
};

export const DELIMITERS = [',', ';', '\t', '|'] as const;
export type Delimiter = (typeof DELIMITERS)[number];
export const DELIMITER_LABELS: Record<Delimiter, string> = {
  ',': 'comma',
  ';': 'semicolon',
  '\t': 'tab',
  '|': 'vertical bar',
};

export type FileFormat = 'csv' | 'xlsx';

/** What a file is, from its first bytes: a workbook, text, or something Kerfline cannot read (and why). */
export type Sniffed =
  { kind: 'xlsx' } | { kind: 'text'; encoding: TextEncoding; bom: number } | { kind: 'unreadable'; message: string };

const startsWith = (bytes: Uint8Array, magic: number[]) => magic.every((b, i) => bytes[i] === b);

/**
 * Decides what the bytes hold. Order: known binary signatures; byte-order marks; UTF-16 without a mark (every
 * other byte NUL); NUL or control bytes (a binary file); then UTF-8 if the sample decodes strictly as UTF-8,
 * else Windows-1252. Node's own Windows-1252 decoder is wrong for 0x80–0x9F (it reads ISO-8859-1), so the
 * server decodes that encoding with iconv-lite; browsers decode it correctly.
 */
export function sniffBytes(bytes: Uint8Array, fileName = ''): Sniffed {
  if (bytes.length === 0) return { kind: 'unreadable', message: 'The file is empty' };
  const lowerName = fileName.toLowerCase();
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) {
    if (lowerName.endsWith('.xlsx') || lowerName.endsWith('.xlsm') || lowerName === '') return { kind: 'xlsx' };
    return {
      kind: 'unreadable',
      message: 'This is a compressed archive (zip), not a spreadsheet: send the CSV or .xlsx file itself',
    };
  }
  if (startsWith(bytes, [0xd0, 0xcf, 0x11, 0xe0]))
    return {
      kind: 'unreadable',
      message: 'This is an old Excel .xls workbook: open it and save it as .xlsx or CSV, then drop that file',
    };
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46]))
    return { kind: 'unreadable', message: 'This is a PDF: Kerfline reads CSV files and .xlsx workbooks' };
  if (
    startsWith(bytes, [0x89, 0x50, 0x4e, 0x47]) ||
    startsWith(bytes, [0xff, 0xd8, 0xff]) ||
    startsWith(bytes, [0x47, 0x49, 0x46, 0x38])
  )
    return { kind: 'unreadable', message: 'This is a picture: Kerfline reads CSV files and .xlsx workbooks' };

  if (startsWith(bytes, [0xef, 0xbb, 0xbf])) return { kind: 'text', encoding: 'utf-8', bom: 3 };
  if (startsWith(bytes, [0xff, 0xfe])) return { kind: 'text', encoding: 'utf-16le', bom: 2 };
  if (startsWith(bytes, [0xfe, 0xff])) return { kind: 'text', encoding: 'utf-16be', bom: 2 };

  const sample = bytes.subarray(0, 64 * 1024);
  let evenNul = 0;
  let oddNul = 0;
  let control = 0;
  for (let i = 0; i < sample.length; i += 1) {
    const b = sample[i]!;
    if (b === 0) {
      if (i % 2 === 0) evenNul += 1;
      else oddNul += 1;
    } else if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d && b !== 0x0c) control += 1;
  }
  const half = sample.length / 2;
  if (oddNul > half * 0.6 && evenNul < half * 0.05) return { kind: 'text', encoding: 'utf-16le', bom: 0 };
  if (evenNul > half * 0.6 && oddNul < half * 0.05) return { kind: 'text', encoding: 'utf-16be', bom: 0 };
  if (evenNul + oddNul > 0 || control > sample.length * 0.01)
    return {
      kind: 'unreadable',
      message:
        'This file is not text: Kerfline reads CSV (or tab-separated text) saved from a spreadsheet, and .xlsx workbooks',
    };
  return {
    kind: 'text',
    encoding: isStrictUtf8(sample, sample.length < bytes.length) ? 'utf-8' : 'windows-1252',
    bom: 0,
  };
}

/** Whether the bytes are valid UTF-8; a sequence cut off at the end of a sample does not count against it. */
export function isStrictUtf8(bytes: Uint8Array, isSample = false): boolean {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes, { stream: isSample });
    return true;
  } catch {
    return false;
  }
}

/**
 * The delimiter that splits the first lines into the same number of cells most often (at least two cells). Ties
 * go to the semicolon and tab before the comma, since a comma inside a semicolon file is usually a decimal mark.
 */
export function detectDelimiter(sampleText: string): Delimiter {
  const lines = sampleText.split(/\r\n|\n|\r/);
  // The last line of a sample may be cut off; empty lines say nothing.
  const usable = (lines.length > 1 ? lines.slice(0, -1) : lines).filter((l) => l.trim() !== '').slice(0, 50);
  const text = usable.join('\n');
  let best: { delimiter: Delimiter; score: number } = { delimiter: ',', score: 0 };
  for (const delimiter of [';', '\t', ',', '|'] as const) {
    const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: 'greedy' });
    const counts = parsed.data.map((row) => row.length);
    const tally = new Map<number, number>();
    for (const c of counts) tally.set(c, (tally.get(c) ?? 0) + 1);
    let mode = 0;
    let modeRows = 0;
    for (const [count, rows] of tally)
      if (rows > modeRows || (rows === modeRows && count > mode)) [mode, modeRows] = [count, rows];
    if (mode < 2) continue;
    const score = modeRows / Math.max(1, counts.length) + mode / 1000;
    if (score > best.score) best = { delimiter, score };
  }
  return best.delimiter;
}

/**
 * The decimal mark of the numbers in these cells: a comma when some number has a comma followed by other than
 * exactly three digits (`12,5`, `0,042`), or thousands grouped by points (`1.234,5`); otherwise a point.
 */
export function detectDecimalMark(cells: Iterable<Cell>): DecimalMark {
  let comma = 0;
  let point = 0;
  for (const cell of cells) {
    if (typeof cell !== 'string') continue;
    const t = cell.trim().replace(/\s*[a-zA-Z"²/]+$/, '');
    if (/^-?\d+,\d+$/.test(t) && !/^-?\d{1,3},\d{3}$/.test(t)) comma += 1;
    else if (/^-?\d{1,3}(\.\d{3})+,\d+$/.test(t)) comma += 1;
    else if (/^-?\d+\.\d+$/.test(t) && !/^-?\d{1,3}\.\d{3}$/.test(t)) point += 1;
    else if (/^-?\d{1,3}(,\d{3})+\.\d+$/.test(t)) point += 1;
  }
  return comma > point ? ',' : '.';
}

/** Whether the numbers in these cells read with `mark` (a quick check the preview shows when they do not). */
export function numbersRead(cells: Cell[], mark: DecimalMark): boolean {
  return cells.every((c) => typeof c !== 'string' || cellText(c) === null || parsePlainNumber(c, mark) !== null);
}

/**
 * The order of numeric dates in a column. Year first is plain. Otherwise a first part above 12 means
 * day-month-year and a second part above 12 month-day-year; when no value settles it (03/04/2021), the answer is
 * `ambiguous` with an example, and the user is asked. Both at once is `conflicting`.
 */
export type DateOrderGuess =
  | { kind: 'none' }
  | { kind: 'known'; order: DateOrder }
  | { kind: 'ambiguous'; example: string; lean: DateOrder | null }
  | { kind: 'conflicting'; dmyExample: string; mdyExample: string };

/**
 * One value that settles the order may be a slip (31/02 typed for 02/31); it takes two to decide without asking.
 * With one, the user is asked, and the order it points to is offered first.
 */
export function detectDateOrder(cells: Iterable<Cell>): DateOrderGuess {
  let dayFirst: string | null = null;
  let monthFirst: string | null = null;
  let dayVotes = 0;
  let monthVotes = 0;
  let unsettled: string | null = null;
  let yearFirst = false;
  for (const cell of cells) {
    if (typeof cell !== 'string') continue;
    const parts = numericDateParts(cell);
    if (!parts) continue;
    const [a, b, , aText] = parts;
    if (aText.length === 4) {
      yearFirst = true;
      continue;
    }
    if (a > 12 && b <= 12) {
      dayFirst ??= cell.trim();
      dayVotes += 1;
    } else if (b > 12 && a <= 12) {
      monthFirst ??= cell.trim();
      monthVotes += 1;
    } else if (a !== b) unsettled ??= cell.trim();
  }
  if (dayFirst && monthFirst) return { kind: 'conflicting', dmyExample: dayFirst, mdyExample: monthFirst };
  if (dayVotes >= 2 || (dayVotes === 1 && !unsettled)) return { kind: 'known', order: 'dmy' };
  if (monthVotes >= 2 || (monthVotes === 1 && !unsettled)) return { kind: 'known', order: 'mdy' };
  if (unsettled) return { kind: 'ambiguous', example: unsettled, lean: dayVotes ? 'dmy' : monthVotes ? 'mdy' : null };
  if (yearFirst) return { kind: 'known', order: 'ymd' };
  return { kind: 'none' };
}
