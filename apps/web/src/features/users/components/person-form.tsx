import { useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch, type FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import {
  ROLES,
  ROLE_LABELS,
  userCreateSchema,
  userUpdateSchema,
  type Role,
  type UserUpdate,
  PASSWORD_HINT,
} from '@kerfline/domain/users/schema';
import { invitationCreateSchema, type InvitationCreateParsed } from '@kerfline/domain/invitations/schema';
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
  site_admin: 'Keeps one site’s saws, and invites and manages its people.',
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
 * The role and where it applies, from the form. Only the assignment the chosen role has is sent; what was
 * picked for another role before the role changed stays in the form but is not sent.
 */
function assignmentFromForm(values: PersonFormValues) {
  const role = values.role;
  const manager = role === 'manager';
  return {
    role: role as Role,
    siteId: AT_ONE_SITE.includes(role as Role) ? values.siteId || null : null,
    regionId: role === 'regional_lead' ? values.regionId || null : null,
    managedSiteIds: manager && values.managerScope === 'chosen' ? values.managedSiteIds : [],
    allSites: manager && values.managerScope === 'all',
  };
}

/** Form values to the input of adding a person with a first password. */
export function personInputFromForm(values: PersonFormValues): z.input<typeof userCreateSchema> {
  return { name: values.name, email: values.email, password: values.password, ...assignmentFromForm(values) };
}

/** Form values to an invitation: the name is optional (the person may change it when they accept). */
export function invitationInputFromForm(values: PersonFormValues): z.input<typeof invitationCreateSchema> {
  return { email: values.email, name: values.name.trim() === '' ? null : values.name, ...assignmentFromForm(values) };
}

/** Form values to a change: the name and the whole assignment (the server checks the merged record). */
export function personUpdateFromForm(values: PersonFormValues): z.input<typeof userUpdateSchema> {
  return { name: values.name, ...assignmentFromForm(values) };
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

/** The resolvers hold no state, so one of each serves every form. */
const resolvers = {
  create: domainSchemaResolver(userCreateSchema, personInputFromForm, fieldForPath, personFormChecks),
  invite: domainSchemaResolver(invitationCreateSchema, invitationInputFromForm, fieldForPath, personFormChecks),
  edit: domainSchemaResolver(userUpdateSchema, personUpdateFromForm, fieldForPath, personFormChecks),
};

export type PersonFormMode = keyof typeof resolvers;

export type PlaceOption = { id: string; name: string };

type CommonProps = {
  /** Sites a person can be assigned to, labelled as they should read (name and code, say). */
  sites: PlaceOption[];
  regions: PlaceOption[];
  /** The roles the signed-in person may give (all of them for an administrator). */
  roles?: readonly Role[];
  submitLabel: string;
  cancel?: ReactNode;
  /** Values to start from (the person as they are, when editing). */
  initial?: Partial<PersonFormValues>;
};

/**
 * `onSubmit` saves the person. A rejected `ApiError` is shown on the form: 400 details and a 409's clashing
 * field (an e-mail already in use) beside their fields, the server's message above the form.
 */
type PersonFormProps =
  | (CommonProps & { mode?: 'create'; onSubmit: (input: UserCreateParsed) => Promise<unknown> })
  | (CommonProps & { mode: 'invite'; onSubmit: (input: InvitationCreateParsed) => Promise<unknown> })
  | (CommonProps & { mode: 'edit'; onSubmit: (input: UserUpdate) => Promise<unknown> });

/**
 * A person: who they are, their role and where that role applies; with a first password when an
 * administrator adds them directly (`create`), without when they are invited (`invite`) or changed (`edit`,
 * where the e-mail address, their sign-in, is shown but not changed).
 */
export function PersonForm(props: PersonFormProps) {
  const { sites, regions, submitLabel, cancel, initial, roles = ROLES } = props;
  const mode: PersonFormMode = props.mode ?? 'create';
  const [passwordShown, setPasswordShown] = useState(false);
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<PersonFormValues, unknown, FieldValues>({
    resolver: resolvers[mode] as never,
    defaultValues: {
      name: '',
      email: '',
      // With one role to give there is nothing to choose.
      role: roles.length === 1 ? (roles[0] ?? '') : '',
      password: '',
      siteId: sites.length === 1 && mode !== 'edit' ? (sites[0]?.id ?? '') : '',
      regionId: '',
      managerScope: 'chosen',
      managedSiteIds: [],
      ...initial,
    },
  });

  const submit = handleSubmit(async (input) => {
    try {
      // The resolver of this mode parsed `input` with this mode's schema.
      await (props.onSubmit as (value: FieldValues) => Promise<unknown>)(input);
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
      {rootMessage ? (
        <Notice
          title={
            mode === 'edit'
              ? 'The change was not saved'
              : mode === 'invite'
                ? 'The invitation was not sent'
                : 'The person was not added'
          }
        >
          {rootMessage}
        </Notice>
      ) : null}

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Person</legend>
        <Field
          label="Name"
          hint={mode === 'invite' ? 'Optional: they can change it when they accept.' : undefined}
          error={errors.name?.message}
        >
          {(props) => <input {...props} {...register('name')} autoComplete="off" className={inputClass} />}
        </Field>
        <Field
          label="E-mail"
          hint={
            mode === 'invite'
              ? 'The invitation goes here; they sign in with it.'
              : mode === 'edit'
                ? 'Their sign-in; it is not changed here.'
                : 'They sign in with it.'
          }
          error={errors.email?.message}
        >
          {(props) => (
            <input
              {...props}
              {...register('email')}
              type="email"
              readOnly={mode === 'edit'}
              // Not the administrator's own address from the browser's memory.
              autoComplete="off"
              spellCheck={false}
              className={`${inputClass} read-only:border-rule read-only:bg-paper`}
            />
          )}
        </Field>
      </fieldset>

      <ChoiceGroup legend="Role" error={errors.role?.message}>
        <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
          {roles.map((value) => (
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

      {mode === 'create' ? (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">First password</legend>
          <Field
            label="Password"
            hint={`${PASSWORD_HINT} Give this password to the person yourself, and ask them to change it as soon as they can.`}
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
      ) : null}

      <div className="flex flex-wrap gap-3 border-t border-rule pt-5">
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : submitLabel}
        </Button>
        {cancel}
      </div>
    </form>
  );
}
