import { useMemo, useState } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { parseDisplayNumber } from '@kerfline/domain/units/display';
import {
  checkRecordCreateSchema,
  type CheckRecord,
  type CheckRecordCreate,
  type CheckRecordCreateParsed,
  type SawCheck,
} from '@kerfline/domain/site-checks/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { basisSentence } from '../../../lib/figure-basis';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { DueStateBadge, VerdictBadge } from './check-status-badge';
import { checkFigure, checkFigureDual, readingToStored, readingUnit } from './check-words';
import { WorkCaution } from './work-caution';

export type RecordFormValues = {
  siteCheckId: string;
  /** Typed in the site's unit. */
  reading: string;
  reachesGullets: '' | 'yes' | 'no';
  worn: '' | 'yes' | 'no';
  notes: string;
};

/**
 * The form's values as the API's input: the reading turned from the site's unit into the check's stored unit,
 * or a condition check's answers; plus the messages only the form can word (nothing chosen, text that is not a
 * number).
 */
export function recordInputFromForm(
  values: RecordFormValues,
  sawId: string,
  checks: readonly SawCheck[],
  system: UnitSystem,
): { input: CheckRecordCreate; fieldErrors: Partial<Record<keyof RecordFormValues, string>> } {
  const fieldErrors: Partial<Record<keyof RecordFormValues, string>> = {};
  const chosen = checks.find((c) => c.check.id === values.siteCheckId);
  const base = { sawId, siteCheckId: values.siteCheckId, notes: values.notes };
  if (!chosen) {
    fieldErrors.siteCheckId = 'Choose the check you are recording';
    return { input: base, fieldErrors };
  }
  if (chosen.check.quantity === 'condition') {
    if (values.reachesGullets === '') fieldErrors.reachesGullets = 'Say whether the brush reaches into the gullets';
    if (values.worn === '') fieldErrors.worn = 'Say whether the brush is worn';
    return {
      input: {
        ...base,
        answers:
          values.reachesGullets === '' || values.worn === ''
            ? null
            : { reachesGullets: values.reachesGullets === 'yes', worn: values.worn === 'yes' },
      },
      fieldErrors,
    };
  }
  if (values.reading.trim() === '') {
    fieldErrors.reading = 'Enter the reading';
    return { input: base, fieldErrors };
  }
  const typed = parseDisplayNumber(values.reading);
  if (!typed.ok) {
    fieldErrors.reading = typed.message;
    return { input: base, fieldErrors };
  }
  return { input: { ...base, reading: readingToStored(chosen.check.quantity, typed.value, system) }, fieldErrors };
}

const FIELD_OF: Record<string, keyof RecordFormValues> = {
  siteCheckId: 'siteCheckId',
  reading: 'reading',
  answers: 'reachesGullets',
  'answers.reachesGullets': 'reachesGullets',
  'answers.worn': 'worn',
  notes: 'notes',
};

function recordResolver(
  sawId: string,
  checks: readonly SawCheck[],
  system: UnitSystem,
): Resolver<RecordFormValues, unknown, CheckRecordCreateParsed> {
  return domainSchemaResolver(
    checkRecordCreateSchema,
    (values: RecordFormValues) => recordInputFromForm(values, sawId, checks, system).input,
    (path) => FIELD_OF[path],
    (values) => recordInputFromForm(values, sawId, checks, system).fieldErrors,
  );
}

/** The check most worth doing now: the one asked for, else the first overdue, else the first due. */
function firstChoice(checks: readonly SawCheck[], asked: string | null): string {
  const usable = checks.filter((c) => c.target.applicable);
  return (
    usable.find((c) => c.check.id === asked)?.check.id ??
    usable.find((c) => c.state === 'overdue')?.check.id ??
    usable.find((c) => c.state === 'due')?.check.id ??
    ''
  );
}

