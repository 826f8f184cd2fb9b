import { useId, useRef, type FormEvent, type ReactNode } from 'react';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { SafetyCaution, SafetyCautionBrief } from './safety-caution';

/** The full cautions' place on the page, for the one-line caution's link (one calculator a page). */
const CAUTION_ID = 'safety-cautions';

/**
 * One calculator's page body: the entries on the left and the result beside them on a wide screen, the result
 * right below the entries on a phone. A calculator for work on the saw opens with a one-line caution and shows
 * the full cautions after the result, so on a phone the answer is not pushed below them. "Work it out" shows
 * every field's message and moves to the result, which on a phone is otherwise out of sight below the keyboard.
 */
export function CalculatorLayout({
  title,
  intro,
  caution = false,
  form,
  result,
  after,
  resultTitle = 'Result',
  onSubmit,
}: {
  title: string;
  intro: string;
  /** Show the safety cautions: for calculators used while adjusting the saw or changing a blade. */
  caution?: boolean;
  form: ReactNode;
  result: ReactNode;
  /** The explanation and sources that follow the answer (below both columns). */
  after?: ReactNode;
  resultTitle?: string;
  onSubmit: () => void;
}) {
  const resultHeadingId = useId();
  const resultHeading = useRef<HTMLHeadingElement>(null);

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    onSubmit();
    resultHeading.current?.focus();
  };

  return (
    <div className="space-y-6">
      <title>{`${title} · Shop calculators · Kerfline`}</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">{title}</h1>
        <p className="mt-1 max-w-prose text-ink-muted">{intro}</p>
      </div>
      {caution ? <SafetyCautionBrief fullId={CAUTION_ID} /> : null}
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <Card className="p-4 sm:p-6">
          <form onSubmit={submit} noValidate className="space-y-6" aria-label={title}>
            {form}
            <div className="border-t border-rule pt-5">
              <Button type="submit" variant="primary" className="w-full sm:w-auto">
                Work it out
              </Button>
            </div>
          </form>
        </Card>
        <Card aria-labelledby={resultHeadingId} className="p-4 sm:p-6 lg:sticky lg:top-24">
          <h2
            id={resultHeadingId}
            ref={resultHeading}
            tabIndex={-1}
            className="text-sm font-bold tracking-wider text-ink-muted uppercase"
          >
            {resultTitle}
          </h2>
          <div className="mt-3 space-y-4">{result}</div>
        </Card>
      </div>
      {after}
      {caution ? <SafetyCaution id={CAUTION_ID} /> : null}
    </div>
  );
}

/** The headline figure of a result: large, tabular, its unit beside it in smaller type. */
export function ResultFigure({
  label,
  value,
  unit,
  detail,
  size = 'large',
}: {
  label: string;
  value: string;
  unit?: string | undefined;
  detail?: ReactNode;
  /** `small` for a figure that supports the headline one. */
  size?: 'large' | 'small';
}) {
  return (
    <div>
      <p className="text-sm font-semibold text-ink-muted">{label}</p>
      <p className="mt-0.5 flex flex-wrap items-baseline gap-x-2 text-ink">
        <span className={`tabular font-extrabold tracking-tight ${size === 'large' ? 'text-4xl' : 'text-2xl'}`}>
          {value}
        </span>
        {unit ? (
          <span className={`font-bold text-ink-muted ${size === 'large' ? 'text-lg' : 'text-base'}`}>{unit}</span>
        ) : null}
      </p>
      {detail ? <div className="mt-1 text-sm text-ink-muted">{detail}</div> : null}
    </div>
  );
}

/** The result said in one plain line. */
export function Explanation({ children }: { children: ReactNode }) {
  return <p className="border-l-4 border-accent pl-3 text-base font-semibold text-ink">{children}</p>;
}

/** Where a figure comes from, in small print; only what the domain itself says about its source. */
export function SourceNote({ children }: { children: ReactNode }) {
  return (
    <p className="border-t border-rule pt-3 text-xs leading-relaxed text-ink-muted">
      <span className="font-bold">Source: </span>
      {children}
    </p>
  );
}

/** What to do before there is a result: no zeros, no NaN, just what is missing. */
export function WaitingForInput({ children }: { children: ReactNode }) {
  return <p className="text-ink-muted">{children}</p>;
}

/** Said when every figure a result needs is there, yet one of them cannot be used. */
export const CORRECT_THE_FIGURES = 'Check the figures entered: the message beside a field says what to change.';
