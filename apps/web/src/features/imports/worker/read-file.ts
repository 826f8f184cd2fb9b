import {
  ImportCollector,
  blobSource,
  readRows,
  standardDecoders,
  type Opened,
  type ReadSettings,
} from '@kerfline/domain/imports/pipeline';
import type { ImportPlan, PreviewRow, RowIssue, Unmatched } from '@kerfline/domain/imports/schema';
import type { ImportTarget } from '@kerfline/domain/imports/build';
import { cellText, type Cell } from '@kerfline/domain/imports/values';

/**
 * What the wizard's Web Worker does with a dropped file, kept apart from the worker's messages so it can be
 * tested: stream the whole file once to learn its shape (scan), and stream it again with the user's plan to build
 * and check every row (check). Browsers decode every encoding correctly, Windows-1252 included.
 */

/** Distinct values kept per column: enough to guess units, dates and decimal marks, and to show examples. */
const DISTINCT_PER_COLUMN = 300;
const SAMPLE_ROWS = 50;

export type ScanResult = {
  opened: Opened;
  /** The first rows, for examples beside each column. */
  sample: Cell[][];
  /** Per column, up to 300 distinct non-empty values seen anywhere in the file. */
  distinct: Cell[][];
};

export async function scanFile(
  file: Blob,
  name: string,
  settings: ReadSettings,
  maxRows: number,
  onProgress: (share: number) => void,
): Promise<ScanResult> {
  let sample: Cell[][] = [];
  let distinct: Map<string, Cell>[] = [];
  const opened = await readRows(
    blobSource(file, name),
    settings,
    standardDecoders,
    { maxRows },
    {
      row: (cells) => {
        if (sample.length < SAMPLE_ROWS) sample.push(cells);
        cells.forEach((cell, i) => {
          const text = cellText(cell);
          if (text === null) return;
          const seen = (distinct[i] ??= new Map());
          if (seen.size < DISTINCT_PER_COLUMN && !seen.has(text)) seen.set(text, cell);
        });
      },
      reset: () => {
        sample = [];
        distinct = [];
      },
    },
    onProgress,
  );
  return { opened, sample, distinct: opened.header.map((_, i) => [...(distinct[i]?.values() ?? [])]) };
}

export type CheckResult = {
  rowsTotal: number;
  rowsValid: number;
  rowsRepeated: number;
  rowsRejected: number;
  preview: PreviewRow[];
  problems: RowIssue[];
  problemsTotal: number;
  unmatched: Unmatched[];
};

export async function checkFile(
  file: Blob,
  name: string,
  plan: ImportPlan,
  target: ImportTarget,
  maxRows: number,
  onProgress: (share: number) => void,
): Promise<CheckResult> {
  const collector = new ImportCollector(plan.kind, plan, target, {
    previewRows: 20,
    maxProblems: 200,
    keepCells: false,
  });
  await readRows(
    blobSource(file, name),
    { format: plan.format, encoding: plan.encoding, delimiter: plan.delimiter, sheet: plan.sheet },
    standardDecoders,
    { maxRows },
    collector.consumer,
    onProgress,
  );
  collector.finish();
  const s = collector.summary();
  return {
    rowsTotal: s.rowsTotal,
    rowsValid: s.rowsValid,
    rowsRepeated: s.rowsRepeated,
    rowsRejected: s.rowsRejected,
    preview: s.preview,
    problems: s.problems,
    problemsTotal: s.problemsTotal,
    unmatched: s.unmatched,
  };
}
