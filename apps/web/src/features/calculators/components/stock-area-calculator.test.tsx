import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { bundleCutAreaMm2 } from '@kerfline/domain/stock-area/cut-area';
import { areaToDisplay } from '@kerfline/domain/units/display';
import { StockAreaCalculator } from './stock-area-calculator';

const field = (name: RegExp) => screen.getByRole('textbox', { name });
const result = () => screen.getByRole('region', { name: 'Result' });

describe('StockAreaCalculator', () => {
  it('gives the cut area of a bundle of rectangular tube in in², then in cm²', async () => {
    const { rerender } = render(<StockAreaCalculator system="imperial" />);
    const user = userEvent.setup();
    await user.selectOptions(screen.getByRole('combobox', { name: 'Shape' }), 'Rectangular tube');
    await user.type(field(/Width/), '4');
    await user.type(field(/Height/), '2');
    await user.type(field(/Wall/), '1/4');
    await user.clear(field(/Pieces in the bundle/));
    await user.type(field(/Pieces in the bundle/), '6');
    // By hand, sharp corners: 2t(W + H − 2t) = 2 × 0.25 × (4 + 2 − 0.5) = 2.75 in² a piece; × 6 = 16.5 in².
    const areaMm2 = bundleCutAreaMm2({ kind: 'rect_tube', widthMm: 101.6, heightMm: 50.8, wallMm: 6.35 }, 6);
    expect(areaToDisplay(areaMm2, 'imperial').text).toBe('16.5 in²');
    expect(result()).toHaveTextContent('Cut area of 6 pieces16.5in²');
    expect(result()).toHaveTextContent(
      'One pass through 6 pieces of this 4 × 2 in rectangular tube with a 0.25 in wall',
    );

    rerender(<StockAreaCalculator system="metric" />);
    // 16.5 in² × 6.4516 cm²/in² = 106.45 cm².
    expect(areaToDisplay(areaMm2, 'metric').text).toBe('106.5 cm²');
    expect(result()).toHaveTextContent('Cut area of 6 pieces106.5cm²');
  });

  it('refuses a bundle that is not a whole number of pieces', async () => {
    render(<StockAreaCalculator system="metric" />);
    const user = userEvent.setup();
    await user.type(field(/Diameter/), '40');
    await user.clear(field(/Pieces in the bundle/));
    await user.type(field(/Pieces in the bundle/), '2.5');
    await user.tab();
    expect(field(/Pieces in the bundle/)).toHaveAccessibleDescription(/Pieces must be a whole number/);
  });
});
