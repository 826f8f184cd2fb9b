import { STOCK_SHAPE_KINDS, type StockShapeKind } from '@kerfline/domain/stock-area/schema';
import {
  DIMENSION_KEYS,
  SHAPE_DIMENSIONS,
  SHAPE_OPTIONS,
  SHAPE_ORIENTATION,
  describeShape,
  type DimensionKey,
} from '../../../lib/stock-shapes';
import { readQuantity, type Entry } from './quantities';
import { take } from './readings';
import type { FieldErrors } from './use-entries';

export { DIMENSION_KEYS, SHAPE_DIMENSIONS, SHAPE_OPTIONS, SHAPE_ORIENTATION, describeShape, type DimensionKey };

/**
 * The area formula of each shape as the domain's cut-area functions state it (t: the design wall of a tube, r: the
 * root radius of a beam or channel).
 */
export const SHAPE_AREA_FORMULAS: Record<StockShapeKind, string> = {
  round_bar: 'π·D²/4',
  square_bar: 'side²',
  flat_bar: 'width × height',
  round_tube: 'π·wall·(OD − wall)',
  square_tube: '4t·side − (16 − 3π)t², t = 0.93 × nominal wall',
  rect_tube: '2t(W + H) − (16 − 3π)t², t = 0.93 × nominal wall',
  angle: 't(A + B − t)',
  channel: '2·b·tf + (d − 2tf)·tw + 2(1 − π/4)r²',
  beam: '2·b·tf + (d − 2tf)·tw + 4(1 − π/4)r²',
};

export function isShapeKind(value: string): value is StockShapeKind {
  return (STOCK_SHAPE_KINDS as readonly string[]).includes(value);
}

/**
 * Reads the dimensions of the chosen shape, in mm, into the object the domain's shape schema parses. Fields
 * that cannot be read get their message and are left out (the schema then has nothing to add about them).
 */
export function readShapeDimensions<K extends string>(
  kind: StockShapeKind,
  entries: Record<DimensionKey, Entry>,
  errors: FieldErrors<K | DimensionKey>,
): Record<string, unknown> {
  const candidate: Record<string, unknown> = { kind };
  for (const { key, label } of SHAPE_DIMENSIONS[kind]) {
    candidate[key] = take(readQuantity(entries[key], 'length'), key, label, errors);
  }
  return candidate;
}

/** The dimension a schema issue under `shape` points at, e.g. ['shape', 'wallMm'] → 'wallMm'. */
export function dimensionAt(path: readonly PropertyKey[], offset = 1): DimensionKey | undefined {
  const key = path[offset];
  return typeof key === 'string' && (DIMENSION_KEYS as readonly string[]).includes(key)
    ? (key as DimensionKey)
    : undefined;
}
