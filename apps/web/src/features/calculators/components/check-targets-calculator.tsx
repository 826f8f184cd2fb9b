import { useId } from 'react';
import type { CheckResult } from '@kerfline/domain/checks/check-targets';
import { describeBasis } from '@kerfline/domain/figures/basis';
import { CHECK_DEFAULTS, type CheckKindId } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { CalculatorLayout } from './calculator-layout';
import { ChoiceField, EntryField, FieldGroup } from './entry-field';
import { figure, rangeFigure, type Quantity } from './quantities';
import { SafetyCaution } from './safety-caution';
import { SawPicker, type CalculatorSaw } from './saw-picker';
import { StatusBadge } from './status-badge';
import {
  BLADE_MATERIAL_OPTIONS,
  YES_NO_OPTIONS,
  evaluateCheckTargets,
  type CheckOutcome,
  type CheckTargetsKey,
} from './check-targets-values';
import { useEntries, type EntriesForm, type FieldErrors } from './use-entries';

/** Lengths in checks are feeler-gauge small: four decimals of an inch, three of a millimetre. */
const CHECK_DECIMALS: Partial<Record<Quantity, Record<UnitSystem, number>>> = {
  length: { imperial: 4, metric: 3 },
  force: { imperial: 1, metric: 1 },
};

/** A check's figure (given in the domain's unit: mm, N or MPa) in the user's units. */
function checkFigure(result: CheckResult, value: number, system: UnitSystem) {
  if (result.unit === 'MPa') return figure('stress', value * 1e6, system);
  const quantity: Quantity = result.unit === 'N' ? 'force' : 'length';
  return figure(quantity, value, system, CHECK_DECIMALS[quantity]?.[system]);
}

function checkRange(result: CheckResult, min: number, max: number, system: UnitSystem) {
  if (result.unit === 'MPa') return rangeFigure('stress', min * 1e6, max * 1e6, system);
  const quantity: Quantity = result.unit === 'N' ? 'force' : 'length';
  return rangeFigure(quantity, min, max, system, CHECK_DECIMALS[quantity]?.[system]);
}

/** The target and the passing readings of a check, in words and the user's units. */
function targetLines(result: CheckResult, system: UnitSystem): { target: string; passes: string } {
  if (result.target === null || result.max === null) {
    return { target: 'Reaches the gullets, not worn', passes: 'Reaches: yes · Worn: no' };
  }
  const max = checkFigure(result, result.max, system).text;
  if (result.kind === 'feed_pressure') {
    return { target: `At most ${max}`, passes: checkRange(result, result.min ?? 0, result.max, system).text };
  }
  if (result.kind === 'bearing_wear') return { target: 'Flush: no gap', passes: `A gap up to ${max}` };
  return {
    target: checkFigure(result, result.target, system).text,
    passes: checkRange(result, result.min ?? 0, result.max, system).text,
  };
}

/** The reading field of each check that has one, with its label and hint. */
const READINGS: Partial<
  Record<CheckKindId, { key: CheckTargetsKey; label: string; quantity: Quantity; hint?: string }>
> = {
  guide_clearance: {
    key: 'guideMeasured',
    label: 'Measured opening',
    quantity: 'length',
    hint: 'Feeler gauges across the guide.',
  },
  tracking: {
    key: 'trackingMeasured',
    label: 'Measured overhang',
    quantity: 'length',
    hint: 'Tooth edge past the wheel face; negative if it sits back on the face.',
  },
  band_tension: { key: 'tensionMeasured', label: 'Tension meter reading', quantity: 'stress' },
  feed_pressure: {
    key: 'forceMeasured',
    label: 'Spring-balance reading',
    quantity: 'force',
    hint: 'Hooked on the head directly above the band, read over the last inch (25.4 mm) of travel.',
  },
  bearing_wear: { key: 'wearMeasured', label: 'Gap under the straightedge', quantity: 'length' },
};

