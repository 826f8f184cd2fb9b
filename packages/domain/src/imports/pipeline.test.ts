import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import iconv from 'iconv-lite';
import {
  ImportCollector,
  bytesSource,
  readRows,
  standardDecoders,
  type DecoderFactory,
  type Opened,
} from './pipeline.js';
import { detectDateOrder, detectDecimalMark, detectDelimiter, sniffBytes } from './detect.js';
import { betterKind, matchSaw, nearSaws, suggestColumns } from './suggest.js';
import { importPlanSchema, type ImportPlan } from './schema.js';
import type { ImportTarget, ImportedRun, ImportedSaw, ImportedStop } from './build.js';
import type { Cell } from './values.js';
import type { ImportKind } from './fields.js';

/** The server's decoders: iconv-lite for Windows-1252, which Node's TextDecoder reads as ISO-8859-1. */
const serverDecoders: DecoderFactory = (encoding, fatal) => {
  if (encoding !== 'windows-1252') return standardDecoders(encoding, fatal);
  const d = iconv.getDecoder('windows-1252');
  return { write: (c) => d.write(Buffer.from(c)), end: () => d.end() ?? '' };
};

const fixture = (name: string) =>
  new Uint8Array(readFileSync(new URL(`../../../../fixtures/imports/${name}`, import.meta.url)));

const SAW = (n: number, site = 'HAM') =>
  `00000000-0000-4000-8000-${site === 'HAM' ? '1' : '2'}000000000${String(n).padStart(2, '0')}`;
const MID = '1.25 in × 0.042 in × 162 in bi-metal 3/4 TPI';
const HEAVY = '1.5 in × 0.05 in × 241 in bi-metal 2/3 TPI';
const LIGHT = '1 in × 0.035 in × 138 in bi-metal 6/10 TPI';
const spec = (id: string, name: string) => ({ id, name, unitCostMinor: 11000, currency: 'USD', archived: false });

/** Hammerfield as the demo has it: six saws in service, a retired one that shares a name, three fleet specs. */
const hammerfield: ImportTarget = {
  siteId: '00000000-0000-4000-8000-0000000000a1',
  timeZone: 'America/Toronto',
  currency: 'CAD',
  saws: [
    { id: SAW(1), assetTag: 'HAM-S01', name: 'Bay 1 bar saw', retired: false },
    { id: SAW(2), assetTag: 'HAM-S02', name: 'Bay 2 bar saw', retired: false },
    { id: SAW(3), assetTag: 'HAM-S03', name: 'Tube line saw', retired: false },
    { id: SAW(4), assetTag: 'HAM-S04', name: 'Heavy bar saw', retired: false },
    { id: SAW(5), assetTag: 'HAM-S05', name: 'Offcut saw', retired: false },
    { id: SAW(6), assetTag: 'HAM-S06', name: 'Contour saw', retired: false },
    { id: SAW(7), assetTag: 'HAM-S07', name: 'Bay 2 bar saw', retired: true },
  ],
  specs: [
    spec('00000000-0000-4000-8000-0000000000b1', MID),
    spec('00000000-0000-4000-8000-0000000000b2', HEAVY),
    spec('00000000-0000-4000-8000-0000000000b3', LIGHT),
  ],
};
const maasvlakte: ImportTarget = {
  siteId: '00000000-0000-4000-8000-0000000000a2',
  timeZone: 'Europe/Amsterdam',
  currency: 'EUR',
  saws: ['Bay 1 bar saw', 'Bay 2 bar saw', 'Tube line saw', 'Heavy bar saw', 'Offcut saw'].map((name, i) => ({
    id: SAW(i + 1, 'RTM'),
    assetTag: `RTM-S0${i + 1}`,
    name,
    retired: false,
  })),
  specs: [spec('00000000-0000-4000-8000-0000000000c1', '34 mm × 1.1 mm × 4115 mm bi-metal 3/4 TPI')],
};

