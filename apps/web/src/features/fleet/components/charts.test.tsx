import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { siteShape } from '../../../lib/palette';
import FleetChart from './charts';
import type { ChartSpec } from './chart-spec';

// jsdom lays nothing out: the chart's box says it is 600 px wide, as a browser would.
beforeEach(() => {
  vi.spyOn(HTMLElement.prototype, 'getBoundingClientRect').mockReturnValue({ width: 600 } as DOMRect);
});
afterEach(() => vi.restoreAllMocks());

const shapeTag = { circle: 'circle', square: 'rect', triangle: 'polygon', diamond: 'polygon' } as const;

describe('a line chart of sites', () => {
  it('draws one line per site, with a gap where a month has no figure, and each point in its site’s shape', () => {
    const spec: ChartSpec = {
      kind: 'line',
      series: [
        {
          id: 'a',
          label: 'CV-HAM',
          slot: 0,
          points: [
            { x: '2026-01', y: 10 },
            { x: '2026-02', y: 12 },
            { x: '2026-03', y: 11 },
          ],
        },
        {
          id: 'b',
          label: 'CV-OSL',
          slot: 1,
          points: [
            { x: '2026-01', y: 4 },
            { x: '2026-02', y: null },
            { x: '2026-03', y: 6 },
          ],
        },
      ],
      yLegend: 'EUR',
      formatY: (v) => `€${v}`,
    };
    const { container } = render(<FleetChart spec={spec} label="Spend by site" />);
    const svg = container.querySelector('svg[role="img"]')!;
    expect(svg.getAttribute('aria-label')).toBe('Spend by site');
    const lines = [...svg.querySelectorAll('path[fill="none"][stroke-width="2.5"]')];
    expect(lines).toHaveLength(2);
    // Site b's line stops at January and starts again at March: two pieces, each one point long.
    const pieces = lines.map((l) => (l.getAttribute('d') ?? '').split('M').filter(Boolean).length).sort();
    expect(pieces).toEqual([1, 2]);
    // Five points with a figure: three of site a's shape and two of site b's, never the missing month.
    const shapes = [0, 1].map((slot) => {
      const tag = shapeTag[siteShape(slot)];
      return svg.querySelectorAll(`${tag}[stroke="#FFFDF9"]`).length;
    });
    expect(siteShape(0)).not.toBe(siteShape(1));
    expect(shapes).toEqual([3, 2]);
  });
});

describe('a stacked bar chart of sites', () => {
  it('draws one bar piece per site and category with hours, in the category’s colour, and names it on hover', () => {
    const spec: ChartSpec = {
      kind: 'stacked',
      rows: [
        { id: 'a', label: 'CV-HAM', values: { breakdown: 3, blade_change: 1.5, planned: 0 } },
        { id: 'b', label: 'CV-OSL', values: { breakdown: 0, blade_change: 2, planned: 4 } },
      ],
      keys: [
        { key: 'breakdown', label: 'Breakdown', colour: '#AA0000' },
        { key: 'blade_change', label: 'Blade change', colour: '#00AA00' },
        { key: 'planned', label: 'Planned', colour: '#0000AA' },
      ],
      yLegend: 'hours',
      formatY: (v) => `${v} h`,
    };
    const { container } = render(<FleetChart spec={spec} label="Stop hours" />);
    const svg = container.querySelector('svg[role="img"]')!;
    const pieces = [...svg.querySelectorAll('rect[stroke="#FFFDF9"]')];
    // Four pieces with hours; the two zero ones are not drawn.
    expect(pieces.map((r) => r.getAttribute('fill')).sort()).toEqual(['#0000AA', '#00AA00', '#00AA00', '#AA0000']);
    // Heights in proportion to hours: site b's 4 h of planned stops twice its 2 h of blade changes.
    const height = (fill: string, i = 0) =>
      Number(pieces.filter((r) => r.getAttribute('fill') === fill)[i]!.getAttribute('height'));
    const greens = pieces
      .filter((r) => r.getAttribute('fill') === '#00AA00')
      .map((r) => Number(r.getAttribute('height')));
    expect(height('#0000AA') / Math.max(...greens)).toBeCloseTo(2, 5);
    fireEvent.mouseEnter(pieces.find((r) => r.getAttribute('fill') === '#0000AA')!);
    expect(screen.getByText(/CV-OSL: Planned 4 h/)).toBeTruthy();
  });
});

