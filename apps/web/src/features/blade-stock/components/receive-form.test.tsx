import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { StockReceiptCreateParsed } from '@kerfline/domain/blade-stock/schema';
import { SITE_ID } from '../../../test-support/fixtures';
import { SPEC_ID, makeSpec } from '../../../test-support/records';
import { ReceiveForm } from './receive-form';

function renderForm(onSubmit: (input: StockReceiptCreateParsed) => Promise<unknown>, currency = 'USD') {
  render(
    <ReceiveForm
      siteId={SITE_ID}
      currency={currency}
      timeZone="America/Chicago"
      specs={[makeSpec()]}
      onSubmit={onSubmit}
      cancel={null}
    />,
  );
  return userEvent.setup();
}

describe('receiving blades', () => {
  it('says what is missing beside each field', async () => {
    const onSubmit = vi.fn();
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('button', { name: 'Receive blades' }));
    expect(await screen.findByText('Choose the blade spec received')).toBeInTheDocument();
    expect(screen.getByText('Enter how many blades came in')).toBeInTheDocument();
    expect(screen.getByText('Enter the cost of one blade in USD')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('starts the cost from the catalogue price and sends money in cents in the site’s currency', async () => {
    const onSubmit = vi.fn<(input: StockReceiptCreateParsed) => Promise<unknown>>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Blade spec' }), SPEC_ID);
    const cost = screen.getByRole('textbox', { name: /Cost of one blade/ });
    expect(cost).toHaveValue('64.5');
    await user.clear(cost);
    await user.type(cost, '61.40');
    await user.type(screen.getByRole('textbox', { name: /Blades received/ }), '12');
    await user.type(screen.getByRole('textbox', { name: /Lot or delivery reference/ }), 'DN-44817');
    await user.click(screen.getByRole('button', { name: 'Receive blades' }));
    expect(onSubmit).toHaveBeenCalledWith(
      expect.objectContaining({
        siteId: SITE_ID,
        bladeSpecId: SPEC_ID,
        quantity: 12,
        unitCostMinor: 6140,
        currency: 'USD',
        reference: 'DN-44817',
      }),
    );
  });

  it('refuses more decimals than the currency has, and a quantity over the limit, in words', async () => {
    const onSubmit = vi.fn();
    const user = renderForm(onSubmit, 'JPY');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Blade spec' }), SPEC_ID);
    await user.type(screen.getByRole('textbox', { name: /Cost of one blade/ }), '6450.5');
    await user.type(screen.getByRole('textbox', { name: /Blades received/ }), '20000');
    await user.click(screen.getByRole('button', { name: 'Receive blades' }));
    expect(await screen.findByText('JPY has no decimals')).toBeInTheDocument();
    expect(screen.getByText('Quantity must be at most 10000 blades')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });
});