/** Reads a fixture the way the wizard does: every row, then the header's suggestions and detections. */
async function open(name: string, sheet: string | null = null) {
  const rows: Cell[][] = [];
  const opened = await readRows(
    bytesSource(fixture(name), name, 97),
    { format: null, encoding: null, delimiter: null, sheet },
    serverDecoders,
    { maxRows: 1000 },
    { row: (cells) => rows.push(cells), reset: () => rows.splice(0) },
  );
  return { opened, rows };
}

function planFor(
  kind: ImportKind,
  target: ImportTarget,
  opened: Opened,
  rows: Cell[][],
  extra: Partial<ImportPlan> = {},
) {
  const columns = suggestColumns(kind, opened.header, target.timeZone.startsWith('America') ? 'imperial' : 'metric');
  const dateGuess = detectDateOrder(rows.flat());
  return importPlanSchema.parse({
    siteId: target.siteId,
    kind,
    format: opened.format,
    encoding: opened.encoding,
    delimiter: opened.delimiter,
    sheet: opened.sheet,
    columns,
    decimalMark: detectDecimalMark(rows.flat()),
    dateOrder: dateGuess.kind === 'known' ? dateGuess.order : 'mdy',
    ...extra,
  });
}

function collect(kind: ImportKind, plan: ImportPlan, target: ImportTarget, rows: Cell[][]) {
  const c = new ImportCollector(kind, plan, target, { previewRows: 20, maxProblems: 200, keepCells: true });
  rows.forEach((r, i) => c.add(r, i + 2));
  c.finish();
  return c;
}

describe('what a file is', () => {
  it('tells encodings apart: BOMs, UTF-16 without a mark, strict UTF-8, then Windows-1252', () => {
    expect(sniffBytes(fixture('hammerfield-saw-list.csv'))).toEqual({ kind: 'text', encoding: 'utf-8', bom: 3 });
    expect(sniffBytes(fixture('hammerfield-blade-stock.txt'))).toEqual({ kind: 'text', encoding: 'utf-16le', bom: 2 });
    expect(sniffBytes(fixture('maasvlakte-stops.csv'))).toEqual({ kind: 'text', encoding: 'windows-1252', bom: 0 });
    expect(sniffBytes(fixture('maasvlakte-blade-log-2022.csv'))).toEqual({ kind: 'text', encoding: 'utf-8', bom: 0 });
    expect(sniffBytes(fixture('hammerfield-blade-log.xlsx'), 'log.xlsx')).toEqual({ kind: 'xlsx' });
    const utf16NoBom = new Uint8Array(iconv.encode('Saw\tStart\nHAM-S01\t2023-01-01\n', 'utf-16le'));
    expect(sniffBytes(utf16NoBom)).toMatchObject({ kind: 'text', encoding: 'utf-16le', bom: 0 });
  });

  it('refuses binary files, old workbooks, archives and empty files in words', () => {
    expect(sniffBytes(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 0]))).toMatchObject({
      kind: 'unreadable',
      message: expect.stringContaining('picture'),
    });
    expect(sniffBytes(new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 1, 2]))).toMatchObject({
      message: expect.stringContaining('.xls'),
    });
    expect(sniffBytes(new Uint8Array([0x50, 0x4b, 3, 4, 1]), 'logs.zip')).toMatchObject({
      message: expect.stringContaining('zip'),
    });
    expect(sniffBytes(new Uint8Array([1, 2, 0, 5, 7, 0, 0, 9, 200, 3]))).toMatchObject({
      message: expect.stringContaining('not text'),
    });
    expect(sniffBytes(new Uint8Array([]))).toMatchObject({ message: 'The file is empty' });
  });

  it('finds the delimiter, the decimal mark and the order of dates', () => {
    expect(detectDelimiter('a;b;c\n1,5;2,0;3\n4;5;6\n')).toBe(';');
    expect(detectDelimiter('a\tb\n1\t2\n')).toBe('\t');
    expect(detectDelimiter('a,b,c\n1,2,3\n')).toBe(',');
    expect(detectDecimalMark(['1,5', '0,75', '12'])).toBe(',');
    expect(detectDecimalMark(['1,842.5', '.042', '1,250'])).toBe('.');
    expect(detectDateOrder(['14.03.2023 06:30', '21.03.2023', '02.04.2023'])).toEqual({ kind: 'known', order: 'dmy' });
    expect(detectDateOrder(['14.03.2023 06:30', '02.04.2023'])).toEqual({
      kind: 'ambiguous',
      example: '02.04.2023',
      lean: 'dmy',
    });
    expect(detectDateOrder(['03/15/2023'])).toEqual({ kind: 'known', order: 'mdy' });
    expect(detectDateOrder(['03/04/2022 07:00', '2022-01-01'])).toEqual({
      kind: 'ambiguous',
      example: '03/04/2022 07:00',
      lean: null,
    });
    expect(detectDateOrder(['15/03/2023', '03/15/2023'])).toMatchObject({ kind: 'conflicting' });
    expect(detectDateOrder(['2023-01-01'])).toEqual({ kind: 'known', order: 'ymd' });
  });
});

