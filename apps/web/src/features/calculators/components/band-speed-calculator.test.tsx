import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { checkBandSpeed } from '@kerfline/domain/band-speed/check-band-speed';
import { BandSpeedCalculator } from './band-speed-calculator';
import type { CalculatorSaw } from './saw-picker';

const field = (name: RegExp) => screen.getByRole('textbox', { name });
const result = () => screen.getByRole('region', { name: 'Result' });

const saw: CalculatorSaw = {
  id: 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55',
  label: 'HS-07 · Bar line saw',
  bandThicknessMm: 1.0668,
  bandWidthMm: 31.75,
  bandSpeedMinMPerMin: 24.384,
  bandSpeedMaxMPerMin: 121.92,
};

function renderCalculator(system: UnitSystem) {
  const view = render(<BandSpeedCalculator system={system} saws={[saw]} />);
  return { ...view, user: userEvent.setup() };
}

describe('BandSpeedCalculator', () => {
  it('gives the range for a material in m/min, and the same range in fpm', () => {
    const { rerender } = renderCalculator('metric');
    // The domain's bi-metal table (from memory): carbon steel 50–90 m/min.
    expect(result()).toHaveTextContent('Recommended band speed for carbon steel50–90m/min');
    rerender(<BandSpeedCalculator system="imperial" saws={[saw]} />);
    // 50 and 90 m/min ÷ 0.3048 m/ft (NIST SP 811, B.8) = 164 and 295 fpm.
    expect(result()).toHaveTextContent('Recommended band speed for carbon steel164–295ft/min');
  });

  it('checks a set speed against the material and the saw picked from the list', async () => {
    const { user } = renderCalculator('imperial');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Material' }), 'Stainless steel');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Fill in from a saw' }), 'HS-07 · Bar line saw');
    // 24.384 and 121.92 m/min are 80 and 400 fpm.
    expect(field(/Lowest band speed of the saw/)).toHaveValue('80');
    expect(field(/Highest band speed of the saw/)).toHaveValue('400');
    await user.type(field(/Band speed set/), '200');
    const expected = checkBandSpeed(
      'stainless_steel',
      200 * 0.3048,
      { minMPerMin: 24.384, maxMPerMin: 121.92 },
      { system: 'imperial' },
    );
    expect(expected.position).toBe('above');
    expect(screen.getByText('Above the range')).toHaveAttribute('data-shape', 'triangle');
    expect(result()).toHaveTextContent(expected.explanation);
  });

  it('asks for the saw’s range when a speed is entered without it', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Band speed set/), '70');
    await user.click(screen.getByRole('button', { name: 'Work it out' }));
    expect(field(/Lowest band speed of the saw/)).toHaveAccessibleDescription('Enter the lowest band speed of the saw');
    expect(result()).not.toHaveTextContent(/NaN/);
  });
});
