import type { AuditEntry } from '@kerfline/domain/audit/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { formatDateTime } from '../../../lib/format';
import { fieldText } from './setting-values';

/** What a change did to where the value comes from, when it did more than change numbers. */
function originChange(before: Record<string, unknown> | null, after: Record<string, unknown> | null): string | null {
  if (before?.source === 'shipped' && after?.source === 'site') return 'From Kerfline’s value to the site’s own.';
  if (before?.source === 'site' && after?.source === 'shipped') return 'Put back to Kerfline’s value.';
  return null;
}

/** One field's old and new value in the site's units, or the raw numbers for a field the setting no longer has. */
function changeLines(entry: AuditEntry, system: UnitSystem): { label: string; before: string; after: string }[] {
  const def = settingDefinition(entry.entityId);
  const keys = new Set([...Object.keys(entry.before ?? {}), ...Object.keys(entry.after ?? {})]);
  keys.delete('source');
  // In the setting's own order (the database keeps JSON keys in its own), fields it no longer has last.
  const order = (name: string) => {
    const index = def?.fields.findIndex((f) => f.name === name) ?? -1;
    return index === -1 ? Number.MAX_SAFE_INTEGER : index;
  };
  return [...keys]
    .sort((a, b) => order(a) - order(b))
    .map((name) => {
      const field = def?.fields.find((f) => f.name === name);
      const show = (value: unknown) =>
        typeof value !== 'number' ? '—' : field ? fieldText(field, value, system) : String(value);
      return { label: field?.label ?? name, before: show(entry.before?.[name]), after: show(entry.after?.[name]) };
    });
}

/**
 * The history of a site's settings, newest first: who changed which setting, when (the site's clock), and each
 * figure's old and new value in the site's units.
 */
export function SettingsHistory({
  entries,
  system,
  timeZone,
}: {
  entries: readonly AuditEntry[];
  system: UnitSystem;
  timeZone: string;
}) {
  if (entries.length === 0) return <p className="text-ink-muted">No setting has been changed at this site yet.</p>;
  return (
    <ol className="divide-y divide-rule">
      {entries.map((entry) => {
        const origin = originChange(entry.before, entry.after);
        return (
          <li key={entry.id} className="space-y-1 py-3 first:pt-0 last:pb-0">
            <p className="text-sm text-ink-muted">
              <time dateTime={entry.at}>{formatDateTime(entry.at, timeZone)}</time> ·{' '}
              <span className="font-semibold text-ink">{entry.actorName ?? 'Someone no longer listed'}</span>
            </p>
            <p className="font-bold text-ink">{settingDefinition(entry.entityId)?.label ?? entry.entityId}</p>
            <ul className="space-y-0.5 text-sm text-ink">
              {changeLines(entry, system).map((line) => (
                <li key={line.label} className="tabular">
                  {line.label}: {line.before} <span aria-hidden="true">→</span>{' '}
                  <span className="sr-only">changed to </span>
                  {line.after}
                </li>
              ))}
            </ul>
            {origin ? <p className="text-sm text-ink-muted">{origin}</p> : null}
          </li>
        );
      })}
    </ol>
  );
}
