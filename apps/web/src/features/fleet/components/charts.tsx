import { createElement, useLayoutEffect, useRef, useState, type MouseEvent, type ReactNode } from 'react';
import { Line, type LineCustomSvgLayerProps, type LineSvgLayer } from '@nivo/line';
import { Bar, type BarCustomLayerProps, type BarDatum, type BarLayer } from '@nivo/bar';
import { useTooltip } from '@nivo/tooltip';
import { monthLabel } from '@kerfline/domain/fleet/period';
import { siteColour, siteShape } from '../../../lib/palette';
import type { ChartSpec } from './chart-spec';

/*
 * The chart code, loaded on its own when a fleet screen first shows a chart, so sign-in and the technicians'
 * phone screens never carry it. Axis text is Manrope, like the rest of the product.
 */

const THEME = {
  text: { fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif', fontSize: 12, fill: '#1E2226' },
  axis: {
    legend: { text: { fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif', fontSize: 12, fontWeight: 700 } },
    ticks: { text: { fill: '#545C64' } },
  },
  grid: { line: { stroke: '#D8D1C4', strokeWidth: 1 } },
  tooltip: { container: { fontFamily: 'Manrope, ui-sans-serif, system-ui, sans-serif', fontSize: 13 } },
};

const shortMonth = (m: string) => monthLabel(m).replace(/ (\d{2})(\d{2})$/, ' ’$2');

function PointShape({ x, y, slot, size }: { x: number; y: number; slot: number; size: number }) {
  const fill = siteColour(slot);
  const h = size / 2;
  switch (siteShape(slot)) {
    case 'square':
      return <rect x={x - h} y={y - h} width={size} height={size} fill={fill} stroke="#FFFDF9" strokeWidth={1} />;
    case 'triangle':
      return (
        <polygon
          points={`${x},${y - h - 1} ${x + h + 1},${y + h} ${x - h - 1},${y + h}`}
          fill={fill}
          stroke="#FFFDF9"
          strokeWidth={1}
        />
      );
    case 'diamond':
      return (
        <polygon
          points={`${x},${y - h - 1} ${x + h + 1},${y} ${x},${y + h + 1} ${x - h - 1},${y}`}
          fill={fill}
          stroke="#FFFDF9"
          strokeWidth={1}
        />
      );
    default:
      return <circle cx={x} cy={y} r={h} fill={fill} stroke="#FFFDF9" strokeWidth={1} />;
  }
}

/** A line chart's series as drawn: each point carries its site's slot, for its shape. */
type SiteSeries = { id: string; data: { x: string; y: number | null; slot: number }[] };

/*
 * The lines and their points drawn as plain SVG. The library's own layers give every line and every point an
 * animated value (springs), which for 60 sites × 12 months was most of the time between the figures arriving and
 * the chart showing; the charts do not animate, so plain shapes draw the same picture at a fraction of the work.
 * These are called as functions by the chart (not mounted as components), so they hold no state of their own.
 */
function plainLines({ series, lineGenerator, lineWidth }: LineCustomSvgLayerProps<SiteSeries>) {
  return (
    <g>
      {[...series].reverse().map((s) => (
        <path
          key={s.id}
          d={lineGenerator(s.data.map((d) => d.position)) ?? undefined}
          fill="none"
          stroke={s.color}
          strokeWidth={lineWidth}
        />
      ))}
    </g>
  );
}

function plainPoints({ points, pointSize }: LineCustomSvgLayerProps<SiteSeries>) {
  return (
    <g>
      {points.map((p) => (
        <PointShape key={p.id} x={p.x} y={p.y} size={pointSize ?? 8} slot={p.data.slot} />
      ))}
    </g>
  );
}

const LINE_LAYERS: LineSvgLayer<SiteSeries>[] = ['grid', 'axes', 'crosshair', plainLines, plainPoints, 'slices'];

/*
 * The bars drawn as plain rectangles, for the same reason: the library's own layer gives each bar its springs, and a
 * fleet's stop hours are 60 sites × 7 categories, a long task of their own. The tooltip is the chart's own.
 */
function PlainBars<D extends BarDatum>({ bars, tooltip, borderWidth }: BarCustomLayerProps<D>) {
  const { showTooltipFromEvent, hideTooltip } = useTooltip();
  return (
    <g>
      {bars.map((bar) => {
        if (bar.height <= 0 || bar.width <= 0) return null;
        const show = (event: MouseEvent<SVGRectElement>) =>
          showTooltipFromEvent(
            createElement(tooltip, { ...bar.data, color: bar.color, label: bar.label, value: bar.data.value ?? 0 }),
            event,
          );
        return (
          <rect
            key={bar.key}
            x={bar.x}
            y={bar.y}
            width={bar.width}
            height={bar.height}
            fill={bar.color}
            stroke="#FFFDF9"
            strokeWidth={borderWidth}
            onMouseEnter={show}
            onMouseMove={show}
            onMouseLeave={hideTooltip}
          />
        );
      })}
    </g>
  );
}

const barLayers = <D extends BarDatum>(): BarLayer<D>[] => ['grid', 'axes', PlainBars<D>, 'markers', 'annotations'];

/**
 * A chart as wide as its box. The width is read in the same commit that first shows the box (a layout effect,
 * before the browser paints), so a chart draws with its figures instead of one frame later, as a resize observer
 * alone would; the observer then follows the box as the window changes.
 */
function Sized({ height, children }: { height: number; children: (width: number) => ReactNode }) {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    const element = box.current;
    if (!element) return;
    setWidth(Math.floor(element.getBoundingClientRect().width));
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(([entry]) => {
      if (entry) setWidth(Math.floor(entry.contentRect.width));
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, []);
  return (
    <div ref={box} style={{ height }}>
      {width > 0 ? children(width) : null}
    </div>
  );
}

export default function FleetChart({ spec, label, height = 320 }: { spec: ChartSpec; label: string; height?: number }) {
  const margin = { top: 16, right: 24, bottom: 56, left: 84 };
  // The value axis reads the same on every chart: five ticks in the chart's own unit, its legend beside them.
  const leftAxis = {
    format: (v: unknown) => spec.formatY(Number(v)),
    tickValues: 5,
    legend: spec.yLegend,
    legendOffset: -74,
    legendPosition: 'middle' as const,
  };
  if (spec.kind === 'line') {
    const slotOf = new Map(spec.series.map((s) => [s.id, s.slot]));
    return (
      <Sized height={height}>
        {(width) => (
          <Line<SiteSeries>
            width={width}
            height={height}
            data={spec.series.map((s) => ({ id: s.id, data: s.points.map((p) => ({ ...p, slot: s.slot })) }))}
            margin={margin}
            theme={THEME}
            animate={false}
            colors={(serie) => siteColour(slotOf.get(String(serie.id)) ?? 0)}
            lineWidth={2.5}
            xScale={{ type: 'point' }}
            yScale={{ type: 'linear', min: 0, max: 'auto' }}
            axisBottom={{ format: (v) => shortMonth(String(v)), tickRotation: -35 }}
            gridYValues={5}
            axisLeft={leftAxis}
            pointSize={8}
            layers={LINE_LAYERS}
            enableSlices="x"
            sliceTooltip={({ slice }) => (
              <div className="rounded-sheet border border-rule bg-card px-3 py-2 text-sm shadow">
                <p className="font-bold">{monthLabel(String(slice.points[0]?.data.x))}</p>
                {slice.points.map((p) => (
                  <p key={p.id}>
                    {spec.series.find((s) => s.id === p.seriesId)?.label}: {spec.formatY(Number(p.data.y))}
                  </p>
                ))}
              </div>
            )}
            role="img"
            ariaLabel={label}
          />
        )}
      </Sized>
    );
  }
  if (spec.kind === 'stacked') {
    return (
      <Sized height={height}>
        {(width) => (
          <Bar
            width={width}
            height={height}
            data={spec.rows.map((r) => ({ id: r.label, ...r.values }))}
            keys={spec.keys.map((k) => k.key)}
            indexBy="id"
            groupMode="stacked"
            margin={margin}
            theme={THEME}
            animate={false}
            padding={0.3}
            colors={(bar) => spec.keys.find((k) => k.key === bar.id)?.colour ?? '#000'}
            borderColor="#FFFDF9"
            borderWidth={1}
            enableLabel={false}
            layers={barLayers()}
            gridYValues={5}
            axisLeft={leftAxis}
            axisBottom={{ tickRotation: 0 }}
            tooltip={({ id, value, indexValue }) => (
              <div className="rounded-sheet border border-rule bg-card px-3 py-2 text-sm shadow">
                {indexValue}: {spec.keys.find((k) => k.key === id)?.label} {spec.formatY(value)}
              </div>
            )}
            role="img"
            ariaLabel={label}
          />
        )}
      </Sized>
    );
  }
  const slotOf = new Map(spec.rows.map((r) => [r.label, r.slot]));
  return (
    <Sized height={height}>
      {(width) => (
        <Bar
          width={width}
          height={height}
          data={spec.rows.map((r) => ({ id: r.label, value: r.value ?? 0 }))}
          keys={['value']}
          indexBy="id"
          margin={margin}
          theme={THEME}
          animate={false}
          padding={0.35}
          colors={(bar) => siteColour(slotOf.get(String(bar.indexValue)) ?? 0)}
          enableLabel={false}
          layers={barLayers()}
          gridYValues={5}
          axisLeft={leftAxis}
          tooltip={({ value, indexValue }) => (
            <div className="rounded-sheet border border-rule bg-card px-3 py-2 text-sm shadow">
              {indexValue}: {spec.formatY(value)}
            </div>
          )}
          role="img"
          ariaLabel={label}
        />
      )}
    </Sized>
  );
}
