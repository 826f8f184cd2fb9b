import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { StockShapeKind } from '@kerfline/domain/stock-area/schema';
import {
  teethInWorkRule,
  teethInWorkRuleBasis,
  type TeethFit,
  type TeethInWorkRule,
} from '@kerfline/domain/teeth-in-work/teeth-in-work';
import { effectiveSettingsOf, shippedSettings, type SiteSetting } from '@kerfline/domain/settings/schema';
import { basisSentence } from '../../../lib/figure-basis';
import { formatNumber } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import {
  CORRECT_THE_FIGURES,
  CalculatorLayout,
  Explanation,
  ResultFigure,
  SourceNote,
  WaitingForInput,
} from './calculator-layout';
import { ChoiceField, EntryField } from './entry-field';
import { rangeFigure } from './quantities';
import { StatusBadge, StatusMark, type StatusShape } from './status-badge';
import { StockShapeFields } from './stock-shape-fields';
import { DIMENSION_KEYS, SHAPE_DIMENSIONS, describeShape, isShapeKind } from './stock-shape';
import {
  OTHER_PITCH,
  PITCH_OPTIONS,
  evaluateTeethInWork,
  pitchOptionValue,
  type ChosenPitchResult,
  type TeethKey,
} from './teeth-in-work-values';
import { useEntries } from './use-entries';
import { capitalise } from './words';

/** The fit labels in the site's own guards and preference. */
function fits({
  fewest,
  most,
  bestFewest,
  bestMost,
}: TeethInWorkRule): Record<TeethFit, { shape: StatusShape; label: string; phrase: string }> {
  return {
    best: {
      shape: 'circle',
      label: `Best: ${bestFewest}–${bestMost} teeth`,
      phrase: `in the preferred ${bestFewest}–${bestMost}`,
    },
    workable: {
      shape: 'ring',
      label: `Workable: ${fewest}–${most} teeth`,
      phrase: `within the ${fewest}–${most} limits, though outside the preferred ${bestFewest}–${bestMost}`,
    },
    outside_limits: {
      shape: 'triangle',
      label: `Outside ${fewest}–${most} teeth`,
      phrase: `outside the ${fewest}–${most} limits`,
    },
  };
}

/** A count of teeth to one decimal, or a range "7.7 to 9.8" where the metal under the band changes. */
function teethText(min: number, max: number, joiner: string): string {
  const low = formatNumber(min, 1);
  const high = formatNumber(max, 1);
  return low === high ? low : `${low}${joiner}${high}`;
}

function initialEntries(): Record<TeethKey, string> {
  const start = { shape: 'round_bar', piecesAcross: '1', pitch: '', otherPitch: '' } as Record<TeethKey, string>;
  for (const key of DIMENSION_KEYS) start[key] = '';
  return start;
}

function Warnings({ chosen }: { chosen: ChosenPitchResult }) {
  if (chosen.warnings.length === 0) return null;
  return (
    <ul className="space-y-2">
      {chosen.warnings.map((warning) => (
        <li key={warning.code} className="flex gap-2 rounded-sheet bg-signal-caution-soft px-3 py-2 text-sm text-ink">
          <StatusMark shape="triangle" className="mt-0.5 size-4" />
          <span>{warning.message}</span>
        </li>
      ))}
    </ul>
  );
}

