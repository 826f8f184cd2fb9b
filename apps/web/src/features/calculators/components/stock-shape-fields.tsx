import type { StockShapeKind } from '@kerfline/domain/stock-area/schema';
import { ChoiceField, EntryField } from './entry-field';
import { SHAPE_DIMENSIONS, SHAPE_OPTIONS, SHAPE_ORIENTATION, type DimensionKey } from './stock-shape';
import type { EntriesForm, FieldErrors } from './use-entries';

/** The stock shape and the dimensions that shape has, in the user's length unit. */
export function StockShapeFields<K extends string>({
  form,
  kind,
  errors,
}: {
  form: EntriesForm<K | 'shape' | DimensionKey>;
  kind: StockShapeKind;
  errors: FieldErrors<K | 'shape' | DimensionKey>;
}) {
  return (
    <fieldset className="grid gap-4 sm:grid-cols-2">
      <legend className="mb-2 text-sm font-bold tracking-wider text-ink-muted uppercase">Stock</legend>
      <ChoiceField
        label="Shape"
        hint={SHAPE_ORIENTATION[kind]}
        field={form.bind('shape', null, errors)}
        options={SHAPE_OPTIONS}
        className="sm:col-span-2"
      />
      {SHAPE_DIMENSIONS[kind].map(({ key, label }) => (
        <EntryField key={key} label={label} field={form.bind(key, 'length', errors)} />
      ))}
    </fieldset>
  );
}
