import { useId, useState } from 'react';
import type { CheckResult } from '@kerfline/domain/checks/check-targets';
import { CHECK_DEFAULTS, type CheckKindId } from '@kerfline/domain/checks/schema';
import { effectiveSetting, settingValue } from '@kerfline/domain/settings/effective';
import { effectiveSettingsOf, type SiteSetting } from '@kerfline/domain/settings/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { basisSentence } from '../../../lib/figure-basis';
import { CalculatorLayout } from './calculator-layout';
import { ChoiceField, EntryField, FieldGroup } from './entry-field';
import { figure, rangeFigure, type Quantity } from './quantities';
import { SawPicker, type CalculatorSaw } from './saw-picker';
import { StatusBadge } from './status-badge';
import {
  BLADE_MATERIAL_OPTIONS,
  YES_NO_OPTIONS,
  evaluateCheckTargets,
  type CheckOutcome,
  type CheckTargetsKey,
} from './check-targets-values';
import { useEntries, type EntriesForm, type FieldErrors, type StartTexts } from './use-entries';

/** Lengths in checks are feeler-gauge small: thousandths of an inch, hundredths of a millimetre. */
const checkQuantity = (result: CheckResult): Quantity =>
  result.unit === 'MPa' ? 'stress' : result.unit === 'N' ? 'force' : 'smallLength';
/** The domain's check figures are in mm, N or MPa; the display takes Pa for stress. */
const toSiOf = (result: CheckResult, value: number) => (result.unit === 'MPa' ? value * 1e6 : value);

/** A check's figure (given in the domain's unit: mm, N or MPa) in the user's units. */
function checkFigure(result: CheckResult, value: number, system: UnitSystem) {
  return figure(checkQuantity(result), toSiOf(result, value), system);
}

function checkRange(result: CheckResult, min: number, max: number, system: UnitSystem) {
  return rangeFigure(checkQuantity(result), toSiOf(result, min), toSiOf(result, max), system);
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
  timeZone,
}: {
  outcome: CheckOutcome;
  form: EntriesForm<CheckTargetsKey>;
  errors: FieldErrors<CheckTargetsKey>;
  system: UnitSystem;
  /** The site's time zone, for the day a setting was changed. */
  timeZone: string | undefined;
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
          {result.basis ? (
            <p className="text-xs text-ink-muted">
              <span className="font-bold">Source: </span>
              {basisSentence(result.basis, timeZone)}.
            </p>
          ) : null}
          {/* The answer first: on a phone the how and why stay one tap away instead of pushing the next check down. */}
          <details className="group text-sm text-ink">
            <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 font-semibold text-ink underline-offset-4 hover:underline [&::-webkit-details-marker]:hidden">
              <svg
                viewBox="0 0 12 12"
                aria-hidden="true"
                focusable="false"
                className="size-3 shrink-0 transition-transform group-open:rotate-90"
              >
                <path d="M4 2 8.5 6 4 10" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              </svg>
              How to check, and why
            </summary>
            <p className="pb-1">{result.explanation}</p>
          </details>
        </>
      ) : null}
    </article>
  );
}

/**
 * Target and tolerance of each maintenance check for a band, and pass or fail for what was measured. Opened for
 * a saw (`saw`), it starts from that saw's band and leaves out the spring-balance check of a hydraulic head; the
 * limits are the site's settings (`settings`, shipped values when no site is known), each saying whose it is.
 */
