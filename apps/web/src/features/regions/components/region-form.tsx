import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { regionCreateSchema, type RegionCreate } from '@kerfline/domain/regions/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';

/**
 * A region's one field and its button, small enough to sit beside another form. A name already taken (409)
 * is said above the field and marked on it. The field is cleared after a save.
 */
export function RegionForm({
  onSubmit,
  defaultName = '',
  submitLabel = 'Add region',
  failedTitle = 'The region was not added',
}: {
  onSubmit: (input: RegionCreate) => Promise<unknown>;
  /** The region's name as it is, when the form renames one. */
  defaultName?: string;
  submitLabel?: string;
  failedTitle?: string;
}) {
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<RegionCreate>({ resolver: zodResolver(regionCreateSchema), defaultValues: { name: defaultName } });

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
      reset({ name: defaultName === '' ? '' : input.name });
    } catch (error) {
      showServerError(error, setError, (path) => (path === 'name' ? 'name' : undefined), 'The region was not saved.');
    }
  });
  const rootMessage = errors.root?.server?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {rootMessage ? <Notice title={failedTitle}>{rootMessage}</Notice> : null}
      <div className="flex flex-wrap items-start gap-3">
        <Field
          label="Region name"
          hint="A country, say, or the plants one lead looks after."
          error={errors.name?.message}
          className="min-w-0 flex-1 basis-64"
        >
          {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
        </Field>
        <Button type="submit" disabled={isSubmitting} className="sm:mt-6">
          {isSubmitting ? 'Saving…' : submitLabel}
        </Button>
      </div>
    </form>
  );
}
