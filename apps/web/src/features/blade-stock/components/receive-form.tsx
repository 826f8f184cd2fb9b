import { useMemo, type ReactNode } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { pitchLabel, type BladeSpec } from '@kerfline/domain/blade-specs/schema';
import { stockReceiptCreateSchema, type StockReceiptCreateParsed } from '@kerfline/domain/blade-stock/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import {
  catalogueCost,
  receiveDefaults,
  receiveFieldForPath,
  receiveInput,
  type ReceiveFormValues,
} from './receive-values';

function resolverFor(siteId: string, currency: string) {
  return domainSchemaResolver(
    stockReceiptCreateSchema,
    (values: ReceiveFormValues) => receiveInput(values, siteId, currency).input,
    (path) => receiveFieldForPath(path),
    (values) => receiveInput(values, siteId, currency).fieldErrors,
  ) as Resolver<ReceiveFormValues, unknown, StockReceiptCreateParsed>;
}

/**
 * Receiving blades into a site's stock (site admins): which spec, how many, the cost of one in the site's
 * currency (the catalogue price to start with), the day they came and the lot or delivery reference.
 */
export function ReceiveForm({
  siteId,
  currency,
  timeZone,
  specs,
  onSubmit,
  cancel,
}: {
  siteId: string;
  currency: string;
  timeZone: string;
  specs: BladeSpec[];
  onSubmit: (input: StockReceiptCreateParsed) => Promise<unknown>;
  cancel: ReactNode;
}) {
  const resolver = useMemo(() => resolverFor(siteId, currency), [siteId, currency]);
  const defaultValues = useMemo(() => receiveDefaults(timeZone), [timeZone]);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors, isSubmitting },
  } = useForm<ReceiveFormValues, unknown, StockReceiptCreateParsed>({ resolver, defaultValues });
  const spec = register('bladeSpecId');

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(error, setError, (path) => receiveFieldForPath(path), 'The blades were not received.');
    }
  });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The blades were not received">{rootMessage}</Notice> : null}
      <Field label="Blade spec" error={errors.bladeSpecId?.message}>
        {(props) => (
          <select
            {...props}
            {...spec}
            onChange={(event) => {
              void spec.onChange(event);
              // Start from the catalogue price unless a cost was already typed.
              if (getValues('unitCost').trim() === '')
                setValue(
                  'unitCost',
                  catalogueCost(
                    specs.find((s) => s.id === event.target.value),
                    currency,
                  ),
                );
            }}
            className={inputClass}
          >
            <option value="">Choose…</option>
            {specs.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name.includes(pitchLabel(s.pitch)) ? s.name : `${s.name} (${pitchLabel(s.pitch)})`}
              </option>
            ))}
          </select>
        )}
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Blades received" unit="blades" error={errors.quantity?.message}>
          {(props) => (
            <input
              {...props}
              {...register('quantity')}
              inputMode="numeric"
              autoComplete="off"
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
        <Field label="Cost of one blade" unit={currency} error={errors.unitCost?.message}>
          {(props) => (
            <input
              {...props}
              {...register('unitCost')}
              inputMode="decimal"
              autoComplete="off"
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
        <Field label="Received on" hint={`Your site’s calendar (${timeZone}).`} error={errors.receivedOn?.message}>
          {(props) => <input {...props} {...register('receivedOn')} type="date" className={`${inputClass} tabular`} />}
        </Field>
        <Field
          label="Lot or delivery reference"
          hint="Optional: the delivery note’s number."
          error={errors.reference?.message}
        >
          {(props) => <input {...props} {...register('reference')} autoComplete="off" className={inputClass} />}
        </Field>
      </div>
      <Field label="Notes" hint="Optional." error={errors.notes?.message}>
        {(props) => <textarea {...props} {...register('notes')} rows={2} className={`${inputClass} py-2`} />}
      </Field>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : 'Receive blades'}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
