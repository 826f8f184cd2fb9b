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
    // As AISC computes HSS: design wall t = 0.93 × 0.25 = 0.233 in, outside corners of radius 2t:
    // 2t(W + H) − (16 − 3π)t² = 2.796 − 0.357 = 2.439 in² a piece (AISC Manual Table 1-11 prints 2.44 for
    // HSS4X2X1/4); × 6 = 14.63 in².
    const areaMm2 = bundleCutAreaMm2({ kind: 'rect_tube', widthMm: 101.6, heightMm: 50.8, wallMm: 6.35 }, 6);
    expect(areaToDisplay(areaMm2, 'imperial').text).toBe('14.63 in²');
    expect(result()).toHaveTextContent('Cut area of 6 pieces14.63in²');
    expect(result()).toHaveTextContent('design wall 0.93');
    expect(result()).toHaveTextContent(
      'One pass through 6 pieces of this 4 × 2 in rectangular tube with a 0.25 in wall',
    );

    rerender(<StockAreaCalculator system="metric" />);
    // 14.634 in² × 6.4516 cm²/in² = 94.41 cm².
    expect(areaToDisplay(areaMm2, 'metric').text).toBe('94.4 cm²');
    expect(result()).toHaveTextContent('Cut area of 6 pieces94.4cm²');
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