export function CheckTargetsCalculator({
  system,
  saws = [],
  saw,
  start,
  settings = [],
  timeZone,
}: {
  system: UnitSystem;
  saws?: readonly CalculatorSaw[];
  /** The saw the calculator was opened for. */
  saw?: CalculatorSaw | undefined;
  start?: StartTexts;
  settings?: readonly SiteSetting[];
  /** The settings' site's time zone, for the date a setting was changed. */
  timeZone?: string | undefined;
}) {
  const [current, setCurrent] = useState<CalculatorSaw | undefined>(saw);
  const form = useEntries<CheckTargetsKey>(
    system,
    {
      thickness: '',
      width: '',
      material: 'bimetal',
      maxForce: '',
      minForce: '',
      guideMeasured: '',
      trackingMeasured: '',
      forceMeasured: '',
      wearMeasured: '',
      tensionMeasured: '',
      brushReaches: '',
      brushWorn: '',
    },
    start,
  );
  const effective = effectiveSettingsOf(settings);
  const evaluation = evaluateCheckTargets(form.entries, system, {
    settings: effective,
    ...(current?.headFeed ? { headFeed: current.headFeed } : {}),
  });
  const { errors } = evaluation;
  // A check that does not apply to this saw (the spring balance on a hydraulic head) is said once, below the list.
  const notApplicable = evaluation.checks.filter((outcome) => outcome.result?.applicable === false);
  const checks = evaluation.checks.filter((outcome) => outcome.result?.applicable !== false);
  // A summary on top, so a failed check is seen without scrolling the list on a phone.
  const failed = checks.filter((outcome) => outcome.result?.passed === false).length;
  const passed = checks.filter((outcome) => outcome.result?.passed === true).length;
  const headForce = effectiveSetting(effective, 'head_force');
  const usualForce = figure('force', settingValue(headForce, 'maxN') ?? CHECK_DEFAULTS.maxHeadForceN, system).text;
  const usualLeast = figure('force', settingValue(headForce, 'minN') ?? CHECK_DEFAULTS.minHeadForceN, system).text;
  const forceOrigin = headForce.changedAt === null ? 'Kerfline’s starting value' : 'the site’s setting';
  // The spring-balance limits are for a head fed by gravity or a spring; a saw typed in by hand may be either.
  const springFed = current?.headFeed !== 'hydraulic';

  const pick = (saw: CalculatorSaw) => {
    setCurrent(saw);
    form.fill({
      // The saw's record is in millimetres; the fields show them in the user's unit.
      thickness: { text: String(saw.bandThicknessMm), system: 'metric' },
      width: { text: String(saw.bandWidthMm), system: 'metric' },
      // The saw's own head-force limits, or empty for the site's setting.
      maxForce: { text: saw.maxHeadForceN != null ? String(saw.maxHeadForceN) : '', system: 'metric' },
      minForce: { text: saw.minHeadForceN != null ? String(saw.minHeadForceN) : '', system: 'metric' },
    });
  };

  const fields = (
    <FieldGroup legend="Band and saw">
      <SawPicker
        saws={saws}
        hint="Takes the band thickness and width from the saw's record."
        onPick={pick}
        initial={saw?.id}
      />
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
      {springFed ? (
        <>
          <EntryField
            label="Largest head force"
            hint={`This saw's maximum; leave empty to use ${forceOrigin}, ${usualForce}.`}
            field={form.bind('maxForce', 'force', errors)}
          />
          <EntryField
            label="Least head force"
            hint={`Below this the head is not feeding; leave empty to use ${forceOrigin}, ${usualLeast}.`}
            field={form.bind('minForce', 'force', errors)}
          />
        </>
      ) : null}
    </FieldGroup>
  );

  return (
    <CalculatorLayout
      title="Check targets"
      intro="What each maintenance check should read for this band, and whether a reading passes."
      caution
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
              <CheckItem
                key={outcome.kind.kind}
                outcome={outcome}
                form={form}
                errors={errors}
                system={system}
                timeZone={timeZone}
              />
            ))}
          </div>
          {notApplicable.map((outcome) => (
            <p key={outcome.kind.kind} className="border-t border-rule pt-3 text-sm text-ink-muted">
              <span className="font-semibold text-ink">No {outcome.kind.label.toLowerCase()} check: </span>
              {outcome.result?.explanation}
            </p>
          ))}
        </>
      }
      onSubmit={form.submit}
    />
  );
}
