import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  REMOVAL_REASON_MAX,
  removeRecordSchema,
  type RemoveRecordInput,
} from '@kerfline/domain/removed-records/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';

/**
 * Removing an entry made by mistake (a blade run, a stop, a photo…): a button that opens a short confirmation
 * asking why. The entry is kept with the reason and can be put back from the site's removed entries, so the
 * words say so. `onRemove` sends the removal; the page decides where to go afterwards.
 */
export function RemoveEntry({
  noun,
  goesWith,
  onRemove,
  compact = false,
}: {
  /** What is removed, in plain words: "blade run", "stop", "photo". */
  noun: string;
  /** What leaves with it, if anything: "Its 2 photos go with it." */
  goesWith?: string;
  onRemove: (input: RemoveRecordInput) => Promise<unknown>;
  /** A smaller trigger, for an entry inside a list (a photo). */
  compact?: boolean;
}) {
  const [open, setOpen] = useState(false);
  const headingId = useId();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<RemoveRecordInput>({ resolver: zodResolver(removeRecordSchema), defaultValues: { reason: '' } });

  if (!open)
    return (
      <Button variant={compact ? 'quiet' : 'danger'} onClick={() => setOpen(true)}>
        Remove this {noun}…
      </Button>
    );

  const submit = handleSubmit(async (values) => {
    try {
      await onRemove(values);
    } catch (error) {
      showServerError(error, setError, (path) => (path === 'reason' ? 'reason' : undefined), 'It was not removed');
    }
  });

  return (
    <Card aria-labelledby={headingId} className="space-y-3 border-signal-stop p-4 sm:p-5">
      <h2 id={headingId} className="text-lg font-bold text-ink">
        Remove this {noun}?
      </h2>
      <p className="text-ink">
        For an entry made by mistake. It leaves the lists, figures and stock.{goesWith ? ` ${goesWith}` : ''} It is kept
        with your reason, and the site’s admin or an administrator can put it back from <b>Removed entries</b>.
      </p>
      {errors.root?.server ? <Notice title="Not removed">{errors.root.server.message}</Notice> : null}
      <form onSubmit={(e) => void submit(e)} noValidate className="space-y-3">
        <Field
          label="Why is it being removed?"
          error={errors.reason?.message}
          hint="For example: logged on the wrong saw"
        >
          {(props) => (
            <input
              {...props}
              {...register('reason')}
              className={inputClass}
              maxLength={REMOVAL_REASON_MAX}
              autoComplete="off"
            />
          )}
        </Field>
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="danger" disabled={isSubmitting}>
            {isSubmitting ? 'Removing…' : `Remove the ${noun}`}
          </Button>
          <Button
            onClick={() => {
              reset();
              setOpen(false);
            }}
          >
            Keep it
          </Button>
        </div>
      </form>
    </Card>
  );
}