/** The target for this saw and blade, in the site's units first, and where it comes from in words. */
function TargetCard({ item, system, timeZone }: { item: SawCheck; system: UnitSystem; timeZone: string }) {
  const { target, check } = item;
  return (
    <Card aria-label="Target" className="space-y-2 border-ink px-4 py-3">
      <h2 className="text-sm font-semibold text-ink-muted">Target for this saw and blade</h2>
      {target.target !== null && check.quantity !== 'condition' ? (
        <>
          <p className="tabular text-3xl font-extrabold text-ink">
            {checkFigure(check.quantity, target.target, system)}
          </p>
          <p className="text-sm text-ink-muted">{checkFigureDual(check.quantity, target.target, system)}</p>
          <p className="text-ink">
            Passes:{' '}
            <strong className="tabular">
              {target.min !== null && target.max !== null
                ? `${checkFigure(check.quantity, target.min, system)} to ${checkFigure(check.quantity, target.max, system)}`
                : target.min !== null
                  ? `at least ${checkFigure(check.quantity, target.min, system)}`
                  : `at most ${checkFigure(check.quantity, target.max!, system)}`}
            </strong>
          </p>
        </>
      ) : null}
      <p className="text-sm text-ink">{target.explanation}</p>
      {target.basis ? (
        <p className="text-xs text-ink-muted">
          <span className="font-bold">Source: </span>
          {basisSentence(target.basis, timeZone)}.
        </p>
      ) : null}
    </Card>
  );
}

function YesNo({
  legend,
  error,
  register,
}: {
  legend: string;
  error?: string;
  register: ReturnType<ReturnType<typeof useForm<RecordFormValues>>['register']>;
}) {
  return (
    <ChoiceGroup legend={legend} error={error}>
      <div className="grid grid-cols-2 gap-2">
        <ChoiceTile type="radio" value="yes" label="Yes" {...register} />
        <ChoiceTile type="radio" value="no" label="No" {...register} />
      </div>
    </ChoiceGroup>
  );
}

/** What the server decided, as a word, a shape and a colour, with its reasons in the site's units. */
export function RecordedResult({
  record,
  system,
  timeZone,
  photoError,
}: {
  record: CheckRecord;
  system: UnitSystem;
  timeZone: string;
  photoError: string | null;
}) {
  return (
    <Card
      aria-label="Result"
      className={`space-y-3 border-2 px-4 py-4 ${record.passed ? 'border-signal-safe' : 'border-signal-stop'}`}
    >
      <p className="flex flex-wrap items-center gap-3">
        <VerdictBadge passed={record.passed} large />
        <span className="font-bold text-ink">{record.checkName}</span>
      </p>
      {record.reading !== null ? (
        <p className="text-ink">
          Reading <strong className="tabular">{checkFigureDual(record.quantity, record.reading, system)}</strong>
        </p>
      ) : null}
      <p className="text-ink">{record.explanation}</p>
      {!record.passed ? (
        <p className="font-semibold text-signal-stop">Put it right before the saw cuts again, then check it again.</p>
      ) : null}
      <p className="text-sm text-ink-muted">
        Saved {formatDateTime(record.checkedAt, timeZone)} by {record.checkedByName ?? 'you'}.
        {record.basis ? ` Target: ${basisSentence(record.basis, timeZone)}.` : ''}
      </p>
      {photoError ? <Notice title="The check is saved, but not the photo">{photoError}</Notice> : null}
    </Card>
  );
}

/**
 * Recording a check on a saw, phone first: the cautions, the check (the most urgent chosen), its target for
 * this saw and blade with its source, a large reading field in the site's unit (or the condition's answers),
 * notes and a photo. The server works out pass or fail; the form shows what it decided.
 */