describe('the axes', () => {
  const stacked: ChartSpec = {
    kind: 'stacked',
    rows: [
      { id: 'a', label: 'CV-HAM', values: { breakdown: 3, blade_change: 1.5 } },
      { id: 'b', label: 'CV-OSL', values: { breakdown: 0, blade_change: 2, planned: 4 } },
    ],
    keys: [
      { key: 'breakdown', label: 'Breakdown', colour: '#AA0000' },
      { key: 'blade_change', label: 'Blade change', colour: '#00AA00' },
      { key: 'planned', label: 'Planned', colour: '#0000AA' },
    ],
    yLegend: 'hours',
    formatY: (v) => `${v} h`,
  };
  const texts = (svg: Element) => [...svg.querySelectorAll('text')].map((t) => t.textContent ?? '');
  const translateY = (el: Element) =>
    Number(/translate\([^,]+,([^)]+)\)/.exec(el.getAttribute('transform') ?? '')?.[1]);

  it('label the values in the chart’s unit at the heights the bars reach, and each site once', () => {
    const { container } = render(<FleetChart spec={stacked} label="Stop hours" />);
    const svg = container.querySelector('svg[role="img"]')!;
    const all = texts(svg);
    expect(all).toContain('hours');
    expect(all.filter((t) => t === 'CV-HAM')).toHaveLength(1);
    expect(all.filter((t) => t === 'CV-OSL')).toHaveLength(1);
    // Site b stacks 2 h of blade changes under 4 h of planned stops: 6 h in all, so the ticks run 0 h to 6 h.
    const ticks = all.filter((t) => / h$/.test(t));
    expect(ticks[0]).toBe('0 h');
    expect(ticks.at(-1)).toBe('6 h');
    // The tick for 2 h sits where site b's blade-change piece ends, and a grid line runs across at it.
    const tick = [...svg.querySelectorAll('g')].find((g) => g.querySelector(':scope > text')?.textContent === '2 h');
    expect(tick).toBeTruthy();
    const greens = [...svg.querySelectorAll('rect[fill="#00AA00"]')].map((r) => Number(r.getAttribute('y')));
    expect(greens).toContain(translateY(tick!));
    const gridAt = [...svg.querySelectorAll('line')].map((l) => [l.getAttribute('y1'), l.getAttribute('y2')]);
    expect(gridAt).toContainEqual([String(translateY(tick!)), String(translateY(tick!))]);
  });

  it('name each month once on a line chart, leaning, with the unit beside the values', () => {
    const spec: ChartSpec = {
      kind: 'line',
      series: [
        {
          id: 'a',
          label: 'CV-HAM',
          slot: 0,
          points: [
            { x: '2026-01', y: 10 },
            { x: '2026-02', y: 12 },
          ],
        },
      ],
      yLegend: 'EUR per month',
      formatY: (v) => `€${v}`,
    };
    const { container } = render(<FleetChart spec={spec} label="Spend" />);
    const svg = container.querySelector('svg[role="img"]')!;
    const months = [...svg.querySelectorAll('text')].filter((t) => /’26$/.test(t.textContent ?? ''));
    expect(months.map((t) => t.textContent)).toEqual(['Jan ’26', 'Feb ’26']);
    for (const m of months) expect(m.getAttribute('transform')).toMatch(/rotate\(-35\)/);
    expect(texts(svg)).toContain('EUR per month');
  });
});
