import { describe, expect, it, vi } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { CutLog, CutLogCreateParsed } from '@kerfline/domain/cut-logs/schema';
import { ApiError } from '../../../lib/api-client';
import { SAW_ID, SITE_ID } from '../../../test-support/fixtures';
import { CutLogForm } from './cut-log-form';

type Submit = (input: CutLogCreateParsed) => Promise<CutLog>;

const field = (name: RegExp) => screen.getByRole('textbox', { name });

function renderForm(onSubmit: Submit, system: 'imperial' | 'metric' = 'imperial') {
  render(
    <CutLogForm
      sawId={SAW_ID}
      system={system}
      timeZone="America/Chicago"
      materialGroup="alloy_steel"
      onSubmit={onSubmit}
      cancel={null}
    />,
  );
  return userEvent.setup();
}

/**
 * What the server answers for three cuts of 2 in round bar: π/4 × 50.8² = 2,026.83 mm² a cut (3.1416 in²), and a
 * warning it worked out (the message is the server's).
 */
const answer = (input: CutLogCreateParsed): CutLog => ({
  id: '9d8c7b6a-5f4e-4d3c-8b2a-1f0e9d8c7b6a',
  siteId: SITE_ID,
  sawId: SAW_ID,
  bladeRunId: null,
  cutAt: '2026-11-30T15:00:00.000Z',
  shape: input.stock.shape,
  pieceCount: 1,
  piecesAcross: 1,
  materialGroup: input.materialGroup,
  quantity: input.quantity ?? 1,
  bandSpeedMPerMin: input.bandSpeedMPerMin ?? null,
  feedMmPerMin: null,
  cutTimeS: null,
  areaPerCutMm2: 2026.83,
  areaCutMm2: 6080.49,
  teethInWorkMin: 2.4,
  teethInWorkMax: 2.4,
  warnings: [
    {
      code: 'too_few_teeth',
      message: 'Only 2.4 teeth are in the work: fewer than 3 can strip teeth. Use a finer pitch.',
    },
  ],
  notes: null,
  createdById: null,
  createdAt: '2026-11-30T15:00:00.000Z',
});

describe('CutLogForm', () => {
  it('takes sizes and band speed in the site’s units and sends them in mm and m/min', async () => {
    const onSubmit = vi.fn<Submit>(async (input) => answer(input));
    const user = renderForm(onSubmit);
    // jsdom's name computation drops the space a browser keeps before the bracket.
    expect(field(/^Diameter/)).toHaveAccessibleName(/^Diameter\s?\(in\)$/);
    expect(field(/^Band speed/)).toHaveAccessibleName(/^Band speed\s?\(ft\/min\)$/);
    await user.type(field(/^Diameter/), '2');
    await user.clear(field(/Cuts of this kind/));
    await user.type(field(/Cuts of this kind/), '3');
    await user.type(field(/^Band speed/), '200');
    await user.click(screen.getByRole('button', { name: 'Log the cut' }));

    expect(onSubmit).toHaveBeenCalledTimes(1);
    const input = onSubmit.mock.calls[0]![0];
    // 2 in = 50.8 mm; 200 ft/min = 60.96 m/min (1 in = 25.4 mm, 1 ft = 0.3048 m exactly: NIST SP 811, B.8).
    expect(input.stock.shape).toEqual({ kind: 'round_bar', diameterMm: 50.8 });
    expect(input).toMatchObject({ sawId: SAW_ID, materialGroup: 'alloy_steel', quantity: 3, bandSpeedMPerMin: 60.96 });
  });

  it('shows the server’s answer with its warnings, and keeps the form for the next cut', async () => {
    const user = renderForm(async (input) => answer(input));
    await user.type(field(/^Diameter/), '2');
    await user.click(screen.getByRole('button', { name: 'Log the cut' }));

    const heading = await screen.findByRole('heading', { name: /^Logged: 1 ×/ });
    expect(heading).toHaveTextContent(/^Logged: 1 × 2\sin round bar$/);
    const logged = heading.closest('section')!;
    // 6,080.49 mm² ÷ 645.16 mm²/in² = 9.42 in²; the site is imperial.
    expect(logged).toHaveTextContent(/Cut area\s*9\.42\sin²/);
    expect(logged).toHaveTextContent('2.4');
    const warning = within(logged).getByText('Outside the trade’s limits').closest('[role]') ?? logged;
    expect(warning).toHaveTextContent('Only 2.4 teeth are in the work: fewer than 3 can strip teeth.');
    expect(screen.getByRole('button', { name: 'Log another' })).toBeInTheDocument();
    expect(field(/^Diameter/)).toHaveValue('2');
  });

  it('puts a 400’s message beside its field and above the form, and shows no answer', async () => {
    const onSubmit = vi.fn<Submit>().mockRejectedValue(
      new ApiError({
        code: 'VALIDATION_FAILED',
        status: 400,
        message: 'Some fields need fixing',
        details: [{ path: 'stock.shape.diameterMm', message: 'Diameter is larger than this saw can take' }],
      }),
    );
    const user = renderForm(onSubmit);
    await user.type(field(/^Diameter/), '40');
    await user.click(screen.getByRole('button', { name: 'Log the cut' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('Some fields need fixing');
    expect(field(/^Diameter/)).toHaveAccessibleDescription(/Diameter is larger than this saw can take/);
    expect(screen.queryByRole('heading', { name: /^Logged:/ })).not.toBeInTheDocument();
  });

  it('says what to fix before anything is sent', async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit, 'metric');
    await user.click(screen.getByRole('button', { name: 'Log the cut' }));
    expect(await screen.findByText('Enter the diameter')).toBeInTheDocument();
    expect(field(/^Diameter/)).toHaveAccessibleDescription('Enter the diameter');
    expect(onSubmit).not.toHaveBeenCalled();
  });
});
