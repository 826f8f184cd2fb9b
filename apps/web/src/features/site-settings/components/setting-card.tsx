import { useId, useMemo, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { settingValueSchema, type SiteSettingDefinition } from '@kerfline/domain/settings/registry';
import { settingFigureBasis, type SettingValues, type SiteSetting } from '@kerfline/domain/settings/schema';
import { basisSentence, STARTING_VALUE_WORDS } from '../../../lib/figure-basis';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { fieldDualText, fieldUnit, settingFormTexts, settingInputFromTexts } from './setting-values';

type Texts = Record<string, string>;

/** How the value in force reads in a short tag: whose figure it is. */
function originTag(setting: SiteSetting): string {
  if (setting.source === 'site') return 'Your site’s setting';
  return setting.shippedBasis.kind === 'published' ? 'Published' : 'Starting value';
}

/** The fields of a setting and their values, site's unit first. */
function Values({ def, value, system }: { def: SiteSettingDefinition; value: SettingValues; system: UnitSystem }) {
  return (
    <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
      {def.fields.map((field) => (
        <div key={field.name}>
          <dt className="text-sm text-ink-muted">{field.label}</dt>
          <dd className="tabular text-lg font-bold text-ink">{fieldDualText(field, value[field.name] ?? 0, system)}</dd>
        </div>
      ))}
    </dl>
  );
}

/**
 * One site setting: its value in force in the site's units, where that value comes from (a printed source,
 * Kerfline's starting value, or the site's own setting with who and when), and — for people who may change it —
 * an editor in the site's units and a way back to the shipped value.
 */
export function SettingCard({
  def,
  setting,
  system,
  timeZone,
  canChange,
  onSave,
  onReset,
}: {
  def: SiteSettingDefinition;
  setting: SiteSetting;
  system: UnitSystem;
  timeZone: string;
  canChange: boolean;
  /** Saves the whole value (stored units); rejects with the server's error. */
  onSave: (value: SettingValues) => Promise<unknown>;
  onReset: () => Promise<unknown>;
}) {
  const headingId = useId();
  const [editing, setEditing] = useState(false);
  const [resetError, setResetError] = useState<string | null>(null);
  const [resetting, setResetting] = useState(false);
  const firstField = useRef<HTMLInputElement | null>(null);

  const start = useMemo(
    () => ({ texts: settingFormTexts(def, setting.value, system), value: setting.value }),
    [def, setting.value, system],
  );
  const resolver = useMemo(
    () =>
      domainSchemaResolver<Texts, ReturnType<typeof settingValueSchema>>(
        settingValueSchema(def),
        (texts) => settingInputFromTexts(def, texts, start, system).input,
        (path) => (def.fields.some((f) => f.name === path) ? path : undefined),
        (texts) => settingInputFromTexts(def, texts, start, system).fieldErrors,
      ),
    [def, start, system],
  );
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Texts, unknown, Record<string, unknown>>({ resolver, defaultValues: start.texts });

  const open = () => {
    reset(start.texts);
    setEditing(true);
    requestAnimationFrame(() => firstField.current?.focus());
  };

  const submit = handleSubmit(async (value) => {
    try {
      await onSave(value as SettingValues);
      setEditing(false);
    } catch (error) {
      showServerError(
        error,
        setError,
        (path) => path.replace(/^value\./, '') || undefined,
        'The setting was not saved.',
      );
    }
  });

  const resetToShipped = async () => {
    setResetting(true);
    setResetError(null);
    try {
      await onReset();
    } catch (error) {
      setResetError(error instanceof Error ? error.message : 'The setting was not put back. Try again.');
    } finally {
      setResetting(false);
    }
  };

  const basis = basisSentence(settingFigureBasis(setting), timeZone);
  const shippedWords =
    setting.shippedBasis.kind === 'published' ? `Published: ${setting.shippedBasis.citation}` : STARTING_VALUE_WORDS;
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;

  return (
    <article aria-labelledby={headingId} className="space-y-3 py-5 first:pt-0 last:pb-0">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 id={headingId} className="text-lg font-bold text-ink">
            {def.label}
          </h3>
          <p className="max-w-prose text-sm text-ink-muted">{def.help}</p>
        </div>
        <span
          className={`inline-flex items-center gap-1.5 rounded-sheet border px-2 py-0.5 text-sm font-bold ${
            setting.source === 'site' ? 'border-accent bg-accent-soft text-accent-dark' : 'border-rule text-ink-muted'
          }`}
        >
          {originTag(setting)}
        </span>
      </div>

      {editing ? (
        <form onSubmit={submit} noValidate className="space-y-4" aria-label={`Change ${def.label}`}>
          {rootMessage ? <Notice title="The setting was not saved">{rootMessage}</Notice> : null}
          <div className="grid gap-4 sm:grid-cols-2">
            {def.fields.map((field, index) => {
              const registered = register(field.name);
              return (
                <Field
                  key={field.name}
                  label={field.label}
                  unit={fieldUnit(field, system)}
                  error={errors[field.name]?.message}
                >
                  {(props) => (
                    <input
                      {...props}
                      {...registered}
                      ref={(element) => {
                        registered.ref(element);
                        if (index === 0) firstField.current = element;
                      }}
                      type="text"
                      inputMode="decimal"
                      autoComplete="off"
                      className={`${inputClass} tabular`}
                    />
                  )}
                </Field>
              );
            })}
          </div>
          <div className="flex flex-wrap gap-2">
            <Button type="submit" variant="primary" disabled={isSubmitting}>
              {isSubmitting ? 'Saving…' : 'Save for this site'}
            </Button>
            <Button onClick={() => setEditing(false)}>Cancel</Button>
          </div>
        </form>
      ) : (
        <Values def={def} value={setting.value} system={system} />
      )}

      <p className="text-sm text-ink">
        <span className="font-bold">Source: </span>
        {basis}.
      </p>
      {setting.source === 'site' ? (
        <div className="rounded-sheet border border-rule bg-paper px-3 py-2 text-sm text-ink-muted">
          <p>
            <span className="font-semibold text-ink">Kerfline’s value: </span>
            {def.fields
              .map((field) => `${field.label} ${fieldDualText(field, setting.defaultValue[field.name] ?? 0, system)}`)
              .join('; ')}
            . {shippedWords}.
          </p>
        </div>
      ) : null}
      {resetError ? <Notice title="The setting was not put back">{resetError}</Notice> : null}

      {canChange && !editing ? (
        <div className="flex flex-wrap gap-2">
          <Button onClick={open} aria-label={`Change ${def.label}`}>
            Change
          </Button>
          {setting.source === 'site' ? (
            <Button
              variant="quiet"
              onClick={() => void resetToShipped()}
              disabled={resetting}
              aria-label={`Put back Kerfline’s value of ${def.label}`}
            >
              {resetting ? 'Putting back…' : 'Put back Kerfline’s value'}
            </Button>
          ) : null}
        </div>
      ) : null}
    </article>
  );
}
