import { describe, expect, it, vi } from 'vitest';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ChartPanel } from './chart-panel';
import type { ChartSpec, ChartTable } from './chart-spec';

const spec: ChartSpec = {
  kind: 'bars',
  rows: [{ id: 'a', label: 'CV-HAM', slot: 1, value: 40.1 }],
  yLegend: 'ft² per blade',
  formatY: (v) => `${v} ft²`,
};
const table: ChartTable = {
  columns: ['Site', 'Median blade life'],
  rows: [{ key: 'a', cells: ['CV-HAM', '40.1 ft²'] }],
};
const base = {
  title: 'Blade life by site (median)',
  units: 'ft² cut per blade',
  legend: [{ key: 'a', label: 'CV-HAM Hammerfield', mark: <span /> }],
  exportPath: '/fleet/overview/export?table=blade-life',
  emptyMessage: 'No blade with its area recorded came off in this period.',
};

describe('a chart panel', () => {
  it('states its units, and shows the same numbers as a table a click away', async () => {
    // Nothing loaded the chart code beforehand: the panel waits for it, then draws the chart from it.
    await act(async () => {
      render(<ChartPanel {...base} spec={spec} table={table} status="success" />);
    });
    await waitFor(() =>
      expect(screen.getByRole('region', { name: base.title }).querySelector('figure')).not.toBeNull(),
    );
    expect(screen.getByText('In ft² cut per blade.')).toBeInTheDocument();
    expect(screen.getByRole('list', { name: 'Legend' })).toHaveTextContent('CV-HAM Hammerfield');
    await userEvent.setup().click(screen.getByRole('button', { name: 'Table' }));
    const shown = screen.getByRole('table', { name: /Blade life by site \(median\), in ft² cut per blade/ });
    expect(within(shown).getByRole('rowheader', { name: 'CV-HAM' })).toBeInTheDocument();
    expect(within(shown).getByText('40.1 ft²')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Table' })).toHaveAttribute('aria-pressed', 'true');
  });

  it('has loading, empty and error states of its own', async () => {
    const { rerender } = render(<ChartPanel {...base} spec={null} table={null} status="pending" />);
    expect(screen.getByRole('status')).toHaveTextContent('Loading the figures…');
    rerender(
      <ChartPanel
        {...base}
        spec={{ ...spec, rows: [{ ...spec.rows[0]!, value: null }] }}
        table={table}
        status="success"
      />,
    );
    expect(screen.getByText(base.emptyMessage)).toBeInTheDocument();
    const retry = vi.fn();
    rerender(
      <ChartPanel
        {...base}
        spec={spec}
        table={table}
        status="error"
        errorMessage="The server did not answer."
        onRetry={retry}
      />,
    );
    expect(screen.getByRole('alert')).toHaveTextContent('These figures could not be loaded');
    await userEvent.setup().click(screen.getByRole('button', { name: 'Try again' }));
    expect(retry).toHaveBeenCalledOnce();
  });
});
