import { IMPORT_FIELDS, type ImportKind } from '@kerfline/domain/imports/fields';
import type {
  ColumnPlan,
  ImportContext,
  PreviewRow,
  RowIssue,
  Unmatched,
  ValueMap,
} from '@kerfline/domain/imports/schema';
import { inputClass } from '../../../lib/ui/field';
import { formatNumber } from '../../../lib/format';
import { VerdictBadge } from './verdict-badge';

type Counts = {
  rowsTotal: number;
  rowsValid: number;
  rowsRepeated: number;
  rowsRejected: number;
  rowsPresent?: number;
};

/** The counts of a file's rows, as tiles with the number large and the meaning in words. */
export function RowCounts({ counts, done = false }: { counts: Counts; done?: boolean }) {
  const tiles: [string, number, string][] = [
    ['Rows in the file', counts.rowsTotal, 'border-rule'],
    [done ? 'Added' : 'Will be added', counts.rowsValid, 'border-signal-safe'],
    ...(counts.rowsPresent !== undefined
      ? ([['Already in Kerfline', counts.rowsPresent, 'border-ink-muted']] as [string, number, string][])
      : []),
    ['Repeat an earlier row', counts.rowsRepeated, 'border-ink-muted'],
    ['Not brought in', counts.rowsRejected, 'border-signal-stop'],
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5">
      {tiles.map(([label, value, border]) => (
        <div key={label} className={`rounded-sheet border-l-4 bg-card px-3 py-2 ${border}`}>
          <dt className="text-sm text-ink-muted">{label}</dt>
          <dd className="tabular text-2xl font-extrabold text-ink">{formatNumber(value)}</dd>
        </div>
      ))}
    </dl>
  );
}

/**
 * Saws, specs and words the file uses that Kerfline could not place: for each, what it means (near matches
 * first), or leave those rows out. The answers are remembered for this site and kind with the import.
 */
export function ValueMapping({
  kind,
  unmatched,
  values,
  onValues,
  context,
}: {
  kind: ImportKind;
  unmatched: Unmatched[];
  values: ValueMap;
  onValues: (values: ValueMap) => void;
  context: ImportContext;
}) {
  if (unmatched.length === 0) return null;
  const fields = IMPORT_FIELDS[kind];
  const optionsFor = (u: Unmatched): { value: string; label: string }[] => {
    const field = fields.find((f) => f.key === u.field);
    if (field?.type === 'saw')
      return context.saws.filter((s) => !s.retired).map((s) => ({ value: s.id, label: `${s.assetTag} · ${s.name}` }));
    if (field?.type === 'spec')
      return context.specs.filter((s) => !s.archived).map((s) => ({ value: s.id, label: s.name }));
    if (field?.type === 'check')
      return context.checks.filter((c) => !c.retired).map((c) => ({ value: c.id, label: c.name }));
    return (field?.choice?.values ?? []).map((v) => ({ value: v, label: field!.choice!.labels[v] ?? v }));
  };
  const set = (u: Unmatched, value: string) => {
    const forField = { ...(values[u.field] ?? {}) };
    if (value === '') delete forField[u.key];
    else forField[u.key] = value;
    onValues({ ...values, [u.field]: forField });
  };
  return (
    <section aria-labelledby="values-heading" className="space-y-3">
      <h3 id="values-heading" className="text-lg font-bold text-ink">
        Names and words Kerfline did not recognise
      </h3>
      <p className="text-sm text-ink-muted">
        Say what each one means, then check the rows again. Rows with an answer left open are not brought in.
      </p>
      <ul className="space-y-2">
        {unmatched.map((u) => {
          const field = fields.find((f) => f.key === u.field);
          const chosen = values[u.field]?.[u.key] ?? '';
          const all = optionsFor(u);
          const near = new Set(u.suggestions.map((s) => s.value));
          const id = `value-${u.field}-${u.key}`;
          return (
            <li
              key={`${u.field}|${u.key}`}
              className="grid gap-2 rounded-sheet border border-rule bg-card p-3 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)] md:items-center"
            >
              <label htmlFor={id} className="min-w-0">
                <span className="block font-bold break-words text-ink">“{u.written}”</span>
                <span className="block text-sm text-ink-muted">
                  {field?.label ?? u.field} · {formatNumber(u.rows)} {u.rows === 1 ? 'row' : 'rows'}
                  {u.suggestions[0] ? ` · close to ${u.suggestions[0].label}` : ''}
                </span>
              </label>
              <select id={id} className={inputClass} value={chosen} onChange={(e) => set(u, e.target.value)}>
                <option value="">— Leave these rows out —</option>
                {u.suggestions.length > 0 ? (
                  <optgroup label="Close matches">
                    {u.suggestions.map((s) => (
                      <option key={`near-${s.value}`} value={s.value}>
                        {s.label}
                      </option>
                    ))}
                  </optgroup>
                ) : null}
                <optgroup
                  label={
                    field?.type === 'saw'
                      ? 'All saws of the site'
                      : field?.type === 'spec'
                        ? 'All blade specs'
                        : field?.type === 'check'
                          ? 'The site’s checks'
                          : 'All values'
                  }
                >
                  {all
                    .filter((o) => !near.has(o.value))
                    .map((o) => (
                      <option key={o.value} value={o.value}>
                        {o.label}
                      </option>
                    ))}
                </optgroup>
              </select>
            </li>
          );
        })}
      </ul>
    </section>
  );
}

