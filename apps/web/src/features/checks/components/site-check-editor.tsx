import { useMemo } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { parseDisplayNumber } from '@kerfline/domain/units/display';
import {
  CHECK_QUANTITY_LABELS,
  CHECK_SCHEDULE_LABELS,
  CHECK_TARGET_RULES,
  CHECK_TARGET_RULE_LABELS,
  RULE_QUANTITY,
  siteCheckValuesSchema,
  type CheckQuantity,
  type CheckTargetRule,
  type SiteCheck,
  type SiteCheckValues,
} from '@kerfline/domain/site-checks/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { readingToStored, readingUnit, storedToEntry } from './check-words';

export type CheckEditorValues = {
  name: string;
  measures: string;
  targetRule: CheckTargetRule;
  quantity: Exclude<CheckQuantity, 'condition'>;
  fixedTarget: string;
  fixedMin: string;
  fixedMax: string;
  schedule: 'blade_change' | 'periodic';
  intervalDays: string;
  graceHours: string;
};

type NumberField = 'fixedTarget' | 'fixedMin' | 'fixedMax' | 'intervalDays' | 'graceHours';

export function editorValuesOf(check: SiteCheck | null, system: UnitSystem): CheckEditorValues {
  const quantity = check && check.quantity !== 'condition' ? check.quantity : 'length';
  const entry = (value: number | null) => (value === null ? '' : storedToEntry(quantity, value, system));
  return {
    name: check?.name ?? '',
    measures: check?.measures ?? '',
    targetRule: check?.targetRule ?? 'fixed',
    quantity,
    fixedTarget: entry(check?.fixedTarget ?? null),
    fixedMin: entry(check?.fixedMin ?? null),
    fixedMax: entry(check?.fixedMax ?? null),
    schedule: check?.schedule ?? 'periodic',
    intervalDays: check ? (check.intervalDays === null ? '' : String(check.intervalDays)) : '30',
    graceHours: String(check?.graceHours ?? 24),
  };
}

/**
 * The editor's values as a check's stored fields: figures typed in the site's units turned into mm, N or MPa; a
 * rule check keeps no fixed figures (its limits are the site's settings) and a blade-change check no interval.
 */
export function checkValuesFromEditor(
  values: CheckEditorValues,
  system: UnitSystem,
  position: number,
): { input: Record<string, unknown>; fieldErrors: Partial<Record<keyof CheckEditorValues, string>> } {
  const fieldErrors: Partial<Record<keyof CheckEditorValues, string>> = {};
  const rule = values.targetRule;
  const fixed = rule === 'fixed';
  const quantity: CheckQuantity = rule === 'fixed' ? values.quantity : RULE_QUANTITY[rule];
  const number = (field: NumberField, convert: (n: number) => number): number | null => {
    const text = values[field].trim();
    if (text === '') return null;
    const parsed = parseDisplayNumber(text);
    if (!parsed.ok) {
      fieldErrors[field] = parsed.message;
      return null;
    }
    return convert(parsed.value);
  };
  const figure = (field: NumberField) => (fixed ? number(field, (n) => readingToStored(quantity, n, system)) : null);
  const grace = number('graceHours', (n) => n);
  if (grace === null && !fieldErrors.graceHours) fieldErrors.graceHours = 'Say how many hours of grace';
  return {
    input: {
      name: values.name,
      measures: values.measures,
      targetRule: values.targetRule,
      quantity,
      fixedTarget: figure('fixedTarget'),
      fixedMin: figure('fixedMin'),
      fixedMax: figure('fixedMax'),
      schedule: values.schedule,
      intervalDays: values.schedule === 'periodic' ? number('intervalDays', (n) => n) : null,
      graceHours: grace ?? Number.NaN,
      position,
    },
    fieldErrors,
  };
}

const FIELDS = new Set<string>([
  'name',
  'measures',
  'targetRule',
  'quantity',
  'fixedTarget',
  'fixedMin',
  'fixedMax',
  'schedule',
  'intervalDays',
  'graceHours',
]);

function editorResolver(system: UnitSystem, position: number): Resolver<CheckEditorValues, unknown, SiteCheckValues> {
  return domainSchemaResolver(
    siteCheckValuesSchema,
    (values: CheckEditorValues) => checkValuesFromEditor(values, system, position).input as never,
    (path) => (FIELDS.has(path) ? (path as keyof CheckEditorValues) : undefined),
    (values) => checkValuesFromEditor(values, system, position).fieldErrors,
  );
}

/**
 * Adding or changing a check on a site's list. A rule check takes its limits from the site's settings (the form
 * says so and offers no figures); a fixed check takes a target and limits typed in the site's units.
 */
