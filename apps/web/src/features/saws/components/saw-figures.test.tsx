import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { makeSaw } from '../../../test-support/fixtures';
import { sawFigures } from './saw-figures';
import { SawFiguresPanel } from './saw-figures-panel';

// An 18 in wheel saw with a 1-1/4 x .042 x 162 in band, its wheels 52.75 in apart, 60–360 ft/min.
const inch = 25.4;
const saw = makeSaw({
  wheelDiameterMm: 18 * inch,
  centreDistanceMm: 52.75 * inch,
  bandWidthMm: 1.25 * inch,
  bandThicknessMm: 0.042 * inch,
  bandLengthMm: 162 * inch,
  bandSpeedMinMPerMin: 60 * 0.3048,
  bandSpeedMaxMPerMin: 360 * 0.3048,
});

describe('the figures for a saw', () => {
  it('works out the band length, bending stress, bends per hour and check targets from the record', () => {
    const f = sawFigures(saw)!;
    // Equal wheels, open-belt length L = 2C + πD (any machine-design text's belt length), in inches:
    // 2 × 52.75 + π × 18 = 162.0487 in.
    expect(f.geometryLengthMm / inch).toBeCloseTo(105.5 + Math.PI * 18, 6);
    expect(f.lengthDifferenceMm / inch).toBeCloseTo(162 - (105.5 + Math.PI * 18), 6);
    expect(f.lengthMismatch).toBe(false);
    // σ = E·t/D = 207 GPa × 0.042 / 18 = 483 MPa (thin band round a wheel, E·t/D).
    expect(f.bendingStressPa / 1e6).toBeCloseTo((207e3 * 0.042) / 18, 6);
    // 360 ft/min round a 162 in band = 26.67 passes a minute, 1,600 an hour, two bends each.
    expect(f.bendCyclesPerHourAtTopSpeed).toBeCloseTo(((360 * 12) / 162) * 60 * 2, 6);
    // Guide opening = thickness + 0.001 in (common practice).
    expect(f.guideClearance.targetMm / inch).toBeCloseTo(0.043, 9);
    // Tracking overhang = 1/8 of the band width (common practice, as the domain documents it).
    expect(f.trackingOverhangMm / inch).toBeCloseTo(1.25 / 8, 9);
  });

  it('flags a band length the wheels cannot take, and shows the caution with a shape and words', () => {
    const wrong = makeSaw({ ...saw, bandLengthMm: 150 * inch });
    expect(sawFigures(wrong)!.lengthMismatch).toBe(true);
    render(<SawFiguresPanel saw={wrong} unitSystem="imperial" />);
    const note = screen.getByRole('note');
    expect(note).toHaveTextContent('Check the record');
    expect(note.querySelector('svg path')).not.toBeNull();
  });

  it('shows the figures in the site’s units', () => {
    render(<SawFiguresPanel saw={saw} unitSystem="metric" />);
    const panel = within(screen.getByLabelText('Figures for this saw'));
    expect(panel.getByText('4,116 mm')).toBeInTheDocument();
    expect(panel.getByText('483 MPa')).toBeInTheDocument();
    expect(panel.getByText('3,200')).toBeInTheDocument();
    expect(screen.queryByRole('note')).not.toBeInTheDocument();
  });

  it('gives nothing for a record whose wheels would overlap', () => {
    expect(sawFigures(makeSaw({ ...saw, centreDistanceMm: 100 }))).toBeNull();
    const { container } = render(
      <SawFiguresPanel saw={makeSaw({ ...saw, centreDistanceMm: 100 })} unitSystem="metric" />,
    );
    expect(container).toBeEmptyDOMElement();
  });
});
