import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { SawCreateParsed } from '@kerfline/domain/saws/schema';
import { ApiError } from '../../../lib/api-client';
import { SITE_ID, makeSaw } from '../../../test-support/fixtures';
import { SawForm } from './saw-form';

type Submit = (input: SawCreateParsed, changed: (keyof SawCreateParsed)[]) => Promise<unknown>;

function renderForm(
  onSubmit: Submit,
  unitSystem: 'metric' | 'imperial' = 'imperial',
  saw = undefined as ReturnType<typeof makeSaw> | undefined,
) {
  render(<SawForm siteId={SITE_ID} unitSystem={unitSystem} saw={saw} submitLabel="Save saw" onSubmit={onSubmit} />);
  return userEvent.setup();
}

/** The labelled input for a field; the accessible name includes the unit, e.g. "Band width (in)". */
const field = (name: RegExp) => screen.getByRole('textbox', { name });

async function fillValidImperialSaw(user: ReturnType<typeof userEvent.setup>) {
  await user.type(field(/Asset tag/), 'HS-07');
  await user.type(field(/^Name/), 'Bar line saw');
  await user.selectOptions(screen.getByRole('combobox', { name: 'Kind' }), 'horizontal');
  await user.selectOptions(screen.getByRole('combobox', { name: 'Head feed' }), 'Gravity or spring');
  await user.type(field(/Wheel diameter/), '14');
  await user.type(field(/Wheel centre distance/), '40');
  await user.type(field(/Band width/), '1.25');
  await user.type(field(/Band thickness/), '.042');
  await user.type(field(/Band length/), '162');
  await user.type(field(/Lowest band speed/), '80');
  await user.type(field(/Highest band speed/), '400');
  await user.type(field(/Round stock capacity/), '10');
}

