import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { IMPORT_KINDS, IMPORT_KIND_LABELS, type ImportKind } from '@kerfline/domain/imports/fields';
import type { ColumnPlan, ImportBatch, ImportPlan, ValueMap } from '@kerfline/domain/imports/schema';
import {
  DELIMITER_LABELS,
  ENCODING_LABELS,
  DELIMITERS,
  TEXT_ENCODINGS,
  type DateOrderGuess,
} from '@kerfline/domain/imports/detect';
import { betterKind, suggestColumns } from '@kerfline/domain/imports/suggest';
import type { ReadSettings } from '@kerfline/domain/imports/pipeline';
import type { DateOrder, DecimalMark } from '@kerfline/domain/imports/values';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { formatNumber } from '../../../lib/format';
import { importContextQuery, importDetailQuery } from '../api/queries';
import { useCheckImport, useCommitImport } from '../api/mutations';
import { runInWorker } from '../worker/messages';
import type { CheckResult, ScanResult } from '../worker/read-file';
import { AcceptedColumns } from './accepted-columns';
import { ColumnsStep } from './columns-step';
import { ProgressBar } from './progress-bar';
import { PreviewTable, ProblemList, RowCounts, ValueMapping } from './rows-report';
import { BatchCard } from './batch-card';
import { buildPlan, dateOrderGuess, decimalMarkOf, mappingProblems, targetOf } from './plan-helpers';

type Step = 'kind' | 'file' | 'columns' | 'rows' | 'done';
const STEPS: [Step, string][] = [
  ['kind', 'What the file holds'],
  ['file', 'The file'],
  ['columns', 'Columns'],
  ['rows', 'Rows'],
  ['done', 'Brought in'],
];

function StepHeading({ step, children }: { step: Step; children: ReactNode }) {
  const n = STEPS.findIndex(([s]) => s === step) + 1;
  return (
    <h2 className="text-2xl font-extrabold tracking-tight text-ink">
      <span className="mr-2 text-accent-dark">{n}.</span>
      {children}
    </h2>
  );
}

const NO_SETTINGS: ReadSettings = { format: null, encoding: null, delimiter: null, sheet: null };

/**
 * The import wizard: choose what the file holds, drop it (read in a Web Worker with a progress bar), match its
 * columns, units and words, see every row checked with the records' own rules, compare with the site's records on
 * the server, and bring it in. The file never leaves the page until the last two steps.
 */
