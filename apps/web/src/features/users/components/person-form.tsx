import { useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { ROLES, ROLE_LABELS, userCreateSchema, type Role } from '@kerfline/domain/users/schema';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import type { UserCreateParsed } from '../api/mutations';

/** What each role may do, in a line: enough to choose the right one. */
const ROLE_HINTS: Record<Role, string> = {
  admin: 'Everything at every site, including people and sites.',
  manager: 'Reads the figures of the sites they are given.',
  regional_lead: 'Reads every site of one region.',
  site_admin: 'Keeps one site’s saws and sees its people.',
  technician: 'Works on the saws of one site.',
};

/** Roles tied to one home site. */
const AT_ONE_SITE: readonly Role[] = ['site_admin', 'technician'];

export type PersonFormValues = {
  name: string;
  email: string;
  role: Role | '';
  password: string;
  /** Home site, for site admins and technicians. */
  siteId: string;
  /** Region, for regional leads. */
  regionId: string;
  /** For managers: every site (now and later), or the sites ticked in `managedSiteIds`. */
  managerScope: 'all' | 'chosen';
  managedSiteIds: string[];
};

type PersonFormField = keyof PersonFormValues;

/** The form field an error path of the schema (or of the server's answer) belongs to. */
function fieldForPath(path: string): PersonFormField | undefined {
  const head = path.split('.')[0] ?? '';
  if (head === 'allSites') return 'managedSiteIds';
  return ['name', 'email', 'role', 'password', 'siteId', 'regionId', 'managedSiteIds'].includes(head)
    ? (head as PersonFormField)
    : undefined;
}

/**
 * Form values to the create input. Only the assignment the chosen role has is sent; what was picked for
 * another role before the role changed stays in the form but is not sent.
 */
export function personInputFromForm(values: PersonFormValues): z.input<typeof userCreateSchema> {
  const role = values.role;
  const manager = role === 'manager';
  return {
    name: values.name,
    email: values.email,
    role: role as Role,
    password: values.password,
    siteId: AT_ONE_SITE.includes(role as Role) ? values.siteId || null : null,
    regionId: role === 'regional_lead' ? values.regionId || null : null,
    managedSiteIds: manager && values.managerScope === 'chosen' ? values.managedSiteIds : [],
    allSites: manager && values.managerScope === 'all',
  };
}

/**
 * zodResolver(userCreateSchema) on the converted values: the very schema the server parses. A missing
 * assignment is asked for in the form's own words, alongside whatever else the schema found.
 */
function personFormChecks(values: PersonFormValues): Partial<Record<PersonFormField, string>> {
  const found: Partial<Record<PersonFormField, string>> = {};
  const role = values.role;
  if (role === '') found.role = 'Choose a role';
  if (AT_ONE_SITE.includes(role as Role) && !values.siteId) found.siteId = 'Choose the site they work at';
  if (role === 'regional_lead' && !values.regionId) found.regionId = 'Choose the region they look after';
  if (role === 'manager' && values.managerScope === 'chosen' && values.managedSiteIds.length === 0)
    found.managedSiteIds = 'Tick at least one site, or choose every site';
  return found;
}

/** The resolver holds no state, so one serves every form. */
const resolver = domainSchemaResolver(userCreateSchema, personInputFromForm, fieldForPath, personFormChecks);

export type PlaceOption = { id: string; name: string };

type PersonFormProps = {
  /** Sites a person can be assigned to, labelled as they should read (name and code, say). */
  sites: PlaceOption[];
  regions: PlaceOption[];
  submitLabel: string;
  /**
   * Saves the person. A rejected `ApiError` is shown on the form: 400 details and a 409's clashing field
   * (an e-mail already in use) beside their fields, the server's message above the form.
   */
  onSubmit: (input: UserCreateParsed) => Promise<unknown>;
  cancel?: ReactNode;
};

/** A new person: who they are, their role, where that role applies, and a first password. */
export function PersonForm({ sites, regions, submitLabel, onSubmit, cancel }: PersonFormProps) {
  const [passwordShown, setPasswordShown] = useState(false);
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<PersonFormValues, unknown, UserCreateParsed>({
    resolver,
    defaultValues: {
      name: '',
      email: '',
      role: '',
      password: '',
      siteId: '',
      regionId: '',
      managerScope: 'chosen',
      managedSiteIds: [],
    },
  });

  const submit = handleSubmit(async (input) => {
    try {
      await onSubmit(input);
    } catch (error) {
      showServerError(error, setError, fieldForPath, 'The person could not be saved. Try again.');
    }
  });

  const role = useWatch({ control, name: 'role' });
  const managerScope = useWatch({ control, name: 'managerScope' });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;

  let assignment: ReactNode = null;
  if (role === 'site_admin' || role === 'technician') {
    assignment = (
      <Field label="Home site" error={errors.siteId?.message}>
        {(props) => (
          <select {...props} {...register('siteId')} className={inputClass}>
            <option value="">Choose…</option>
            {sites.map((site) => (
              <option key={site.id} value={site.id}>
                {site.name}
              </option>
            ))}
          </select>
        )}
      </Field>
    );
  } else if (role === 'regional_lead') {
    assignment = (
      <Field label="Region" error={errors.regionId?.message}>
        {(props) => (
          <select {...props} {...register('regionId')} className={inputClass}>
            <option value="">{regions.length === 0 ? 'No regions yet' : 'Choose…'}</option>
            {regions.map((region) => (
              <option key={region.id} value={region.id}>
                {region.name}
              </option>
            ))}
          </select>
        )}
      </Field>
    );
  } else if (role === 'manager') {
    assignment = (
      <div className="space-y-4">
        <ChoiceGroup legend="Sites they see">
          <div className="grid gap-2 sm:grid-cols-2">
            <ChoiceTile
              type="radio"
              value="all"
              label="Every site"
              hint="Sites added later too."
              {...register('managerScope')}
            />
            <ChoiceTile
              type="radio"
              value="chosen"
              label="Chosen sites"
              hint="Only the sites ticked below."
              {...register('managerScope')}
            />
          </div>
        </ChoiceGroup>
        {managerScope === 'chosen' ? (
          <Controller
            control={control}
            name="managedSiteIds"
            render={({ field }) => (
              <ChoiceGroup legend="Their sites" error={errors.managedSiteIds?.message}>
                <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
                  {sites.map((site) => (
                    <ChoiceTile
                      key={site.id}
                      type="checkbox"
                      name={field.name}
                      value={site.id}
                      label={site.name}
                      checked={field.value.includes(site.id)}
                      onBlur={field.onBlur}
                      onChange={(event) =>
                        field.onChange(
                          event.target.checked ? [...field.value, site.id] : field.value.filter((id) => id !== site.id),
                        )
                      }
                    />
                  ))}
                </div>
              </ChoiceGroup>
            )}
          />
        ) : null}
      </div>
    );
  }

  return (
    // POST, so that even a submit the script never sees cannot put the password in the address.
    <form method="post" onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The person was not added">{rootMessage}</Notice> : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Person</legend>
        <Field label="Name" error={errors.name?.message}>
          {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="E-mail" hint="They sign in with it." error={errors.email?.message}>
          {(props) => (
            <input
              {...props}
              {...register('email')}
              type="email"
              // Not the administrator's own address from the browser's memory.
              autoComplete="off"
              spellCheck={false}
              className={inputClass}
            />
          )}
        </Field>
      </fieldset>

      <ChoiceGroup legend="Role" error={errors.role?.message}>
        <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
          {ROLES.map((value) => (
            <ChoiceTile
              key={value}
              type="radio"
              value={value}
              label={ROLE_LABELS[value]}
              hint={ROLE_HINTS[value]}
              {...register('role')}
            />
          ))}
        </div>
      </ChoiceGroup>

      {assignment ? (
        <fieldset className="space-y-2">
          <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Where they work</legend>
          {assignment}
        </fieldset>
      ) : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">First password</legend>
        <Field
          label="Password"
          hint="At least 12 characters. Kerfline sends no invitation yet: give this password to the person yourself, and ask them to change it as soon as they can."
          error={errors.password?.message}
          className="sm:col-span-2"
        >
          {(props) => (
            <div className="flex gap-2">
              <input
                {...props}
                {...register('password')}
                type={passwordShown ? 'text' : 'password'}
                autoComplete="new-password"
                autoCapitalize="off"
                spellCheck={false}
                className={`${inputClass} sm:max-w-md`}
              />
              <Button
                aria-controls={props.id}
                aria-label={passwordShown ? 'Hide password' : 'Show password'}
                onClick={() => setPasswordShown((shown) => !shown)}
              >
                {passwordShown ? 'Hide' : 'Show'}
              </Button>
            </div>
          )}
        </Field>
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