describe('the saw list (UTF-8 with BOM, fractions of an inch, lengths in feet)', () => {
  it('maps its columns with their units and builds the new saws, skipping the repeat and naming the slip', async () => {
    const { opened, rows } = await open('hammerfield-saw-list.csv');
    expect(opened).toMatchObject({ format: 'csv', encoding: 'utf-8', delimiter: ',', rowsTotal: 5 });
    expect(opened.header[0]).toBe('Asset #');
    const plan = planFor('saws', hammerfield, opened, rows);
    const mapped = Object.fromEntries(plan.columns.filter((c) => c.field).map((c) => [c.field, c.unit]));
    expect(mapped).toMatchObject({
      assetTag: null,
      name: null,
      kind: null,
      wheelDiameterMm: 'in',
      bandWidthMm: 'in',
      bandLengthMm: 'ft',
      bandSpeedMinMPerMin: 'ft/min',
      bandSpeedMaxMPerMin: 'ft/min',
      capacityRoundMm: 'in',
    });
    const c = collect('saws', plan, hammerfield, rows);
    const built = c.rows.map((r) => r.record as ImportedSaw | null);
    expect(built[1]).toMatchObject({
      assetTag: 'HAM-S08',
      kind: 'horizontal',
      bandWidthMm: 38.1,
      bandThicknessMm: 1.27,
    });
    // L = 2C + πD for equal wheels: C = (20.08 ft − π·24 in)/2.
    expect(built[1]!.centreDistanceMm).toBeCloseTo((20.08 * 304.8 - Math.PI * 24 * 25.4) / 2, 6);
    expect(built[3]).toMatchObject({ kind: 'vertical', bandSpeedMaxMPerMin: 457.2 });
    expect(c.rows[4]!.error).toContain('Band thickness must be smaller than the band width');
    const s = c.summary();
    expect(s).toMatchObject({ rowsTotal: 5, rowsValid: 4, rowsRejected: 1 });
    expect(s.problems.some((p) => p.level === 'warning' && p.message.includes('Centre distance worked out'))).toBe(
      true,
    );
  });
});

