import { useEffect, useMemo, type ReactNode } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { UNIT_SYSTEMS, siteCreateSchema, type SiteCreate, type UnitSystem } from '@kerfline/domain/sites/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { UNIT_SYSTEM_LABELS } from './site-tiles';
import {
  COMMON_CURRENCIES,
  OTHER_CURRENCY,
  currencyLabel,
  timeNowIn,
  timeZoneGroups,
  type ZoneGroup,
} from './site-form-options';

/** What the site form holds: text as typed, and '' for a choice not made yet. */
export type SiteFormValues = {
  name: string;
  code: string;
  city: string;
  regionId: string;
  timeZone: string;
  /** One of the common codes, OTHER_CURRENCY (then `otherCurrency` holds the code), or ''. */
  currency: string;
  otherCurrency: string;
  unitSystem: UnitSystem | '';
};

type SiteFormField = keyof SiteFormValues;

/** A choice left blank gets a plain request rather than the schema's "is required". */
const BLANK_CHOICES: Partial<Record<SiteFormField, string>> = {
  regionId: 'Choose the region the site belongs to',
  timeZone: 'Choose the time zone the site works in',
  currency: 'Choose the currency the site keeps its costs in',
  unitSystem: 'Choose metric or imperial',
};

const FIELDS = new Set<string>(['name', 'code', 'city', 'regionId', 'timeZone', 'currency', 'unitSystem']);

/** The form field an error path of the schema (or of the server's answer) belongs to. */
function fieldForPath(path: string, values: Pick<SiteFormValues, 'currency'>): SiteFormField | undefined {
  if (path === 'currency' && values.currency === OTHER_CURRENCY) return 'otherCurrency';
  return FIELDS.has(path) ? (path as SiteFormField) : undefined;
}

/** Form values to the create input: the code in capitals, a blank city as none, the chosen currency. */
export function siteInputFromForm(values: SiteFormValues): z.input<typeof siteCreateSchema> {
  return {
    name: values.name,
    code: values.code.trim().toUpperCase(),
    city: values.city.trim() === '' ? null : values.city,
    regionId: values.regionId,
    timeZone: values.timeZone,
    currency: values.currency === OTHER_CURRENCY ? values.otherCurrency : values.currency,
    unitSystem: values.unitSystem as UnitSystem,
  };
}

/** zodResolver(siteCreateSchema) on the converted values, with the form's own words for blank choices. */
function siteFormChecks(values: SiteFormValues): Partial<Record<SiteFormField, string>> {
  const found: Partial<Record<SiteFormField, string>> = {};
  for (const [field, message] of Object.entries(BLANK_CHOICES) as [SiteFormField, string][]) {
    if (values[field] === '') found[field] = message;
  }
  if (values.currency === OTHER_CURRENCY && values.otherCurrency.trim() === '')
    found.otherCurrency = 'Type the three-letter code, such as SGD';
  return found;
}

/** The resolver holds no state, so one serves every form. */
const resolver = domainSchemaResolver(siteCreateSchema, siteInputFromForm, fieldForPath, siteFormChecks);

export type RegionOption = { id: string; name: string };

type SiteFormProps = {
  regions: RegionOption[];
  /** A region to choose as soon as it is among `regions` (one just added beside the form, say). */
  chooseRegionId?: string | undefined;
  submitLabel: string;
  /**
   * Saves the site. A rejected `ApiError` is shown on the form: 400 details and a 409's clashing field
   * (a code already taken) beside their fields, the server's message above the form.
   */
  onSubmit: (input: SiteCreate) => Promise<unknown>;
  cancel?: ReactNode;
  /** Shown under the region list, e.g. where to add a region that is missing. */
  regionHint?: string;
  /** The site as it is, when the form changes one. */
  initial?: Partial<SiteFormValues>;
  /** The code names the site everywhere and does not change once it exists. */
  codeLocked?: boolean;
  /** Moving a site to another region is for administrators; others see the region but cannot change it. */
  regionLocked?: boolean;
};

/** Form values for an existing site: a currency outside the common list goes in the "another" field. */
export function siteFormValuesOf(site: {
  name: string;
  code: string;
  city: string | null;
  regionId: string;
  timeZone: string;
  currency: string;
  unitSystem: UnitSystem;
}): SiteFormValues {
  const common = (COMMON_CURRENCIES as readonly string[]).includes(site.currency);
  return {
    name: site.name,
    code: site.code,
    city: site.city ?? '',
    regionId: site.regionId,
    timeZone: site.timeZone,
    currency: common ? site.currency : OTHER_CURRENCY,
    otherCurrency: common ? '' : site.currency,
    unitSystem: site.unitSystem,
  };
}

