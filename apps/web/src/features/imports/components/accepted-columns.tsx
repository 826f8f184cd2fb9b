import { IMPORT_FIELDS, type ImportKind } from '@kerfline/domain/imports/fields';
import { UNITS } from '@kerfline/domain/imports/units';

/** The columns Kerfline takes for a kind of file, with the units and words it understands: shown before a file. */
export function AcceptedColumns({ kind }: { kind: ImportKind }) {
  const fields = IMPORT_FIELDS[kind];
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Columns Kerfline takes for this kind of file</caption>
        <thead className="border-b border-rule text-ink-muted">
          <tr>
            <th scope="col" className="py-2 pr-4 font-semibold">
              Column
            </th>
            <th scope="col" className="py-2 pr-4 font-semibold">
              Needed
            </th>
            <th scope="col" className="py-2 pr-4 font-semibold">
              Units or values
            </th>
            <th scope="col" className="hidden py-2 font-semibold md:table-cell">
              Headers it recognises (examples)
            </th>
          </tr>
        </thead>
        <tbody>
          {fields.map((field) => (
            <tr key={field.key} className="border-b border-rule align-top last:border-0">
              <th scope="row" className="py-2 pr-4 font-semibold text-ink">
                {field.label}
                {field.hint ? <span className="block font-normal text-ink-muted">{field.hint}</span> : null}
              </th>
              <td className="py-2 pr-4">{field.required ? 'Every row' : 'If known'}</td>
              <td className="py-2 pr-4">
                {field.quantity
                  ? UNITS[field.quantity].options.map((o) => o.label).join(', ')
                  : field.choice
                    ? field.choice.values.map((v) => field.choice!.labels[v] ?? v).join(', ')
                    : field.type === 'datetime' || field.type === 'date'
                      ? '2023-03-04, 04/03/2023, 4 Mar 2023, spreadsheet dates'
                      : field.type === 'money'
                        ? 'amount, decimal point or comma'
                        : field.type === 'reading'
                          ? 'mm or in, N or lbf, MPa or psi: by the check'
                          : '—'}
              </td>
              <td className="hidden py-2 text-ink-muted md:table-cell">{field.synonyms.slice(0, 6).join(', ')}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
