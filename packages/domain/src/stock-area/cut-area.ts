import { DomainInputError } from '../errors.js';
/**
 * Area of the cut face of a piece of stock, in mm². Blade life and cost per area cut are measured in this area,
 * so structural sections take the area the published section tables give:
 * - W-shape beams and C-shape channels whose dimensions match a section of the AISC Steel Construction Manual
 *   (15th ed.) take its printed area, root fillets included; other beams and channels add the fillets of the
 *   root radius given, else are computed without fillets (about 1–2 % under a rolled section) and say so;
 * - rectangular and square tube are HSS as AISC computes them: the design wall 0.93 × the nominal wall of an
 *   ERW tube (AISC 360, §B4.2) and an outside corner radius of twice the design wall;
 * - angles keep sharp corners (the AISC Manual's angle areas are t·(A + B − t) to the printed digit).
 *
 * Guards: each function accepts the geometric limit (a tube whose wall is half the outside diameter, which is the
 * solid bar) and throws a `RangeError` naming the field for anything impossible. The user-input schema is stricter.
 */
import { requireCount, requireNonNegative, requirePositive } from '../units/guards.js';
import { inToMm, mmToIn } from '../units/units.js';
import { published, type FigureBasis } from '../figures/basis.js';
import { AISC_360_B4_2, AISC_MANUAL_15_SHAPES } from '../figures/sources.js';
import type { StockShape, StockShapeOf } from './schema.js';
import { findStandardSection } from './standard-sections.js';

/** Design wall of an ERW hollow section: 0.93 × nominal (AISC 360-16, §B4.2). */
export const ERW_DESIGN_WALL_FACTOR = 0.93;
/** AISC takes the outside corner radius of rectangular HSS as twice the design wall. */
export const HSS_CORNER_RADIUS_PER_WALL = 2;

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

/**
 * Design wall of an ERW tube from its nominal wall, mm: 0.93 × nominal, rounded to 0.001 in as the AISC Manual
 * tabulates it (and computes its areas from): 5/16 in → 0.291 in, 3/16 in → 0.174 in.
 */
export function erwDesignWallMm(nominalWallMm: number): number {
  const exact = ERW_DESIGN_WALL_FACTOR * nominalWallMm;
  const rounded = inToMm(Math.round(mmToIn(exact) * 1000) / 1000);
  // A wall under 0.001 in is no tube anyone saws; keep it rather than round it to nothing.
  return rounded > 0 ? rounded : exact;
}

export interface TubeWallOptions {
  /**
   * How the wall was given: `nominal_erw` (default), the nominal wall of an ERW tube, of which AISC takes 0.93 as
   * the design wall; or `design`, the wall itself.
   */
  wall?: 'nominal_erw' | 'design';
}

/**
 * Rectangular tube as AISC computes HSS (mm²): design wall t (0.93 × nominal for ERW, AISC 360 §B4.2) and an
 * outside corner radius 2t (inside t), kept within half the smaller side. The outer rounded rectangle less the
 * inner one: W·H − (4 − π)·ro² − [(W − 2t)(H − 2t) − (4 − π)·ri²]; with ro = 2t this is 2t(W + H) − (16 − 3π)t².
 */
export function rectTubeAreaMm2(
  { widthMm, heightMm, wallMm }: Omit<StockShapeOf<'rect_tube'>, 'kind'>,
  options: TubeWallOptions = {},
): number {
  requirePositive(widthMm, 'Width', 'mm');
  requirePositive(heightMm, 'Height', 'mm');
  requirePositive(wallMm, 'Wall', 'mm');
  requireAtMost(wallMm, Math.min(widthMm, heightMm) / 2, 'Wall cannot be more than half the smaller side');
  const t = (options.wall ?? 'nominal_erw') === 'nominal_erw' ? erwDesignWallMm(wallMm) : wallMm;
  const outer = Math.min(HSS_CORNER_RADIUS_PER_WALL * t, Math.min(widthMm, heightMm) / 2);
  const inner = Math.max(0, outer - t);
  const cornerLoss = 4 - Math.PI;
  return (
    widthMm * heightMm - cornerLoss * outer ** 2 - ((widthMm - 2 * t) * (heightMm - 2 * t) - cornerLoss * inner ** 2)
  );
}

