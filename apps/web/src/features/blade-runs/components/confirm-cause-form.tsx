import { useForm } from 'react-hook-form';
import type { CauseId } from '@kerfline/domain/diagnosis/likely-causes';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { useConfirmCause } from '../api/mutations';
import { LikelyCausesChoice } from './likely-causes';

/** Confirming (or changing) the cause of a removed run's failure, from its ranked likely causes. */
export function ConfirmCauseForm({
  runId,
  reason,
  current,
  onSaved,
}: {
  runId: string;
  reason: RemovalReason;
  current: CauseId | null;
  onSaved?: () => void;
}) {
  const confirm = useConfirmCause();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting, isSubmitSuccessful },
  } = useForm<{ cause: CauseId | '' }>({ defaultValues: { cause: current ?? '' } });
  const submit = handleSubmit(async ({ cause }) => {
    if (!cause) {
      setError('cause', { type: 'form', message: 'Choose the cause you found' });
      return;
    }
    try {
      await confirm.mutateAsync({ runId, input: { cause } });
      onSaved?.();
    } catch (error) {
      showServerError(error, setError, (path) => (path === 'cause' ? 'cause' : undefined), 'The cause was not saved.');
    }
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {errors.root?.server?.message ? <Notice>{errors.root.server.message}</Notice> : null}
      {isSubmitSuccessful && !errors.root ? <Notice tone="info">Cause saved.</Notice> : null}
      <LikelyCausesChoice
        runId={runId}
        reason={reason}
        register={register('cause')}
        error={errors.cause?.message}
        offerUnsure={false}
      />
      <Button type="submit" variant="primary" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : current ? 'Change the cause' : 'Confirm this cause'}
      </Button>
    </form>
  );
}
