import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { render } from '@testing-library/react';
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
