import { memo, useDeferredValue, useEffect, useMemo, useState } from 'react';
import { numberFormat } from '@kerfline/domain/common/number-format';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { FleetOverview, FleetQuery } from '@kerfline/domain/fleet/schema';
import { DOWNTIME_CATEGORIES } from '@kerfline/domain/metrics/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { monthLabel } from '@kerfline/domain/fleet/period';
import { DISPLAY_UNITS, largeAreaToDisplay, moneyPerAreaToDisplay } from '@kerfline/domain/units/display';
import { minorUnitDigits } from '@kerfline/domain/money/currency';
import { APP_LOCALE, formatNumber } from '../../../lib/format';
import { CATEGORY_COLOURS } from '../../../lib/palette';
import { ChartPanel } from './chart-panel';
import { useChartCode } from './chart-code';
import type { ChartSpec, ChartTable } from './chart-spec';
import { costPerAreaText, lifeText, spendText } from './figure-text';
import { SiteMark } from './site-mark';

type Props = {
  data: FleetOverview | undefined;
  status: 'pending' | 'error' | 'success';
  errorMessage?: string;
  onRetry: () => void;
  units: UnitSystem;
  query: FleetQuery;
};

export function exportPath(base: string, query: FleetQuery, units: UnitSystem, extra: Record<string, string> = {}) {
  const params = new URLSearchParams({ from: query.from, to: query.to, units, ...extra });
  if (query.sites?.length) params.set('sites', query.sites.join(','));
  return `${base}?${params.toString()}`;
}

/** Money on an axis or in a tooltip: cents under a thousand, whole units above (formatters made once per chart). */
const money = (currency: string) => {
  const small = numberFormat(APP_LOCALE, { style: 'currency', currency, maximumFractionDigits: 2 });
  const large = numberFormat(APP_LOCALE, { style: 'currency', currency, maximumFractionDigits: 0 });
  return (major: number) => (major < 1000 ? small : large).format(major);
};

/**
 * Moves `stage` on by one, up to `last`, the frame after `go` holds (and again each time it holds after a move):
 * what waits for a stage lets the screen paint, and take a tap, first.
 */
function useNextStageAfterFrame(stage: number, setStage: (next: number) => void, go: boolean, last: number): void {
  useEffect(() => {
    if (!go || stage >= last) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setStage(stage + 1), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== undefined) clearTimeout(timer);
    };
  }, [stage, setStage, go, last]);
}

/** The months of an overview, in order. */
const monthsOf = (data: FleetOverview) => [...new Set(data.months.map((m) => m.month))];

/** A site's figures in a month, looked up through one index of the overview's months (60 sites × 12 months). */
function monthFigures(data: FleetOverview | undefined) {
  const index = new Map((data?.months ?? []).map((m) => [`${m.siteId}|${m.month}`, m.figures]));
  return (siteId: string, month: string) => index.get(`${siteId}|${month}`);
}

type MonthFigures = NonNullable<ReturnType<ReturnType<typeof monthFigures>>>;

/** One line per site through its months, at `y` of each month's figures (null: a gap). */
function siteMonthLines(data: FleetOverview, y: (f: MonthFigures | undefined) => number | null) {
  const figure = monthFigures(data);
  const months = monthsOf(data);
  return data.sites.map(({ site: s }) => ({
    id: s.id,
    label: s.code,
    slot: s.colourIndex,
    points: months.map((m) => ({ x: m, y: y(figure(s.id, m)) })),
  }));
}

/** Spend per site and month, one line per site. */
function spendSpec(data: FleetOverview | undefined): ChartSpec | null {
  if (!data) return null;
  const currency = data.reportingCurrency;
  const digits = minorUnitDigits(currency);
  return {
    kind: 'line',
    // A month with a missing rate is left out of the line (a gap), not drawn too low.
    series: siteMonthLines(data, (f) => (f && f.spend.complete ? f.spend.amountMinor / 10 ** digits : null)),
    yLegend: `${currency} per month`,
    formatY: money(currency),
  };
}

/** A table of one figure per site and month (a chart's table view). */
function monthTable(
  from: FleetOverview | undefined,
  cell: (siteId: string, month: string) => string,
): ChartTable | null {
  if (!from) return null;
  const months = monthsOf(from);
  return {
    columns: ['Site', ...months.map(monthLabel)],
    rows: from.sites.map(({ site: s }) => ({ key: s.id, cells: [s.code, ...months.map((m) => cell(s.id, m))] })),
  };
}

