import { DomainInputError } from '../errors.js';
/**
 * Area of the cut face of a piece of stock, in mm². Blade life and cost per area cut are measured in this area.
 *
 * Model: corners are sharp and root fillets are left out. For rolled structural shapes the root fillets add a
 * little metal (about 1–2 % on a wide-flange beam), and rounded tube corners take a little away; both are small
 * next to the spread of blade life, and sharp corners keep the formulas exact and checkable.
 *
 * Guards: each function accepts the geometric limit (a tube whose wall is half the outside diameter, which is the
 * solid bar) and throws a `RangeError` naming the field for anything impossible. The user-input schema is stricter.
 */
import { requireCount, requirePositive } from '../units/guards.js';
import type { StockShape, StockShapeOf } from './schema.js';

function requireAtMost(value: number, limit: number, message: string): void {
  if (value > limit) throw new DomainInputError(message);
}

/** Solid round bar: π·D²/4 (mm²). */
export function roundBarAreaMm2({ diameterMm }: Omit<StockShapeOf<'round_bar'>, 'kind'>): number {
  requirePositive(diameterMm, 'Diameter', 'mm');
  return (Math.PI * diameterMm * diameterMm) / 4;
}

/** Solid square bar: side² (mm²). */
export function squareBarAreaMm2({ sideMm }: Omit<StockShapeOf<'square_bar'>, 'kind'>): number {
  requirePositive(sideMm, 'Side', 'mm');
  return sideMm * sideMm;
}

/** Flat or rectangular bar: width × height (mm²). */
export function flatBarAreaMm2({ widthMm, heightMm }: Omit<StockShapeOf<'flat_bar'>, 'kind'>): number {
  requirePositive(widthMm, 'Width', 'mm');
  requirePositive(heightMm, 'Height', 'mm');
  return widthMm * heightMm;
}

/** Round tube or pipe: π/4·(OD² − ID²) = π·wall·(OD − wall) (mm²). Wall may equal OD/2 (the solid bar). */
export function roundTubeAreaMm2({ outsideDiameterMm, wallMm }: Omit<StockShapeOf<'round_tube'>, 'kind'>): number {
  requirePositive(outsideDiameterMm, 'Outside diameter', 'mm');
  requirePositive(wallMm, 'Wall', 'mm');
  requireAtMost(wallMm, outsideDiameterMm / 2, 'Wall cannot be more than half the outside diameter');
  return Math.PI * wallMm * (outsideDiameterMm - wallMm);
}

/** Rectangular tube with sharp corners: W·H − (W − 2t)(H − 2t) = 2t(W + H − 2t) (mm²). */
export function rectTubeAreaMm2({ widthMm, heightMm, wallMm }: Omit<StockShapeOf<'rect_tube'>, 'kind'>): number {
  requirePositive(widthMm, 'Width', 'mm');
  requirePositive(heightMm, 'Height', 'mm');
  requirePositive(wallMm, 'Wall', 'mm');
  requireAtMost(wallMm, Math.min(widthMm, heightMm) / 2, 'Wall cannot be more than half the smaller side');
  return 2 * wallMm * (widthMm + heightMm - 2 * wallMm);
}

/** Square tube with sharp corners: 4t(side − t) (mm²). */
export function squareTubeAreaMm2({ sideMm, wallMm }: Omit<StockShapeOf<'square_tube'>, 'kind'>): number {
  return rectTubeAreaMm2({ widthMm: sideMm, heightMm: sideMm, wallMm });
}

/** Angle with sharp corners and no fillets: t(A + B − t) (mm²). */
export function angleAreaMm2({ legOnBedMm, legUpMm, thicknessMm }: Omit<StockShapeOf<'angle'>, 'kind'>): number {
  requirePositive(legOnBedMm, 'Leg on the bed', 'mm');
  requirePositive(legUpMm, 'Standing leg', 'mm');
  requirePositive(thicknessMm, 'Thickness', 'mm');
  requireAtMost(thicknessMm, Math.min(legOnBedMm, legUpMm), 'Thickness cannot be more than either leg');
  return thicknessMm * (legOnBedMm + legUpMm - thicknessMm);
}

type FlangedDims = Omit<StockShapeOf<'channel'>, 'kind'>;

/**
 * Two flanges and a web, parallel flanges, no fillets: 2·b·tf + (d − 2tf)·tw (mm²). Channel and I/H beam have
 * the same formula; they differ only in where the web meets the flanges, which does not change the area.
 */
function flangedAreaMm2({ depthMm, flangeWidthMm, webThicknessMm, flangeThicknessMm }: FlangedDims): number {
  requirePositive(depthMm, 'Depth', 'mm');
  requirePositive(flangeWidthMm, 'Flange width', 'mm');
  requirePositive(webThicknessMm, 'Web thickness', 'mm');
  requirePositive(flangeThicknessMm, 'Flange thickness', 'mm');
  requireAtMost(2 * flangeThicknessMm, depthMm, 'The two flanges together cannot be thicker than the depth');
  requireAtMost(webThicknessMm, flangeWidthMm, 'Web thickness cannot be more than the flange width');
  return 2 * flangeWidthMm * flangeThicknessMm + (depthMm - 2 * flangeThicknessMm) * webThicknessMm;
}

/** Channel (C or U section), parallel flanges, no fillets (mm²). */
export function channelAreaMm2(dims: FlangedDims): number {
  return flangedAreaMm2(dims);
}

/** I or H beam, parallel flanges, no fillets (mm²). Tapered flanges: enter their mean thickness. */
export function beamAreaMm2(dims: Omit<StockShapeOf<'beam'>, 'kind'>): number {
  return flangedAreaMm2(dims);
}

/** Area of the cut face of one piece of any stock shape (mm²). */
export function cutFaceAreaMm2(shape: StockShape): number {
  switch (shape.kind) {
    case 'round_bar':
      return roundBarAreaMm2(shape);
    case 'square_bar':
      return squareBarAreaMm2(shape);
    case 'flat_bar':
      return flatBarAreaMm2(shape);
    case 'round_tube':
      return roundTubeAreaMm2(shape);
    case 'square_tube':
      return squareTubeAreaMm2(shape);
    case 'rect_tube':
      return rectTubeAreaMm2(shape);
    case 'angle':
      return angleAreaMm2(shape);
    case 'channel':
      return channelAreaMm2(shape);
    case 'beam':
      return beamAreaMm2(shape);
    default: {
      const unknown: never = shape;
      throw new DomainInputError(`Unknown stock shape: ${JSON.stringify(unknown)}`);
    }
  }
}

/** Area cut when `pieceCount` equal pieces are cut in one pass (a bundle), in mm². */
export function bundleCutAreaMm2(shape: StockShape, pieceCount: number): number {
  requireCount(pieceCount, 'Pieces');
  return cutFaceAreaMm2(shape) * pieceCount;
}
