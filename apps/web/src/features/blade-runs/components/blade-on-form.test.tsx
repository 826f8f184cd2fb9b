import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { BladeRunInstallParsed } from '@kerfline/domain/blade-runs/schema';
import { makeSaw } from '../../../test-support/fixtures';
import { OTHER_SPEC_ID, SPEC_ID, makeRun, makeSpec } from '../../../test-support/records';
import { BladeOnForm } from './blade-on-form';
import { bladeOnDefaults, usualSpecId } from './blade-on-values';

const saw = makeSaw();
const fitting = makeSpec();
const otherSize = makeSpec({ id: OTHER_SPEC_ID, name: '1 in carbon 10/14', widthMm: 25.4, lengthMm: 3500 });

function renderForm(onSubmit = vi.fn<(input: BladeRunInstallParsed) => Promise<unknown>>(), runs = [makeRun()]) {
  const renderBreakIn = vi.fn((specId: string, material: string | null) => (
    <p>
      Plan for {specId} and {material ?? 'no material'}
    </p>
  ));
  render(
    <BladeOnForm
      saw={saw}
      system="imperial"
      timeZone="America/Chicago"
      specs={[otherSize, fitting]}
      stock={undefined}
      recentRuns={runs}
      renderBreakIn={renderBreakIn}
      onSubmit={onSubmit}
      cancel={null}
    />,
  );
  return { user: userEvent.setup(), onSubmit, renderBreakIn };
}

describe('putting a blade on', () => {
  it('starts from the saw’s usual spec, the tension last set in the site’s unit, and now on the site’s clock', () => {
    const { renderBreakIn } = renderForm();
    expect(screen.getByRole('combobox', { name: 'Blade spec' })).toHaveValue(SPEC_ID);
    // 206.8427 MPa is 30,000 psi (NIST SP 811: 1 psi = 6,894.757 Pa), shown in whole psi.
    expect(screen.getByRole('textbox', { name: /Tension set/ })).toHaveValue('30000');
    expect(screen.getByRole('combobox', { name: /Material it will cut first/ })).toHaveValue('alloy_steel');
    expect(renderBreakIn).toHaveBeenLastCalledWith(SPEC_ID, 'alloy_steel');
    expect(screen.getByText(`Plan for ${SPEC_ID} and alloy_steel`)).toBeInTheDocument();
    expect(screen.getByRole('region', { name: 'Caution: work on the saw safely' })).toHaveTextContent(
      'Isolate and lock out the power before reaching into the saw.',
    );
  });

  it('chooses the spec most often put on the saw lately, else one that fits its band', () => {
    const older = makeRun({ bladeSpecId: OTHER_SPEC_ID, installedAt: '2026-01-01T00:00:00Z' });
    expect(usualSpecId(saw, [makeRun(), older, { ...older, id: 'x' }], [fitting, otherSize])).toBe(OTHER_SPEC_ID);
    expect(usualSpecId(saw, [], [otherSize, fitting])).toBe(SPEC_ID);
    expect(bladeOnDefaults(saw, [], [otherSize, fitting], 'metric', 'UTC').tension).toBe('');
  });

  it('sends the tension in MPa and the time as the instant on the site’s clock', async () => {
    const { user, onSubmit } = renderForm(vi.fn().mockResolvedValue(undefined));
    const tension = screen.getByRole('textbox', { name: /Tension set/ });
    await user.clear(tension);
    await user.type(tension, '25,000');
    const when = screen.getByLabelText(/Put on at/);
    await user.clear(when);
    await user.type(when, '2026-03-04T07:30');
    await user.click(screen.getByRole('radio', { name: 'Skipped it' }));
    await user.click(screen.getByRole('button', { name: 'Put blade on' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    const input = onSubmit.mock.calls[0]![0];
    // 25,000 psi × 6,894.757 Pa/psi = 172.369 MPa.
    expect(input.tensionMpa).toBeCloseTo(172.369, 3);
    expect(input.installedAt?.toISOString()).toBe('2026-03-04T13:30:00.000Z');
    expect(input).toMatchObject({
      sawId: saw.id,
      bladeSpecId: SPEC_ID,
      breakInFollowed: false,
      materialGroup: 'alloy_steel',
    });
  });

  it('says what to fix beside each field and sends nothing', async () => {
    const { user, onSubmit } = renderForm(vi.fn(), []);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Blade spec' }), '');
    const tension = screen.getByRole('textbox', { name: /Tension set/ });
    await user.type(tension, '100000');
    await user.click(screen.getByRole('button', { name: 'Put blade on' }));
    expect(await screen.findByText('Choose the blade spec')).toBeInTheDocument();
    // 100,000 psi is 689 MPa, over the schema's 600 MPa; the limit is read in psi first.
    expect(tension).toHaveAccessibleDescription(/87,023 psi \(600 MPa\)/);
    expect(onSubmit).not.toHaveBeenCalled();
  });
});
