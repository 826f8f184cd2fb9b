import type { BreakInPlan, BreakInStepKind } from '@kerfline/domain/break-in/break-in-plan';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { effectiveSetting, settingBasis, settingValue } from '@kerfline/domain/settings/effective';
import { effectiveSettingsOf, shippedSettings, type SiteSetting } from '@kerfline/domain/settings/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatNumber, formatSpeedRange } from '../../../lib/format';
import { basisSentence } from '../../../lib/figure-basis';
import { Notice } from '../../../lib/ui/notice';
import { CalculatorLayout, Explanation, ResultFigure, SourceNote, WaitingForInput } from './calculator-layout';
import { ChoiceField, EntryField, FieldGroup, ModeChoice } from './entry-field';
import { figure, messageInUnits } from './quantities';
import { BREAK_IN_LABELS, breakInMode, evaluateBreakIn, type BreakInKey } from './break-in-values';
import { MATERIAL_OPTIONS } from './band-speed-values';
import { useEntries, type StartTexts } from './use-entries';

const percent = (fraction: number) => `${Math.round(fraction * 100)}\u00a0%`;
const minutes = (value: number) => `${formatNumber(value, 1)}\u00a0min`;

const STEP_TITLES: Record<BreakInStepKind, string> = {
  reduced: 'Starting feed',
  ramp: 'Step up',
  normal: 'Normal cutting',
};

function explain(plan: BreakInPlan, system: UnitSystem): string {
  const feeds = plan.steps.filter((step) => step.kind !== 'normal');
  const [first, ...ramps] = feeds;
  if (!first) return 'Cut at normal feed.';
  const time = plan.totalDurationMin === null ? null : minutes(plan.totalDurationMin);
  const area = plan.totalAreaMm2 === null ? null : `${figure('area', plan.totalAreaMm2, system).text} of cut`;
  const after =
    plan.mode === 'time'
      ? `${time ?? ''}${area ? ` (${area})` : ''}`
      : `${area ?? ''}${time ? ` (about ${time})` : ''}`;
  const steps =
    ramps.length > 0 ? `, step up through ${ramps.map((step) => percent(step.feedFraction)).join(' and ')}` : '';
  return `Start the new blade at ${percent(first.feedFraction)} of normal feed${steps}, and reach normal feed after ${after}.`;
}

const NO_MATERIAL = [{ value: '', label: 'Not given' }, ...MATERIAL_OPTIONS];

/**
 * The feed steps that bring a new blade up to normal cutting, measured in minutes or in area cut: the site's
 * `break_in` setting (Kerfline's starting plan unless the site changed it). Opened from a saw, it starts from the
 * saw's band speed range; with the material to be cut it gives the break-in band speeds the saw can run.
 */
