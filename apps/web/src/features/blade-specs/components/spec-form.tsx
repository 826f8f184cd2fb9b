import { useMemo, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import {
  BLADE_MATERIAL_LABELS,
  TOOTH_FORMS,
  TOOTH_FORM_LABELS,
  TOOTH_SETS,
  TOOTH_SET_LABELS,
  bladeSpecCreateSchema,
  type BladeSpec,
  type BladeSpecCreateParsed,
} from '@kerfline/domain/blade-specs/schema';
import { BLADE_MATERIALS } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { unitOf } from '../../../lib/form-numbers';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { emptySpecValues, specFieldForPath, specInput, specValuesFrom, type SpecFormValues } from './spec-values';

function resolverFor(system: UnitSystem) {
  return domainSchemaResolver(
    bladeSpecCreateSchema,
    (values: SpecFormValues) => specInput(values, system).input,
    (path) => specFieldForPath(path),
    (values) => specInput(values, system).fieldErrors,
  ) as Resolver<SpecFormValues, unknown, BladeSpecCreateParsed>;
}

/**
 * A blade spec of the catalogue: band size in the viewer's units, pitch as the trade writes it (3 TPI constant,
 * or 4/6 TPI variable: coarse end, then fine end), tooth form and set, material, and the cost of one blade.
 * Administrators keep the fleet-wide catalogue; a site admin keeps their site's own specs.
 */
export function SpecForm({
  system,
  spec,
  ownerChoices,
  defaultOwner,
  defaultCurrency,
  submitLabel,
  onSubmit,
  cancel,
}: {
  system: UnitSystem;
  spec?: BladeSpec;
  /** Who the spec may belong to: '' is the fleet-wide catalogue, else a site id. */
  ownerChoices: { value: string; label: string }[];
  defaultOwner: string;
  defaultCurrency: string;
  submitLabel: string;
  onSubmit: (input: BladeSpecCreateParsed) => Promise<unknown>;
  cancel: ReactNode;
}) {
  const resolver = useMemo(() => resolverFor(system), [system]);
  const defaultValues = useMemo(
    () => (spec ? specValuesFrom(spec, system) : emptySpecValues(defaultOwner, defaultCurrency)),
    [spec, system, defaultOwner, defaultCurrency],
  );
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<SpecFormValues, unknown, BladeSpecCreateParsed>({ resolver, defaultValues });
  const pitchKind = useWatch({ control, name: 'pitchKind' });
  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(error, setError, (path) => specFieldForPath(path), 'The spec was not saved.');
    }
  });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;
  const sizeField = (field: 'width' | 'thickness' | 'length', label: string, kind: 'length' | 'smallLength') => (
    <Field label={label} unit={unitOf(kind, system)} error={errors[field]?.message}>
      {(props) => (
        <input
          {...props}
          {...register(field)}
          inputMode="decimal"
          autoComplete="off"
          className={`${inputClass} tabular`}
        />
      )}
    </Field>
  );
  const tpiField = (field: 'tpi' | 'coarseTpi' | 'fineTpi', label: string, hint?: string) => (
    <Field label={label} unit="TPI" hint={hint} error={errors[field]?.message}>
      {(props) => (
        <input
          {...props}
          {...register(field)}
          inputMode="decimal"
          autoComplete="off"
          className={`${inputClass} tabular`}
        />
      )}
    </Field>
  );

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The spec was not saved">{rootMessage}</Notice> : null}
      {spec ? null : ownerChoices.length > 1 ? (
        <Field label="Offered to" error={errors.owner?.message}>
          {(props) => (
            <select {...props} {...register('owner')} className={inputClass}>
              {ownerChoices.map((choice) => (
                <option key={choice.value} value={choice.value}>
                  {choice.label}
                </option>
              ))}
            </select>
          )}
        </Field>
      ) : (
        <p className="text-sm text-ink-muted">Offered to: {ownerChoices[0]?.label}</p>
      )}
      <Field label="Name" hint="As the label on the band reads, so people find it." error={errors.name?.message}>
        {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
      </Field>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Band</legend>
        {sizeField('width', 'Width', 'length')}
        {sizeField('thickness', 'Thickness', 'smallLength')}
        {sizeField('length', 'Length', 'length')}
      </fieldset>
      <fieldset className="space-y-3">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Teeth</legend>
        <ChoiceGroup legend="Pitch" error={errors.pitchKind?.message}>
          <div className="grid grid-cols-2 gap-2">
            <ChoiceTile
              type="radio"
              value="variable"
              label="Variable"
              hint="Written coarse/fine, e.g. 4/6 TPI"
              {...register('pitchKind')}
            />
            <ChoiceTile
              type="radio"
              value="constant"
              label="Constant"
              hint="One pitch, e.g. 3 TPI"
              {...register('pitchKind')}
            />
          </div>
        </ChoiceGroup>
        <div className="grid gap-4 sm:grid-cols-2">
          {pitchKind === 'constant' ? (
            tpiField('tpi', 'Pitch')
          ) : (
            <>
              {tpiField('coarseTpi', 'Coarse end', 'The smaller number: 4 of 4/6.')}
              {tpiField('fineTpi', 'Fine end', 'The larger number: 6 of 4/6.')}
            </>
          )}
          <Field label="Tooth form" error={errors.toothForm?.message}>
            {(props) => (
              <select {...props} {...register('toothForm')} className={inputClass}>
                {TOOTH_FORMS.map((form) => (
                  <option key={form} value={form}>
                    {TOOTH_FORM_LABELS[form]}
                  </option>
                ))}
              </select>
            )}
          </Field>
          <Field label="Tooth set" error={errors.toothSet?.message}>
            {(props) => (
              <select {...props} {...register('toothSet')} className={inputClass}>
                {TOOTH_SETS.map((set) => (
                  <option key={set} value={set}>
                    {TOOTH_SET_LABELS[set]}
                  </option>
                ))}
              </select>
            )}
          </Field>
          <Field label="Blade material" error={errors.material?.message}>
            {(props) => (
              <select {...props} {...register('material')} className={inputClass}>
                <option value="">Choose…</option>
                {BLADE_MATERIALS.map((material) => (
                  <option key={material} value={material}>
                    {BLADE_MATERIAL_LABELS[material]}
                  </option>
                ))}
              </select>
            )}
          </Field>
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Cost of one blade" error={errors.unitCost?.message}>
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
        <Field label="Currency" hint="Three letters, e.g. USD." error={errors.currency?.message}>
          {(props) => (
            <input
              {...props}
              {...register('currency')}
              autoComplete="off"
              maxLength={3}
              className={`${inputClass} uppercase`}
            />
          )}
        </Field>
        <Field label="Supplier" hint="Optional." error={errors.supplier?.message}>
          {(props) => <input {...props} {...register('supplier')} autoComplete="off" className={inputClass} />}
        </Field>
      </div>
      {spec ? (
        <label className="flex min-h-11 cursor-pointer items-center gap-3 text-sm text-ink">
          <input type="checkbox" {...register('archived')} className="size-5 accent-accent" />
          Archived: no longer offered for new blades (its records keep it)
        </label>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : submitLabel}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
