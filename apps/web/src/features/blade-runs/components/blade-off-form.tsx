import { useMemo, useState, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { bladeRunRemoveSchema, type BladeRun, type BladeRunRemoveParsed } from '@kerfline/domain/blade-runs/schema';
import { REMOVAL_REASONS, REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { areaToDisplay } from '@kerfline/domain/units/display';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { unitOf } from '../../../lib/form-numbers';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { SafetyCaution } from '../../../lib/ui/safety-caution';
import { useConfirmCause, useRemoveBladeRun, useUploadRunPhoto } from '../api/mutations';
import { bladeOffDefaults, bladeOffFieldForPath, bladeOffInput, type BladeOffFormValues } from './blade-off-values';
import { LikelyCausesChoice } from './likely-causes';
import { PhotoPicker, type PendingPhoto } from './photo-picker';

/** What each reason means in the shop, under its tile. */
const REASON_HINTS: Record<(typeof REMOVAL_REASONS)[number], string> = {
  worn_out: 'Dull at the end of a normal life.',
  tooth_strippage: 'Teeth torn off the band.',
  fatigue_crack: 'Cracks from the gullets; not yet broken.',
  broken: 'The band parted.',
  crooked_cutting: 'Cut wandering off square.',
  other: 'Say what in the notes.',
};

/** The schema's area limit is in mm²; the site reads it in its own unit too. */
function inSiteUnits(message: string, system: UnitSystem): string {
  return message.replace(/([\d,]+) mm²/, (whole, mm2: string) => {
    const shown = areaToDisplay(Number(mm2.replaceAll(',', '')), system).text;
    return `${shown} (${whole})`;
  });
}

function resolverFor(system: UnitSystem, timeZone: string, openedAt: Date) {
  return domainSchemaResolver(
    bladeRunRemoveSchema,
    (values: BladeOffFormValues) => bladeOffInput(values, system, timeZone, openedAt).input,
    (path) => bladeOffFieldForPath(path),
    (values) => bladeOffInput(values, system, timeZone, openedAt).fieldErrors,
    (message) => inSiteUnits(message, system),
  ) as Resolver<BladeOffFormValues, unknown, BladeRunRemoveParsed>;
}

type BladeOffFormProps = {
  run: Pick<BladeRun, 'id' | 'installedAt' | 'bladeSpecName'>;
  system: UnitSystem;
  timeZone: string;
  /** Called once the blade is recorded as off (and the cause and photos have gone, or failed in words). */
  onDone: (run: BladeRun, outcome: { photoFailures: number }) => void | Promise<void>;
  submitLabel?: string;
  cancel: ReactNode;
};

/**
 * Taking a blade off: why (a failure reason shows this saw's ranked likely causes at once, and one may be
 * confirmed), what it cut (area and/or cuts; blank adds up its cut logs), notes and photos with upload progress.
 * Saving goes in steps — off, cause, each photo — so a photo that fails to send never loses the removal: the
 * form says which step failed and tries only what is left.
 */
export function BladeOffForm({
  run,
  system,
  timeZone,
  onDone,
  submitLabel = 'Take blade off',
  cancel,
}: BladeOffFormProps) {
  const [openedAt] = useState(() => new Date());
  const resolver = useMemo(() => resolverFor(system, timeZone, openedAt), [system, timeZone, openedAt]);
  const defaultValues = useMemo(() => bladeOffDefaults(timeZone, openedAt), [timeZone, openedAt]);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<BladeOffFormValues, unknown, BladeRunRemoveParsed>({ resolver, defaultValues });
  const reason = useWatch({ control, name: 'reason' });
  const cause = useWatch({ control, name: 'cause' });
  const remove = useRemoveBladeRun();
  const confirm = useConfirmCause();
  const upload = useUploadRunPhoto();
  const [removed, setRemoved] = useState<BladeRun | null>(null);
  const [causeSaved, setCauseSaved] = useState(false);
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);

  const setPhoto = (key: string, change: Partial<PendingPhoto>) =>
    setPhotos((list) => list.map((p) => (p.key === key ? { ...p, ...change } : p)));

  const submit = handleSubmit(async (input) => {
    let saved = removed;
    if (!saved) {
      try {
        saved = await remove.mutateAsync({ runId: run.id, input });
        setRemoved(saved);
      } catch (error) {
        showServerError(error, setError, (path) => bladeOffFieldForPath(path), 'The blade was not recorded as off.');
        return;
      }
    }
    if (cause && !causeSaved) {
      try {
        saved = await confirm.mutateAsync({ runId: run.id, input: { cause } });
        setCauseSaved(true);
      } catch (error) {
        setError('root.server', {
          type: 'server',
          message: `The blade is recorded as off, but the cause was not saved: ${
            error instanceof Error ? error.message : 'try again'
          }.`,
        });
        return;
      }
    }
    let failures = 0;
    for (const photo of photos.filter((p) => !p.done)) {
      setPhoto(photo.key, { progress: 0, error: null });
      try {
        await upload.mutateAsync({
          runId: run.id,
          file: photo.file,
          onProgress: (fraction) => setPhoto(photo.key, { progress: fraction }),
        });
        setPhoto(photo.key, { progress: 1, done: true });
      } catch (error) {
        failures += 1;
        setPhoto(photo.key, { error: error instanceof Error ? error.message : 'Not sent.' });
      }
    }
    if (failures > 0) {
      setError('root.server', {
        type: 'server',
        message: `The blade is recorded as off${cause ? ' with its cause' : ''}, but ${failures} photo${
          failures === 1 ? ' was' : 's were'
        } not sent. Send again, or remove ${failures === 1 ? 'it' : 'them'} and finish.`,
      });
      return;
    }
    await onDone(saved, { photoFailures: 0 });
  });

  const rootMessage = errors.root?.server?.message ?? errors.root?.message;
  const areaUnit = unitOf('area', system);

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      <SafetyCaution compact />
      <p className="text-sm text-ink-muted">
        {run.bladeSpecName}, on since {formatDateTime(run.installedAt, timeZone)}.
      </p>
      {rootMessage ? (
        <Notice title={removed ? 'Not everything was saved' : 'The blade was not recorded as off'}>
          {rootMessage}
        </Notice>
      ) : null}

      <ChoiceGroup legend="Why it came off" error={errors.reason?.message}>
        <div className="grid gap-2 sm:grid-cols-2">
          {REMOVAL_REASONS.map((value) => (
            <ChoiceTile
              key={value}
              type="radio"
              value={value}
              label={REMOVAL_REASON_LABELS[value]}
              hint={REASON_HINTS[value]}
              disabled={removed !== null}
              {...register('reason')}
            />
          ))}
        </div>
      </ChoiceGroup>

      {reason && reason !== 'other' && !causeSaved ? (
        <LikelyCausesChoice runId={run.id} reason={reason} register={register('cause')} error={errors.cause?.message} />
      ) : null}

      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Taken off at" hint={`Your site’s clock (${timeZone}).`} error={errors.removedAt?.message}>
          {(props) => (
            <input
              {...props}
              {...register('removedAt')}
              type="datetime-local"
              disabled={removed !== null}
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
        <Field
          label="Area cut"
          unit={areaUnit}
          hint="Blank: added up from this blade’s cut logs."
          error={errors.areaCut?.message}
        >
          {(props) => (
            <input
              {...props}
              {...register('areaCut')}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              disabled={removed !== null}
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
        <Field label="Number of cuts" hint="Blank: from the cut logs." error={errors.cuts?.message}>
          {(props) => (
            <input
              {...props}
              {...register('cuts')}
              type="text"
              inputMode="numeric"
              autoComplete="off"
              disabled={removed !== null}
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
      </div>

      <Field label="Notes" hint="Optional." error={errors.notes?.message}>
        {(props) => (
          <textarea
            {...props}
            {...register('notes')}
            rows={2}
            disabled={removed !== null}
            className={`${inputClass} py-2`}
          />
        )}
      </Field>

      <PhotoPicker photos={photos} onChange={setPhotos} disabled={isSubmitting} />

      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : removed ? 'Send again' : submitLabel}
        </Button>
        {removed ? (
          <Button onClick={() => void onDone(removed, { photoFailures: photos.filter((p) => !p.done).length })}>
            Finish without them
          </Button>
        ) : (
          cancel
        )}
      </div>
    </form>
  );
}
