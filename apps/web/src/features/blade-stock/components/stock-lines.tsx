import { useState } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { pitchLabel } from '@kerfline/domain/blade-specs/schema';
import {
  stockLevelsInputSchema,
  type SiteStock,
  type StockLevelsInput,
  type StockLine,
} from '@kerfline/domain/blade-stock/schema';
import { REORDER_POINT_FORMULA } from '@kerfline/domain/stock/reorder';
import { STARTING_VALUE_WORDS } from '../../../lib/figure-basis';
import { formatDate, formatNumber } from '../../../lib/format';
import { domainSchemaResolver, showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { StatusMark } from '../../../lib/ui/status-mark';
import { useSetStockLevels } from '../api/mutations';

/** Days left as a person reads it: "27 days", "under a day", or no use lately. */
export function daysLeftText(days: number | null): string {
  if (days === null) return 'No blades used lately';
  if (days < 1) return 'Under a day';
  const whole = Math.floor(days);
  return whole === 1 ? '1 day' : `${formatNumber(whole)} days`;
}

/** A line's state: reorder now (triangle), none on hand (block), or fine (circle). */
function LineStatus({ line }: { line: StockLine }) {
  if (line.onHand <= 0 && line.usedInWindow > 0) return <StatusMark shape="block">None on hand</StatusMark>;
  if (line.reorderNow) return <StatusMark shape="triangle">Reorder now</StatusMark>;
  return <StatusMark shape="circle">Enough</StatusMark>;
}

/** Where the lead time and safety stock come from: the site's own values (who, when) or Kerfline's starting ones. */
function levelsBasis(line: StockLine, timeZone: string): string {
  if (!line.levelsSetAt) return `${STARTING_VALUE_WORDS}; a site admin sets them for your supplier`;
  return `your site’s setting, changed by ${line.levelsSetByName ?? 'someone no longer listed'} on ${formatDate(line.levelsSetAt, timeZone)}`;
}

type LevelsFormValues = { leadTimeDays: string; safetyStock: string };

function LevelsForm({ siteId, line, onDone }: { siteId: string; line: StockLine; onDone: () => void }) {
  const setLevels = useSetStockLevels(siteId);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<LevelsFormValues, unknown, StockLevelsInput>({
    defaultValues: { leadTimeDays: String(line.leadTimeDays), safetyStock: String(line.safetyStock) },
    resolver: domainSchemaResolver(
      stockLevelsInputSchema,
      (values: LevelsFormValues) =>
        ({
          leadTimeDays: values.leadTimeDays.trim() === '' ? undefined : Number(values.leadTimeDays),
          safetyStock: values.safetyStock.trim() === '' ? undefined : Number(values.safetyStock),
        }) as StockLevelsInput,
      (path) => (path === 'leadTimeDays' || path === 'safetyStock' ? path : undefined),
    ) as Resolver<LevelsFormValues, unknown, StockLevelsInput>,
  });
  const submit = handleSubmit(async (input) => {
    try {
      await setLevels.mutateAsync({ bladeSpecId: line.bladeSpec.id, input });
      onDone();
    } catch (error) {
      showServerError(
        error,
        setError,
        (path) => (path === 'leadTimeDays' || path === 'safetyStock' ? path : undefined),
        'The levels were not saved.',
      );
    }
  });
  return (
    <form onSubmit={submit} noValidate className="mt-3 space-y-3 rounded-sheet border border-rule bg-paper p-3">
      {errors.root?.server?.message ? <Notice>{errors.root.server.message}</Notice> : null}
      <div className="grid grid-cols-2 gap-3">
        <Field label="Lead time" unit="days" error={errors.leadTimeDays?.message}>
          {(props) => (
            <input {...props} {...register('leadTimeDays')} inputMode="numeric" className={`${inputClass} tabular`} />
          )}
        </Field>
        <Field label="Safety stock" unit="blades" error={errors.safetyStock?.message}>
          {(props) => (
            <input {...props} {...register('safetyStock')} inputMode="numeric" className={`${inputClass} tabular`} />
          )}
        </Field>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : 'Save levels'}
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

function Line({
  line,
  siteId,
  windowDays,
  timeZone,
  canSetLevels,
}: {
  line: StockLine;
  siteId: string;
  windowDays: number;
  timeZone: string;
  canSetLevels: boolean;
}) {
  const [editing, setEditing] = useState(false);
  const perWeek = line.dailyUsage * 7;
  return (
    <li className="rounded-sheet border border-rule bg-card p-4 sm:p-5">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h3 className="font-bold text-ink">{line.bladeSpec.name}</h3>
          {line.bladeSpec.name.includes(pitchLabel(line.bladeSpec.pitch)) && !line.bladeSpec.siteId ? null : (
            <p className="text-sm text-ink-muted">
              {[
                line.bladeSpec.name.includes(pitchLabel(line.bladeSpec.pitch))
                  ? null
                  : pitchLabel(line.bladeSpec.pitch),
                line.bladeSpec.siteId ? 'this site’s own spec' : null,
              ]
                .filter(Boolean)
                .join(' · ')}
            </p>
          )}
        </div>
        <LineStatus line={line} />
      </div>
      <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-4">
        <div>
          <dt className="text-sm text-ink-muted">On hand</dt>
          <dd className="tabular text-3xl font-extrabold text-ink">{formatNumber(line.onHand)}</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Days left</dt>
          <dd className="tabular text-3xl font-extrabold text-ink">{daysLeftText(line.daysOfStockLeft)}</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Used</dt>
          <dd className="tabular text-lg font-semibold text-ink">
            {formatNumber(perWeek, 1)} a week
            <span className="block text-sm font-normal text-ink-muted">
              {formatNumber(line.usedInWindow)} in {windowDays} days
            </span>
          </dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Reorder at</dt>
          <dd className="tabular text-lg font-semibold text-ink">
            {formatNumber(line.reorderPoint, 1)} blades
            <span className="block text-sm font-normal text-ink-muted">
              lead {formatNumber(line.leadTimeDays)} days, safety {formatNumber(line.safetyStock)}
            </span>
          </dd>
        </div>
      </dl>
      <p className="mt-3 text-sm text-ink">{line.reason}</p>
      <p className="mt-1 text-sm text-ink-muted">
        Use rate from blades put on this site’s saws in the last {windowDays} days. Reorder point: published:{' '}
        {REORDER_POINT_FORMULA}. Lead time and safety stock: {levelsBasis(line, timeZone)}.
      </p>
      {canSetLevels ? (
        editing ? (
          <LevelsForm siteId={siteId} line={line} onDone={() => setEditing(false)} />
        ) : (
          <Button
            className="mt-3"
            onClick={() => setEditing(true)}
            aria-label={`Change lead time and safety stock of ${line.bladeSpec.name}`}
          >
            Change lead time and safety stock
          </Button>
        )
      ) : null}
    </li>
  );
}

/**
 * A site's blade stock per spec, most urgent first: on hand, days left at the recent use rate, the reorder point,
 * each with where it comes from; site admins change a spec's lead time and safety stock in place.
 */
export function StockLines({
  stock,
  timeZone,
  canSetLevels,
}: {
  stock: SiteStock;
  timeZone: string;
  canSetLevels: boolean;
}) {
  if (stock.items.length === 0)
    return <p className="text-ink-muted">No blades have been received or used at this site yet.</p>;
  return (
    <ul className="space-y-3">
      {stock.items.map((line) => (
        <Line
          key={line.bladeSpec.id}
          line={line}
          siteId={stock.siteId}
          windowDays={stock.windowDays}
          timeZone={timeZone}
          canSetLevels={canSetLevels}
        />
      ))}
    </ul>
  );
}
