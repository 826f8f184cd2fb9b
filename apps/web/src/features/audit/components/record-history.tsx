import type { AuditAction, AuditEntry } from '@kerfline/domain/audit/schema';
import { formatDateTime, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';

/** The fields of the site's records as people name them; ids and bookkeeping columns are left out. */
const FIELD_LABELS: Record<string, string> = {
  installedAt: 'Put on',
  removedAt: 'Taken off',
  tensionMpa: 'Tension (MPa)',
  materialGroup: 'First material',
  breakInFollowed: 'Break-in followed',
  installNotes: 'Notes when put on',
  removalReason: 'Why it came off',
  areaCutMm2: 'Area cut (mm²)',
  cuts: 'Cuts',
  areaSource: 'Area from',
  removalNotes: 'Notes when taken off',
  confirmedCause: 'Confirmed cause',
  costMinor: 'Cost',
  startedAt: 'Stopped',
  endedAt: 'Running again',
  category: 'Why it stopped',
  planned: 'Planned',
  notes: 'Notes',
  quantity: 'Quantity',
  unitCostMinor: 'Cost of one',
  currency: 'Currency',
  receivedOn: 'Received on',
  reference: 'Reference',
  leadTimeDays: 'Lead time (days)',
  safetyStock: 'Safety stock',
  name: 'Name',
  caption: 'Caption',
  // A removed entry (kept, so it can be put back).
  subject: 'Entry',
  reason: 'Why it was removed',
};

/** Columns that say nothing to a reader of the history. */
const HIDDEN = new Set([
  'id',
  'siteId',
  'sawId',
  'bladeSpecId',
  'stockReceiptId',
  'bladeRunId',
  'installedById',
  'removedById',
  'createdById',
  'endedById',
  'confirmedCauseById',
  'confirmedCauseAt',
  'updatedById',
  'uploadedById',
  'recordId',
  'photoIds',
  'relinks',
  'createdAt',
  'updatedAt',
]);

export const ACTION_WORDS: Record<AuditAction, string> = {
  create: 'Recorded',
  update: 'Changed',
  // Runs, stops, cut logs, photos and recorded checks are kept when removed; other deletions are of unused slips.
  delete: 'Removed',
  retire: 'Retired',
  restore: 'Brought back',
  undo: 'Undone',
};

/** A stored value in words: dates on the site's clock, yes/no, numbers with separators, blank as a dash. */
function valueText(value: unknown, timeZone: string): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (typeof value === 'number') return formatNumber(value, 3);
  if (typeof value === 'string' && /^\d{4}-\d{2}-\d{2}T/.test(value)) return formatDateTime(value, timeZone);
  if (typeof value === 'string') return value.replaceAll('_', ' ');
  return JSON.stringify(value);
}

/** Money fields (integer minor units) as money in the record's currency. */
const MONEY_FIELDS = new Set(['costMinor', 'unitCostMinor']);

/** The lines of one entry: each changed field's old and new value (a new record: its values). */
export function changeLines(
  entry: AuditEntry,
  timeZone: string,
): { label: string; before: string | null; after: string | null }[] {
  const keys = new Set([...Object.keys(entry.before ?? {}), ...Object.keys(entry.after ?? {})]);
  const currency = String(entry.after?.currency ?? entry.before?.currency ?? '').trim();
  const show = (key: string, values: Record<string, unknown> | null) => {
    if (!values) return null;
    const value = values[key];
    if (MONEY_FIELDS.has(key) && typeof value === 'number' && /^[A-Z]{3}$/.test(currency))
      return formatMoney(value, currency);
    return valueText(value, timeZone);
  };
  return [...keys]
    .filter((key) => !HIDDEN.has(key))
    .filter((key) => entry.action !== 'create' || (entry.after?.[key] ?? null) !== null)
    .map((key) => ({
      label: FIELD_LABELS[key] ?? key,
      before: show(key, entry.before),
      after: show(key, entry.after),
    }));
}

/**
 * A record's change history, newest first: who did what and when (on the site's clock), and each field's value
 * before and after. Readable by administrators and the site's own admins (the server decides).
 */
export function RecordHistory({
  entries,
  timeZone,
  entityLabel,
  emptyMessage = 'No changes recorded.',
}: {
  entries: readonly AuditEntry[];
  timeZone: string;
  /** For a site's history: names what each entry is about. */
  entityLabel?: (entry: AuditEntry) => React.ReactNode;
  emptyMessage?: string;
}) {
  if (entries.length === 0) return <p className="text-ink-muted">{emptyMessage}</p>;
  return (
    <ol className="divide-y divide-rule">
      {entries.map((entry) => (
        <li key={entry.id} className="space-y-1 py-3 first:pt-0 last:pb-0">
          <p className="text-sm text-ink-muted">
            <time dateTime={entry.at}>{formatDateTime(entry.at, timeZone)}</time> ·{' '}
            <span className="font-semibold text-ink">{entry.actorName ?? 'Someone no longer listed'}</span>
          </p>
          <p className="font-bold text-ink">
            {ACTION_WORDS[entry.action]}
            {entityLabel ? <> · {entityLabel(entry)}</> : null}
          </p>
          <ul className="space-y-0.5 text-sm text-ink">
            {changeLines(entry, timeZone).map((line) => (
              <li key={line.label} className="tabular break-words">
                {line.label}:{' '}
                {line.before !== null && line.after !== null ? (
                  <>
                    {line.before} <span aria-hidden="true">→</span>
                    <span className="sr-only"> changed to </span> {line.after}
                  </>
                ) : (
                  (line.after ?? line.before)
                )}
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ol>
  );
}