export function ImportWizard({
  sites,
  initialSiteId,
  initialKind,
}: {
  sites: { id: string; name: string }[];
  initialSiteId: string;
  initialKind: ImportKind | null;
}) {
  const [step, setStep] = useState<Step>(initialKind ? 'file' : 'kind');
  const [siteId, setSiteId] = useState(initialSiteId);
  const [kind, setKind] = useState<ImportKind | null>(initialKind);
  const [file, setFile] = useState<File | null>(null);
  const [settings, setSettings] = useState<ReadSettings>(NO_SETTINGS);
  const [scan, setScan] = useState<ScanResult | null>(null);
  const [progress, setProgress] = useState<{ label: string; share: number } | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [columns, setColumns] = useState<ColumnPlan[]>([]);
  const [decimalMark, setDecimalMark] = useState<DecimalMark>('.');
  const [dateOrder, setDateOrder] = useState<DateOrder | null>(null);
  const [values, setValues] = useState<ValueMap>({});
  const [rows, setRows] = useState<CheckResult | null>(null);
  const [committed, setCommitted] = useState<ImportBatch | null>(null);
  const abort = useRef<AbortController | null>(null);
  const headingRef = useRef<HTMLDivElement>(null);

  const context = useQuery({
    ...importContextQuery({ siteId, kind: kind ?? 'saws' }),
    enabled: kind !== null && siteId !== '',
  });
  const check = useCheckImport();
  const commit = useCommitImport();
  const ctx = context.data;

  useEffect(() => headingRef.current?.focus(), [step]);
  useEffect(() => () => abort.current?.abort(), []);

  const dateGuess: DateOrderGuess = useMemo(
    () => (scan && kind ? dateOrderGuess(kind, columns, scan) : { kind: 'none' }),
    [scan, kind, columns],
  );
  const needsDate = dateGuess.kind === 'ambiguous' || dateGuess.kind === 'conflicting';
  const effectiveDateOrder: DateOrder | null =
    dateGuess.kind === 'known' ? dateGuess.order : needsDate ? dateOrder : (dateOrder ?? 'ymd');
  const problems = kind ? mappingProblems(kind, columns, effectiveDateOrder, needsDate) : [];

  const plan: ImportPlan | null =
    kind && scan && effectiveDateOrder && problems.length === 0
      ? buildPlan({ siteId, kind, settings, scan, columns, decimalMark, dateOrder: effectiveDateOrder, values })
      : null;

  /** Another site or kind: the file must be read again for it (other saws, other columns). */
  const forgetFile = () => {
    abort.current?.abort();
    setFile(null);
    setScan(null);
    setRows(null);
    setReadError(null);
    check.reset();
  };

  const stopReading = () => {
    abort.current?.abort();
    abort.current = new AbortController();
    return abort.current.signal;
  };

  async function readFile(chosen: File, next: ReadSettings) {
    if (!kind || !ctx) return;
    setReadError(null);
    setScan(null);
    setRows(null);
    check.reset();
    if (chosen.size > ctx.limits.maxBytes) {
      setReadError(
        `This file is ${formatNumber(chosen.size / 1048576, 1)} MB; one import takes at most ${formatNumber(ctx.limits.maxBytes / 1048576)} MB. Split it (by year, say) and bring the parts in one after another.`,
      );
      return;
    }
    const signal = stopReading();
    setProgress({ label: `Reading ${chosen.name}`, share: 0 });
    try {
      const result = await runInWorker<ScanResult>(
        { type: 'scan', file: chosen, settings: next, maxRows: ctx.limits.maxRows },
        (share) => setProgress({ label: `Reading ${chosen.name}`, share }),
        signal,
      );
      setScan(result);
      setSettings({
        format: result.opened.format,
        encoding: next.encoding,
        delimiter: next.delimiter,
        sheet: result.opened.sheet,
      });
      const suggested = suggestColumns(kind, result.opened.header, ctx.site.unitSystem, ctx.memory);
      setColumns(suggested);
      setDecimalMark(decimalMarkOf(result, ctx.memory?.decimalMark ?? null));
      setDateOrder(ctx.memory?.dateOrder ?? null);
      setValues(ctx.memory?.values ?? {});
    } catch (err) {
      if (err instanceof DOMException && err.name === 'AbortError') return;
      setReadError(err instanceof Error ? err.message : String(err));
    } finally {
      setProgress(null);
    }
  }

  async function checkRows(nextValues: ValueMap = values) {
    if (!file || !ctx || !plan) return;
    const signal = stopReading();
    check.reset();
    setProgress({ label: 'Checking every row', share: 0 });
    try {
      const result = await runInWorker<CheckResult>(
        {
          type: 'check',
          file,
          plan: { ...plan, values: nextValues },
          target: targetOf(ctx),
          maxRows: ctx.limits.maxRows,
        },
        (share) => setProgress({ label: 'Checking every row', share }),
        signal,
      );
      setRows(result);
    } catch (err) {
      if (err instanceof DOMException && err.name === 'AbortError') return;
      setReadError(err instanceof Error ? err.message : String(err));
    } finally {
      setProgress(null);
    }
  }

  const suggestion = scan && kind && ctx ? betterKind(kind, scan.opened.header, ctx.kinds) : null;

  return (
    <div className="space-y-6">
      <nav aria-label="Steps of bringing a file in">
        <ol className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
          {STEPS.map(([s, label], i) => (
            <li
              key={s}
              aria-current={s === step ? 'step' : undefined}
              className={s === step ? 'font-bold text-accent-dark' : 'text-ink-muted'}
            >
              {i + 1}. {label}
            </li>
          ))}
        </ol>
      </nav>
      <div ref={headingRef} tabIndex={-1} className="outline-none">
        {step === 'kind' ? (
          <Card className="space-y-5 p-4 sm:p-6">
            <StepHeading step="kind">What does the file hold?</StepHeading>
            {sites.length > 1 ? (
              <div className="max-w-md">
                <label htmlFor="import-site" className="block text-sm font-semibold text-ink">
                  Site the records belong to
                </label>
                <select
                  id="import-site"
                  className={`${inputClass} mt-1`}
                  value={siteId}
                  onChange={(e) => {
                    setSiteId(e.target.value);
                    forgetFile();
                  }}
                >
                  {sites.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                    </option>
                  ))}
                </select>
              </div>
            ) : null}
            <ChoiceGroup legend="Kind of records">
              <div className="grid gap-2 md:grid-cols-2">
                {IMPORT_KINDS.map((k) => {
                  const available = !ctx || ctx.kinds.includes(k);
                  return (
                    <ChoiceTile
                      key={k}
                      type="radio"
                      name="kind"
                      label={IMPORT_KIND_LABELS[k].title}
                      hint={available ? IMPORT_KIND_LABELS[k].holds : 'Comes with the maintenance checks feature'}
                      checked={kind === k}
                      disabled={!available}
                      onChange={() => {
                        setKind(k);
                        forgetFile();
                      }}
                    />
                  );
                })}
              </div>
            </ChoiceGroup>
            {kind ? (
              <details className="rounded-sheet border border-rule p-3">
                <summary className="min-h-11 cursor-pointer py-2 font-semibold text-ink">
                  Columns Kerfline takes for {IMPORT_KIND_LABELS[kind].title.toLowerCase()}
                </summary>
                <AcceptedColumns kind={kind} />
              </details>
            ) : null}
            <Button variant="primary" disabled={!kind} onClick={() => setStep('file')}>
              Next: choose the file
            </Button>
          </Card>
        ) : null}

        {step === 'file' && kind ? (
          <Card className="space-y-5 p-4 sm:p-6">
            <StepHeading step="file">Choose the {IMPORT_KIND_LABELS[kind].title.toLowerCase()} file</StepHeading>
            <FileDrop
              disabled={!ctx || progress !== null}
              maxBytes={ctx?.limits.maxBytes ?? 0}
              onFile={(chosen) => {
                setFile(chosen);
                void readFile(chosen, NO_SETTINGS);
              }}
            />
            {progress ? <ProgressBar label={progress.label} share={progress.share} /> : null}
            {readError ? <Notice title="The file cannot be brought in as it is">{readError}</Notice> : null}
            {scan && file ? (
              <div className="space-y-4">
                <Notice
                  tone="info"
                  title={`${file.name}: ${formatNumber(scan.opened.rowsTotal)} rows and ${scan.opened.header.length} columns`}
                >
                  {scan.opened.format === 'xlsx'
                    ? `Workbook, sheet “${scan.opened.sheet}”.`
                    : `Text in ${ENCODING_LABELS[scan.opened.encoding!]}, cells split by ${DELIMITER_LABELS[scan.opened.delimiter!]}.`}{' '}
                  Change how it is read below if the columns look wrong.
                  {scan.opened.notes.map((n) => (
                    <span key={n} className="mt-1 block">
                      {n}
                    </span>
                  ))}
                </Notice>
                {suggestion ? (
                  <Notice
                    tone="caution"
                    title={`This looks like a ${IMPORT_KIND_LABELS[suggestion].title.toLowerCase()}, not a ${IMPORT_KIND_LABELS[kind].title.toLowerCase()}`}
                  >
                    Its columns fit {IMPORT_KIND_LABELS[suggestion].title.toLowerCase()} better.{' '}
                    <Button
                      className="mt-2"
                      onClick={() => {
                        setKind(suggestion);
                        forgetFile();
                      }}
                    >
                      Bring it in as a {IMPORT_KIND_LABELS[suggestion].title.toLowerCase()}
                    </Button>
                  </Notice>
                ) : null}
                <div className="grid gap-3 sm:grid-cols-3">
                  {scan.opened.format === 'xlsx' && scan.opened.sheets ? (
                    <SelectField
                      label="Sheet"
                      value={scan.opened.sheet ?? ''}
                      options={scan.opened.sheets.map((s) => [
                        s.name,
                        `${s.name} (${formatNumber(Math.max(0, s.rows - 1))} rows)`,
                      ])}
                      onChange={(sheet) => void readFile(file, { ...settings, sheet })}
                    />
                  ) : (
                    <>
                      <SelectField
                        label="Characters (encoding)"
                        value={scan.opened.encoding ?? ''}
                        options={TEXT_ENCODINGS.map((e) => [e, ENCODING_LABELS[e]])}
                        onChange={(encoding) =>
                          void readFile(file, { ...settings, encoding: encoding as ReadSettings['encoding'] })
                        }
                      />
                      <SelectField
                        label="Cells split by"
                        value={scan.opened.delimiter ?? ''}
                        options={DELIMITERS.map((d) => [d, DELIMITER_LABELS[d]])}
                        onChange={(delimiter) =>
                          void readFile(file, { ...settings, delimiter: delimiter as ReadSettings['delimiter'] })
                        }
                      />
                    </>
                  )}
                </div>
                <Button variant="primary" onClick={() => setStep('columns')}>
                  Next: match the columns
                </Button>
              </div>
            ) : null}
            <div>
              <Button variant="quiet" onClick={() => setStep('kind')}>
                Back
              </Button>
            </div>
          </Card>
        ) : null}

        {step === 'columns' && kind && scan && ctx ? (
          <Card className="space-y-5 p-4 sm:p-6">
            <StepHeading step="columns">Match the columns</StepHeading>
            <p className="text-ink-muted">
              Kerfline suggests a field for each column from its name, and a unit from the header or from the site’s
              units ({ctx.site.unitSystem}). Times without a zone are read in the site’s zone, {ctx.site.timeZone}.
            </p>
            <ColumnsStep
              kind={kind}
              scan={scan}
              columns={columns}
              onColumns={setColumns}
              unitSystem={ctx.site.unitSystem}
              decimalMark={decimalMark}
              onDecimalMark={setDecimalMark}
              dateGuess={dateGuess}
              dateOrder={dateOrder}
              onDateOrder={setDateOrder}
              rememberedBy={ctx.memory && columns.some((c) => c.field) ? (ctx.memory.updatedByName ?? 'someone') : null}
            />
            {problems.length > 0 ? (
              <Notice title="Before the rows can be checked">
                <ul className="list-disc pl-5">
                  {problems.map((p) => (
                    <li key={p}>{p}</li>
                  ))}
                </ul>
              </Notice>
            ) : null}
            <div className="flex flex-wrap gap-3">
              <Button
                variant="primary"
                disabled={!plan}
                onClick={() => {
                  setStep('rows');
                  void checkRows();
                }}
              >
                Next: check every row
              </Button>
              <Button variant="quiet" onClick={() => setStep('file')}>
                Back
              </Button>
            </div>
          </Card>
        ) : null}

        {step === 'rows' && kind && ctx && plan && file ? (
          <Card className="space-y-6 p-4 sm:p-6">
            <StepHeading step="rows">Check the rows</StepHeading>
            {progress ? <ProgressBar label={progress.label} share={progress.share} /> : null}
            {readError ? <Notice>{readError}</Notice> : null}
            {rows && !progress ? (
              <>
                <RowCounts counts={check.data ?? rows} />
                <ValueMapping
                  kind={kind}
                  unmatched={rows.unmatched}
                  values={values}
                  onValues={(next) => {
                    setValues(next);
                    check.reset();
                  }}
                  context={ctx}
                />
                {rows.unmatched.length > 0 ? (
                  <Button onClick={() => void checkRows()}>Check the rows again with these answers</Button>
                ) : null}
                <PreviewTable kind={kind} columns={columns} preview={check.data?.preview ?? rows.preview} />
                <ProblemList
                  problems={check.data?.problems ?? rows.problems}
                  total={check.data?.problemsTotal ?? rows.problemsTotal}
                />
                <section
                  aria-labelledby="records-heading"
                  className="space-y-3 rounded-sheet border border-rule bg-paper p-4"
                >
                  <h3 id="records-heading" className="text-lg font-bold text-ink">
                    Compare with {ctx.site.name}’s records
                  </h3>
                  <p className="text-sm text-ink-muted">
                    Kerfline reads the file again on the server, skips rows it already has and finds rows that clash
                    with a record (a blade run or stop that overlaps one already kept). Nothing is written yet.
                  </p>
                  {check.data?.earlier.length ? (
                    <Notice tone="caution" title="This same file was brought in before">
                      {check.data.earlier.map((e) => (
                        <Link key={e.id} to={`/imports/${e.id}`} className="block underline">
                          {new Date(e.createdAt).toLocaleString('en-GB')} by {e.createdByName ?? 'someone'} ({e.state})
                        </Link>
                      ))}
                      Rows it added are counted as already in Kerfline and skipped.
                    </Notice>
                  ) : null}
                  {check.isError ? <Notice title="The check did not go through">{check.error.message}</Notice> : null}
                  {commit.isError ? <Notice title="Nothing was brought in">{commit.error.message}</Notice> : null}
                  <div className="flex flex-wrap gap-3">
                    <Button disabled={check.isPending} onClick={() => check.mutate({ file, plan })}>
                      {check.isPending
                        ? 'Comparing…'
                        : check.data
                          ? 'Compare again'
                          : 'Compare with the site’s records'}
                    </Button>
                    {check.data ? (
                      <Button
                        variant="primary"
                        disabled={commit.isPending || check.data.rowsValid === 0}
                        onClick={() =>
                          commit.mutate(
                            { file, plan },
                            {
                              onSuccess: (result) => {
                                setCommitted(result.batch);
                                setStep('done');
                              },
                            },
                          )
                        }
                      >
                        {commit.isPending
                          ? 'Bringing it in…'
                          : `Bring in ${formatNumber(check.data.rowsValid)} ${check.data.rowsValid === 1 ? 'row' : 'rows'}`}
                      </Button>
                    ) : null}
                  </div>
                  {check.data && check.data.rowsValid === 0 ? (
                    <p className="text-sm font-semibold text-ink">There is nothing new to bring in from this file.</p>
                  ) : null}
                </section>
              </>
            ) : null}
            <Button variant="quiet" onClick={() => setStep('columns')}>
              Back to the columns
            </Button>
          </Card>
        ) : null}

        {step === 'done' && committed && ctx ? (
          <div className="space-y-4">
            <StepHeading step="done">Brought in</StepHeading>
            <CommittedBatch batch={committed} timeZone={ctx.site.timeZone} />
            <div className="flex flex-wrap gap-3">
              <Link
                className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
                to={`/imports?siteId=${siteId}`}
              >
                All imports of {ctx.site.name}
              </Link>
            </div>
          </div>
        ) : null}
      </div>
    </div>
  );
}

