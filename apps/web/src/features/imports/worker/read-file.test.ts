import { readFileSync } from 'node:fs';
import { Blob as NodeBlob } from 'node:buffer';
import { describe, expect, it } from 'vitest';
import { importPlanSchema } from '@kerfline/domain/imports/schema';
import { suggestColumns } from '@kerfline/domain/imports/suggest';
import { checkFile, scanFile } from './read-file';

/** Tests run from the repository root. */
const ROOT = process.cwd();

// jsdom's Blob cannot stream; Node's can, as a browser's File does.
const fixture = (name: string) => new NodeBlob([readFileSync(`${ROOT}/fixtures/imports/${name}`)]) as unknown as Blob;

const target = {
  siteId: '00000000-0000-4000-8000-0000000000a2',
  timeZone: 'Europe/Amsterdam',
  currency: 'EUR',
  saws: ['Bay 1 bar saw', 'Bay 2 bar saw', 'Tube line saw', 'Heavy bar saw', 'Offcut saw'].map((name, i) => ({
    id: `00000000-0000-4000-8000-00000000000${i + 1}`,
    assetTag: `RTM-S0${i + 1}`,
    name,
    retired: false,
  })),
  specs: [],
};

describe('what the wizard’s worker does with a dropped file', () => {
  it('scans the Windows-1252 stop log with progress, keeping examples and distinct values per column', async () => {
    const shares: number[] = [];
    const scan = await scanFile(
      fixture('maasvlakte-stops.csv'),
      'maasvlakte-stops.csv',
      { format: null, encoding: null, delimiter: null, sheet: null },
      1000,
      (s) => shares.push(s),
    );
    expect(scan.opened).toMatchObject({ encoding: 'windows-1252', delimiter: ';', rowsTotal: 8 });
    expect(shares.at(-1)).toBe(1);
    expect(scan.sample).toHaveLength(8);
    expect(scan.distinct[3]).toEqual([
      'Bandwechsel',
      'Hydraulik',
      'Wartung',
      'Störung Antrieb',
      'kein Material',
      'Elektrik',
    ]);
    expect(scan.distinct[5]).toContain('Ersatzteil 35 €');
  });

  it('checks every row with a plan and says what it did not recognise', async () => {
    const blob = fixture('maasvlakte-stops.csv');
    const scan = await scanFile(
      blob,
      'x.csv',
      { format: null, encoding: null, delimiter: null, sheet: null },
      1000,
      () => {},
    );
    const plan = importPlanSchema.parse({
      siteId: target.siteId,
      kind: 'stops',
      format: 'csv',
      encoding: scan.opened.encoding,
      delimiter: scan.opened.delimiter,
      columns: suggestColumns('stops', scan.opened.header, 'metric'),
      decimalMark: ',',
      dateOrder: 'dmy',
      values: { category: { 'storung antrieb': 'mechanical' } },
    });
    const result = await checkFile(blob, 'x.csv', plan, target, 1000, () => {});
    // The sample's heavy saw stops for 12 hours from 05:45, so its 09:00 stop overlaps it: both logs were kept.
    expect(result).toMatchObject({ rowsTotal: 8, rowsValid: 5, rowsRejected: 3 });
    expect(result.problems.map((p) => `${p.rowNumber}: ${p.message}`)).toContain(
      '7: Overlaps the stop in row 6 on the same saw; stops of a saw do not overlap',
    );
    expect(result.unmatched.map((u) => u.written)).toEqual(['Zaag 7']);
    expect(result.preview[0]!.values).toMatchObject({ category: 'Blade change', planned: 'No' });
  });
});
