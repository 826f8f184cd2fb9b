import type { BreakInPlan, BreakInStepKind } from '@kerfline/domain/break-in/break-in-plan';
import { BREAK_IN_BASIS } from '@kerfline/domain/break-in/break-in-plan';
import { BREAK_IN_DEFAULTS } from '@kerfline/domain/break-in/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatNumber } from '../../../lib/format';
import { Notice } from '../../../lib/ui/notice';
import { CalculatorLayout, Explanation, ResultFigure, SourceNote, WaitingForInput } from './calculator-layout';
import { EntryField, FieldGroup, ModeChoice } from './entry-field';
import { figure, messageInUnits } from './quantities';
import { SafetyCaution } from './safety-caution';
import { breakInMode, evaluateBreakIn, type BreakInKey } from './break-in-values';
import { useEntries } from './use-entries';

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

/** The feed steps that bring a new blade up to normal cutting, measured in minutes or in area cut. */
export function BreakInCalculator({ system }: { system: UnitSystem }) {
  const form = useEntries<BreakInKey>(system, { mode: 'time', rate: '' });
  const mode = breakInMode(form.entries.mode);
  const { errors, formError, plan } = evaluateBreakIn(form.entries, system);
  const firstArea = figure('area', BREAK_IN_DEFAULTS.initialAreaMm2, system).text;
  const stepArea = figure('area', BREAK_IN_DEFAULTS.rampStepAreaMm2, system).text;

  const modes = [
    {
      value: 'time',
      label: 'By time',
      hint: `${minutes(BREAK_IN_DEFAULTS.initialDurationMin)} at the starting feed, ${minutes(BREAK_IN_DEFAULTS.rampStepDurationMin)} a step.`,
    },
    { value: 'area', label: 'By area cut', hint: `The first ${firstArea} at the starting feed, ${stepArea} a step.` },
  ];

  const fields = (
    <>
      <ModeChoice legend="Measure each step" field={form.bind('mode', null, errors)} options={modes} />
      <FieldGroup legend="This job (optional)">
        <EntryField
          label="Normal cutting rate"
          hint={`Area cut per minute at normal feed on this job, if you know it: it gives the ${mode === 'time' ? 'area' : 'time'} of each step.`}
          field={form.bind('rate', 'areaRate', errors)}
          className="sm:col-span-2"
        />
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
      caution={<SafetyCaution />}
      form={fields}
      result={
        <>
          {body}
          <SourceNote>
            Break-in steps: {BREAK_IN_BASIS}. They start at full normal band speed; feed at about one third of normal
            for about ten minutes (or the first {firstArea} of cut), then 50 % and 75 % before normal feed.
          </SourceNote>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
