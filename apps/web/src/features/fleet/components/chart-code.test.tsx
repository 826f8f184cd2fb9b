import { describe, expect, it, vi } from 'vitest';
import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ChartPanel } from './chart-panel';
import { OverviewCharts } from './overview-charts';
import { loadChartCode } from './chart-code';
import type { ChartSpec, ChartTable } from './chart-spec';
import { overviewFor } from '../../../test-support/fleet';

// The chart code's chunk as the network gives it: the test says whether the next load fails.
const network = vi.hoisted(() => ({ down: true, loads: 0 }));
vi.mock('./charts', async (importOriginal) => {
  network.loads += 1;
  if (network.down) throw new Error('Failed to fetch dynamically imported module');
  return importOriginal();
});

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

describe('the chart code', () => {
  // First: the chart code has not been asked for yet in this file, and the network is down.
  it('that could not load is said in every panel of the overview, not left loading', async () => {
    const reported = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const data = overviewFor({
      method: 'GET',
      path: '/api/fleet/overview',
      query: new URLSearchParams({ from: '2026-01', to: '2026-06' }),
      body: undefined,
    });
    await act(async () => {
      render(
        <OverviewCharts
          data={data}
          status="success"
          onRetry={() => undefined}
          units="metric"
          query={{ from: '2026-01', to: '2026-06' }}
        />,
      );
    });
    // Each of the four panels says the chart could not be drawn, or that it has nothing to draw; none is loading.
    const panels = [
      'Blade spend by month',
      'Cost per area cut by month',
      'Stop hours by category',
      'Blade life by site (median)',
    ].map((name) => screen.getByRole('region', { name }));
    await waitFor(
      () =>
        expect(
          panels.map((p) =>
            within(p).queryByText('The chart could not be drawn')
              ? 'failed'
              : within(p).queryByText(/^No .* in this period\.$/)
                ? 'empty'
                : 'loading',
          ),
        ).not.toContain('loading'),
      { timeout: 10_000 },
    );
    expect(screen.getAllByText('The chart could not be drawn').length).toBeGreaterThan(0);
    expect(screen.queryByText('Loading the figures…')).toBeNull();
    reported.mockRestore();
  }, 20_000);

  it('says when it could not load, asks again only on "Try again", and then draws the chart', async () => {
    // React reports the failed load it hands to the panel's boundary; the panel's own words are what is checked.
    const reported = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    // Awaited in act: the panel suspends on the chart code, and what follows its answer is React's work to finish.
    await act(async () => {
      render(
        <ChartPanel
          title="Blade life by site (median)"
          units="ft² cut per blade"
          spec={spec}
          table={table}
          legend={[]}
          exportPath="/fleet/overview/export?table=blade-life"
          status="success"
          emptyMessage="No blade with its area recorded came off in this period."
        />,
      );
    });
    const panel = screen.getByRole('region', { name: 'Blade life by site (median)' });
    expect(await within(panel).findByText('The chart could not be drawn')).toBeInTheDocument();
    const loadsWhileDown = network.loads;
    expect(loadsWhileDown).toBeGreaterThanOrEqual(1);

    network.down = false;
    // In act until the code is here: the panel suspends again on the new load, and React finishes on its answer.
    await act(async () => {
      await userEvent.setup().click(within(panel).getByRole('button', { name: 'Try again' }));
      await loadChartCode();
    });
    await waitFor(() => expect(panel.querySelector('figure')).not.toBeNull());
    expect(within(panel).queryByText('The chart could not be drawn')).toBeNull();
    expect(network.loads).toBe(loadsWhileDown + 1);
    reported.mockRestore();
  }, 20_000);
});
