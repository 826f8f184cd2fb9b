import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { bytesSource, readRows, standardDecoders } from './pipeline.js';
import { TableError, columnLetter } from './read-table.js';
import { csvFile, csvLine, neutraliseCell } from './csv-out.js';
import type { Cell } from './values.js';

const enc = (text: string) => new TextEncoder().encode(text);

async function read(bytes: Uint8Array, maxRows = 1000, name = 'file.csv', chunk = 13) {
  const rows: Cell[][] = [];
  const opened = await readRows(
    bytesSource(bytes, name, chunk),
    { format: null, encoding: null, delimiter: null, sheet: null },
    standardDecoders,
    { maxRows },
    { row: (cells) => rows.push(cells), reset: () => rows.splice(0) },
  );
  return { opened, rows };
}

describe('bad files get a message that says what to do', () => {
  it('an empty file, a file of blank lines, and a header with no rows', async () => {
    await expect(read(new Uint8Array())).rejects.toThrow('The file is empty');
    await expect(read(enc('\r\n  \r\n'))).rejects.toThrow(/empty/);
    await expect(read(enc('Saw;Start;Category\r\n'))).rejects.toThrow(/column names but no rows/);
  });

  it('two columns with the same name', async () => {
    await expect(read(enc('Saw,Date,Notes,date\nA,1,2,3\n'))).rejects.toThrow(
      'Columns B and D are both named “date”. Kerfline matches columns by their names: rename one of them in the file and drop it again.',
    );
  });

  it('a quote that is never closed', async () => {
    const err = await read(enc('Saw,Notes\nHAM-S01,"bent guide\nHAM-S02,ok\n')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TableError);
    expect((err as Error).message).toMatch(/quote \("\) opened .* is never closed/);
  });

  it('more rows than one import takes', async () => {
    const text = ['Saw,Start', ...Array.from({ length: 30 }, (_, i) => `S${i},2023-01-01`)].join('\n');
    await expect(read(enc(text), 25)).rejects.toThrow(/more than 25 rows/);
  });

  it('a workbook that is not one', async () => {
    await expect(read(new Uint8Array([0x50, 0x4b, 3, 4, 9, 9, 9, 9]), 10, 'log.xlsx')).rejects.toThrow(
      /could not be opened as an \.xlsx workbook/,
    );
  });
});

describe('streaming text', () => {
  it('keeps characters split across chunks whole, and pads short rows', async () => {
    const { rows, opened } = await read(enc('Säge;Bemerkung;Extra\nRTM-S01;Öl nachgefüllt – 35 €\n'), 10, 'x.csv', 3);
    expect(opened.header).toEqual(['Säge', 'Bemerkung', 'Extra']);
    expect(rows).toEqual([['RTM-S01', 'Öl nachgefüllt – 35 €']]);
  });

  it('names a nameless column by its letter and drops empty trailing ones', async () => {
    const { opened } = await read(enc('Saw,,Start,\nA,x,1,\n'));
    expect(opened.header).toEqual(['Saw', 'Column B', 'Start']);
    expect(columnLetter(27)).toBe('AB');
  });

  it('reads a file as Windows-1252 when a byte past the first 64 KB is not UTF-8, and says so', async () => {
    const head = `Saw,Notes\n${'HAM-S01,plain ascii text\n'.repeat(3000)}`;
    const tail = new Uint8Array([...enc('HAM-S02,caf'), 0xe9, 0x0a]); // é in Windows-1252
    const bytes = new Uint8Array([...enc(head), ...tail]);
    expect(bytes.length).toBeGreaterThan(64 * 1024);
    const { rows, opened } = await read(bytes, 10_000, 'x.csv', 4096);
    expect(opened.encoding).toBe('windows-1252');
    expect(opened.notes[0]).toMatch(/not UTF-8/);
    expect(rows).toHaveLength(3001);
    expect(rows[3000]).toEqual(['HAM-S02', 'café']);
  });
});

describe('rejected rows as CSV (OWASP CSV injection)', () => {
  it('neutralises cells a spreadsheet would run as formulas, and quotes every cell', () => {
    expect(neutraliseCell('=HYPERLINK("http://x","y")')).toBe(`'=HYPERLINK("http://x","y")`);
    for (const start of ['+', '-', '@', '\t', '\r']) expect(neutraliseCell(`${start}1`)).toBe(`'${start}1`);
    expect(neutraliseCell('HAM-S01')).toBe('HAM-S01');
    expect(neutraliseCell(12.5)).toBe('12.5');
    expect(neutraliseCell(null)).toBe('');
    expect(csvLine(['a "b"', 'c,d'])).toBe('"a ""b""","c,d"');
    const file = csvFile(['Saw', 'Why rejected'], [['=cmd|x', 'Saw: unknown']]);
    expect(file.startsWith('\uFEFF')).toBe(true);
    // Read back by a CSV reader, the cell is text that starts with an apostrophe, not a formula.
    const back = Papa.parse<string[]>(file.slice(1), { skipEmptyLines: true }).data;
    expect(back).toEqual([
      ['Saw', 'Why rejected'],
      ["'=cmd|x", 'Saw: unknown'],
    ]);
  });
});