export function SiteCheckEditor({
  check,
  system,
  position,
  settingsHref,
  onSave,
  onCancel,
}: {
  check: SiteCheck | null;
  system: UnitSystem;
  position: number;
  settingsHref: string;
  onSave: (values: SiteCheckValues) => Promise<unknown>;
  onCancel: () => void;
}) {
  const resolver = useMemo(() => editorResolver(system, position), [system, position]);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<CheckEditorValues, unknown, SiteCheckValues>({ resolver, defaultValues: editorValuesOf(check, system) });
  const rule = useWatch({ control, name: 'targetRule' });
  const quantity = useWatch({ control, name: 'quantity' });
  const schedule = useWatch({ control, name: 'schedule' });
  const unit = readingUnit(quantity, system);

  const submit = handleSubmit(async (values) => {
    try {
      await onSave(values);
    } catch (err) {
      showServerError(
        err,
        setError,
        (path) => (FIELDS.has(path) ? (path as keyof CheckEditorValues) : undefined),
        'The check was not saved. Try again.',
      );
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={check ? `Change ${check.name}` : 'New check'}>
      {errors.root?.server ? <Notice title="Not saved">{errors.root.server.message}</Notice> : null}
      {errors.root && !errors.root.server ? <Notice title="Check the form">{errors.root.message}</Notice> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Name" error={errors.name?.message}>
          {(props) => <input {...props} {...register('name')} className={inputClass} />}
        </Field>
        <Field label="What is measured (optional)" error={errors.measures?.message}>
          {(props) => <input {...props} {...register('measures')} className={inputClass} />}
        </Field>
        <Field label="Target" error={errors.targetRule?.message} className="sm:col-span-2">
          {(props) => (
            <select {...props} {...register('targetRule')} className={inputClass}>
              {CHECK_TARGET_RULES.map((r) => (
                <option key={r} value={r}>
                  {CHECK_TARGET_RULE_LABELS[r]}
                </option>
              ))}
            </select>
          )}
        </Field>
      </div>
      {rule === 'fixed' ? (
        <div className="grid gap-4 sm:grid-cols-4">
          <Field label="Reads" error={errors.quantity?.message}>
            {(props) => (
              <select {...props} {...register('quantity')} className={inputClass}>
                {(['length', 'force', 'stress'] as const).map((q) => (
                  <option key={q} value={q}>
                    {CHECK_QUANTITY_LABELS[q]}
                  </option>
                ))}
              </select>
            )}
          </Field>
          <Field label="Target value" unit={unit} error={errors.fixedTarget?.message}>
            {(props) => <input {...props} {...register('fixedTarget')} inputMode="decimal" className={inputClass} />}
          </Field>
          <Field label="Lowest passing" unit={unit} error={errors.fixedMin?.message}>
            {(props) => <input {...props} {...register('fixedMin')} inputMode="decimal" className={inputClass} />}
          </Field>
          <Field label="Highest passing" unit={unit} error={errors.fixedMax?.message}>
            {(props) => <input {...props} {...register('fixedMax')} inputMode="decimal" className={inputClass} />}
          </Field>
        </div>
      ) : (
        <p className="text-sm text-ink-muted">
          This target is worked out for each saw and blade; its limits are your site’s settings, kept in one place.{' '}
          <a href={settingsHref} className="font-semibold text-ink underline underline-offset-4">
            Change them in the site’s settings
          </a>
          .
        </p>
      )}
      <ChoiceGroup legend="When due" error={errors.schedule?.message}>
        <div className="grid gap-2 sm:grid-cols-2">
          {(['blade_change', 'periodic'] as const).map((s) => (
            <ChoiceTile key={s} type="radio" value={s} label={CHECK_SCHEDULE_LABELS[s]} {...register('schedule')} />
          ))}
        </div>
      </ChoiceGroup>
      <div className="grid gap-4 sm:grid-cols-2">
        {schedule === 'periodic' ? (
          <Field label="Every" unit="days" error={errors.intervalDays?.message}>
            {(props) => <input {...props} {...register('intervalDays')} inputMode="numeric" className={inputClass} />}
          </Field>
        ) : null}
        <Field
          label="Grace before it is overdue"
          unit="h"
          hint={schedule === 'blade_change' ? 'Hours after the blade goes on.' : 'Hours after the day it falls due.'}
          error={errors.graceHours?.message}
        >
          {(props) => <input {...props} {...register('graceHours')} inputMode="decimal" className={inputClass} />}
        </Field>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : check ? 'Save changes' : 'Add check'}
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}