/** The first rows as they will be stored, each with its verdict and its problems. */
export function PreviewTable({
  kind,
  columns,
  preview,
}: {
  kind: ImportKind;
  columns: ColumnPlan[];
  preview: PreviewRow[];
}) {
  const fields = IMPORT_FIELDS[kind].filter((f) => columns.some((c) => c.field === f.key));
  if (preview.length === 0) return null;
  return (
    <section aria-labelledby="preview-heading" className="space-y-2">
      <h3 id="preview-heading" className="text-lg font-bold text-ink">
        The first rows as they will be stored
      </h3>
      <p className="text-sm text-ink-muted">
        Lengths in mm, speeds in m/min, areas in mm², tension in MPa, times in UTC: how Kerfline keeps them.
      </p>
      {/* On a phone each row is a card: field and value one under the other. */}
      <ol className="space-y-2 md:hidden" aria-label="First rows">
        {preview.map((row) => (
          <li key={row.rowNumber} className="rounded-sheet border border-rule bg-card p-3 text-sm">
            <div className="flex items-center justify-between gap-2">
              <span className="font-bold text-ink">Row {row.rowNumber}</span>
              <VerdictBadge verdict={row.verdict} />
            </div>
            {row.issues.length > 0 ? (
              <ul className="mt-1 space-y-0.5 text-xs">
                {row.issues.map((issue, i) => (
                  <li key={i} className={issue.level === 'error' ? 'font-semibold text-signal-stop' : 'text-ink-muted'}>
                    {issue.level === 'warning' ? 'Note: ' : ''}
                    {issue.message}
                  </li>
                ))}
              </ul>
            ) : null}
            <dl className="mt-2 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5">
              {fields.map((f) => (
                <div key={f.key} className="contents">
                  <dt className="text-ink-muted">{f.label}</dt>
                  <dd className="tabular break-words text-ink">{row.values[f.key] ?? '—'}</dd>
                </div>
              ))}
            </dl>
          </li>
        ))}
      </ol>
      <div className="hidden overflow-x-auto rounded-sheet border border-rule bg-card md:block">
        <table className="w-full text-left text-sm">
          <thead className="border-b border-rule bg-paper-deep text-ink-muted">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Row
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Verdict
              </th>
              {fields.map((f) => (
                <th key={f.key} scope="col" className="px-3 py-2 font-semibold whitespace-nowrap">
                  {f.label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {preview.map((row) => (
              <tr key={row.rowNumber} className="border-b border-rule align-top last:border-0">
                <th scope="row" className="tabular px-3 py-2 font-semibold">
                  {row.rowNumber}
                </th>
                <td className="px-3 py-2">
                  <VerdictBadge verdict={row.verdict} />
                  {row.issues.length > 0 ? (
                    <ul className="mt-1 space-y-0.5 text-xs">
                      {row.issues.map((issue, i) => (
                        <li
                          key={i}
                          className={issue.level === 'error' ? 'font-semibold text-signal-stop' : 'text-ink-muted'}
                        >
                          {issue.level === 'warning' ? 'Note: ' : ''}
                          {issue.message}
                        </li>
                      ))}
                    </ul>
                  ) : null}
                </td>
                {fields.map((f) => {
                  const bad = row.issues.some((i) => i.field === f.key && i.level === 'error');
                  return (
                    <td key={f.key} className={`tabular px-3 py-2 ${bad ? 'font-semibold text-signal-stop' : ''}`}>
                      {row.values[f.key] ?? '—'}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/** Every problem found (the first 200 listed), by row and column. */
export function ProblemList({ problems, total }: { problems: RowIssue[]; total: number }) {
  if (total === 0) return null;
  return (
    <section aria-labelledby="problems-heading" className="space-y-2">
      <h3 id="problems-heading" className="text-lg font-bold text-ink">
        Problems and notes ({formatNumber(total)})
      </h3>
      <ul className="max-h-96 space-y-1 overflow-y-auto rounded-sheet border border-rule bg-card p-3 text-sm">
        {problems.map((p, i) => (
          <li key={i} className="flex gap-2">
            <span className="tabular w-16 shrink-0 font-semibold text-ink">Row {p.rowNumber}</span>
            <span className={p.level === 'error' ? 'text-signal-stop' : 'text-ink-muted'}>
              {p.level === 'warning' ? 'Note: ' : ''}
              {p.column ? <span className="font-semibold">[{p.column}] </span> : null}
              {p.message}
            </span>
          </li>
        ))}
        {total > problems.length ? (
          <li className="text-ink-muted">
            … and {formatNumber(total - problems.length)} more; the rejected-rows file after the import lists every one.
          </li>
        ) : null}
      </ul>
    </section>
  );
}