describe('the blade log workbook (two sheets, mixed dates, misspelt saws, shop words)', () => {
  it('lists both sheets and reads spreadsheet dates as wall-clock times', async () => {
    const { opened, rows } = await open('hammerfield-blade-log.xlsx');
    expect(opened.sheets).toEqual([
      { name: 'Blade log 2023', rows: 14 },
      { name: 'Read me', rows: 3 },
    ]);
    expect(opened.sheet).toBe('Blade log 2023');
    expect(rows[0]![2]).toBe('2023-01-09T07:10:00');
    expect(detectDateOrder(rows.flat())).toEqual({ kind: 'ambiguous', example: '03/04/2023 14:30', lean: 'dmy' });
    const other = await open('hammerfield-blade-log.xlsx', 'Read me');
    expect(other.opened.header).toEqual(['Blade log kept by the maintenance office, Hammerfield.']);
    await expect(open('hammerfield-blade-log.xlsx', 'Summary')).rejects.toThrow(/no sheet called “Summary”/);
  });

  it('builds runs once the shop’s words and saws are settled, and screens repeats and overlaps', async () => {
    const { opened, rows } = await open('hammerfield-blade-log.xlsx');
    const first = planFor('blade_runs', hammerfield, opened, rows, { dateOrder: 'mdy' });
    expect(Object.fromEntries(first.columns.map((c) => [c.header, c.field]))).toMatchObject({
      Saw: 'saw',
      Blade: 'spec',
      'Date on': 'installedAt',
      'Date off': 'removedAt',
      'Why off': 'reason',
      'Area cut (sq in)': 'areaCutMm2',
      Cuts: 'cuts',
      'Tension (psi)': 'tensionMpa',
      Material: 'materialGroup',
      Comments: 'notes',
    });
    const before = collect('blade_runs', first, hammerfield, rows);
    const unmatched = before.unmatchedList();
    const byWritten = Object.fromEntries(unmatched.map((u) => [u.written, u]));
    expect(byWritten['Offcutt saw']!.suggestions[0]!.label).toBe('HAM-S05 · Offcut saw');
    expect(byWritten['Saw 12']!.suggestions).toEqual([]);
    expect(byWritten['snapped']).toMatchObject({ field: 'reason', rows: 2 });
    expect(byWritten['1-1/4 x .042 x 162 3/4 BiM']).toMatchObject({ field: 'spec', rows: 2 });
    // "cracked", "worn", "teeth stripped" and "crooked" need no help; "Heavy barsaw" and "ham s02" match loosely.
    expect(byWritten['cracked']).toBeUndefined();
    expect(byWritten['Heavy barsaw']).toBeUndefined();

    const plan = importPlanSchema.parse({
      ...first,
      values: {
        reason: { snapped: 'broken' },
        saw: { offcuttsaw: SAW(5) },
        spec: { '114x042x16234bim': hammerfield.specs[0]!.id },
      },
    });
    const c = collect('blade_runs', plan, hammerfield, rows);
    const s = c.summary();
    expect(s.rowsTotal).toBe(13);
    const verdicts = c.rows.map((_, i) => c.verdictOf(i).verdict);
    expect(verdicts).toEqual([
      'add',
      'add',
      'add',
      'add',
      'add',
      'add',
      'add',
      'add',
      'add',
      'repeated',
      'rejected',
      'add',
      'rejected',
    ]);
    const run = (i: number) => c.rows[i]!.record as ImportedRun;
    // 2023-01-09 07:10 in Toronto (EST, UTC−5); 1,842.5 in² = 1 188 707.3 mm²; 27,500 psi = 189.61 MPa.
    expect(run(0).installedAt.toISOString()).toBe('2023-01-09T12:10:00.000Z');
    expect(run(0).areaCutMm2).toBeCloseTo(1842.5 * 645.16, 6);
    expect(run(0).tensionMpa).toBeCloseTo(189.606, 3);
    expect(run(0)).toMatchObject({
      removalReason: 'worn_out',
      materialGroup: 'carbon_steel',
      sawId: SAW(1),
      currency: 'USD',
      costMinor: 11000,
    });
    // Month-first: 03/04/2023 14:30 is 4 March, EST.
    expect(run(1).removedAt!.toISOString()).toBe('2023-03-04T19:30:00.000Z');
    expect(run(3)).toMatchObject({ removalReason: 'broken', sawId: SAW(2), materialGroup: 'stainless_steel' });
    expect(run(4)).toMatchObject({
      removalReason: 'tooth_strippage',
      sawId: SAW(2),
      bladeSpecId: hammerfield.specs[0]!.id,
    });
    expect(run(6)).toMatchObject({ removalReason: 'crooked_cutting', materialGroup: 'alloy_steel' });
    expect(run(11)).toMatchObject({ removedAt: null, removalReason: null });
    expect(c.verdictOf(9).message).toContain('Same record as row 4');
    expect(c.rows[10]!.error).toContain('has no month 31');
    expect(c.rows[12]!.error).toContain('no saw of this site is called “Saw 12”');
    expect(s).toMatchObject({ rowsValid: 10, rowsRepeated: 1, rowsRejected: 2 });
  });

  it('reads the same month-first text day-first when told so, and then refuses what cannot be', async () => {
    const { opened, rows } = await open('hammerfield-blade-log.xlsx');
    const plan = planFor('blade_runs', hammerfield, opened, rows, { dateOrder: 'dmy' });
    const c = collect('blade_runs', plan, hammerfield, rows);
    // Day-first, row 3 is taken off on 3 April and row 4 goes on 3 April: still in order.
    expect((c.rows[1]!.record as ImportedRun | null)?.removedAt?.toISOString()).toBe('2023-04-03T18:30:00.000Z');
  });
});

