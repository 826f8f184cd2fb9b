import { useMemo, useState, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import {
  STOP_CATEGORIES,
  STOP_CATEGORY_LABELS,
  stopCreateSchema,
  type StopCreateParsed,
} from '@kerfline/domain/stops/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { plannedFor, stopDefaults, stopFieldForPath, stopInput, type StopFormValues } from './stop-values';

function resolverFor(sawId: string, timeZone: string, openedAt: Date) {
  return domainSchemaResolver(
    stopCreateSchema,
    (values: StopFormValues) => stopInput(values, sawId, timeZone, openedAt).input,
    (path) => stopFieldForPath(path),
    (values) => stopInput(values, sawId, timeZone, openedAt).fieldErrors,
  ) as Resolver<StopFormValues, unknown, StopCreateParsed>;
}

/**
 * Logging a stop: why, planned or not, since when (now unless changed), and — for a stop logged afterwards —
 * when it ended. A stop that overlaps another on this saw is refused by the server, and its message (which names
 * the other stop and its times) is shown above the form in words.
 */
export function StopForm({
  sawId,
  timeZone,
  onSubmit,
  cancel,
}: {
  sawId: string;
  timeZone: string;
  onSubmit: (input: StopCreateParsed) => Promise<unknown>;
  cancel: ReactNode;
}) {
  const [openedAt] = useState(() => new Date());
  const resolver = useMemo(() => resolverFor(sawId, timeZone, openedAt), [sawId, timeZone, openedAt]);
  const defaultValues = useMemo(() => stopDefaults(timeZone, openedAt), [timeZone, openedAt]);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    control,
    formState: { errors, isSubmitting },
  } = useForm<StopFormValues, unknown, StopCreateParsed>({ resolver, defaultValues });
  const stillStopped = useWatch({ control, name: 'stillStopped' });

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(error, setError, (path) => stopFieldForPath(path), 'The stop was not logged. Try again.');
    }
  });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;
  const category = register('category');

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The stop was not logged">{rootMessage}</Notice> : null}
      <ChoiceGroup legend="Why the saw stopped" error={errors.category?.message}>
        <div className="grid gap-2 sm:grid-cols-2">
          {STOP_CATEGORIES.map((value) => (
            <ChoiceTile
              key={value}
              type="radio"
              value={value}
              label={STOP_CATEGORY_LABELS[value]}
              {...category}
              onChange={(event) => {
                void category.onChange(event);
                setValue('planned', plannedFor(value));
              }}
            />
          ))}
        </div>
      </ChoiceGroup>

      <ChoiceGroup legend="Planned?" error={errors.planned?.message}>
        <div className="grid grid-cols-2 gap-2">
          <ChoiceTile type="radio" value="unplanned" label="Unplanned" {...register('planned')} />
          <ChoiceTile type="radio" value="planned" label="Planned" {...register('planned')} />
        </div>
      </ChoiceGroup>

      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Stopped at" hint={`Your site’s clock (${timeZone}).`} error={errors.startedAt?.message}>
          {(props) => (
            <input {...props} {...register('startedAt')} type="datetime-local" className={`${inputClass} tabular`} />
          )}
        </Field>
        <div className="space-y-2">
          <label className="flex min-h-11 cursor-pointer items-center gap-3 text-sm font-semibold text-ink">
            <input type="checkbox" {...register('stillStopped')} className="size-5 accent-accent" />
            Still stopped
          </label>
          {!stillStopped ? (
            <Field label="Running again at" error={errors.endedAt?.message}>
              {(props) => (
                <input {...props} {...register('endedAt')} type="datetime-local" className={`${inputClass} tabular`} />
              )}
            </Field>
          ) : null}
        </div>
      </div>

      <Field label="Notes" hint="Optional: what happened, what was done." error={errors.notes?.message}>
        {(props) => <textarea {...props} {...register('notes')} rows={2} className={`${inputClass} py-2`} />}
      </Field>

      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : 'Log the stop'}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