export function RecordCheckForm({
  sawId,
  checks,
  system,
  timeZone,
  askedCheckId,
  onSave,
}: {
  sawId: string;
  checks: readonly SawCheck[];
  system: UnitSystem;
  timeZone: string;
  askedCheckId: string | null;
  /** Saves the record (and the photo); rejects with the API's error, shown on the form. */
  onSave: (input: CheckRecordCreateParsed, photo: File | null) => Promise<unknown>;
}) {
  const resolver = useMemo(() => recordResolver(sawId, checks, system), [sawId, checks, system]);
  const [photo, setPhoto] = useState<File | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<RecordFormValues, unknown, CheckRecordCreateParsed>({
    resolver,
    defaultValues: {
      siteCheckId: firstChoice(checks, askedCheckId),
      reading: '',
      reachesGullets: '',
      worn: '',
      notes: '',
    },
  });
  const chosenId = useWatch({ control, name: 'siteCheckId' });
  const chosen = checks.find((c) => c.check.id === chosenId) ?? null;
  const usable = checks.filter((c) => c.target.applicable);
  const notHere = checks.filter((c) => !c.target.applicable);

  const submit = handleSubmit(async (input) => {
    try {
      await onSave(input, photo);
    } catch (err) {
      showServerError(err, setError, (path) => FIELD_OF[path], 'The check was not saved. Try again.');
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      <WorkCaution />
      {errors.root?.server ? <Notice title="The check was not saved">{errors.root.server.message}</Notice> : null}
      {errors.root && !errors.root.server ? <Notice title="Check the form">{errors.root.message}</Notice> : null}

      <ChoiceGroup legend="Check" error={errors.siteCheckId?.message}>
        <div className="grid gap-2 sm:grid-cols-2">
          {usable.map((item) => (
            <ChoiceTile
              key={item.check.id}
              type="radio"
              value={item.check.id}
              label={item.check.name}
              hint={<DueStateBadge state={item.state} />}
              {...register('siteCheckId')}
            />
          ))}
        </div>
      </ChoiceGroup>
      {notHere.length > 0 ? (
        <details className="text-sm text-ink-muted">
          <summary className="min-h-11 cursor-pointer py-2">Not for this saw ({notHere.length})</summary>
          <ul className="list-disc space-y-1 pl-5">
            {notHere.map((item) => (
              <li key={item.check.id}>
                <strong className="text-ink">{item.check.name}</strong>: {item.target.explanation}
              </li>
            ))}
          </ul>
        </details>
      ) : null}

      {chosen ? (
        <>
          <TargetCard item={chosen} system={system} timeZone={timeZone} />
          {chosen.check.quantity === 'condition' ? (
            <div className="space-y-4">
              <YesNo
                legend="Does the brush reach into the gullets?"
                error={errors.reachesGullets?.message}
                register={register('reachesGullets')}
              />
              <YesNo legend="Is the brush worn?" error={errors.worn?.message} register={register('worn')} />
            </div>
          ) : (
            <Field
              label={`Reading${chosen.check.measures ? `: ${chosen.check.measures.toLowerCase()}` : ''}`}
              unit={readingUnit(chosen.check.quantity, system)}
              error={errors.reading?.message}
            >
              {(props) => (
                <input
                  {...props}
                  {...register('reading')}
                  inputMode="decimal"
                  autoComplete="off"
                  className={`${inputClass} min-h-14 text-2xl font-bold tabular-nums`}
                />
              )}
            </Field>
          )}
          <Field label="Notes (optional)" error={errors.notes?.message}>
            {(props) => <textarea {...props} {...register('notes')} rows={2} className={`${inputClass} py-2`} />}
          </Field>
          <Field label="Photo (optional)" hint="JPEG, PNG or WebP, up to 10 MB: a worn guide, a brush, a gauge.">
            {(props) => (
              <input
                {...props}
                type="file"
                accept="image/jpeg,image/png,image/webp"
                capture="environment"
                onChange={(event) => setPhoto(event.target.files?.[0] ?? null)}
                className="block min-h-11 w-full text-sm text-ink file:mr-3 file:min-h-11 file:rounded-sheet file:border file:border-ink-muted file:bg-card file:px-4 file:font-semibold"
              />
            )}
          </Field>
          <Button
            type="submit"
            variant="primary"
            disabled={isSubmitting}
            className="min-h-14 w-full text-base sm:w-auto"
          >
            {isSubmitting ? 'Saving…' : 'Save reading'}
          </Button>
        </>
      ) : usable.length === 0 ? (
        <Notice tone="info">No check on this site’s list applies to this saw.</Notice>
      ) : null}
    </form>
  );
}
