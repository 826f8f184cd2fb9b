import {
  STOCK_SHAPE_KINDS,
  STOCK_SHAPE_LABELS,
  type StockShape,
  type StockShapeKind,
} from '@kerfline/domain/stock-area/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatLength, formatLengthValue } from './format';

/**
 * The stock shapes as forms and calculators ask for them: each shape's dimensions in drawing order, how it lies
 * on the saw, and a shape named as a person says it. Lengths in mm, as the domain's shape schema names them.
 */

/** Every dimension any stock shape has, named as the domain's shape schema names them (all in mm). */
export const DIMENSION_KEYS = [
  'diameterMm',
  'sideMm',
  'widthMm',
  'heightMm',
  'outsideDiameterMm',
  'wallMm',
  'legOnBedMm',
  'legUpMm',
  'thicknessMm',
  'depthMm',
  'flangeWidthMm',
  'webThicknessMm',
  'flangeThicknessMm',
] as const;
export type DimensionKey = (typeof DIMENSION_KEYS)[number];

type Dimension = { key: DimensionKey; label: string };

// Labels match the names the domain's messages use ("Wall must be less than half the side…").
const flanged: Dimension[] = [
  { key: 'depthMm', label: 'Depth' },
  { key: 'flangeWidthMm', label: 'Flange width' },
  { key: 'webThicknessMm', label: 'Web thickness' },
  { key: 'flangeThicknessMm', label: 'Flange thickness' },
];

/** The dimensions of each shape, in the order a person reads them off a drawing. */
export const SHAPE_DIMENSIONS: Record<StockShapeKind, readonly Dimension[]> = {
  round_bar: [{ key: 'diameterMm', label: 'Diameter' }],
  square_bar: [{ key: 'sideMm', label: 'Side' }],
  flat_bar: [
    { key: 'widthMm', label: 'Width' },
    { key: 'heightMm', label: 'Height' },
  ],
  round_tube: [
    { key: 'outsideDiameterMm', label: 'Outside diameter' },
    { key: 'wallMm', label: 'Wall' },
  ],
  square_tube: [
    { key: 'sideMm', label: 'Side' },
    { key: 'wallMm', label: 'Wall' },
  ],
  rect_tube: [
    { key: 'widthMm', label: 'Width' },
    { key: 'heightMm', label: 'Height' },
    { key: 'wallMm', label: 'Wall' },
  ],
  angle: [
    { key: 'legOnBedMm', label: 'Leg on the bed' },
    { key: 'legUpMm', label: 'Standing leg' },
    { key: 'thicknessMm', label: 'Thickness' },
  ],
  channel: flanged,
  beam: flanged,
};

/** How each shape lies on the saw, which decides the metal under the band (the domain's shape schema). */
export const SHAPE_ORIENTATION: Partial<Record<StockShapeKind, string>> = {
  flat_bar: 'The width lies along the band; the head feeds down through the height.',
  rect_tube: 'The width lies along the band; the head feeds down through the height.',
  angle: 'Lies as an L: one leg flat on the bed along the band, the other standing.',
  channel: 'Web flat on the bed, flanges pointing up: the depth lies along the band.',
  beam: 'Stands upright, web vertical: the flange width lies along the band.',
};

export const SHAPE_OPTIONS = STOCK_SHAPE_KINDS.map((kind) => ({ value: kind, label: STOCK_SHAPE_LABELS[kind] }));

/** A shape as a person names it, in their units: "50 mm round bar", "4 × 2 × 0.25 in rectangular tube". */
export function describeShape(shape: StockShape, system: UnitSystem): string {
  const one = (mm: number) => formatLength(mm, system);
  const several = (...mm: number[]) =>
    `${mm
      .slice(0, -1)
      .map((v) => formatLengthValue(v, system))
      .join(' × ')} × ${one(mm[mm.length - 1]!)}`;
  switch (shape.kind) {
    case 'round_bar':
      return `${one(shape.diameterMm)} round bar`;
    case 'square_bar':
      return `${one(shape.sideMm)} square bar`;
    case 'flat_bar':
      return `${several(shape.widthMm, shape.heightMm)} flat bar`;
    case 'round_tube':
      return `${one(shape.outsideDiameterMm)} round tube with a ${one(shape.wallMm)} wall`;
    case 'square_tube':
      return `${one(shape.sideMm)} square tube with a ${one(shape.wallMm)} wall`;
    case 'rect_tube':
      return `${several(shape.widthMm, shape.heightMm)} rectangular tube with a ${one(shape.wallMm)} wall`;
    case 'angle':
      return `${several(shape.legOnBedMm, shape.legUpMm, shape.thicknessMm)} angle`;
    case 'channel':
      return `${several(shape.depthMm, shape.flangeWidthMm)} channel`;
    case 'beam':
      return `${several(shape.depthMm, shape.flangeWidthMm)} I/H beam`;
  }
}