describe('SawForm', () => {
  it('shows the units of the site in every measurement field', () => {
    renderForm(vi.fn());
    // jsdom's name computation drops the space a browser keeps before the bracket.
    expect(field(/Band width/)).toHaveAccessibleName(/^Band width\s?\(in\)$/);
    expect(field(/Lowest band speed/)).toHaveAccessibleName(/^Lowest band speed\s?\(ft\/min\)$/);
    expect(screen.getAllByText('in', { selector: '[aria-hidden="true"]' }).length).toBeGreaterThanOrEqual(8);
  });

  it('shows field errors from the schema before anything is sent', async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit);
    await user.type(field(/Band width/), '10');
    await user.type(field(/Band thickness/), '1,5');
    await user.click(screen.getByRole('button', { name: 'Save saw' }));

    expect(await screen.findByText('Enter the wheel diameter')).toBeInTheDocument();
    expect(field(/Asset tag/)).toHaveAccessibleDescription(/must not be empty/);
    expect(screen.getByRole('combobox', { name: 'Kind' })).toHaveAccessibleDescription('choose horizontal or vertical');
    expect(field(/Wheel diameter/)).toHaveAccessibleDescription('Enter the wheel diameter');
    // 10 in = 254 mm, over the schema's 200 mm limit for a band width; the limit is repeated in inches.
    expect(field(/Band width/)).toHaveAccessibleDescription(/Band width must be at most 200 mm \(7\.87 in\)/);
    expect(field(/Band thickness/)).toHaveAccessibleDescription(/must be a number written with a decimal point/);
    expect(field(/Band width/)).toHaveAttribute('aria-invalid', 'true');
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("applies the schema's cross-field rules in the site's units", async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit);
    await fillValidImperialSaw(user);
    await user.clear(field(/Lowest band speed/));
    await user.type(field(/Lowest band speed/), '500');
    await user.click(screen.getByRole('button', { name: 'Save saw' }));
    expect(await screen.findByText('Highest band speed must not be below the lowest')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('converts inches and feet per minute to millimetres and metres per minute on an imperial site', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await fillValidImperialSaw(user);
    await user.type(field(/Largest head force/), '6');
    await user.click(screen.getByRole('button', { name: 'Save saw' }));

    expect(onSubmit).toHaveBeenCalledTimes(1);
    // 1 in = 25.4 mm, 1 ft = 0.3048 m exactly (NIST SP 811 (2008), B.8); the products are worked by hand:
    // 14 in = 355.6 mm, 40 in = 1016 mm, 1.25 in = 31.75 mm, 0.042 in = 1.0668 mm, 162 in = 4114.8 mm,
    // 10 in = 254 mm, 80 ft/min = 24.384 m/min, 400 ft/min = 121.92 m/min.
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({
      siteId: SITE_ID,
      assetTag: 'HS-07',
      name: 'Bar line saw',
      kind: 'horizontal',
      headFeed: 'gravity_spring',
      make: null,
      model: null,
      wheelDiameterMm: 355.6,
      centreDistanceMm: 1016,
      bandWidthMm: 31.75,
      bandThicknessMm: 1.0668,
      bandLengthMm: 4114.8,
      bandSpeedMinMPerMin: 24.384,
      bandSpeedMaxMPerMin: 121.92,
      capacityRoundMm: 254,
      capacityRectWidthMm: null,
      capacityRectHeightMm: null,
      // 6 lbf × 4.4482216152605 N/lbf (NIST SP 811 (2008), B.8) = 26.6893 N; the least left empty: the site's.
      maxHeadForceN: 26.6893,
      minHeadForceN: null,
    });
  });

  it('asks for the head-force limits only on a head fed by gravity or a spring, in the site’s force unit', async () => {
    const user = renderForm(vi.fn<Submit>(), 'imperial');
    // A new saw starts hydraulic: no spring-balance limits.
    expect(screen.queryByRole('textbox', { name: /head force/ })).not.toBeInTheDocument();
    await user.selectOptions(screen.getByRole('combobox', { name: 'Head feed' }), 'Gravity or spring');
    expect(field(/Largest head force/)).toHaveAccessibleName(/^Largest head force\s?\(lbf\)$/);
    expect(field(/Largest head force/)).toHaveAccessibleDescription(/leave empty to use the site’s setting/);
    expect(field(/Least head force/)).toHaveAccessibleDescription(/Below this the head is not feeding/);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Head feed' }), 'Hydraulic');
    expect(screen.queryByRole('textbox', { name: /head force/ })).not.toBeInTheDocument();
  });

  it('refuses a least head force above the largest, and shows a saw’s own limits in newtons on a metric site', async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit, 'metric', makeSaw({ maxHeadForceN: 26.6893, minHeadForceN: 8.8964 }));
    expect(field(/Largest head force/)).toHaveValue('26.689');
    expect(field(/Largest head force/)).toHaveAccessibleName(/\(N\)$/);
    await user.clear(field(/Least head force/));
    await user.type(field(/Least head force/), '30');
    await user.click(screen.getByRole('button', { name: 'Save saw' }));
    expect(await screen.findByText('Largest head force must not be below the least')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("puts the server's 400 details beside their fields", async () => {
    const onSubmit = vi.fn<Submit>().mockRejectedValue(
      new ApiError({
        code: 'VALIDATION_FAILED',
        status: 400,
        message: 'Some fields need another look.',
        details: [{ path: 'bandLengthMm', message: 'Band length is too short for these wheels' }],
      }),
    );
    const user = renderForm(onSubmit);
    await fillValidImperialSaw(user);
    await user.click(screen.getByRole('button', { name: 'Save saw' }));
    expect(await screen.findByText('Band length is too short for these wheels')).toBeInTheDocument();
    expect(field(/Band length/)).toHaveAccessibleDescription(/Band length is too short for these wheels/);
    expect(screen.getByRole('alert')).toHaveTextContent('Some fields need another look.');
  });

  it('shows a 409 clash as a message above the form', async () => {
    const onSubmit = vi
      .fn<Submit>()
      .mockRejectedValue(
        new ApiError({ code: 'CONFLICT', status: 409, message: 'Asset tag HS-07 is already used at this site' }),
      );
    const user = renderForm(onSubmit);
    await fillValidImperialSaw(user);
    await user.click(screen.getByRole('button', { name: 'Save saw' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Asset tag HS-07 is already used at this site');
  });

  it('fills an edit in the site units and reports only the fields that changed', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit, 'imperial', makeSaw());
    expect(field(/Band width/)).toHaveValue('1.25');
    expect(screen.getByRole('combobox', { name: 'Head feed' })).toHaveDisplayValue('Gravity or spring');
    expect(field(/Highest band speed/)).toHaveValue('400');
    await user.clear(field(/Band length/));
    await user.type(field(/Band length/), '164.5');
    await user.click(screen.getByRole('button', { name: 'Save saw' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    const [input, changed] = onSubmit.mock.calls[0]!;
    expect(changed).toEqual(['bandLengthMm']);
    expect(input.headFeed).toBe('gravity_spring');
    // 164.5 in × 25.4 mm/in = 4178.3 mm.
    expect(input.bandLengthMm).toBe(4178.3);
  });
});
