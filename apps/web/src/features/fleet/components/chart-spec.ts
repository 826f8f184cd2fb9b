/**
 * What a fleet chart draws, in plain data (no chart library here): the panel builds a spec and its table view
 * from the same figures, and only the lazily loaded chart code turns a spec into SVG.
 */
export type LineSpec = {
  kind: 'line';
  series: { id: string; label: string; slot: number; points: { x: string; y: number | null }[] }[];
  yLegend: string;
  formatY: (value: number) => string;
};

export type StackedSpec = {
  kind: 'stacked';
  rows: { id: string; label: string; values: Record<string, number> }[];
  keys: { key: string; label: string; colour: string }[];
  yLegend: string;
  formatY: (value: number) => string;
};

export type BarsSpec = {
  kind: 'bars';
  rows: { id: string; label: string; slot: number; value: number | null }[];
  yLegend: string;
  formatY: (value: number) => string;
};

export type ChartSpec = LineSpec | StackedSpec | BarsSpec;

/** Nothing to draw: every value missing or zero. */
export function isEmptySpec(spec: ChartSpec): boolean {
  switch (spec.kind) {
    case 'line':
      return spec.series.every((s) => s.points.every((p) => p.y === null || p.y === 0));
    case 'stacked':
      return spec.rows.every((r) => Object.values(r.values).every((v) => v === 0));
    case 'bars':
      return spec.rows.every((r) => r.value === null || r.value === 0);
  }
}

/** A table of the same numbers as the chart: one row per series or bar. */
export type ChartTable = { columns: string[]; rows: { key: string; cells: string[] }[] };
