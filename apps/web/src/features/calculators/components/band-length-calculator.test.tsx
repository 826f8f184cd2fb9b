import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { bandLengthMm, centreDistanceForBandLengthMm } from '@kerfline/domain/band/band-length';
import { lengthToDisplay } from '@kerfline/domain/units/display';
import { BandLengthCalculator } from './band-length-calculator';

const field = (name: RegExp) => screen.getByRole('textbox', { name });
const result = () => screen.getByRole('region', { name: 'Result' });

/** The domain's figure with its unit (Testing Library reads the page's non-breaking spaces as spaces). */
const shown = (mm: number, system: UnitSystem) => lengthToDisplay(mm, system).text;

function renderCalculator(system: UnitSystem) {
  const view = render(<BandLengthCalculator system={system} />);
  return { ...view, user: userEvent.setup() };
}

describe('BandLengthCalculator', () => {
  it('works out the band for two 455 mm wheels 1,343 mm apart, and shows the same band in inches', async () => {
    const { user, rerender } = renderCalculator('metric');
    await user.type(field(/Drive wheel diameter/), '455');
    await user.type(field(/Centre distance/), '1343');

    const lengthMm = bandLengthMm({ driveWheelDiameterMm: 455, idlerWheelDiameterMm: 455, centreDistanceMm: 1343 });
    // Independent check, textbook open-belt drive with equal pulleys: L = 2C + πD = 2686 + 1429.42 = 4115.42 mm.
    expect(lengthMm).toBeCloseTo(2 * 1343 + Math.PI * 455, 9);
    expect(shown(lengthMm, 'metric')).toBe('4,115 mm');
    expect(result()).toHaveTextContent(
      `Two 455 mm wheels 1,343 mm apart take a band ${shown(lengthMm, 'metric')} long.`,
    );

    rerender(<BandLengthCalculator system="imperial" />);
    // 4115.42 mm ÷ 25.4 mm/in (NIST SP 811, B.8) = 162.02 in, shown to 0.1 in; the fields follow (455 mm = 17.9134 in).
    expect(shown(lengthMm, 'imperial')).toBe('162 in');
    expect(result()).toHaveTextContent(`take a band ${shown(lengthMm, 'imperial')} long.`);
    expect(field(/Drive wheel diameter/)).toHaveValue('17.9134');
    expect(field(/Drive wheel diameter/)).toHaveAccessibleName(/^Drive wheel diameter\s?\(in\)$/);
  });

  it('works in inches as typed: 18 in wheels 53 in apart take a 162.55 in band', async () => {
    const { user } = renderCalculator('imperial');
    await user.type(field(/Drive wheel diameter/), '18');
    await user.type(field(/Centre distance/), '53');
    // By hand: 2 × 53 + π × 18 = 106 + 56.549 = 162.549 in; the domain gets millimetres (× 25.4).
    const lengthMm = bandLengthMm({
      driveWheelDiameterMm: 457.2,
      idlerWheelDiameterMm: 457.2,
      centreDistanceMm: 1346.2,
    });
    expect(shown(lengthMm, 'imperial')).toBe('162.5 in');
    expect(result()).toHaveTextContent(`a band ${shown(lengthMm, 'imperial')} long`);
  });

  it('works out the centre distance for a band on unequal wheels', async () => {
    const { user } = renderCalculator('metric');
    await user.click(screen.getByRole('radio', { name: 'Centre distance' }));
    await user.type(field(/Drive wheel diameter/), '500');
    await user.type(field(/Idler wheel diameter/), '300');
    await user.type(field(/Band length/), '3100');
    const centreMm = centreDistanceForBandLengthMm({
      driveWheelDiameterMm: 500,
      idlerWheelDiameterMm: 300,
      bandLengthMm: 3100,
    });
    // Independent check: the band for that centre distance is the one asked for.
    expect(
      bandLengthMm({ driveWheelDiameterMm: 500, idlerWheelDiameterMm: 300, centreDistanceMm: centreMm }),
    ).toBeCloseTo(3100, 6);
    expect(result()).toHaveTextContent(
      `A 3,100 mm band fits a 500 mm drive wheel and a 300 mm idler wheel set ${shown(centreMm, 'metric')} apart`,
    );
  });

  it('puts the schema’s message beside the field once the user has left it', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Drive wheel diameter/), '455');
    await user.type(field(/Centre distance/), '300');
    // Not yet: the user is still in the field.
    expect(field(/Centre distance/)).not.toHaveAccessibleDescription(/overlap/);
    await user.tab();
    expect(field(/Centre distance/)).toHaveAccessibleDescription(
      /Centre distance must be more than half the sum of the wheel diameters, or the wheels overlap/,
    );
    expect(field(/Centre distance/)).toHaveAttribute('aria-invalid', 'true');
    expect(result()).not.toHaveTextContent(/NaN/);
    expect(result()).toHaveTextContent('Check the figures entered: the message beside a field says what to change.');
  });

  it('says in words what is wrong with a figure it cannot read, and asks for empty ones on "Work it out"', async () => {
    const { user } = renderCalculator('imperial');
    await user.type(field(/Drive wheel diameter/), '14,5');
    await user.click(screen.getByRole('button', { name: 'Work it out' }));
    expect(field(/Drive wheel diameter/)).toHaveAccessibleDescription(/"14,5" is not a number/);
    expect(field(/Centre distance/)).toHaveAccessibleDescription(/Enter the centre distance/);
    expect(screen.getByRole('heading', { name: 'Result' })).toHaveFocus();
  });

  it('names the wheel that is impossible, in the user’s units, when working out a centre distance', async () => {
    const { user } = renderCalculator('imperial');
    await user.click(screen.getByRole('radio', { name: 'Centre distance' }));
    await user.type(field(/Drive wheel diameter/), '-14');
    await user.type(field(/Band length/), '160');
    await user.click(screen.getByRole('button', { name: 'Work it out' }));
    expect(field(/Drive wheel diameter/)).toHaveAccessibleDescription(/Drive wheel diameter must be .*greater than 0/);
    // 3000 mm ÷ 25.4 = 118.11 in: a 200 in wheel is refused with its limit in both units, inches first.
    await user.clear(field(/Drive wheel diameter/));
    await user.type(field(/Drive wheel diameter/), '200');
    expect(field(/Drive wheel diameter/)).toHaveAccessibleDescription(
      /^Drive wheel diameter must be at most 118\.1\sin \(3,000\smm\)/,
    );
  });

  it('shows the safety caution, since the centre distance is set when fitting a band', () => {
    renderCalculator('metric');
    const caution = screen.getByRole('region', { name: /Caution/ });
    expect(caution).toHaveTextContent('Isolate and lock out the power before reaching into the saw.');
  });
});
