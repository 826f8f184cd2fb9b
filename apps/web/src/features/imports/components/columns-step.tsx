import { IMPORT_FIELDS, type ImportKind } from '@kerfline/domain/imports/fields';
import { UNITS, defaultUnit } from '@kerfline/domain/imports/units';
import type { ColumnPlan } from '@kerfline/domain/imports/schema';
import type { DateOrderGuess } from '@kerfline/domain/imports/detect';
import { cellText, type DateOrder, type DecimalMark } from '@kerfline/domain/imports/values';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import type { ScanResult } from '../worker/read-file';
import { bothReadings } from './plan-helpers';

/**
 * Matching the file's columns to Kerfline's fields: a suggested field for each column (from its header, or what
 * this site chose last time), a unit for each numeric one, the decimal mark, and the order of dates when the file
 * leaves it open.
 */
export function ColumnsStep({
  kind,
  scan,
  columns,
  onColumns,
  unitSystem,
  decimalMark,
  onDecimalMark,
  dateGuess,
  dateOrder,
  onDateOrder,
  rememberedBy,
}: {
  kind: ImportKind;
  scan: ScanResult;
  columns: ColumnPlan[];
  onColumns: (columns: ColumnPlan[]) => void;
  unitSystem: 'metric' | 'imperial';
  decimalMark: DecimalMark;
  onDecimalMark: (mark: DecimalMark) => void;
  dateGuess: DateOrderGuess;
  dateOrder: DateOrder | null;
  onDateOrder: (order: DateOrder) => void;
  rememberedBy: string | null;
}) {
  const fields = IMPORT_FIELDS[kind];
  const taken = new Map(columns.filter((c) => c.field).map((c) => [c.field!, c.header]));
  const setField = (index: number, key: string) => {
    const field = fields.find((f) => f.key === key);
    onColumns(
      columns.map((c, i) => {
        if (i === index)
          return {
            ...c,
            field: field ? field.key : null,
            unit: field?.quantity
              ? c.unit && UNITS[field.quantity].options.some((o) => o.id === c.unit)
                ? c.unit
                : defaultUnit(field.quantity, unitSystem)
              : null,
          };
        // A field belongs to one column: choosing it here frees it elsewhere.
        return field && c.field === field.key ? { ...c, field: null, unit: null } : c;
      }),
    );
  };
  const setUnit = (index: number, unit: string) => onColumns(columns.map((c, i) => (i === index ? { ...c, unit } : c)));
  const numeric = columns.some((c) => {
    const f = fields.find((x) => x.key === c.field);
    return f && (f.quantity || f.type === 'money' || f.type === 'integer');
  });
  // Different values say more than the first three rows (a log starts with one saw's runs).
  const examples = (i: number) =>
    (scan.distinct[i] ?? [])
      .map((cell) => cellText(cell)?.replace(/^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2}):00$/, '$1 $2') ?? null)
      .filter((v): v is string => v !== null)
      .slice(0, 3);
  const readings = dateGuess.kind === 'ambiguous' ? bothReadings(dateGuess.example) : null;

  return (
    <div className="space-y-6">
      {rememberedBy ? (
        <Notice tone="info">
          Columns with the same names as last time are matched the way {rememberedBy} matched them.
        </Notice>
      ) : null}
      <ol className="space-y-3" aria-label="Columns of the file">
        {columns.map((column, i) => {
          const field = fields.find((f) => f.key === column.field);
          const id = `column-${i}`;
          return (
            <li
              key={`${column.header}-${i}`}
              className="grid gap-3 rounded-sheet border border-rule bg-card p-3 md:grid-cols-[minmax(0,1.2fr)_minmax(0,1fr)_10rem] md:items-center"
            >
              <div className="min-w-0">
                <p className="font-bold break-words text-ink">{column.header}</p>
                <p className="truncate text-sm text-ink-muted">
                  {examples(i).length ? `e.g. ${examples(i).join(' · ')}` : 'empty in the first rows'}
                </p>
              </div>
              <div>
                <label htmlFor={`${id}-field`} className="sr-only">
                  Kerfline field for column {column.header}
                </label>
                <select
                  id={`${id}-field`}
                  className={inputClass}
                  value={column.field ?? ''}
                  onChange={(e) => setField(i, e.target.value)}
                >
                  <option value="">— Leave this column out —</option>
                  {fields.map((f) => (
                    <option key={f.key} value={f.key}>
                      {f.label}
                      {f.required ? ' (needed)' : ''}
                      {taken.has(f.key) && taken.get(f.key) !== column.header ? ` — now “${taken.get(f.key)}”` : ''}
                    </option>
                  ))}
                </select>
              </div>
              <div>
                {field?.quantity ? (
                  <>
                    <label htmlFor={`${id}-unit`} className="sr-only">
                      Unit of column {column.header}
                    </label>
                    <select
                      id={`${id}-unit`}
                      className={inputClass}
                      value={column.unit ?? ''}
                      onChange={(e) => setUnit(i, e.target.value)}
                    >
                      {UNITS[field.quantity].options.map((o) => (
                        <option key={o.id} value={o.id}>
                          in {o.label}
                        </option>
                      ))}
                    </select>
                  </>
                ) : (
                  <span className="sr-only">{field ? 'no unit' : ''}</span>
                )}
              </div>
            </li>
          );
        })}
      </ol>

      {numeric ? (
        <ChoiceGroup
          legend="Decimal mark in the file's numbers"
          hint="Kerfline looked at the numbers and chose one; change it if numbers read wrong below."
        >
          <div className="grid gap-2 sm:grid-cols-2">
            <ChoiceTile
              type="radio"
              name="decimal"
              label="Point: 1,234.5"
              checked={decimalMark === '.'}
              onChange={() => onDecimalMark('.')}
            />
            <ChoiceTile
              type="radio"
              name="decimal"
              label="Comma: 1.234,5"
              checked={decimalMark === ','}
              onChange={() => onDecimalMark(',')}
            />
          </div>
        </ChoiceGroup>
      ) : null}

      {dateGuess.kind === 'ambiguous' ? (
        <ChoiceGroup
          legend={`How is “${dateGuess.example}” written?`}
          hint="Dates like this one read two ways, and nothing in the file settles it. Kerfline reads every such date in the file the way you say."
        >
          <div className="grid gap-2 sm:grid-cols-2">
            <ChoiceTile
              type="radio"
              name="date-order"
              label={readings ? readings.dmy : 'Day first'}
              hint={`Day first (day/month/year)${dateGuess.lean === 'dmy' ? ' — another date in the file points this way' : ''}`}
              checked={dateOrder === 'dmy'}
              onChange={() => onDateOrder('dmy')}
            />
            <ChoiceTile
              type="radio"
              name="date-order"
              label={readings ? readings.mdy : 'Month first'}
              hint={`Month first (month/day/year)${dateGuess.lean === 'mdy' ? ' — another date in the file points this way' : ''}`}
              checked={dateOrder === 'mdy'}
              onChange={() => onDateOrder('mdy')}
            />
          </div>
        </ChoiceGroup>
      ) : null}
      {dateGuess.kind === 'conflicting' ? (
        <Notice tone="caution" title="Dates are written both ways">
          “{dateGuess.dmyExample}” can only be day first, and “{dateGuess.mdyExample}” only month first. Choose the
          order most rows use; rows written the other way will be listed as problems.
          <div className="mt-2 flex flex-wrap gap-2">
            <ChoiceTile
              type="radio"
              name="date-order"
              label="Day first"
              checked={dateOrder === 'dmy'}
              onChange={() => onDateOrder('dmy')}
            />
            <ChoiceTile
              type="radio"
              name="date-order"
              label="Month first"
              checked={dateOrder === 'mdy'}
              onChange={() => onDateOrder('mdy')}
            />
          </div>
        </Notice>
      ) : null}
    </div>
  );
}
