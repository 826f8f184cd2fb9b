/**
 * Length of metal a tooth path crosses, in mm: the teeth in the work are this length (in inches) times the TPI.
 *
 * The band runs along one side of the piece while the head feeds down through the other (see the orientations in
 * `stock-area/schema.ts`). As the cut goes down, the length of metal under the band changes, so the model gives a
 * least and a greatest length: too few teeth where it is least strips teeth; too many where it is greatest packs
 * the gullets. The first and last moments of a cut, where the length shrinks to nothing on any shape, are left
 * out: they cannot be avoided by choosing a pitch.
 *
 * - round bar: the chord changes all through the cut, from nothing at the top to D at the centre line and back.
 *   Two figures are given, each named for what it is: the mean over the cut, π·D/4 (the cut face area divided
 *   by D), and the chord at the centre line, D. Published pitch tables read the diameter of a round solid as its
 *   length of cut (Machinery's Handbook, 31st ed., p. 1245), so the pitch choice and the teeth-in-work warnings
 *   use the centre line; the mean over the cut is shown beside it.
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
  /**
   * Lower figure of metal under the band (mm): the least during the cut, except on round bar, where it is the
   * mean over the cut (`minLabel` says which).
   */
  minMm: number;
  /** Greatest length of metal under the band during the cut (mm); gullets pack if it holds too many teeth. */
  maxMm: number;
  /** What `minMm` is, in words: "least" or, on round bar, "mean over the cut". */
  minLabel: string;
  /** What `maxMm` is, in words: "greatest" or, on round bar, "at the centre line". */
  maxLabel: string;
  /**
   * The length the too-few-teeth warning reads (mm): the length of cut a published pitch table reads for a
   * solid (the diameter of a round bar, the side of a square), and the least length for tubes and shapes.
   */
  fewestTeethMm: number;
  /** Where the figures come from, in a sentence for the user. */
  basis: string;
}

const LEAST = 'least';
const GREATEST = 'greatest';

function plain(minMm: number, maxMm: number, basis: string): EngagedLength {
  return { minMm, maxMm, minLabel: LEAST, maxLabel: GREATEST, fewestTeethMm: minMm, basis };
}

/** Every kind is handled (the compiler checks); an unknown kind never gets here, `cutFaceAreaMm2` refuses it first. */
function forOnePiece(shape: StockShape): EngagedLength {
  switch (shape.kind) {
    case 'round_bar':
      return {
        minMm: (Math.PI * shape.diameterMm) / 4,
        maxMm: shape.diameterMm,
        minLabel: 'mean over the cut',
        maxLabel: 'at the centre line',
        fewestTeethMm: shape.diameterMm,
        basis:
          'mean over the cut π·D/4 to the full diameter D at the centre line; pitch tables read the diameter as the length of cut',
      };
    case 'square_bar':
      return plain(shape.sideMm, shape.sideMm, 'the side along the band, all the way down');
    case 'flat_bar':
      return plain(shape.widthMm, shape.widthMm, 'the width along the band, all the way down');
    case 'round_tube': {
      const outerRadiusMm = shape.outsideDiameterMm / 2;
      const boreRadiusMm = outerRadiusMm - shape.wallMm;
      return plain(
        2 * shape.wallMm,
        2 * Math.sqrt(outerRadiusMm ** 2 - boreRadiusMm ** 2),
        'two walls at the centre line; the chord through the solid top just above the bore',
      );
    }
    case 'square_tube':
      return plain(2 * shape.wallMm, shape.sideMm, 'two side walls; the full side through the top and bottom');
    case 'rect_tube':
      return plain(2 * shape.wallMm, shape.widthMm, 'two side walls; the full width through the top and bottom');
    case 'angle':
      return plain(shape.thicknessMm, shape.legOnBedMm, 'the standing leg’s thickness; the full leg on the bed');
    case 'channel':
      return plain(2 * shape.flangeThicknessMm, shape.depthMm, 'the two flanges; the full depth through the web');
    case 'beam':
      return plain(shape.webThicknessMm, shape.flangeWidthMm, 'the web; the full flange width through the flanges');
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
    ...one,
    minMm: one.minMm * piecesAcross,
    maxMm: one.maxMm * piecesAcross,
    fewestTeethMm: one.fewestTeethMm * piecesAcross,
    basis: `${one.basis}; ${piecesAcross} pieces side by side`,
  };
}
