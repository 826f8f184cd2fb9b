import { useMemo, useState, type ReactNode } from 'react';
import { useForm, useWatch, type Resolver } from 'react-hook-form';
import { cutLogCreateSchema, type CutLog, type CutLogCreateParsed } from '@kerfline/domain/cut-logs/schema';
import { MATERIAL_GROUPS, MATERIAL_GROUP_LABELS, type MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { mmToIn } from '@kerfline/domain/units/units';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { formatArea, formatNumber, formatSpeed, lengthUnit, speedUnit } from '../../../lib/format';
import { SHAPE_DIMENSIONS, SHAPE_OPTIONS, SHAPE_ORIENTATION, describeShape } from '../../../lib/stock-shapes';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { cutLogDefaults, cutLogFieldForPath, cutLogInput, type CutLogFormValues } from './cut-log-values';

/** Stock-size limits are written in mm; an imperial site reads them in inches too. */
function inSiteUnits(message: string, system: UnitSystem): string {
  if (system !== 'imperial') return message;
  return message.replace(
    /(\d+(?:\.\d+)?) mm$/,
    (whole, mm: string) => `${whole} (${formatNumber(mmToIn(Number(mm)), 2)} in)`,
  );
}

function resolverFor(sawId: string, system: UnitSystem, timeZone: string) {
  return domainSchemaResolver(
    cutLogCreateSchema,
    (values: CutLogFormValues) => cutLogInput(values, sawId, system, timeZone).input,
    (path) => cutLogFieldForPath(path),
    (values) => cutLogInput(values, sawId, system, timeZone).fieldErrors,
    (message) => inSiteUnits(message, system),
  ) as Resolver<CutLogFormValues, unknown, CutLogCreateParsed>;
}

const capital = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** What the server worked out for a logged cut: area, teeth in the work, and any warning. */
export function CutLogAnswer({ log, system }: { log: CutLog; system: UnitSystem }) {
  return (
    <section aria-labelledby="cut-answer" className="space-y-2 rounded-sheet border border-rule bg-card p-4">
      <h2 id="cut-answer" className="font-bold text-ink">
        Logged: {log.quantity} × {describeShape(log.shape, system)}
      </h2>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-muted">Cut area</dt>
        <dd className="tabular font-semibold text-ink">
          {formatArea(log.areaCutMm2, system)}
          {log.quantity > 1 ? ` (${formatArea(log.areaPerCutMm2, system)} a cut)` : ''}
        </dd>
        <dt className="text-ink-muted">Teeth in the work</dt>
        <dd className="tabular font-semibold text-ink">
          {log.teethInWorkMin === null || log.teethInWorkMax === null
            ? 'Not worked out: no blade is recorded on the saw then'
            : log.teethInWorkMin === log.teethInWorkMax
              ? formatNumber(log.teethInWorkMin, 1)
              : `${formatNumber(log.teethInWorkMin, 1)} to ${formatNumber(log.teethInWorkMax, 1)}`}
        </dd>
        {log.bandSpeedMPerMin !== null ? (
          <>
            <dt className="text-ink-muted">Band speed</dt>
            <dd className="tabular text-ink">{formatSpeed(log.bandSpeedMPerMin, system)}</dd>
          </>
        ) : null}
      </dl>
      {log.warnings.length > 0 ? (
        <Notice tone="caution" title="Outside the trade’s limits">
          <ul className="list-disc pl-5">
            {log.warnings.map((w) => (
              <li key={w.code}>{w.message}</li>
            ))}
          </ul>
        </Notice>
      ) : (
        <p className="text-sm text-ink-muted">Within the trade’s limits.</p>
      )}
    </section>
  );
}

/**
 * A cut log: the stock's shape and size in the site's units, the material, how many cuts, and the band speed and
 * cut time when known. The answer (cut area, teeth in the work, warnings) shows under the form, which stays
 * filled for the next cut of the same stock.
 */
export function CutLogForm({
  sawId,
  system,
  timeZone,
  materialGroup,
  onSubmit,
  cancel,
}: {
  sawId: string;
  system: UnitSystem;
  timeZone: string;
  /** The material of the blade on the saw, as a starting choice. */
  materialGroup: MaterialGroup | null;
  onSubmit: (input: CutLogCreateParsed) => Promise<CutLog>;
  cancel: ReactNode;
}) {
  const resolver = useMemo(() => resolverFor(sawId, system, timeZone), [sawId, system, timeZone]);
  const defaultValues = useMemo(() => cutLogDefaults(timeZone, materialGroup), [timeZone, materialGroup]);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<CutLogFormValues, unknown, CutLogCreateParsed>({ resolver, defaultValues });
  const shape = useWatch({ control, name: 'shape' });
  const [answer, setAnswer] = useState<CutLog | null>(null);

  const submit = handleSubmit(async (input) => {
    try {
      setAnswer(await onSubmit(input));
    } catch (error) {
      setAnswer(null);
      showServerError(error, setError, (path) => cutLogFieldForPath(path), 'The cut was not logged. Try again.');
    }
  });
  const rootMessage = errors.root?.server?.message ?? errors.root?.message;
  const numberInput = (field: keyof CutLogFormValues, label: string, unit?: string, hint?: string) => (
    <Field key={field} label={label} unit={unit} hint={hint} error={errors[field]?.message}>
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

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {rootMessage ? <Notice title="The cut was not logged">{rootMessage}</Notice> : null}
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Stock</legend>
        <Field label="Shape" hint={SHAPE_ORIENTATION[shape]} error={errors.shape?.message} className="sm:col-span-2">
          {(props) => (
            <select {...props} {...register('shape')} className={inputClass}>
              {SHAPE_OPTIONS.map((option) => (
                <option key={option.value} value={option.value}>
                  {option.label}
                </option>
              ))}
            </select>
          )}
        </Field>
        {SHAPE_DIMENSIONS[shape].map(({ key, label }) => numberInput(key, label, lengthUnit(system)))}
        {numberInput('pieceCount', 'Pieces in the bundle')}
        {numberInput('piecesAcross', 'Pieces side by side', undefined, 'Along the band.')}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Material" error={errors.materialGroup?.message}>
          {(props) => (
            <select {...props} {...register('materialGroup')} className={inputClass}>
              <option value="">Choose…</option>
              {MATERIAL_GROUPS.map((group) => (
                <option key={group} value={group}>
                  {capital(MATERIAL_GROUP_LABELS[group])}
                </option>
              ))}
            </select>
          )}
        </Field>
        {numberInput('quantity', 'Cuts of this kind')}
        {numberInput('bandSpeed', 'Band speed', speedUnit(system), 'Optional.')}
        {numberInput('cutTimeMin', 'Cut time', 'min', 'Optional: one cut, head down to up.')}
        <Field label="Cut at" hint={`Your site’s clock (${timeZone}).`} error={errors.cutAt?.message}>
          {(props) => (
            <input {...props} {...register('cutAt')} type="datetime-local" className={`${inputClass} tabular`} />
          )}
        </Field>
        <Field label="Notes" hint="Optional." error={errors.notes?.message}>
          {(props) => <input {...props} {...register('notes')} className={inputClass} />}
        </Field>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting} className="min-h-12 px-6 text-base">
          {isSubmitting ? 'Saving…' : answer ? 'Log another' : 'Log the cut'}
        </Button>
        {cancel}
      </div>
      {answer ? <CutLogAnswer log={answer} system={system} /> : null}
    </form>
  );
}