/** Square tube as AISC computes HSS (see `rectTubeAreaMm2`), mm². */
export function squareTubeAreaMm2(
  { sideMm, wallMm }: Omit<StockShapeOf<'square_tube'>, 'kind'>,
  options: TubeWallOptions = {},
): number {
  return rectTubeAreaMm2({ widthMm: sideMm, heightMm: sideMm, wallMm }, options);
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

function checkFlanged({ depthMm, flangeWidthMm, webThicknessMm, flangeThicknessMm, rootRadiusMm }: FlangedDims) {
  requirePositive(depthMm, 'Depth', 'mm');
  requirePositive(flangeWidthMm, 'Flange width', 'mm');
  requirePositive(webThicknessMm, 'Web thickness', 'mm');
  requirePositive(flangeThicknessMm, 'Flange thickness', 'mm');
  if (rootRadiusMm !== undefined) requireNonNegative(rootRadiusMm, 'Root radius', 'mm');
  requireAtMost(2 * flangeThicknessMm, depthMm, 'The two flanges together cannot be thicker than the depth');
  requireAtMost(webThicknessMm, flangeWidthMm, 'Web thickness cannot be more than the flange width');
}

/**
 * Two flanges and a web with `fillets` root fillets of radius r, each adding (1 − π/4)·r² (mm²):
 * 2·b·tf + (d − 2tf)·tw + n·(1 − π/4)·r². A tapered flange enters as its mean thickness.
 */
function flangedWithFilletsMm2(dims: FlangedDims, fillets: number, radiusMm: number): number {
  const { depthMm, flangeWidthMm, webThicknessMm, flangeThicknessMm } = dims;
  return (
    2 * flangeWidthMm * flangeThicknessMm +
    (depthMm - 2 * flangeThicknessMm) * webThicknessMm +
    fillets * (1 - Math.PI / 4) * radiusMm ** 2
  );
}

export interface SectionArea {
  areaMm2: number;
  /** The standard section matched, e.g. "W8X31"; null when none matched. */
  designation: string | null;
  /** Whether the root fillets are in the area. */
  filletsIncluded: boolean;
}

function flangedArea(dims: FlangedDims, family: 'W' | 'C'): SectionArea {
  checkFlanged(dims);
  const fillets = family === 'W' ? 4 : 2;
  const standard = findStandardSection(family, dims);
  if (dims.rootRadiusMm !== undefined) {
    return {
      areaMm2: flangedWithFilletsMm2(dims, fillets, dims.rootRadiusMm),
      designation: standard?.designation ?? null,
      filletsIncluded: dims.rootRadiusMm > 0,
    };
  }
  if (standard) return { areaMm2: standard.areaMm2, designation: standard.designation, filletsIncluded: true };
  return { areaMm2: flangedWithFilletsMm2(dims, fillets, 0), designation: null, filletsIncluded: false };
}

/**
 * Channel (C or U section), mm²: a standard C-shape's printed area when the dimensions match one; else the web,
 * the flanges (mean thickness) and the two root fillets of the radius given, or no fillets without one.
 */
export function channelArea(dims: FlangedDims): SectionArea {
  return flangedArea(dims, 'C');
}

/**
 * I or H beam, mm²: a standard W-shape's printed area when the dimensions match one; else the web, the flanges
 * and the four root fillets of the radius given, or no fillets without one.
 */
export function beamArea(dims: Omit<StockShapeOf<'beam'>, 'kind'>): SectionArea {
  return flangedArea(dims, 'W');
}

/** Channel area, mm² (see `channelArea`). */
export function channelAreaMm2(dims: FlangedDims): number {
  return channelArea(dims).areaMm2;
}

/** I or H beam area, mm² (see `beamArea`). */
export function beamAreaMm2(dims: Omit<StockShapeOf<'beam'>, 'kind'>): number {
  return beamArea(dims).areaMm2;
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

export interface CutFaceArea {
  areaMm2: number;
  /** Printed source of the area's model or figure; null for plain geometry of the dimensions typed. */
  basis: FigureBasis | null;
  /** The standard section matched, e.g. "W8X31", or null. */
  designation: string | null;
  /** One sentence for the user: how the area was taken. */
  note: string;
}

/**
 * Area of the cut face with how it was taken: a standard section's printed area, AISC's HSS rule, or the
 * geometry of the dimensions typed (saying when fillets are left out).
 */
export function cutFaceArea(shape: StockShape): CutFaceArea {
  const areaMm2 = cutFaceAreaMm2(shape);
  if (shape.kind === 'beam' || shape.kind === 'channel') {
    const section = shape.kind === 'beam' ? beamArea(shape) : channelArea(shape);
    if (section.designation !== null && shape.rootRadiusMm === undefined) {
      return {
        areaMm2,
        basis: published(AISC_MANUAL_15_SHAPES),
        designation: section.designation,
        note: `The printed area of ${section.designation}, root fillets included.`,
      };
    }
    return {
      areaMm2,
      basis: null,
      designation: section.designation,
      note: section.filletsIncluded
        ? 'Web and flanges with root fillets of the radius given.'
        : 'Web and flanges without root fillets (a rolled section has about 1–2 % more): enter the root radius, or the dimensions of a standard section.',
    };
  }
  if (shape.kind === 'rect_tube' || shape.kind === 'square_tube') {
    return {
      areaMm2,
      basis: published(AISC_360_B4_2),
      designation: null,
      note: 'As AISC computes HSS: design wall 0.93 × the nominal wall, outside corners of twice that radius.',
    };
  }
  return { areaMm2, basis: null, designation: null, note: 'The geometry of the dimensions given.' };
}

/** Area cut when `pieceCount` equal pieces are cut in one pass (a bundle), in mm². */
export function bundleCutAreaMm2(shape: StockShape, pieceCount: number): number {
  requireCount(pieceCount, 'Pieces');
  return cutFaceAreaMm2(shape) * pieceCount;
}
