import { useId, useState } from 'react';
import type { CheckResult } from '@kerfline/domain/checks/check-targets';
import { BLADE_MATERIALS, CHECK_DEFAULTS, type CheckKindId } from '@kerfline/domain/checks/schema';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import { settingFigureBasis, settingValue, type SiteSetting } from '@kerfline/domain/settings/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { basisSentence } from '../../../lib/figure-basis';
import { CalculatorLayout } from './calculator-layout';
import { ChoiceField, EntryField, FieldGroup } from './entry-field';
import { figure, messageInUnits, rangeFigure, type Quantity } from './quantities';
import { SawPicker, type CalculatorSaw } from './saw-picker';
import { StatusBadge } from './status-badge';
import {
  BLADE_MATERIAL_OPTIONS,
  YES_NO_OPTIONS,
  evaluateCheckTargets,
  type CheckLimits,
  type CheckOutcome,
  type CheckTargetsKey,
} from './check-targets-values';
import { useEntries, type EntriesForm, type FieldErrors, type StartTexts } from './use-entries';
import { capitalise } from './words';

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

/** The site setting each check's limits come from, where the user has not typed a figure of their own. */
function settingKeyFor(kind: CheckKindId, material: string): string | null {
  if (kind === 'guide_clearance') return 'guide_clearance';
  if (kind === 'feed_pressure') return 'head_force';
  if (kind === 'band_tension') return `band_tension.${material}`;
  return null;
}

/** The limits the site's settings give the checks, in the domain's units. */
function limitsFrom(settings: readonly SiteSetting[]): CheckLimits {
  const guide = settingValue(settings, 'guide_clearance');
  const force = settingValue(settings, 'head_force');
  const tensionMPa: CheckLimits['tensionMPa'] = {};
  for (const material of BLADE_MATERIALS) {
    const range = settingValue(settings, `band_tension.${material}`);
    if (range) tensionMPa[material] = { minMPa: range.minMPa, maxMPa: range.maxMPa };
  }
  return {
    ...(guide ? { guide: { extraClearanceMm: guide.extraClearanceMm, toleranceMm: guide.toleranceMm } } : {}),
    ...(force?.maxN === undefined ? {} : { maxHeadForceN: force.maxN }),
    tensionMPa,
  };
}

/** The target and the passing readings of a check, in words and the user's units. */
function targetLines(result: CheckResult, system: UnitSystem): { target: string; passes: string } {
  if (result.target === null || result.max === null) {
    return { target: 'Reaches the gullets, not worn', passes: 'Reaches: yes · Worn: no' };
  }
  const max = checkFigure(result, result.max, system).text;
  if (result.kind === 'feed_pressure') return { target: `At most ${max}`, passes: `Up to ${max}` };
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
    hint: 'Under the head, over the last inch (25.4 mm) of travel.',
  },
  bearing_wear: { key: 'wearMeasured', label: 'Gap under the straightedge', quantity: 'length' },
};

function CheckItem({
  outcome,
  form,
  errors,
  system,
  source,
}: {
  outcome: CheckOutcome;
  form: EntriesForm<CheckTargetsKey>;
  errors: FieldErrors<CheckTargetsKey>;
  system: UnitSystem;
  /** Where the target's limits come from, when they are the site's settings; else the domain's own words. */
  source: string | null;
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
          <p className="text-xs text-ink-muted">
            <span className="font-bold">Source: </span>
            {source ?? capitalise(result.basis)}.
          </p>
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
            <p className="pb-1">{messageInUnits(result.explanation, system)}</p>
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
  const limits = limitsFrom(settings);
  const evaluation = evaluateCheckTargets(form.entries, system, limits);
  const { errors } = evaluation;
  // A hydraulic head's down-force is set by its feed valve: the spring-balance check is not for it.
  const hydraulic = current?.headFeed === 'hydraulic';
  const checks = evaluation.checks.filter((outcome) => !(hydraulic && outcome.kind.kind === 'feed_pressure'));
  // A summary on top, so a failed check is seen without scrolling the list on a phone.
  const failed = checks.filter((outcome) => outcome.result?.passed === false).length;
  const passed = checks.filter((outcome) => outcome.result?.passed === true).length;
  const usualForce = figure('force', limits.maxHeadForceN ?? CHECK_DEFAULTS.maxHeadForceN, system).text;

  /** Where a check's limits come from: the site's setting, unless the user typed the figure it would give. */
  const sourceOf = (kind: CheckKindId): string | null => {
    if (kind === 'feed_pressure' && form.entries.maxForce.text.trim() !== '')
      return 'The largest head force typed above';
    const key = settingKeyFor(kind, form.entries.material.text);
    const setting = key ? settings.find((s) => s.key === key) : undefined;
    if (!setting) return null;
    const basis: FigureBasis = settingFigureBasis(setting);
    return basisSentence(basis, timeZone);
  };

  const pick = (saw: CalculatorSaw) => {
    setCurrent(saw);
    form.fill({
      // The saw's record is in millimetres; the fields show them in the user's unit.
      thickness: { text: String(saw.bandThicknessMm), system: 'metric' },
      width: { text: String(saw.bandWidthMm), system: 'metric' },
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
      <EntryField
        label="Largest head force"
        hint={`This saw's maximum; leave empty to use ${settings.find((s) => s.key === 'head_force')?.source === 'site' ? 'the site’s setting' : 'Kerfline’s starting value'}, ${usualForce}.`}
        field={form.bind('maxForce', 'force', errors)}
      />
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
                source={sourceOf(outcome.kind.kind)}
              />
            ))}
          </div>
          {hydraulic ? (
            <p className="border-t border-rule pt-3 text-sm text-ink-muted">
              No spring-balance check: this saw’s head feeds hydraulically, so its down-force is set by the feed valve,
              not read on a balance.
            </p>
          ) : null}
        </>
      }
      onSubmit={form.submit}
    />
  );
}
