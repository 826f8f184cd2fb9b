import { useMemo, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { domainSchemaResolver } from '../../../lib/form-errors';
import { HEAD_FEEDS, sawCreateSchema, type Saw, type SawCreateParsed } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { mmToIn } from '@kerfline/domain/units/units';
import { isApiError } from '../../../lib/api-client';
import { formatNumber, lengthUnit, speedUnit } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { HEAD_FEED_LABELS } from './saws-table';
import {
  FORCE_FIELDS,
  MEASURE_LABELS,
  SPEED_FIELDS,
  emptySawFormValues,
  formFieldForPath,
  sawFormValuesFromSaw,
  sawInputFromForm,
  schemaFieldFor,
  type MeasureField,
  type SawFormField,
  type SawFormValues,
} from './saw-form-values';

/** The schema states its limits in millimetres; an imperial site also gets them in inches. */
function inSiteUnits(message: string, system: UnitSystem): string {
  if (system !== 'imperial') return message;
  return message.replace(
    /(\d+(?:\.\d+)?) mm$/,
    (whole, mm: string) => `${whole} (${formatNumber(mmToIn(Number(mm)), 2)} in)`,
  );
}

/**
 * zodResolver(sawCreateSchema) run on the converted values: the form validates with the very schema the
 * server parses, while the user types in the site's units. Errors come back under the form's field names.
 */
function sawFormResolver(siteId: string, system: UnitSystem): Resolver<SawFormValues, unknown, SawCreateParsed> {
  return domainSchemaResolver(
    sawCreateSchema,
    (values: SawFormValues) => sawInputFromForm(values, siteId, system).input,
    (path) => formFieldForPath(path),
    (values) => sawInputFromForm(values, siteId, system).fieldErrors,
    (message) => inSiteUnits(message, system),
  );
}

type SawFormProps = {
  siteId: string;
  unitSystem: UnitSystem;
  /** The saw being edited; omitted when adding one. */
  saw?: Saw;
  submitLabel: string;
  /**
   * Saves the saw. `changed` names the schema fields the user altered (all of them for a new saw), so an
   * edit can send only those. A rejected `ApiError` is shown on the form: 400 details beside their fields,
   * anything else (a 409 clash, say) as a message above it.
   */
  onSubmit: (input: SawCreateParsed, changed: (keyof SawCreateParsed)[]) => Promise<unknown>;
  cancel?: ReactNode;
};

export function SawForm({ siteId, unitSystem, saw, submitLabel, onSubmit, cancel }: SawFormProps) {
  const resolver = useMemo(() => sawFormResolver(siteId, unitSystem), [siteId, unitSystem]);
  const defaultValues = useMemo(
    () => (saw ? sawFormValuesFromSaw(saw, unitSystem) : emptySawFormValues()),
    [saw, unitSystem],
  );
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting, dirtyFields },
  } = useForm<SawFormValues, unknown, SawCreateParsed>({ resolver, defaultValues });

  const submit = handleSubmit(async (input) => {
    const changed = saw
      ? (Object.keys(dirtyFields) as SawFormField[]).map(schemaFieldFor)
      : (Object.keys(input) as (keyof SawCreateParsed)[]);
    try {
      await onSubmit(input, changed);
    } catch (error) {
      if (isApiError(error, 400) && error.details.length > 0) {
        const unplaced: string[] = [];
        for (const detail of error.details) {
          const field = formFieldForPath(detail.path);
          if (field) setError(field, { type: 'server', message: inSiteUnits(detail.message, unitSystem) });
          else unplaced.push(detail.message);
        }
        setError('root.server', { type: 'server', message: [error.message, ...unplaced].join(' ') });
      } else {
        setError('root.server', {
          type: 'server',
          message: error instanceof Error ? error.message : 'The saw could not be saved. Try again.',
        });
      }
    }
  });

  const lengthUnitLabel = lengthUnit(unitSystem);
  const speedUnitLabel = speedUnit(unitSystem);
  const forceUnitLabel = unitSystem === 'imperial' ? 'lbf' : 'N';
  const unitOf = (field: MeasureField) =>
    field in SPEED_FIELDS ? speedUnitLabel : field in FORCE_FIELDS ? forceUnitLabel : lengthUnitLabel;
  // The spring-balance limits mean something only for a head fed by gravity or a spring.
  const springFed = useWatch({ control, name: 'headFeed' }) === 'gravity_spring';
  const measure = (field: MeasureField, hint?: string) => (
    <Field label={MEASURE_LABELS[field]} unit={unitOf(field)} hint={hint} error={errors[field]?.message}>
      {(props) => (
        <input
          {...props}
          {...register(field)}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          className={`${inputClass} tabular`}
        />
      )}
    </Field>
  );
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The saw was not saved">{rootMessage}</Notice> : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Saw</legend>
        <Field label="Asset tag" hint="The plant's own number on the machine." error={errors.assetTag?.message}>
          {(props) => <input {...props} {...register('assetTag')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Name" error={errors.name?.message}>
          {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Kind" error={errors.kind?.message}>
          {(props) => (
            <select {...props} {...register('kind')} className={inputClass}>
              <option value="">Choose…</option>
              <option value="horizontal">Horizontal</option>
              <option value="vertical">Vertical</option>
            </select>
          )}
        </Field>
        <Field
          label="Head feed"
          hint="How the head comes down into the cut. Gravity- or spring-fed heads get the spring-balance check."
          error={errors.headFeed?.message}
        >
          {(props) => (
            <select {...props} {...register('headFeed')} className={inputClass}>
              {HEAD_FEEDS.map((feed) => (
                <option key={feed} value={feed}>
                  {HEAD_FEED_LABELS[feed]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Make" hint="Optional." error={errors.make?.message}>
          {(props) => <input {...props} {...register('make')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Model" hint="Optional." error={errors.model?.message}>
          {(props) => <input {...props} {...register('model')} autoComplete="off" className={inputClass} />}
        </Field>
      </fieldset>

      {springFed ? (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">
            Head down-force (optional)
          </legend>
          {measure(
            'maxHeadForce',
            'This saw’s greatest spring-balance reading over the last inch of head travel; leave empty to use the site’s setting.',
          )}
          {measure('minHeadForce', 'Below this the head is not feeding; leave empty to use the site’s setting.')}
        </fieldset>
      ) : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Wheels and band</legend>
        {measure('wheelDiameter')}
        {measure('centreDistance', 'Between the wheel centres, at working tension.')}
        {measure('bandWidth', 'Tooth tip to back edge.')}
        {measure('bandThickness', 'The gauge of the band body.')}
        {measure('bandLength', 'Round the loop, as welded.')}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Band speed</legend>
        {measure('bandSpeedMin')}
        {measure('bandSpeedMax')}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Capacity (optional)</legend>
        {measure('capacityRound')}
        {measure('capacityRectWidth')}
        {measure('capacityRectHeight')}
      </fieldset>

      <div className="flex flex-wrap gap-3 border-t border-rule pt-5">
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : submitLabel}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
