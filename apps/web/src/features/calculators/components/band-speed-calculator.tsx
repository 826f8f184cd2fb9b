import { describeBasis } from '@kerfline/domain/figures/basis';
import type { SpeedPosition } from '@kerfline/domain/band-speed/check-band-speed';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { Notice } from '../../../lib/ui/notice';
import { CalculatorLayout, Explanation, ResultFigure, SourceNote } from './calculator-layout';
import { ChoiceField, EntryField, FieldGroup } from './entry-field';
import { figure, rangeFigure } from './quantities';
import { SawPicker, type CalculatorSaw } from './saw-picker';
import { StatusBadge, type StatusShape } from './status-badge';
import { BAND_SPEED_LABELS, MATERIAL_OPTIONS, evaluateBandSpeed, type BandSpeedKey } from './band-speed-values';
import { useEntries } from './use-entries';

const POSITIONS: Record<SpeedPosition, { shape: StatusShape; label: string }> = {
  below: { shape: 'triangle', label: 'Below the range' },
  within: { shape: 'circle', label: 'Within the range' },
  above: { shape: 'triangle', label: 'Above the range' },
};

/** The recommended band speed for a material, and whether a set speed (and the saw) fits it. */
export function BandSpeedCalculator({ system, saws = [] }: { system: UnitSystem; saws?: readonly CalculatorSaw[] }) {
  const form = useEntries<BandSpeedKey>(system, { material: 'carbon_steel', speed: '', sawMin: '', sawMax: '' });
  const { errors, formError, material, recommended, check } = evaluateBandSpeed(form.entries, system);

  const pick = (saw: CalculatorSaw) =>
    form.fill({
      // The saw's figures are in m/min; the fields show them in the user's unit.
      sawMin: { text: String(saw.bandSpeedMinMPerMin), system: 'metric' },
      sawMax: { text: String(saw.bandSpeedMaxMPerMin), system: 'metric' },
    });

  const fields = (
    <>
      <ChoiceField label="Material" field={form.bind('material', null, errors)} options={MATERIAL_OPTIONS} />
      <FieldGroup legend="Check a speed (optional)">
        <SawPicker saws={saws} hint="Takes the saw's band speed range from its record." onPick={pick} />
        <EntryField
          label={BAND_SPEED_LABELS.speed}
          hint="The speed the saw is set to, or the one you plan."
          field={form.bind('speed', 'bandSpeed', errors)}
          className="sm:col-span-2"
        />
        <EntryField label={BAND_SPEED_LABELS.sawMin} field={form.bind('sawMin', 'bandSpeed', errors)} />
        <EntryField label={BAND_SPEED_LABELS.sawMax} field={form.bind('sawMax', 'bandSpeed', errors)} />
      </FieldGroup>
    </>
  );

  // The size of stock the table's speeds are typical for: 50–150 mm.
  const stockSize = figure('length', 101.6, system, 0).text;
  let body = null;
  if (material && recommended) {
    const range = rangeFigure('bandSpeed', recommended.minMPerMin, recommended.maxMPerMin, system);
    const reachable = check?.reachableMPerMin;
    body = (
      <>
        <ResultFigure
          label={`Recommended band speed for ${MATERIAL_GROUP_LABELS[material]}`}
          value={range.number}
          unit={range.unit}
          detail={`Bi-metal blade, a ${stockSize} length of cut, with coolant.`}
        />
        {check ? (
          <>
            <div className="flex flex-wrap gap-2">
              <StatusBadge shape={POSITIONS[check.position].shape}>{POSITIONS[check.position].label}</StatusBadge>
              {!check.sawCanReachRange ? (
                <StatusBadge shape="triangle">This saw cannot reach the range</StatusBadge>
              ) : !check.speedWithinSaw ? (
                <StatusBadge shape="triangle">Outside this saw’s range</StatusBadge>
              ) : null}
            </div>
            <Explanation>{check.explanation}</Explanation>
            {reachable ? (
              <p className="text-sm text-ink-muted">
                This saw can run{' '}
                <span className="tabular font-semibold text-ink">
                  {rangeFigure('bandSpeed', reachable.minMPerMin, reachable.maxMPerMin, system).text}
                </span>{' '}
                of the recommended range.
              </p>
            ) : null}
          </>
        ) : (
          <Explanation>
            Run a bi-metal blade at {range.text} in {MATERIAL_GROUP_LABELS[material]}: the low end for large sections
            and hard tempers, the high end for small sections and free-machining grades.
          </Explanation>
        )}
        {formError ? <Notice title="This speed cannot be checked">{formError}</Notice> : null}
      </>
    );
  }

  return (
    <CalculatorLayout
      title="Band speed for a material"
      intro="The band speed range that suits a material, and whether the speed you set is in it and within the saw’s reach."
      form={fields}
      result={
        <>
          {body}
          <SourceNote>
            {recommended ? `${describeBasis(recommended.basis)}. ` : ''}
            The range is for a bi-metal blade, a {stockSize} length of cut, with coolant. Machinery&apos;s Handbook
            (31st ed., p. 1245) raises it up to 15 % for shorter cuts, lowers it 12 % for 8 in, halves it for
            carbon-steel blades and lowers it 30–50 % for cutting dry. 1 ft = 0.3048 m exactly (NIST SP 811).
          </SourceNote>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