describe('the stop log (Windows-1252, semicolons, decimal commas, German)', () => {
  it('decodes the euro sign and umlauts, reads hours with a comma and German words', async () => {
    const { opened, rows } = await open('maasvlakte-stops.csv');
    expect(opened).toMatchObject({ encoding: 'windows-1252', delimiter: ';' });
    expect(opened.header).toEqual(['Säge', 'Beginn', 'Dauer (h)', 'Grund', 'Geplant', 'Bemerkung']);
    expect(rows[3]![5]).toBe('Ersatzteil 35 €');
    const plan = planFor('stops', maasvlakte, opened, rows);
    expect(plan.decimalMark).toBe(',');
    expect(plan.dateOrder).toBe('dmy');
    expect(Object.fromEntries(plan.columns.map((c) => [c.header, [c.field, c.unit]]))).toEqual({
      Säge: ['saw', null],
      Beginn: ['startedAt', null],
      'Dauer (h)': ['duration', 'h'],
      Grund: ['category', null],
      Geplant: ['planned', null],
      Bemerkung: ['notes', null],
    });
    const c = collect('stops', plan, maasvlakte, rows);
    const stop = (i: number) => c.rows[i]!.record as ImportedStop;
    // 14.03.2023 06:30 in Amsterdam (CET, UTC+1), 1,5 h.
    expect(stop(0)).toMatchObject({ category: 'blade_change', planned: false, sawId: SAW(1, 'RTM') });
    expect(stop(0).startedAt.toISOString()).toBe('2023-03-14T05:30:00.000Z');
    expect(stop(0).endedAt!.toISOString()).toBe('2023-03-14T07:00:00.000Z');
    expect(stop(2)).toMatchObject({ category: 'planned_maintenance', planned: true });
    expect(stop(4)).toMatchObject({ category: 'no_material_operator' });
    const unmatched = c.unmatchedList().map((u) => [u.field, u.written]);
    expect(unmatched).toEqual(
      expect.arrayContaining([
        ['category', 'Störung Antrieb'],
        ['saw', 'Zaag 7'],
      ]),
    );
    expect(c.verdictOf(7)).toMatchObject({ verdict: 'rejected', message: expect.stringContaining('row 2') });
  });
});

describe('the blade deliveries (UTF-16 tab text, currency signs, month names)', () => {
  it('builds receipts in the site’s currency and keys them by what they are', async () => {
    const { opened, rows } = await open('hammerfield-blade-stock.txt');
    expect(opened).toMatchObject({ encoding: 'utf-16le', delimiter: '\t', rowsTotal: 4 });
    const plan = planFor('blade_stock', hammerfield, opened, rows);
    const c = collect('blade_stock', plan, hammerfield, rows);
    expect(c.rows[0]!.record).toMatchObject({
      quantity: 10,
      unitCostMinor: 11850,
      currency: 'CAD',
      receivedOn: '2023-03-04',
      reference: 'PO-2231',
    });
    expect(c.rows[1]!.record).toMatchObject({ unitCostMinor: 24600, receivedOn: '2023-06-19' });
    expect(c.rows[3]!.error).toContain('no blade spec');
    expect(c.rows[0]!.key).toContain('2023-03-04|10|11850|CAD|po-2231');
  });
});

