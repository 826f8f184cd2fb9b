import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { SiteCreate } from '@kerfline/domain/sites/schema';
import { ApiError } from '../../../lib/api-client';
import { REGION_ID } from '../../../test-support/fixtures';
import { SiteForm } from './site-form';

const OTHER_REGION_ID = '6f5e4d3c-2b1a-4f0e-9d8c-7b6a5f4e3d2c';
const regions = [
  { id: REGION_ID, name: 'Great Lakes' },
  { id: OTHER_REGION_ID, name: 'Gulf Coast' },
];

type Submit = (input: SiteCreate) => Promise<unknown>;

function renderForm(onSubmit: Submit) {
  render(<SiteForm regions={regions} submitLabel="Add site" onSubmit={onSubmit} />);
  return userEvent.setup();
}

const textbox = (name: RegExp | string) => screen.getByRole('textbox', { name });
const combobox = (name: string) => screen.getByRole('combobox', { name });

describe('SiteForm', () => {
  it('asks for every choice in words before anything is sent', async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit);
    await user.type(textbox(/^Code/), 'RB 2');
    await user.click(screen.getByRole('button', { name: 'Add site' }));

    expect(await screen.findByText('Choose the region the site belongs to')).toBeInTheDocument();
    expect(textbox(/^Name/)).toHaveAccessibleDescription(/must not be empty/);
    expect(textbox(/^Code/)).toHaveAccessibleDescription(/use capital letters, digits and dashes only/);
    expect(combobox('Region')).toHaveAccessibleDescription('Choose the region the site belongs to');
    expect(combobox('Time zone')).toHaveAccessibleDescription('Choose the time zone the site works in');
    expect(combobox('Currency')).toHaveAccessibleDescription(/Choose the currency/);
    expect(screen.getByRole('group', { name: 'Units' })).toHaveAccessibleDescription(/Choose metric or imperial/);
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('takes a currency that is not in the list as a code, checked by the schema', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await user.type(textbox(/^Name/), 'Harbour Cut Centre');
    await user.type(textbox(/^Code/), 'HCC');
    await user.selectOptions(combobox('Region'), OTHER_REGION_ID);
    await user.selectOptions(combobox('Time zone'), 'Asia/Singapore');
    await user.selectOptions(combobox('Currency'), 'other');
    await user.type(textbox('Currency code'), 'S$');
    await user.click(screen.getByRole('radio', { name: /Metric/ }));
    await user.click(screen.getByRole('button', { name: 'Add site' }));
    expect(await screen.findByText(/must be a three-letter ISO 4217 currency code/)).toBeInTheDocument();
    expect(textbox('Currency code')).toHaveAccessibleDescription(/three-letter ISO 4217/);
    expect(onSubmit).not.toHaveBeenCalled();

    await user.clear(textbox('Currency code'));
    await user.type(textbox('Currency code'), 'sgd');
    await user.click(screen.getByRole('button', { name: 'Add site' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    // A blank city is sent as none; the currency code in capitals (the schema upper-cases it).
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({
      name: 'Harbour Cut Centre',
      code: 'HCC',
      city: null,
      regionId: OTHER_REGION_ID,
      timeZone: 'Asia/Singapore',
      currency: 'SGD',
      unitSystem: 'metric',
    });
  });

  it('takes the time zone as text where the browser cannot list the zones', async () => {
    // Everything else of Intl stays, so the schema still checks the zone with Intl.DateTimeFormat.
    vi.stubGlobal('Intl', Object.assign(Object.create(Intl) as typeof Intl, { supportedValuesOf: undefined }));
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit);
    expect(screen.queryByRole('combobox', { name: 'Time zone' })).not.toBeInTheDocument();
    await user.type(textbox('Time zone'), 'Mars/Olympus_Mons');
    await user.click(screen.getByRole('button', { name: 'Add site' }));
    expect(await screen.findByText(/must be an IANA time zone/)).toBeInTheDocument();
    expect(textbox('Time zone')).toHaveAttribute('aria-invalid', 'true');

    await user.clear(textbox('Time zone'));
    await user.type(textbox('Time zone'), 'Europe/Lisbon');
    await user.click(screen.getByRole('button', { name: 'Add site' }));
    expect(textbox('Time zone')).toHaveAttribute('aria-invalid', 'false');
  });

  it("puts the server's 400 details beside their fields", async () => {
    const onSubmit = vi.fn<Submit>().mockRejectedValue(
      new ApiError({
        code: 'VALIDATION_FAILED',
        status: 400,
        message: 'That region does not exist',
        details: [{ path: 'regionId', message: 'choose an existing region' }],
      }),
    );
    const user = renderForm(onSubmit);
    await user.type(textbox(/^Name/), 'Harbour Cut Centre');
    await user.type(textbox(/^Code/), 'HCC');
    await user.selectOptions(combobox('Region'), REGION_ID);
    await user.selectOptions(combobox('Time zone'), 'Europe/Berlin');
    await user.selectOptions(combobox('Currency'), 'EUR');
    await user.click(screen.getByRole('radio', { name: /Metric/ }));
    await user.click(screen.getByRole('button', { name: 'Add site' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('That region does not exist');
    expect(combobox('Region')).toHaveAccessibleDescription('choose an existing region');
  });
});
