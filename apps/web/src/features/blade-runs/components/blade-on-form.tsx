import { useMemo, useState, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { bladeRunInstallSchema, type BladeRun, type BladeRunInstallParsed } from '@kerfline/domain/blade-runs/schema';
import { pitchLabel, type BladeSpec } from '@kerfline/domain/blade-specs/schema';
import { MATERIAL_GROUPS, MATERIAL_GROUP_LABELS, type MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { StockLine } from '@kerfline/domain/blade-stock/schema';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { formatNumber } from '../../../lib/format';
import { unitOf } from '../../../lib/form-numbers';
import { stressToDisplay } from '@kerfline/domain/units/display';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { SafetyCaution } from '../../../lib/ui/safety-caution';
import {
  bladeOnDefaults,
  bladeOnFieldForPath,
  bladeOnInput,
  specFitsSaw,
  type BladeOnFormValues,
} from './blade-on-values';

/** The schema's tension limit is in MPa; an imperial site reads it in psi too. */
function inSiteUnits(message: string, system: UnitSystem): string {
  if (system !== 'imperial') return message;
  return message.replace(/(\d+(?:\.\d+)?) MPa/, (whole, mpa: string) => {
    const psi = stressToDisplay(Number(mpa) * 1e6, 'imperial').text;
    return `${psi} (${whole})`;
  });
}

function resolverFor(sawId: string, system: UnitSystem, timeZone: string, openedAt: Date) {
  return domainSchemaResolver(
    bladeRunInstallSchema,
    (values: BladeOnFormValues) => bladeOnInput(values, sawId, system, timeZone, openedAt).input,
    (path) => bladeOnFieldForPath(path),
    (values) => bladeOnInput(values, sawId, system, timeZone, openedAt).fieldErrors,
    (message) => inSiteUnits(message, system),
  ) as Resolver<BladeOnFormValues, unknown, BladeRunInstallParsed>;
}

/** "3 in stock", "none in stock" or nothing where the stock is not known. */
function stockWords(line: StockLine | undefined): string {
  if (!line) return 'none in stock';
  return line.onHand === 1 ? '1 in stock' : `${formatNumber(line.onHand)} in stock`;
}

type BladeOnFormProps = {
  saw: Saw;
  system: UnitSystem;
  timeZone: string;
  /** Specs the site may put on saws (fleet-wide and its own), not archived. */
  specs: BladeSpec[];
  /** The site's stock per spec, when the user may read it. */
  stock: StockLine[] | undefined;
  /** The saw's latest runs, for its usual spec and the tension last set. */
  recentRuns: BladeRun[];
  /** The break-in plan for the chosen spec and material (the route fetches it). */
  renderBreakIn: (bladeSpecId: string, materialGroup: MaterialGroup | null) => ReactNode;
  onSubmit: (input: BladeRunInstallParsed) => Promise<unknown>;
  cancel: ReactNode;
};

/**
 * Putting a blade on a saw, fast on a phone: the saw's usual spec already chosen (with what is in stock),
 * now as the time, the tension last set; the break-in plan for that saw, band and material under it; the
 * cautions for the job first.
 */
export function BladeOnForm({
  saw,
  system,
  timeZone,
  specs,
  stock,
  recentRuns,
  renderBreakIn,
  onSubmit,
  cancel,
}: BladeOnFormProps) {
  const [openedAt] = useState(() => new Date());
  const resolver = useMemo(() => resolverFor(saw.id, system, timeZone, openedAt), [saw.id, system, timeZone, openedAt]);
  const defaultValues = useMemo(
    () => bladeOnDefaults(saw, recentRuns, specs, system, timeZone, openedAt),
    [saw, recentRuns, specs, system, timeZone, openedAt],
  );
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<BladeOnFormValues, unknown, BladeRunInstallParsed>({ resolver, defaultValues });
  const [bladeSpecId, materialGroup] = useWatch({ control, name: ['bladeSpecId', 'materialGroup'] });

  const stockBySpec = new Map((stock ?? []).map((line) => [line.bladeSpec.id, line]));
  const fitting = specs.filter((spec) => specFitsSaw(spec, saw));
  const others = specs.filter((spec) => !specFitsSaw(spec, saw));
  const option = (spec: BladeSpec) => (
    <option key={spec.id} value={spec.id}>
      {spec.name}
      {stock ? ` — ${stockWords(stockBySpec.get(spec.id))}` : ''}
    </option>
  );
  const chosen = specs.find((spec) => spec.id === bladeSpecId);
  const chosenStock = chosen ? stockBySpec.get(chosen.id) : undefined;

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(error, setError, (path) => bladeOnFieldForPath(path), 'The blade was not recorded. Try again.');
    }
  });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;
  const stressUnit = unitOf('stress', system);

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      <SafetyCaution compact />
      {rootMessage ? <Notice title="The blade was not recorded">{rootMessage}</Notice> : null}

      <Field
        label="Blade spec"
        hint={
          chosen
            ? `${pitchLabel(chosen.pitch)}${stock ? ` · ${stockWords(chosenStock)}` : ''}${
                specFitsSaw(chosen, saw) ? '' : ' · not this saw’s band size'
              }`
            : 'The spec on the band’s label.'
        }
        error={errors.bladeSpecId?.message}
      >
        {(props) => (
          <select {...props} {...register('bladeSpecId')} className={inputClass}>
            <option value="">Choose…</option>
            {fitting.length > 0 ? <optgroup label="Fits this saw’s band">{fitting.map(option)}</optgroup> : null}
            {others.length > 0 ? <optgroup label="Other sizes">{others.map(option)}</optgroup> : null}
          </select>
        )}
      </Field>

      <Field
        label="Material it will cut first"
        hint="For the band speed in the break-in plan."
        error={errors.materialGroup?.message}
      >
        {(props) => (
          <select {...props} {...register('materialGroup')} className={inputClass}>
            <option value="">Not known yet</option>
            {MATERIAL_GROUPS.map((group) => (
              <option key={group} value={group}>
                {MATERIAL_GROUP_LABELS[group].charAt(0).toUpperCase() + MATERIAL_GROUP_LABELS[group].slice(1)}
              </option>
            ))}
          </select>
        )}
      </Field>

      {bladeSpecId ? renderBreakIn(bladeSpecId, materialGroup === '' ? null : materialGroup) : null}

      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Put on at" hint={`Your site’s clock (${timeZone}).`} error={errors.installedAt?.message}>
          {(props) => (
            <input {...props} {...register('installedAt')} type="datetime-local" className={`${inputClass} tabular`} />
          )}
        </Field>
        <Field
          label="Tension set"
          unit={stressUnit}
          hint={
            defaultValues.tension ? 'The tension set on the last blade; change it if you set another.' : 'Optional.'
          }
          error={errors.tension?.message}
        >
          {(props) => (
            <input
              {...props}
              {...register('tension')}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              className={`${inputClass} tabular`}
            />
          )}
        </Field>
      </div>

      <ChoiceGroup legend="Break-in" error={errors.breakInFollowed?.message}>
        <div className="grid gap-2 sm:grid-cols-3">
          <ChoiceTile type="radio" value="yes" label="Followed the plan" {...register('breakInFollowed')} />
          <ChoiceTile type="radio" value="no" label="Skipped it" {...register('breakInFollowed')} />
          <ChoiceTile
            type="radio"
            value="later"
            label="Not done yet"
            hint="Record it from the saw page."
            {...register('breakInFollowed')}
          />
        </div>
      </ChoiceGroup>

      <Field label="Notes" hint="Optional." error={errors.notes?.message}>
        {(props) => <textarea {...props} {...register('notes')} rows={2} className={`${inputClass} py-2`} />}
      </Field>

      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : 'Put blade on'}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