/** Teeth in the work for a stock size and a pitch, and the standard pitches ranked for that stock. */
export function TeethInWorkCalculator({
  system,
  settings = shippedSettings(),
  timeZone,
}: {
  system: UnitSystem;
  /** The site's settings (its teeth-in-work guards); Kerfline's shipped values when not given. */
  settings?: SiteSetting[];
  timeZone?: string;
}) {
  const form = useEntries<TeethKey>(system, initialEntries());
  const effective = effectiveSettingsOf(settings);
  const rule = teethInWorkRule(effective);
  const { fewest, most, bestFewest, bestMost } = rule;
  const fitWords = fits(rule);
  const evaluation = evaluateTeethInWork(form.entries, system, effective);
  const { errors, shape, chosen, engaged } = evaluation;
  const kind: StockShapeKind = isShapeKind(form.entries.shape.text) ? form.entries.shape.text : 'round_bar';
  const chosenValue = form.entries.pitch.text;
  const pieces = evaluation.piecesAcross > 1 ? ` (${evaluation.piecesAcross} side by side)` : '';

  const formFields = (
    <>
      <StockShapeFields form={form} kind={kind} errors={errors} />
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Blade and bundle</legend>
        <ChoiceField
          label="Pitch"
          hint="Teeth per inch, as printed on the blade."
          field={form.bind('pitch', null, errors)}
          options={PITCH_OPTIONS}
        />
        {chosenValue === OTHER_PITCH ? (
          <EntryField
            label="Other pitch (TPI)"
            hint="For example 3 or 4/6."
            field={form.bind('otherPitch', null, errors)}
          />
        ) : null}
        <EntryField
          label="Pieces side by side"
          hint="Pieces of a bundle next to each other along the band."
          field={form.bind('piecesAcross', null, errors)}
        />
      </fieldset>
    </>
  );

  const allDimensionsTyped = SHAPE_DIMENSIONS[kind].every(({ key }) => form.entries[key].text.trim() !== '');
  let result;
  if (shape && engaged) {
    const metal = rangeFigure('length', engaged.minMm, engaged.maxMm, system);
    result = (
      <>
        {chosen ? (
          <>
            <ResultFigure
              label={`Teeth in the work at ${chosen.label} TPI`}
              value={teethText(chosen.range.min, chosen.range.max, '–')}
              unit="teeth"
              detail={<StatusBadge shape={fitWords[chosen.fit].shape}>{fitWords[chosen.fit].label}</StatusBadge>}
            />
            <Explanation>
              {chosen.label} TPI puts {teethText(chosen.range.min, chosen.range.max, ' to ')} teeth in this{' '}
              {describeShape(shape, system)}
              {pieces}
              {chosen.range.minLabel === 'least'
                ? ''
                : ` (${formatNumber(chosen.range.min, 1)} ${chosen.range.minLabel}, ${formatNumber(chosen.range.max, 1)} ${chosen.range.maxLabel})`}{' '}
              — {fitWords[chosen.fit].phrase}.
            </Explanation>
            <Warnings chosen={chosen} />
          </>
        ) : (
          <WaitingForInput>
            Choose a pitch to count its teeth in this stock, or take one from the list below.
          </WaitingForInput>
        )}
        <ResultFigure
          size="small"
          label="Metal under the band"
          value={metal.number}
          unit={metal.unit}
          detail={
            engaged.minLabel === 'least'
              ? `Least to greatest during the cut: ${engaged.basis}.`
              : `${capitalise(engaged.basis)}.`
          }
        />
        <section aria-label="Pitches that suit this stock">
          <h3 className="text-base font-bold text-ink">Pitches that suit this stock</h3>
          <ol className="mt-2 divide-y divide-rule border-y border-rule">
            {evaluation.recommendations.slice(0, 5).map((candidate) => {
              const value = pitchOptionValue(candidate.pitch);
              return (
                <li key={candidate.label} className="grid grid-cols-[minmax(0,1fr)_auto] items-center gap-x-3 py-3">
                  <div className="space-y-1">
                    <p className="text-ink">
                      <span className="tabular text-lg font-bold">{candidate.label}</span> TPI
                      <span className="tabular text-sm text-ink-muted">
                        {' · '}
                        {teethText(candidate.teethMin, candidate.teethMax, '–')} teeth
                      </span>
                    </p>
                    <StatusBadge shape={fitWords[candidate.fit].shape}>{fitWords[candidate.fit].label}</StatusBadge>
                    {candidate.warnings.length > 0 ? (
                      <p className="text-sm text-ink-muted">{candidate.warnings.map((w) => w.message).join(' ')}</p>
                    ) : null}
                  </div>
                  {value === chosenValue ? (
                    <span className="flex min-h-11 items-center px-2 text-sm font-bold text-ink">Chosen</span>
                  ) : (
                    <Button aria-label={`Use ${candidate.label} TPI`} onClick={() => form.change('pitch', value)}>
                      Use
                    </Button>
                  )}
                </li>
              );
            })}
          </ol>
        </section>
        <SourceNote>
          {evaluation.advice?.note}{' '}
          {evaluation.advice?.basis?.kind === 'published' ? `${evaluation.advice.basis.citation}. ` : ''}
          Guards: fewer than {fewest} teeth in the work strip teeth, more than {most} overload the gullets; {bestFewest}{' '}
          to {bestMost} is preferred, shown but never put above the printed table. These guards:{' '}
          {basisSentence(teethInWorkRuleBasis(effective), timeZone)}. Teeth = TPI × inches of metal under the band; a
          variable pitch counts by the mean of its two ends (4/6 → 5 TPI).
        </SourceNote>
      </>
    );
  } else if (evaluation.formError) {
    result = <Notice title="This stock cannot be worked out">{evaluation.formError}</Notice>;
  } else {
    result = (
      <WaitingForInput>
        {allDimensionsTyped
          ? CORRECT_THE_FIGURES
          : 'Enter the size of the stock to see the teeth in the work and the pitches that suit it.'}
      </WaitingForInput>
    );
  }

  return (
    <CalculatorLayout
      title="Teeth in the work and pitch"
      intro="Too few teeth in the work and they strip; too many and the gullets pack with chips. Enter the stock and a pitch."
      form={formFields}
      result={result}
      onSubmit={form.submit}
    />
  );
}