type Chart = { spec: ChartSpec | null; table: ChartTable | null };

/** Cost per area cut per site by month, in the reporting currency per display area. */
function costChart(data: FleetOverview | undefined, units: UnitSystem): Chart {
  if (!data) return { spec: null, table: null };
  const currency = data.reportingCurrency;
  const figure = monthFigures(data);
  return {
    spec: {
      kind: 'line',
      series: siteMonthLines(data, (f) => {
        const v = f?.costPerAreaMinorPerMm2 ?? null;
        return v === null ? null : moneyPerAreaToDisplay(v, currency, units).value;
      }),
      yLegend: moneyPerAreaToDisplay(1, currency, units).unit,
      formatY: (v) => numberFormat(APP_LOCALE, { style: 'currency', currency, maximumSignificantDigits: 2 }).format(v),
    },
    table: monthTable(data, (siteId, m) => {
      const f = figure(siteId, m);
      return f ? costPerAreaText(f.costPerAreaMinorPerMm2, currency, units, f.costPerAreaComplete) : '—';
    }),
  };
}

/** Stop hours per site over the period, stacked by category. */
function stopChart(data: FleetOverview | undefined): Chart {
  if (!data) return { spec: null, table: null };
  return {
    spec: {
      kind: 'stacked',
      rows: data.sites.map((s) => ({
        id: s.site.id,
        label: s.site.code,
        values: Object.fromEntries(DOWNTIME_CATEGORIES.map((c) => [c, Math.round(s.current.stopHours[c] * 10) / 10])),
      })),
      keys: DOWNTIME_CATEGORIES.map((c, i) => ({
        key: c,
        label: STOP_CATEGORY_LABELS[c],
        colour: CATEGORY_COLOURS[i]!,
      })),
      yLegend: 'hours',
      formatY: (v) => `${formatNumber(v)} h`,
    },
    table: {
      columns: ['Site', ...DOWNTIME_CATEGORIES.map((c) => STOP_CATEGORY_LABELS[c]), 'All stops'],
      rows: data.sites.map((s) => ({
        key: s.site.id,
        cells: [
          `${s.site.code} ${s.site.name}`,
          ...DOWNTIME_CATEGORIES.map((c) => `${formatNumber(s.current.stopHours[c], 1)} h`),
          `${formatNumber(s.current.downtimeHours, 1)} h`,
        ],
      })),
    },
  };
}

/** Median blade life per site over the period, in the display area. */
function lifeChart(data: FleetOverview | undefined, units: UnitSystem): Chart {
  if (!data) return { spec: null, table: null };
  const areaUnit = DISPLAY_UNITS.largeArea[units].unit;
  return {
    spec: {
      kind: 'bars',
      rows: data.sites.map((s) => ({
        id: s.site.id,
        label: s.site.code,
        slot: s.site.colourIndex,
        value: s.current.medianLifeMm2 === null ? null : largeAreaToDisplay(s.current.medianLifeMm2, units).value,
      })),
      yLegend: `${areaUnit} per blade`,
      formatY: (v) => `${formatNumber(v, v < 10 ? 1 : 0)} ${areaUnit}`,
    },
    table: {
      columns: ['Site', 'Median blade life', 'Mean blade life', 'Blades finished with area', 'Mean cuts per blade'],
      rows: data.sites.map((s) => ({
        key: s.site.id,
        cells: [
          `${s.site.code} ${s.site.name}`,
          lifeText(s.current.medianLifeMm2, units),
          lifeText(s.current.meanLifeMm2, units),
          formatNumber(s.current.bladesWithArea),
          s.current.meanCutsPerBlade === null ? '—' : formatNumber(s.current.meanCutsPerBlade),
        ],
      })),
    },
  };
}

const STOP_LEGEND = DOWNTIME_CATEGORIES.map((c, i) => ({
  key: c,
  label: STOP_CATEGORY_LABELS[c],
  mark: <span aria-hidden="true" className="inline-block size-3" style={{ background: CATEGORY_COLOURS[i] }} />,
}));

/** A panel redraws only when what it shows changes (the overview adds its charts one at a time). */
const MemoChartPanel = memo(ChartPanel);