describe('saws by name, tag and near misses', () => {
  it('matches loosely, never a retired saw by a shared name, and suggests near spellings', () => {
    expect(matchSaw(hammerfield.saws, 'ham s02')?.assetTag).toBe('HAM-S02');
    expect(matchSaw(hammerfield.saws, 'Bay 2 bar saw')?.assetTag).toBe('HAM-S02');
    expect(matchSaw(hammerfield.saws, 'HAM-S07')?.retired).toBe(true);
    expect(matchSaw(hammerfield.saws, 'Contur saw')).toBeNull();
    expect(nearSaws(hammerfield.saws, 'Contur saw')[0]?.assetTag).toBe('HAM-S06');
  });

  it('says when the headers fit another kind better', async () => {
    const { opened } = await open('maasvlakte-stops.csv');
    expect(betterKind('saws', opened.header)).toBe('stops');
    expect(betterKind('stops', opened.header)).toBeNull();
  });
});

describe('check sheets (one reading column, its unit by row)', () => {
  const checks = [
    ['c1', 'Guide bearing clearance', 'length'],
    ['c2', 'Band tracking', 'length'],
    ['c3', 'Band tension', 'stress'],
    ['c4', 'Chip brush', 'condition'],
    ['c5', 'Head down-force', 'force'],
    ['c6', 'Guide and pressure bearing wear', 'length'],
  ].map(([n, name, quantity]) => ({
    id: `00000000-0000-4000-8000-0000000000${n!.slice(1).padStart(2, '0')}`,
    name: name!,
    quantity: quantity as 'length' | 'stress' | 'condition' | 'force',
    retired: false,
  }));
  const withChecks: ImportTarget = { ...hammerfield, checks, unitSystem: 'imperial' };

  it('reads each reading in its row’s unit and the brush’s answers, and asks about a check it does not know', async () => {
    const { opened, rows } = await open('hammerfield-check-sheets.csv');
    const plan = planFor('checks', withChecks, opened, rows);
    expect(Object.fromEntries(plan.columns.map((c) => [c.header, c.field]))).toEqual({
      Saw: 'saw',
      Check: 'check',
      Date: 'checkedAt',
      Reading: 'reading',
      Unit: 'readingUnit',
      'Brush reaches gullets': 'reachesGullets',
      'Brush worn': 'brushWorn',
      Notes: 'notes',
    });
    const c = collect('checks', plan, withChecks, rows);
    expect(c.rows.map((r) => r.error).filter(Boolean)).toHaveLength(1);
    const rec = (i: number) => c.rows[i]!.record as { reading: number | null; answers: unknown; siteCheckId: string };
    // 0.043 in = 1.0922 mm; 27,500 psi = 189.606 MPa; 6.5 lbf = 28.913 N (NIST SP 811, B.8).
    expect(rec(0).reading).toBeCloseTo(1.0922, 9);
    expect(rec(1).reading).toBeCloseTo(189.6058, 3);
    expect(rec(2)).toMatchObject({ reading: null, answers: { reachesGullets: true, worn: false } });
    expect(rec(3).reading).toBe(1.4);
    expect(rec(4).reading).toBeCloseTo(28.91344, 4);
    expect(c.rows[6]!.error).toContain('no check on this site’s list is called “Guide & bearing wear”');
    expect(c.unmatchedList()[0]).toMatchObject({ field: 'check', written: 'Guide & bearing wear' });
    expect(c.unmatchedList()[0]!.suggestions[0]!.label).toBe('Guide and pressure bearing wear');
    expect(c.verdictOf(7)).toMatchObject({ verdict: 'repeated' });
  });
});
