import { useMemo, useState, type ReactNode } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import type { Stop } from '@kerfline/domain/stops/schema';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { readZonedTime, toZonedInput } from '../../../lib/zoned-time';
import { stopEndSchema, type StopEnd } from '@kerfline/domain/stops/schema';

type EndValues = { endedAt: string };

/**
 * Ending the saw's open stop: one button, the end at now unless changed (the saw may have run again a while
 * ago). The time is checked with the same schema the server parses.
 */
export function EndStopForm({
  stop,
  timeZone,
  onSubmit,
  cancel,
}: {
  stop: Pick<Stop, 'id' | 'startedAt' | 'category' | 'planned'>;
  timeZone: string;
  onSubmit: (endedAt: Date) => Promise<unknown>;
  cancel: ReactNode;
}) {
  const [openedAt] = useState(() => new Date());
  const defaultValues = useMemo(() => ({ endedAt: toZonedInput(openedAt, timeZone) }), [openedAt, timeZone]);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<EndValues, unknown, StopEnd>({
    defaultValues,
    resolver: domainSchemaResolver(
      stopEndSchema,
      (values: EndValues) => ({
        endedAt: readZonedTime(values.endedAt, timeZone, openedAt)?.toISOString() ?? values.endedAt,
      }),
      (path) => (path === 'endedAt' ? 'endedAt' : undefined),
      (values) => {
        const at = readZonedTime(values.endedAt, timeZone, openedAt);
        if (!at) return { endedAt: 'Enter when the saw ran again' };
        if (at.getTime() <= Date.parse(stop.startedAt))
          return { endedAt: `The end must be after the start (${formatDateTime(stop.startedAt, timeZone)})` };
        return {};
      },
    ) as Resolver<EndValues, unknown, StopEnd>,
  });

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input.endedAt ?? new Date());
    } catch (error) {
      showServerError(error, setError, (path) => (path === 'endedAt' ? 'endedAt' : undefined), 'The stop did not end.');
    }
  });
  const rootMessage = errors.root?.server?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      <p className="text-ink">
        Stopped for <strong>{STOP_CATEGORY_LABELS[stop.category].toLowerCase()}</strong>
        {stop.planned ? ' (planned)' : ''} since{' '}
        <strong className="tabular">{formatDateTime(stop.startedAt, timeZone)}</strong>.
      </p>
      {rootMessage ? <Notice title="The stop did not end">{rootMessage}</Notice> : null}
      <Field label="Running again at" hint={`Your site’s clock (${timeZone}).`} error={errors.endedAt?.message}>
        {(props) => (
          <input {...props} {...register('endedAt')} type="datetime-local" className={`${inputClass} tabular`} />
        )}
      </Field>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : 'End the stop'}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