export function BreakInCalculator({
  system,
  start,
  settings = shippedSettings(),
  timeZone,
}: {
  system: UnitSystem;
  start?: StartTexts;
  /** The site's settings (its break-in steps and band speeds); Kerfline's shipped values when not given. */
  settings?: SiteSetting[];
  timeZone?: string;
}) {
  const form = useEntries<BreakInKey>(system, { mode: 'time', rate: '', material: '', sawMin: '', sawMax: '' }, start);
  const mode = breakInMode(form.entries.mode);
  const effective = effectiveSettingsOf(settings);
  const { errors, formError, plan, material, onSaw } = evaluateBreakIn(form.entries, system, effective);
  const steps = effectiveSetting(effective, 'break_in');
  const firstArea = figure('area', settingValue(steps, 'startAreaMm2'), system).text;
  const stepArea = figure('area', settingValue(steps, 'stepAreaMm2'), system).text;

  const modes = [
    {
      value: 'time',
      label: 'By time',
      hint: `${minutes(settingValue(steps, 'startMinutes'))} at the starting feed, ${minutes(settingValue(steps, 'stepMinutes'))} a step.`,
    },
    { value: 'area', label: 'By area cut', hint: `The first ${firstArea} at the starting feed, ${stepArea} a step.` },
  ];

  const fields = (
    <>
      <ModeChoice legend="Measure each step" field={form.bind('mode', null, errors)} options={modes} />
      <FieldGroup legend="This job (optional)">
        <ChoiceField
          label="Material to cut first"
          hint="Gives the band speeds during break-in."
          field={form.bind('material', null, errors)}
          options={NO_MATERIAL}
          className="sm:col-span-2"
        />
        <EntryField
          label="Normal cutting rate"
          hint={`Area cut per minute at normal feed on this job, if you know it: it gives the ${mode === 'time' ? 'area' : 'time'} of each step.`}
          field={form.bind('rate', 'areaRate', errors)}
          className="sm:col-span-2"
        />
        <EntryField label={BREAK_IN_LABELS.sawMin} field={form.bind('sawMin', 'bandSpeed', errors)} />
        <EntryField label={BREAK_IN_LABELS.sawMax} field={form.bind('sawMax', 'bandSpeed', errors)} />
      </FieldGroup>
    </>
  );

  let body;
  if (plan) {
    const missing = 'Enter a normal cutting rate to work this out.';
    body = (
      <>
        <div className="grid gap-4 sm:grid-cols-2">
          <ResultFigure
            label="Time to normal feed"
            value={plan.totalDurationMin === null ? '—' : formatNumber(plan.totalDurationMin, 1)}
            unit={plan.totalDurationMin === null ? undefined : 'min'}
            detail={plan.totalDurationMin === null ? missing : undefined}
          />
          <ResultFigure
            label="Area cut in break-in"
            value={plan.totalAreaMm2 === null ? '—' : figure('area', plan.totalAreaMm2, system).number}
            unit={plan.totalAreaMm2 === null ? undefined : figure('area', plan.totalAreaMm2, system).unit}
            detail={plan.totalAreaMm2 === null ? missing : undefined}
          />
        </div>
        <Explanation>{explain(plan, system)}</Explanation>
        {plan.bandSpeed && material ? (
          <p className="text-sm text-ink">
            Band speed in {MATERIAL_GROUP_LABELS[material]} during break-in:{' '}
            <strong className="tabular">
              {formatSpeedRange(plan.bandSpeed.breakInMinMPerMin, plan.bandSpeed.breakInMaxMPerMin, system)}
            </strong>
            {onSaw === 'empty'
              ? '. This saw cannot run any of that range: check the blade and material with the saw maker’s manual.'
              : onSaw
                ? `; this saw runs ${formatSpeedRange(onSaw.minMPerMin, onSaw.maxMPerMin, system)} of it.`
                : '.'}
          </p>
        ) : null}
        <section aria-label="Break-in steps">
          <h3 className="text-base font-bold text-ink">Steps</h3>
          <ol className="mt-2 divide-y divide-rule border-y border-rule">
            {plan.steps.map((step, index) => (
              <li key={index} className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 py-3">
                <span
                  aria-hidden="true"
                  className="tabular flex size-8 items-center justify-center rounded-full border-2 border-ink text-sm font-extrabold text-ink"
                >
                  {index + 1}
                </span>
                <div className="space-y-2">
                  <p className="font-bold text-ink">
                    <span className="sr-only">Step {index + 1}: </span>
                    {STEP_TITLES[step.kind]}
                  </p>
                  <dl className="grid grid-cols-3 gap-2 text-sm">
                    <div>
                      <dt className="text-ink-muted">Feed</dt>
                      <dd className="tabular font-bold text-ink">{percent(step.feedFraction)}</dd>
                    </div>
                    <div>
                      <dt className="text-ink-muted">Time</dt>
                      <dd className="tabular font-bold text-ink">
                        {step.durationMin === null
                          ? step.kind === 'normal'
                            ? 'from here on'
                            : '—'
                          : minutes(step.durationMin)}
                      </dd>
                    </div>
                    <div>
                      <dt className="text-ink-muted">Area cut</dt>
                      <dd className="tabular font-bold text-ink">
                        {step.areaMm2 === null ? '—' : figure('area', step.areaMm2, system).text}
                      </dd>
                    </div>
                  </dl>
                  <p className="text-sm text-ink-muted">{messageInUnits(step.note, system)}</p>
                </div>
              </li>
            ))}
          </ol>
        </section>
      </>
    );
  } else if (formError) {
    body = <Notice title="The plan cannot be worked out">{formError}</Notice>;
  } else {
    body = <WaitingForInput>Correct the normal cutting rate, or leave it empty, to see the plan.</WaitingForInput>;
  }

  return (
    <CalculatorLayout
      title="Break-in plan"
      intro="A new blade’s sharp tooth tips need a gentle start. Feed below normal first, then step up to normal cutting."
      caution
      form={fields}
      result={
        <>
          {body}
          <SourceNote>
            Break-in steps: {basisSentence(plan?.basis ?? settingBasis(steps), timeZone)}.
            {plan?.bandSpeed ? ` Band speed: ${basisSentence(plan.bandSpeed.normal.basis, timeZone)}.` : ''} The blade
            maker’s own break-in takes precedence.
          </SourceNote>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
