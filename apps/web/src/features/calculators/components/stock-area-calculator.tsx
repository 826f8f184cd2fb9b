import { describeBasis } from '@kerfline/domain/figures/basis';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { STOCK_SHAPE_LABELS, type StockShapeKind } from '@kerfline/domain/stock-area/schema';
import { formatNumber } from '../../../lib/format';
import { Notice } from '../../../lib/ui/notice';
import {
  CORRECT_THE_FIGURES,
  CalculatorLayout,
  Explanation,
  ResultFigure,
  SourceNote,
  WaitingForInput,
} from './calculator-layout';
import { EntryField, FieldGroup } from './entry-field';
import { figure } from './quantities';
import { StockShapeFields } from './stock-shape-fields';
import { DIMENSION_KEYS, SHAPE_DIMENSIONS, SHAPE_AREA_FORMULAS, describeShape, isShapeKind } from './stock-shape';
import { evaluateStockArea, type StockAreaKey } from './stock-area-values';
import { useEntries } from './use-entries';

function initialEntries(): Record<StockAreaKey, string> {
  const start = { shape: 'round_bar', pieceCount: '1' } as Record<StockAreaKey, string>;
  for (const key of DIMENSION_KEYS) start[key] = '';
  return start;
}

/** The area of the cut face of a stock shape, for one piece or a bundle cut in one pass. */
export function StockAreaCalculator({ system }: { system: UnitSystem }) {
  const form = useEntries<StockAreaKey>(system, initialEntries());
  const { errors, formError, result } = evaluateStockArea(form.entries, system);
  const kind: StockShapeKind = isShapeKind(form.entries.shape.text) ? form.entries.shape.text : 'round_bar';

  const fields = (
    <>
      <StockShapeFields form={form} kind={kind} errors={errors} />
      <FieldGroup legend="Bundle">
        <EntryField
          label="Pieces in the bundle"
          hint="Pieces cut together in one pass; 1 for a single bar."
          field={form.bind('pieceCount', null, errors)}
        />
      </FieldGroup>
    </>
  );

  const allDimensionsTyped = SHAPE_DIMENSIONS[kind].every(({ key }) => form.entries[key].text.trim() !== '');
  let body;
  if (result) {
    const bundle = figure('area', result.bundleAreaMm2, system);
    const piece = figure('area', result.pieceAreaMm2, system);
    const stock = describeShape(result.shape, system);
    body = (
      <>
        <ResultFigure
          label={result.pieceCount === 1 ? 'Cut area' : `Cut area of ${formatNumber(result.pieceCount)} pieces`}
          value={bundle.number}
          unit={bundle.unit}
          detail={result.pieceCount === 1 ? undefined : `${piece.text} a piece`}
        />
        <Explanation>
          {result.pieceCount === 1
            ? `One cut through this ${stock} cuts ${bundle.text} of metal.`
            : `One pass through ${formatNumber(result.pieceCount)} pieces of this ${stock} cuts ${bundle.text} of metal (${piece.text} each).`}
        </Explanation>
      </>
    );
  } else if (formError) {
    body = <Notice title="This stock cannot be worked out">{formError}</Notice>;
  } else {
    body = (
      <WaitingForInput>
        {allDimensionsTyped ? CORRECT_THE_FIGURES : 'Enter the size of the stock to see the area of its cut face.'}
      </WaitingForInput>
    );
  }

  return (
    <CalculatorLayout
      title="Cut area of a stock shape"
      intro="Blade life and cost are measured per area cut. Enter the stock, and the pieces if you cut a bundle."
      form={fields}
      result={
        <>
          {body}
          <SourceNote>
            {STOCK_SHAPE_LABELS[kind]}: area = {SHAPE_AREA_FORMULAS[kind]}. {result ? result.how.note : ''}
            {result?.how.basis ? ` ${describeBasis(result.how.basis)}.` : ''}
          </SourceNote>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