export function SiteForm({
  regions,
  chooseRegionId,
  submitLabel,
  onSubmit,
  cancel,
  regionHint,
  initial,
  codeLocked = false,
  regionLocked = false,
}: SiteFormProps) {
  const zoneGroups = useMemo<ZoneGroup[] | undefined>(() => timeZoneGroups(), []);
  const {
    register,
    handleSubmit,
    setError,
    control,
    setValue,
    getValues,
    formState: { errors, isSubmitting, isSubmitted },
  } = useForm<SiteFormValues, unknown, SiteCreate>({
    resolver,
    defaultValues: {
      name: '',
      code: '',
      city: '',
      // With one region there is nothing to choose.
      regionId: regions.length === 1 ? (regions[0]?.id ?? '') : '',
      timeZone: '',
      currency: '',
      otherCurrency: '',
      unitSystem: '',
      ...initial,
    },
  });

  useEffect(() => {
    if (chooseRegionId && regions.some((region) => region.id === chooseRegionId))
      setValue('regionId', chooseRegionId, { shouldDirty: true, shouldValidate: isSubmitted });
  }, [chooseRegionId, regions, setValue, isSubmitted]);

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(
        error,
        setError,
        (path) => fieldForPath(path, getValues()),
        'The site could not be saved. Try again.',
      );
    }
  });

  const timeZone = useWatch({ control, name: 'timeZone' });
  const currency = useWatch({ control, name: 'currency' });
  const timeThere = timeZone ? timeNowIn(timeZone) : undefined;
  const zoneHint = timeThere ? `Dates at this site are shown in this zone. Now there: ${timeThere}.` : undefined;
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The site was not saved">{rootMessage}</Notice> : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Site</legend>
        <Field label="Name" hint="As people at the plant call it." error={errors.name?.message}>
          {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field
          label="Code"
          hint={
            codeLocked
              ? 'The code names the site everywhere and stays as it is.'
              : 'Short and unique: capital letters, digits and dashes, such as RBT or HAM-2.'
          }
          error={errors.code?.message}
        >
          {(props) => (
            <input
              {...props}
              {...register('code')}
              readOnly={codeLocked}
              autoComplete="off"
              autoCapitalize="characters"
              spellCheck={false}
              maxLength={12}
              // Shown in capitals as typed; sent in capitals.
              className={`${inputClass} uppercase read-only:border-rule read-only:bg-paper`}
            />
          )}
        </Field>
        <Field label="City" hint="Optional." error={errors.city?.message}>
          {(props) => <input {...props} {...register('city')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Region" hint={regionHint} error={errors.regionId?.message}>
          {(props) =>
            regionLocked ? (
              <input
                {...props}
                readOnly
                value={regions.find((region) => region.id === initial?.regionId)?.name ?? ''}
                className={`${inputClass} border-rule bg-paper`}
              />
            ) : (
              <select {...props} {...register('regionId')} className={inputClass}>
                <option value="">{regions.length === 0 ? 'No regions yet' : 'Choose…'}</option>
                {regions.map((region) => (
                  <option key={region.id} value={region.id}>
                    {region.name}
                  </option>
                ))}
              </select>
            )
          }
        </Field>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">How its figures read</legend>
        <Field
          label="Time zone"
          hint={zoneHint ?? (zoneGroups ? undefined : 'An IANA zone name, such as America/Chicago or Europe/Berlin.')}
          error={errors.timeZone?.message}
        >
          {(props) =>
            zoneGroups ? (
              <select {...props} {...register('timeZone')} className={inputClass}>
                <option value="">Choose…</option>
                {zoneGroups.map((group) => (
                  <optgroup key={group.area} label={group.area}>
                    {group.zones.map((zone) => (
                      <option key={zone.value} value={zone.value}>
                        {zone.label}
                      </option>
                    ))}
                  </optgroup>
                ))}
              </select>
            ) : (
              <input
                {...props}
                {...register('timeZone')}
                autoComplete="off"
                spellCheck={false}
                className={inputClass}
              />
            )
          }
        </Field>
        <div className="grid gap-4">
          <Field label="Currency" hint="Costs at this site are kept in it." error={errors.currency?.message}>
            {(props) => (
              <select {...props} {...register('currency')} className={inputClass}>
                <option value="">Choose…</option>
                {COMMON_CURRENCIES.map((code) => (
                  <option key={code} value={code}>
                    {currencyLabel(code)}
                  </option>
                ))}
                <option value={OTHER_CURRENCY}>Another currency…</option>
              </select>
            )}
          </Field>
          {currency === OTHER_CURRENCY ? (
            <Field label="Currency code" hint="Three letters, as in ISO 4217." error={errors.otherCurrency?.message}>
              {(props) => (
                <input
                  {...props}
                  {...register('otherCurrency')}
                  autoComplete="off"
                  autoCapitalize="characters"
                  spellCheck={false}
                  maxLength={3}
                  className={`${inputClass} uppercase`}
                />
              )}
            </Field>
          ) : null}
        </div>
        <ChoiceGroup
          legend="Units"
          hint="Saw measurements at this site are typed and shown in these units."
          error={errors.unitSystem?.message}
          className="sm:col-span-2"
        >
          <div className="grid gap-2 sm:grid-cols-2">
            {UNIT_SYSTEMS.map((system) => (
              <ChoiceTile
                key={system}
                type="radio"
                value={system}
                label={UNIT_SYSTEM_LABELS[system]}
                {...register('unitSystem')}
              />
            ))}
          </div>
        </ChoiceGroup>
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