function CheckItem({
  outcome,
  form,
  errors,
  system,
}: {
  outcome: CheckOutcome;
  form: EntriesForm<CheckTargetsKey>;
  errors: FieldErrors<CheckTargetsKey>;
  system: UnitSystem;
}) {
  const headingId = useId();
  const { kind, result } = outcome;
  const reading = READINGS[kind.kind];
  const lines = result ? targetLines(result, system) : null;
  // Figures read large; the chip brush's words at body size.
  const figureSize = kind.kind === 'chip_brush' ? 'text-base' : 'text-lg';
  const due = kind.due === 'blade_change' ? 'At every blade change' : `Every ${kind.defaultIntervalDays} days`;

  return (
    <article aria-labelledby={headingId} className="space-y-3 py-5 first:pt-0 last:pb-0">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 id={headingId} className="text-lg font-bold text-ink">
            {kind.label}
          </h3>
          <p className="text-sm text-ink-muted">{due}</p>
        </div>
        {result?.passed === true ? <StatusBadge shape="circle">Pass</StatusBadge> : null}
        {result?.passed === false ? <StatusBadge shape="square">Fail</StatusBadge> : null}
        {result && result.passed === null ? <StatusBadge shape="dash">Not measured</StatusBadge> : null}
      </div>
      {lines ? (
        <dl className="grid grid-cols-2 gap-3">
          <div>
            <dt className="text-sm text-ink-muted">Target</dt>
            <dd className={`tabular font-extrabold text-ink ${figureSize}`}>{lines.target}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-muted">Passes</dt>
            <dd className={`tabular font-extrabold text-ink ${figureSize}`}>{lines.passes}</dd>
          </div>
        </dl>
      ) : (
        <p className="text-ink-muted">{outcome.waiting}</p>
      )}
      {reading ? (
        <EntryField
          className="sm:max-w-sm"
          label={reading.label}
          hint={reading.hint}
          field={form.bind(reading.key, reading.quantity, errors)}
        />
      ) : null}
      {kind.kind === 'chip_brush' ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <ChoiceField
            label="Reaches into the gullets?"
            field={form.bind('brushReaches', null, errors)}
            options={YES_NO_OPTIONS}
          />
          <ChoiceField label="Bristles worn?" field={form.bind('brushWorn', null, errors)} options={YES_NO_OPTIONS} />
        </div>
      ) : null}
      {result ? (
        <>
          <p className="text-sm text-ink">{result.explanation}</p>
          {result.basis ? (
            <p className="text-xs text-ink-muted">
              <span className="font-bold">Source: </span>
              {describeBasis(result.basis)}.
            </p>
          ) : null}
        </>
      ) : null}
    </article>
  );
}

/** Target and tolerance of each maintenance check for a band, and pass or fail for what was measured. */
export function CheckTargetsCalculator({ system, saws = [] }: { system: UnitSystem; saws?: readonly CalculatorSaw[] }) {
  const form = useEntries<CheckTargetsKey>(system, {
    thickness: '',
    width: '',
    material: 'bimetal',
    maxForce: '',
    guideMeasured: '',
    trackingMeasured: '',
    forceMeasured: '',
    wearMeasured: '',
    tensionMeasured: '',
    brushReaches: '',
    brushWorn: '',
  });
  const { errors, checks } = evaluateCheckTargets(form.entries, system);
  // A summary on top, so a failed check is seen without scrolling the list on a phone.
  const failed = checks.filter((outcome) => outcome.result?.passed === false).length;
  const passed = checks.filter((outcome) => outcome.result?.passed === true).length;
  const usualForce = figure('force', CHECK_DEFAULTS.maxHeadForceN, system, 1).text;

  const pick = (saw: CalculatorSaw) =>
    form.fill({
      // The saw's record is in millimetres; the fields show them in the user's unit.
      thickness: { text: String(saw.bandThicknessMm), system: 'metric' },
      width: { text: String(saw.bandWidthMm), system: 'metric' },
    });

  const fields = (
    <FieldGroup legend="Band and saw">
      <SawPicker saws={saws} hint="Takes the band thickness and width from the saw's record." onPick={pick} />
      <EntryField
        label="Band thickness"
        hint="The gauge of the band body."
        field={form.bind('thickness', 'length', errors)}
      />
      <EntryField label="Band width" hint="Tooth tip to back edge." field={form.bind('width', 'length', errors)} />
      <ChoiceField
        label="Blade material"
        field={form.bind('material', null, errors)}
        options={BLADE_MATERIAL_OPTIONS}
      />
      <EntryField
        label="Largest head force"
        hint={`This saw's maximum; leave empty for the usual ${usualForce}.`}
        field={form.bind('maxForce', 'force', errors)}
      />
    </FieldGroup>
  );

  return (
    <CalculatorLayout
      title="Check targets"
      intro="What each maintenance check should read for this band, and whether a reading passes. Enter the band, then any readings."
      caution={<SafetyCaution />}
      form={fields}
      resultTitle="Targets"
      result={
        <>
          {failed + passed > 0 ? (
            <p className="flex flex-wrap gap-2">
              <span className="sr-only">Readings so far: </span>
              {failed > 0 ? <StatusBadge shape="square">{`${failed} fail`}</StatusBadge> : null}
              {passed > 0 ? <StatusBadge shape="circle">{`${passed} pass`}</StatusBadge> : null}
            </p>
          ) : null}
          <div className="divide-y divide-rule">
            {checks.map((outcome) => (
              <CheckItem key={outcome.kind.kind} outcome={outcome} form={form} errors={errors} system={system} />
            ))}
          </div>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
