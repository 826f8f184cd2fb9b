import { useForm, type FieldValues } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { followUpCreateSchema, type FollowUp } from '@kerfline/domain/follow-ups/schema';
import type { PeerMetric } from '@kerfline/domain/outliers/peer-review';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { followUpAssigneesQuery } from '../api/queries';
import { useCreateFollowUp } from '../api/mutations';

type Values = { title: string; assigneeId: string; dueOn: string; notes: string };
type Field = keyof Values;

const fieldForPath = (path: string): Field | undefined => {
  const head = path.split('.')[0] ?? '';
  return (['title', 'assigneeId', 'dueOn', 'notes'] as const).find((f) => f === head);
};

/** Today plus `days`, as a date, for the due date's starting value. */
function inDays(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

/**
 * Opens a follow-up on a saw for someone at its site: what to do, who, by when, and a note. The flag it comes
 * from (figure and period) goes with it, so the site sees what the lead saw.
 */
export function FollowUpForm({
  sawId,
  siteId,
  defaultTitle,
  fromFlag,
  onCreated,
}: {
  sawId: string;
  siteId: string;
  defaultTitle: string;
  fromFlag: { metric: PeerMetric; from: string; to: string } | null;
  onCreated: (followUp: FollowUp) => void;
}) {
  const assignees = useQuery(followUpAssigneesQuery(siteId));
  const create = useCreateFollowUp();
  const toInput = (v: Values) => ({
    sawId,
    title: v.title,
    assigneeId: v.assigneeId,
    dueOn: v.dueOn,
    notes: v.notes,
    fromFlag,
  });
  const form = useForm<Values, unknown, FieldValues>({
    defaultValues: { title: defaultTitle, assigneeId: '', dueOn: inDays(14), notes: '' },
    resolver: domainSchemaResolver(followUpCreateSchema, toInput, fieldForPath, (v) =>
      v.assigneeId === '' ? { assigneeId: 'Choose who at the site does it' } : {},
    ),
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (_parsed, _event) => {
    try {
      onCreated(await create.mutateAsync(toInput(form.getValues())));
      form.reset({ title: defaultTitle, assigneeId: '', dueOn: inDays(14), notes: '' });
    } catch (error) {
      showServerError(error, form.setError, fieldForPath, 'The follow-up could not be opened.');
    }
  });

  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="space-y-4">
      {errors.root?.server ? <Notice title="Not opened">{errors.root.server.message}</Notice> : null}
      <Field label="What should be done" error={errors.title?.message}>
        {(props) => <input {...props} {...form.register('title')} className={inputClass} maxLength={160} />}
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Who at the site"
          error={errors.assigneeId?.message}
          hint={assignees.isError ? 'The people of the site could not be loaded.' : undefined}
        >
          {(props) => (
            <select {...props} {...form.register('assigneeId')} className={inputClass}>
              <option value="">{assignees.isPending ? 'Loading…' : 'Choose a person'}</option>
              {assignees.data?.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} ({p.role})
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Due by" error={errors.dueOn?.message}>
          {(props) => (
            <input {...props} type="date" min={inDays(0)} {...form.register('dueOn')} className={inputClass} />
          )}
        </Field>
      </div>
      <Field label="Note for the site (optional)" error={errors.notes?.message}>
        {(props) => (
          <textarea
            {...props}
            {...form.register('notes')}
            rows={3}
            className="w-full rounded-sheet border border-ink-muted bg-card px-3 py-2 text-base"
          />
        )}
      </Field>
      <Button type="submit" variant="primary" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? 'Opening…' : 'Open the follow-up'}
      </Button>
    </form>
  );
}
