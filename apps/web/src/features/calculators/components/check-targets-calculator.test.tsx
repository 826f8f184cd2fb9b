import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { guideClearanceTarget } from '@kerfline/domain/checks/check-targets';
import { smallLengthToDisplay } from '@kerfline/domain/units/display';
import { CheckTargetsCalculator } from './check-targets-calculator';
import type { CalculatorSaw } from './saw-picker';

const field = (name: RegExp) => screen.getByRole('textbox', { name });
const check = (name: string) => screen.getByRole('article', { name });

const saw: CalculatorSaw = {
  id: 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55',
  label: 'HS-07 · Bar line saw',
  bandThicknessMm: 1.0668,
  bandWidthMm: 31.75,
  bandSpeedMinMPerMin: 24.384,
  bandSpeedMaxMPerMin: 121.92,
};

function renderCalculator(system: UnitSystem, saws: CalculatorSaw[] = []) {
  const view = render(<CheckTargetsCalculator system={system} saws={saws} />);
  return { ...view, user: userEvent.setup() };
}

describe('CheckTargetsCalculator', () => {
  it('shows the safety caution', () => {
    renderCalculator('imperial');
    const caution = screen.getByRole('region', { name: /Caution/ });
    expect(caution).toHaveTextContent('Isolate and lock out the power before reaching into the saw.');
    expect(caution).toHaveTextContent('local regulations (such as lockout/tagout rules)');
  });

  it('gives the guide opening for a 0.035 in band and fails a loose reading', async () => {
    const { user } = renderCalculator('imperial');
    await user.type(field(/Band thickness/), '0.035');
    // Common practice, no source: band thickness + 0.001 in = 0.036 in; up to 0.001 in more open passes.
    const target = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: 0.889 });
    expect(smallLengthToDisplay(target.target!, 'imperial').text).toBe('0.036 in');
    const guide = check('Guide bearing clearance');
    expect(guide).toHaveTextContent('Target0.036 in');
    expect(guide).toHaveTextContent('Passes0.036–0.037 in');
    expect(within(guide).getByText('Not measured')).toHaveAttribute('data-shape', 'dash');

    await user.type(field(/Measured opening/), '0.040');
    expect(within(guide).getByText('Fail')).toHaveAttribute('data-shape', 'square');
    expect(guide).toHaveTextContent('too loose');
    await user.clear(field(/Measured opening/));
    await user.type(field(/Measured opening/), '0.0365');
    expect(within(guide).getByText('Pass')).toHaveAttribute('data-shape', 'circle');
    expect(within(guide).queryByText('Fail')).not.toBeInTheDocument();
    // As tight as the band itself pinches it: a fail.
    await user.clear(field(/Measured opening/));
    await user.type(field(/Measured opening/), '0.035');
    expect(within(guide).getByText('Fail')).toHaveAttribute('data-shape', 'square');
    expect(guide).toHaveTextContent('too tight');
    // The explanation reads inches first on an imperial site.
    expect(guide).toHaveTextContent('0.036 in (0.914 mm)');
  });

  it('has head force and bearing targets before any band is entered', () => {
    renderCalculator('metric');
    // 8 lbf × 4.448 N/lbf (NIST SP 811, B.8) = 35.6 N (common practice, no source); 2 lbf = 8.9 N (ours).
    expect(check('Head down-force')).toHaveTextContent('TargetAt most 35.6 N');
    expect(check('Head down-force')).toHaveTextContent('Passes8.9–35.6 N');
    expect(check('Guide bearing clearance')).toHaveTextContent('Enter the band thickness above for this target.');
  });

  it('fills the band from a saw, in the user’s units', async () => {
    const { user } = renderCalculator('imperial', [saw]);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Fill in from a saw' }), 'HS-07 · Bar line saw');
    // 1.0668 mm ÷ 25.4 = 0.042 in; 31.75 mm = 1.25 in.
    expect(field(/Band thickness/)).toHaveValue('0.042');
    expect(field(/Band width/)).toHaveValue('1.25');
    expect(check('Guide bearing clearance')).toHaveTextContent('Target0.043 in');
  });

  it('starts from a spring-fed saw’s own head-force limits, and asks for none on a hydraulic head', async () => {
    // 6 lbf greatest and 3 lbf least, as the saw page's link carries them (1 lbf = 4.448 N, NIST SP 811, B.8).
    const spring = { ...saw, headFeed: 'gravity_spring' as const, maxHeadForceN: 26.6893, minHeadForceN: 13.3447 };
    const view = render(
      <CheckTargetsCalculator
        system="imperial"
        saws={[spring]}
        saw={spring}
        start={{ maxForce: '6', minForce: '3' }}
      />,
    );
    expect(field(/Largest head force/)).toHaveValue('6');
    expect(field(/Least head force/)).toHaveValue('3');
    expect(check('Head down-force')).toHaveTextContent('Passes3–6 lbf');
    expect(check('Head down-force')).toHaveTextContent("Source: This saw's own head-force limits.");
    view.unmount();
    const hydraulic = { ...saw, headFeed: 'hydraulic' as const };
    render(<CheckTargetsCalculator system="imperial" saws={[hydraulic]} saw={hydraulic} />);
    expect(screen.queryByRole('textbox', { name: /head force/ })).not.toBeInTheDocument();
  });

  it('puts the schema’s message beside the band thickness', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Band thickness/), '9');
    await user.tab();
    expect(field(/Band thickness/)).toHaveAccessibleDescription(/Band thickness must be at most 5\smm/);
    expect(check('Guide bearing clearance')).toHaveTextContent('Correct the figure with a message to get this target.');
  });
});
