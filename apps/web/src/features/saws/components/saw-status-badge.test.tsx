import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { SAW_STATUSES } from '@kerfline/domain/saws/schema';
import { SawStatusBadge } from './saw-status-badge';

describe('SawStatusBadge', () => {
  // Shapes after the meanings of ISO 3864 sign shapes: circle = running, square block = stopped.
  const expected = {
    in_service: { word: 'In service', shape: 'circle', element: 'circle' },
    down: { word: 'Down', shape: 'square', element: 'rect' },
    retired: { word: 'Retired', shape: 'dash', element: 'line' },
  } as const;

  it.each(SAW_STATUSES)('shows %s as a word and a shape, not colour alone', (status) => {
    const { container } = render(<SawStatusBadge status={status} />);
    const badge = screen.getByText(expected[status].word);
    expect(badge).toHaveAttribute('data-status', status);
    const svg = container.querySelector('svg');
    expect(svg).toHaveAttribute('data-shape', expected[status].shape);
    expect(svg).toHaveAttribute('aria-hidden', 'true');
    expect(svg?.querySelector(expected[status].element)).not.toBeNull();
    // Exactly one shape is drawn per status.
    expect(svg?.children).toHaveLength(1);
  });

  it('gives each status a different shape', () => {
    const shapes = SAW_STATUSES.map((status) => {
      const { container, unmount } = render(<SawStatusBadge status={status} />);
      const shape = container.querySelector('svg')?.getAttribute('data-shape');
      unmount();
      return shape;
    });
    expect(new Set(shapes).size).toBe(SAW_STATUSES.length);
  });

  it('says why a down saw is down, from its open stop, with the start in the tooltip', () => {
    const since = '2026-03-04T07:30:00.000Z';
    render(
      <SawStatusBadge
        status="down"
        down={{ stopId: '9d1c2b3a-4e5f-4a6b-8c7d-0e1f2a3b4c5d', category: 'hydraulic', planned: false, since }}
      />,
    );
    const badge = screen.getByText('Down').closest('[data-status]');
    expect(badge).toHaveTextContent('Down· Hydraulic');
    expect(badge).toHaveAttribute('title', `Down since ${new Date(since).toLocaleString()}`);
  });
});