/** The import just made, kept current from the cache (taking it back out changes it). */
function CommittedBatch({ batch, timeZone }: { batch: ImportBatch; timeZone: string }) {
  const { data } = useQuery({ ...importDetailQuery(batch.id), initialData: batch });
  return <BatchCard batch={data} timeZone={timeZone} />;
}

function SelectField({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: string;
  options: [string, string][];
  onChange: (value: string) => void;
}) {
  const id = `read-${label.replace(/\W+/g, '-').toLowerCase()}`;
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold text-ink">
        {label}
      </label>
      <select id={id} className={`${inputClass} mt-1`} value={value} onChange={(e) => onChange(e.target.value)}>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </div>
  );
}

/** A drop zone that is also a file button (a phone has nothing to drop): CSV, tab text or .xlsx. */
function FileDrop({
  onFile,
  disabled,
  maxBytes,
}: {
  onFile: (file: File) => void;
  disabled: boolean;
  maxBytes: number;
}) {
  const [over, setOver] = useState(false);
  return (
    <label
      onDragOver={(e) => {
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        const dropped = e.dataTransfer.files[0];
        if (dropped && !disabled) onFile(dropped);
      }}
      className={`flex min-h-32 cursor-pointer flex-col items-center justify-center gap-2 rounded-sheet border-2 border-dashed p-6 text-center ${over ? 'border-accent bg-accent-soft' : 'border-ink-muted bg-paper'}`}
    >
      <span className="text-lg font-bold text-ink">Drop the file here, or choose it</span>
      <span className="text-sm text-ink-muted">
        CSV or tab-separated text from any spreadsheet, or an .xlsx workbook; up to {formatNumber(maxBytes / 1048576)}{' '}
        MB
      </span>
      <input
        type="file"
        accept=".csv,.txt,.tsv,.xlsx,text/csv,text/plain,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
        className="mt-2 text-sm file:mr-3 file:min-h-11 file:rounded-sheet file:border file:border-ink-muted file:bg-card file:px-4 file:font-semibold"
        disabled={disabled}
        onChange={(e) => {
          const chosen = e.target.files?.[0];
          if (chosen) onFile(chosen);
          e.target.value = '';
        }}
      />
    </label>
  );
}
