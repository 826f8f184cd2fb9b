import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { bundleCutAreaMm2, cutFaceArea, type CutFaceArea } from '@kerfline/domain/stock-area/cut-area';
import { stockCutSchema, type StockShape } from '@kerfline/domain/stock-area/schema';
import { readNumber, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import { dimensionAt, isShapeKind, readShapeDimensions, type DimensionKey } from './stock-shape';
import type { FieldErrors } from './use-entries';

export type StockAreaKey = 'shape' | DimensionKey | 'pieceCount';

export interface StockAreaResult {
  shape: StockShape;
  pieceCount: number;
  /** One piece's cut face, mm². */
  pieceAreaMm2: number;
  /** All the pieces cut in one pass, mm². */
  bundleAreaMm2: number;
  /** How the area was taken (a standard section's printed area, AISC's HSS rule, or the geometry) and its source. */
  how: Pick<CutFaceArea, 'basis' | 'designation' | 'note'>;
}

export interface StockAreaEvaluation {
  errors: FieldErrors<StockAreaKey>;
  formError: string | null;
  result: StockAreaResult | null;
}

/** Area of the cut face of one piece and of a bundle, from the stock entered (checked by the cut schema, in mm). */
export function evaluateStockArea(entries: Record<StockAreaKey, Entry>, system: UnitSystem): StockAreaEvaluation {
  const errors: FieldErrors<StockAreaKey> = {};
  const kind = entries.shape.text;
  if (!isShapeKind(kind)) return { errors: { shape: 'Choose a stock shape' }, formError: null, result: null };

  const shape = readShapeDimensions(kind, entries, errors);
  const countReading = readNumber(entries.pieceCount.text);
  // Left empty, one piece, as the schema's default.
  const pieceCount =
    countReading.kind === 'empty' ? 1 : take(countReading, 'pieceCount', 'Pieces in the bundle', errors);
  const parsed = stockCutSchema.safeParse({ shape, pieceCount });
  if (!parsed.success) {
    placeIssues(
      parsed.error.issues,
      (path) => (path[0] === 'shape' ? dimensionAt(path) : path[0] === 'pieceCount' ? 'pieceCount' : undefined),
      errors,
      system,
    );
  }
  if (!parsed.success || hasErrors(errors)) return { errors, formError: null, result: null };

  const cut = parsed.data;
  const worked = compute(() => {
    const piece = cutFaceArea(cut.shape);
    return {
      pieceAreaMm2: piece.areaMm2,
      bundleAreaMm2: bundleCutAreaMm2(cut.shape, cut.pieceCount),
      how: { basis: piece.basis, designation: piece.designation, note: piece.note },
    };
  });
  if (!worked.ok) return { errors, formError: worked.message, result: null };
  return { errors, formError: null, result: { shape: cut.shape, pieceCount: cut.pieceCount, ...worked.value } };
}
