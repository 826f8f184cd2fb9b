/**
 * Length of metal a tooth path crosses, in mm: the teeth in the work are this length (in inches) times the TPI.
 *
 * The band runs along one side of the piece while the head feeds down through the other (see the orientations in
 * `stock-area/schema.ts`). As the cut goes down, the length of metal under the band changes, so the model gives a
 * least and a greatest length: too few teeth where it is least strips teeth; too many where it is greatest packs
 * the gullets. The first and last moments of a cut, where the length shrinks to nothing on any shape, are left
 * out: they cannot be avoided by choosing a pitch.
 *
 * - round bar: the chord changes all through the cut. The least is taken as the mean chord, π·D/4 (the cut
 *   face area divided by D), the usual figure for choosing a pitch; the greatest is the full diameter D.
 * - square and flat bar: the side along the band, all the way down.
 * - round tube: through the bore the band crosses the wall twice, least at the centre line where the two
 *   crossings are exactly 2 × wall; greatest just above the bore, the chord 2·√(R² − r²) through the solid top.
 * - square and rectangular tube: 2 × wall through the side walls; the full width through the top and bottom.
 * - angle (an L, one leg on the bed): the standing leg's thickness; the full leg on the bed.
 * - channel (web on the bed, flanges up): the two flange thicknesses; the full depth through the web.
 * - I/H beam (upright): the web thickness; the full flange width through the flanges.
 * A bundle with `piecesAcross` pieces side by side along the band multiplies both lengths.
 */
import { requireCount } from '../units/guards.js';
import { cutFaceAreaMm2 } from '../stock-area/cut-area.js';
import type { StockShape } from '../stock-area/schema.js';

export interface EngagedLength {
  /** Least length of metal under the band during the cut (mm); teeth strip if it holds too few teeth. */
  minMm: number;
  /** Greatest length of metal under the band during the cut (mm); gullets pack if it holds too many. */
  maxMm: number;
  /** Where the least and greatest lengths come from, in a sentence for the user. */
  basis: string;
}

/** Every kind is handled (the compiler checks); an unknown kind never gets here, `cutFaceAreaMm2` refuses it first. */
function forOnePiece(shape: StockShape): EngagedLength {
  switch (shape.kind) {
    case 'round_bar':
      return {
        minMm: (Math.PI * shape.diameterMm) / 4,
        maxMm: shape.diameterMm,
        basis: 'mean chord π·D/4 (used for the pitch); full diameter at the centre',
      };
    case 'square_bar':
      return { minMm: shape.sideMm, maxMm: shape.sideMm, basis: 'the side along the band, all the way down' };
    case 'flat_bar':
      return { minMm: shape.widthMm, maxMm: shape.widthMm, basis: 'the width along the band, all the way down' };
    case 'round_tube': {
      const outerRadiusMm = shape.outsideDiameterMm / 2;
      const boreRadiusMm = outerRadiusMm - shape.wallMm;
      return {
        minMm: 2 * shape.wallMm,
        maxMm: 2 * Math.sqrt(outerRadiusMm ** 2 - boreRadiusMm ** 2),
        basis: 'two walls at the centre line; the chord through the solid top just above the bore',
      };
    }
    case 'square_tube':
      return {
        minMm: 2 * shape.wallMm,
        maxMm: shape.sideMm,
        basis: 'two side walls; the full side through the top and bottom',
      };
    case 'rect_tube':
      return {
        minMm: 2 * shape.wallMm,
        maxMm: shape.widthMm,
        basis: 'two side walls; the full width through the top and bottom',
      };
    case 'angle':
      return {
        minMm: shape.thicknessMm,
        maxMm: shape.legOnBedMm,
        basis: 'the standing leg’s thickness; the full leg on the bed',
      };
    case 'channel':
      return {
        minMm: 2 * shape.flangeThicknessMm,
        maxMm: shape.depthMm,
        basis: 'the two flanges; the full depth through the web',
      };
    case 'beam':
      return {
        minMm: shape.webThicknessMm,
        maxMm: shape.flangeWidthMm,
        basis: 'the web; the full flange width through the flanges',
      };
  }
}

/**
 * Least and greatest length of metal under the band (mm) for a stock shape, times the pieces side by side.
 * The shape is checked first with the same guards as its cut-face area, so impossible dimensions throw a
 * `RangeError` naming the field.
 */
export function engagedLengthMm(shape: StockShape, piecesAcross = 1): EngagedLength {
  requireCount(piecesAcross, 'Pieces side by side');
  cutFaceAreaMm2(shape);
  const one = forOnePiece(shape);
  if (piecesAcross === 1) return one;
  return {
    minMm: one.minMm * piecesAcross,
    maxMm: one.maxMm * piecesAcross,
    basis: `${one.basis}; ${piecesAcross} pieces side by side`,
  };
}
