import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { StopCreateParsed } from '@kerfline/domain/stops/schema';
import { ApiError } from '../../../lib/api-client';
import { SAW_ID } from '../../../test-support/fixtures';
import { StopForm } from './stop-form';

function renderForm(onSubmit: (input: StopCreateParsed) => Promise<unknown>) {
  render(<StopForm sawId={SAW_ID} timeZone="Europe/Berlin" onSubmit={onSubmit} cancel={null} />);
  return userEvent.setup();
}

describe('logging a stop', () => {
  it('asks why the saw stopped before anything is sent', async () => {
    const onSubmit = vi.fn();
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('button', { name: 'Log the stop' }));
    expect(await screen.findByText('Choose why the saw stopped')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('takes planned maintenance as planned, and a stop logged afterwards with its end on the site’s clock', async () => {
    const onSubmit = vi.fn<(input: StopCreateParsed) => Promise<unknown>>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('radio', { name: 'Planned maintenance' }));
    expect(screen.getByRole('radio', { name: 'Planned' })).toBeChecked();
    const start = screen.getByLabelText(/Stopped at/);
    await user.clear(start);
    await user.type(start, '2026-03-04T07:30');
    await user.click(screen.getByRole('checkbox', { name: 'Still stopped' }));
    await user.type(screen.getByLabelText(/Running again at/), '2026-03-04T09:15');
    await user.click(screen.getByRole('button', { name: 'Log the stop' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    const input = onSubmit.mock.calls[0]![0];
    // Berlin is UTC+1 in March.
    expect(input.startedAt?.toISOString()).toBe('2026-03-04T06:30:00.000Z');
    expect(input.endedAt?.toISOString()).toBe('2026-03-04T08:15:00.000Z');
    expect(input).toMatchObject({ category: 'planned_maintenance', planned: true, sawId: SAW_ID });
  });

  it('refuses an end before the start in the schema’s words', async () => {
    const onSubmit = vi.fn();
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('radio', { name: 'Hydraulic' }));
    const start = screen.getByLabelText(/Stopped at/);
    await user.clear(start);
    await user.type(start, '2026-03-04T07:30');
    await user.click(screen.getByRole('checkbox', { name: 'Still stopped' }));
    await user.type(screen.getByLabelText(/Running again at/), '2026-03-04T07:00');
    await user.click(screen.getByRole('button', { name: 'Log the stop' }));
    expect(await screen.findByText('The end must be after the start')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('shows the server’s 409 in words, naming the stop it collides with by what it is, not its id', async () => {
    const onSubmit = vi.fn().mockRejectedValue(
      new ApiError({
        code: 'CONFLICT',
        status: 409,
        message:
          'This stop overlaps stop 5d0c2b1e-7a3f-4e9a-b6c5-0f1d2e3a4b55 (hydraulic, open since 4 Mar 2026, 07:30 (Europe/Berlin)); end that stop first or change these times',
        details: [{ path: 'startedAt', message: 'overlaps another stop on this saw' }],
      }),
    );
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('radio', { name: 'Electrical' }));
    await user.click(screen.getByRole('button', { name: 'Log the stop' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent(
      'This stop overlaps the stop (hydraulic, open since 4 Mar 2026, 07:30 (Europe/Berlin)); end that stop first or change these times',
    );
    expect(screen.getByLabelText(/Stopped at/)).toHaveAccessibleDescription(/overlaps another stop on this saw/);
  });
});