/** The overview's four charts: spend and cost per area per site by month, stop hours by category, blade life. */
export function OverviewCharts({ data: shown, status: shownStatus, errorMessage, onRetry, units, query }: Props) {
  // The first chart draws with the figures as they come; the other three once it is on screen (the frame after
  // both the figures and the chart code are here, or the code failed and every panel says so), one a frame, each
  // after the one before is drawn: a chart is a long task, and three in one kept the page from answering a tap.
  // Later figures (another period) reach them in the background (React's deferred value), never before the first.
  const chartCodeSettled = useChartCode() !== 'coming';
  const [stage, setStage] = useState(0);
  const data = useDeferredValue<FleetOverview | null | undefined>(stage >= 1 ? shown : null, null) ?? undefined;
  // Stage 1 once the figures and the code are here; 2 and 3 once the second chart has its figures (drawn).
  useNextStageAfterFrame(stage, setStage, shown !== undefined && chartCodeSettled && (stage === 0 || !!data), 3);
  const stopData = stage >= 2 ? data : undefined;
  const lifeData = stage >= 3 ? data : undefined;
  const statusOf = (d: FleetOverview | undefined) => (shownStatus === 'success' && !d ? 'pending' : shownStatus);
  const currency = data?.reportingCurrency ?? 'USD';
  const shownCurrency = shown?.reportingCurrency ?? 'USD';
  const perAreaUnit = moneyPerAreaToDisplay(1, currency, units).unit;
  const areaUnit = DISPLAY_UNITS.largeArea[units].unit;
  // Each chart's figures are worked out once for the figures it shows (useMemo) and its panel is memoized: a
  // stage redraws the chart it adds, not the ones already on screen.
  const legend = useMemo(
    () =>
      (shown?.sites.map((s) => s.site) ?? []).map((s) => ({
        key: s.id,
        label: `${s.code} ${s.name}`,
        mark: <SiteMark slot={s.colourIndex} />,
      })),
    [shown],
  );
  const spend = useMemo(() => {
    const figure = monthFigures(shown);
    return {
      spec: spendSpec(shown),
      table: monthTable(shown, (siteId, m) => {
        const f = figure(siteId, m);
        return f ? spendText(f.spend) : '—';
      }),
    };
  }, [shown]);
  const cost = useMemo(() => costChart(data, units), [data, units]);
  const stops = useMemo(() => stopChart(stopData), [stopData]);
  const life = useMemo(() => lifeChart(lifeData, units), [lifeData, units]);

  const common = { errorMessage, onRetry };
  return (
    <div className="grid gap-6 xl:grid-cols-2">
      <MemoChartPanel
        status={shownStatus}
        errorMessage={errorMessage}
        onRetry={onRetry}
        title="Blade spend by month"
        units={`${shownCurrency}, each month converted at its own rate`}
        spec={spend.spec}
        table={spend.table}
        legend={legend}
        exportPath={exportPath('/fleet/overview/export', query, units, { table: 'months' })}
        emptyMessage="No blades were put on in this period."
      />
      <MemoChartPanel
        {...common}
        status={statusOf(data)}
        title="Cost per area cut by month"
        units={`${currency} per ${units === 'imperial' ? 'square inch' : 'square centimetre'} (${perAreaUnit})`}
        spec={cost.spec}
        table={cost.table}
        legend={legend}
        exportPath={exportPath('/fleet/overview/export', query, units, { table: 'months' })}
        emptyMessage="No blade with its area recorded came off in this period."
      />
      <MemoChartPanel
        {...common}
        status={statusOf(stopData)}
        title="Stop hours by category"
        units="hours, per site over the period"
        spec={stops.spec}
        table={stops.table}
        legend={STOP_LEGEND}
        exportPath={exportPath('/fleet/overview/export', query, units, { table: 'stop-hours' })}
        emptyMessage="No stops were recorded in this period."
      />
      <MemoChartPanel
        {...common}
        status={statusOf(lifeData)}
        title="Blade life by site (median)"
        units={`${areaUnit} cut per blade (${units === 'imperial' ? 'square feet' : 'square metres'})`}
        spec={life.spec}
        table={life.table}
        legend={legend}
        exportPath={exportPath('/fleet/overview/export', query, units, { table: 'blade-life' })}
        emptyMessage="No blade with its area recorded came off in this period."
      />
      <p className="text-sm text-ink-muted xl:col-span-2">
        Money is in {currency}: blades bought in another currency are converted at the rate an administrator entered for
        their month. A figure marked * leaves out money whose month has no rate yet.
      </p>
    </div>
  );
}
