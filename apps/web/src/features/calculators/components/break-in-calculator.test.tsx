import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { planBreakIn } from '@kerfline/domain/break-in/break-in-plan';
import { areaToDisplay } from '@kerfline/domain/units/display';
import { shippedSettings, type SiteSetting } from '@kerfline/domain/settings/schema';
import { BreakInCalculator } from './break-in-calculator';

/** The shipped settings with the site's own break-in steps. */
function siteWithOwnBreakIn(): SiteSetting[] {
  return shippedSettings().map((s) =>
    s.key === 'break_in'
      ? {
          ...s,
          source: 'site',
          value: { ...s.value, startFeedPercent: 25, startMinutes: 15, stepMinutes: 10 },
          changedById: '00000000-0000-4000-8000-000000000009',
          changedByName: 'Ines Carvalho',
          changedAt: '2026-10-01T12:00:00.000Z',
        }
      : s,
  );
}

const result = () => screen.getByRole('region', { name: 'Result' });

function renderCalculator(system: UnitSystem) {
  const view = render(<BreakInCalculator system={system} />);
  return { ...view, user: userEvent.setup() };
}

describe('BreakInCalculator', () => {
  it('shows the safety caution before the plan', () => {
    renderCalculator('metric');
    const caution = screen.getByRole('region', { name: /Caution/ });
    expect(caution).toHaveTextContent('Isolate and lock out the power before reaching into the saw.');
    expect(caution).toHaveTextContent('Wear gloves and eye protection');
    expect(caution).toHaveTextContent(
      'A coiled or broken band stores energy and can spring. Uncoil it with care, pointing it away from people.',
    );
    expect(caution).toHaveTextContent('Put the guards back before running the saw.');
    expect(caution).toHaveTextContent(
      'These figures do not replace your employer’s procedures, local regulations (such as lockout/tagout rules) or the saw maker’s manual.',
    );
  });

  it('lays out the default time-based plan, with the area of each step once a cutting rate is known', async () => {
    const { user } = renderCalculator('metric');
    const plan = planBreakIn({ mode: 'time' }, null);
    // Common practice, no source: 10 min at one third of normal feed, then 5 min each at 50 % and 75 %.
    expect(plan.totalDurationMin).toBe(20);
    expect(result()).toHaveTextContent('Time to normal feed20min');
    expect(within(screen.getByRole('region', { name: 'Break-in steps' })).getAllByRole('listitem')).toHaveLength(
      plan.steps.length,
    );

    await user.type(screen.getByRole('textbox', { name: /Normal cutting rate/ }), '100');
    // 100 cm²/min = 10,000 mm²/min. By hand: (1/3 × 10 + 0.5 × 5 + 0.75 × 5) min × 10,000 mm²/min = 95,833 mm²
    // = 958.3 cm².
    const withRate = planBreakIn({ mode: 'time' }, 10000);
    expect(withRate.totalAreaMm2).toBeCloseTo(95833.33, 2);
    expect(result()).toHaveTextContent(
      `Area cut in break-in${areaToDisplay(withRate.totalAreaMm2!, 'metric').text.replace(' ', '')}`,
    );
    expect(result()).toHaveTextContent('reach normal feed after 20 min (958.3 cm² of cut)');
  });

  it('measures the steps in square inches on an area-based plan', async () => {
    const { user } = renderCalculator('imperial');
    await user.click(screen.getByRole('radio', { name: 'By area cut' }));
    const plan = planBreakIn({ mode: 'area' }, null);
    // The defaults are 50 in² at the starting feed and 25 in² a step: 100 in² in all (common practice, no source).
    expect(areaToDisplay(plan.totalAreaMm2!, 'imperial').text).toBe('100 in²');
    expect(result()).toHaveTextContent('Area cut in break-in100in²');
    expect(result()).toHaveTextContent('Time to normal feed—');
  });

  it('explains a cutting rate it cannot use', async () => {
    const { user } = renderCalculator('metric');
    const rate = screen.getByRole('textbox', { name: /Normal cutting rate/ });
    await user.type(rate, '-5');
    await user.tab();
    expect(rate).toHaveAccessibleDescription(/Normal cutting rate must be greater than 0\scm²\/min/);
    expect(result()).not.toHaveTextContent(/NaN/);
  });

  it('says the shipped steps are Kerfline’s starting value, never a rule of thumb', () => {
    renderCalculator('metric');
    expect(result()).toHaveTextContent(
      'Break-in steps: Kerfline’s starting value (no printed source gives one value).',
    );
    expect(document.body).not.toHaveTextContent(/common practice|from memory/i);
  });

  it('uses the site’s own break-in steps and says who changed them', () => {
    render(<BreakInCalculator system="metric" settings={siteWithOwnBreakIn()} timeZone="UTC" />);
    // By hand: 15 min at 25 %, then 10 min at 50 % and at 75 %: 35 min.
    expect(result()).toHaveTextContent('Time to normal feed35min');
    expect(result()).toHaveTextContent('Start the new blade at 25 % of normal feed');
    expect(result()).toHaveTextContent('Break-in steps: Your site’s setting, changed by Ines Carvalho on Oct 1, 2026.');
  });

  it('opened from a saw, gives the break-in band speeds for the material within the saw’s range', () => {
    render(
      <BreakInCalculator
        system="metric"
        start={{ sawMin: '20', sawMax: '70', material: 'carbon_steel' }}
        settings={shippedSettings()}
      />,
    );
    expect(screen.getByRole('combobox', { name: /Material to cut first/ })).toHaveValue('carbon_steel');
    // Shipped carbon steel 50–90 m/min at full band speed during break-in; the saw reaches 20–70 m/min of it.
    expect(result()).toHaveTextContent(
      'Band speed in carbon steel during break-in: 50–90 m/min; this saw runs 50–70 m/min of it.',
    );
    expect(result()).toHaveTextContent('Band speed: Kerfline’s starting value');
  });
});
