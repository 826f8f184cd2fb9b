import { z } from 'zod';

/**
 * Stock shapes as a user types them, all dimensions in millimetres.
 *
 * Orientation on the saw matters for teeth in the work, so each shape's fields say how the piece lies:
 * "along the band" is the side the teeth travel across; the head feeds down through the other side.
 * - flat bar and rectangular tube: `widthMm` lies along the band, `heightMm` is fed through;
 * - angle: lies as an L, `legOnBedMm` flat on the bed along the band, `legUpMm` standing;
 * - channel: web flat on the bed, flanges pointing up, so the depth lies along the band;
 * - I/H beam: stands upright (web vertical), so the flange width lies along the band.
 * See `cut-area.ts` for how fillets and tube corners are taken into the area.
 */
export const STOCK_SHAPE_KINDS = [
  'round_bar',
  'square_bar',
  'flat_bar',
  'round_tube',
  'square_tube',
  'rect_tube',
  'angle',
  'channel',
  'beam',
] as const;
export type StockShapeKind = (typeof STOCK_SHAPE_KINDS)[number];

/** Names shown to users for each shape. */
export const STOCK_SHAPE_LABELS: Record<StockShapeKind, string> = {
  round_bar: 'Round bar',
  square_bar: 'Square bar',
  flat_bar: 'Flat bar',
  round_tube: 'Round tube',
  square_tube: 'Square tube',
  rect_tube: 'Rectangular tube',
  angle: 'Angle',
  channel: 'Channel',
  beam: 'I/H beam',
};

/** Largest dimension accepted, in mm: beyond any production band saw's capacity, so a typo in the units shows. */
export const MAX_STOCK_DIMENSION_MM = 3000;
/** Most pieces in one bundle cut. */
export const MAX_BUNDLE_PIECES = 500;

const dimensionMm = (label: string) =>
  z
    .number({ message: `${label} must be a number (mm)` })
    .positive({ message: `${label} must be greater than 0` })
    .max(MAX_STOCK_DIMENSION_MM, { message: `${label} must be at most ${MAX_STOCK_DIMENSION_MM} mm` });

const roundBarSchema = z.object({ kind: z.literal('round_bar'), diameterMm: dimensionMm('Diameter') });

const squareBarSchema = z.object({ kind: z.literal('square_bar'), sideMm: dimensionMm('Side') });

const flatBarSchema = z.object({
  kind: z.literal('flat_bar'),
  widthMm: dimensionMm('Width'),
  heightMm: dimensionMm('Height'),
});

const roundTubeSchema = z
  .object({
    kind: z.literal('round_tube'),
    outsideDiameterMm: dimensionMm('Outside diameter'),
    wallMm: dimensionMm('Wall'),
  })
  .refine((v) => v.wallMm < v.outsideDiameterMm / 2, {
    path: ['wallMm'],
    message: 'Wall must be less than half the outside diameter (with no bore left it is a round bar)',
  });

const squareTubeSchema = z
  .object({ kind: z.literal('square_tube'), sideMm: dimensionMm('Side'), wallMm: dimensionMm('Wall') })
  .refine((v) => v.wallMm < v.sideMm / 2, {
    path: ['wallMm'],
    message: 'Wall must be less than half the side (with no bore left it is a square bar)',
  });

const rectTubeSchema = z
  .object({
    kind: z.literal('rect_tube'),
    widthMm: dimensionMm('Width'),
    heightMm: dimensionMm('Height'),
    wallMm: dimensionMm('Wall'),
  })
  .refine((v) => v.wallMm < Math.min(v.widthMm, v.heightMm) / 2, {
    path: ['wallMm'],
    message: 'Wall must be less than half the smaller side (with no bore left it is a flat bar)',
  });

const angleSchema = z
  .object({
    kind: z.literal('angle'),
    legOnBedMm: dimensionMm('Leg on the bed'),
    legUpMm: dimensionMm('Standing leg'),
    thicknessMm: dimensionMm('Thickness'),
  })
  .refine((v) => v.thicknessMm < Math.min(v.legOnBedMm, v.legUpMm), {
    path: ['thicknessMm'],
    message: 'Thickness must be less than each leg',
  });

/**
 * Channel and beam share their fields: depth, flange width, web and flange thickness, and optionally the root
 * radius (the fillet between web and flange); a standard section's dimensions bring their printed area.
 */
const flangedFields = {
  depthMm: dimensionMm('Depth'),
  flangeWidthMm: dimensionMm('Flange width'),
  webThicknessMm: dimensionMm('Web thickness'),
  flangeThicknessMm: dimensionMm('Flange thickness'),
  rootRadiusMm: z
    .number({ message: 'Root radius must be a number (mm)' })
    .min(0, { message: 'Root radius must not be negative' })
    .max(200, { message: 'Root radius must be at most 200 mm' })
    .optional(),
};

function flangedIssues(v: {
  depthMm: number;
  flangeWidthMm: number;
  webThicknessMm: number;
  flangeThicknessMm: number;
}) {
  const issues: { path: string; message: string }[] = [];
  if (2 * v.flangeThicknessMm >= v.depthMm) {
    issues.push({ path: 'flangeThicknessMm', message: 'The two flanges together must be thinner than the depth' });
  }
  if (v.webThicknessMm >= v.flangeWidthMm) {
    issues.push({ path: 'webThicknessMm', message: 'Web thickness must be less than the flange width' });
  }
  return issues;
}

const channelSchema = z.object({ kind: z.literal('channel'), ...flangedFields }).superRefine((v, ctx) => {
  for (const issue of flangedIssues(v)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
});

const beamSchema = z.object({ kind: z.literal('beam'), ...flangedFields }).superRefine((v, ctx) => {
  for (const issue of flangedIssues(v)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
});

/** One piece of stock as typed into a calculator or a cut log (mm inside). */
export const stockShapeSchema = z.discriminatedUnion(
  'kind',
  [
    roundBarSchema,
    squareBarSchema,
    flatBarSchema,
    roundTubeSchema,
    squareTubeSchema,
    rectTubeSchema,
    angleSchema,
    channelSchema,
    beamSchema,
  ],
  { message: `Choose a stock shape: ${STOCK_SHAPE_KINDS.join(', ')}` },
);
export type StockShape = z.infer<typeof stockShapeSchema>;
/** The fields of one shape kind, e.g. `StockShapeOf<'round_tube'>`. */
export type StockShapeOf<K extends StockShapeKind> = Extract<StockShape, { kind: K }>;

/**
 * A cut of one piece or a bundle. `pieceCount` pieces are cut at once; `piecesAcross` of them lie side by side
 * along the band (one layer of a bundle), which is what multiplies the teeth in the work.
 */
export const stockCutSchema = z
  .object({
    shape: stockShapeSchema,
    pieceCount: z
      .number({ message: 'Pieces must be a number' })
      .int({ message: 'Pieces must be a whole number' })
      .min(1, { message: 'Pieces must be at least 1' })
      .max(MAX_BUNDLE_PIECES, { message: `Pieces must be at most ${MAX_BUNDLE_PIECES}` })
      .default(1),
    piecesAcross: z
      .number({ message: 'Pieces side by side must be a number' })
      .int({ message: 'Pieces side by side must be a whole number' })
      .min(1, { message: 'Pieces side by side must be at least 1' })
      .default(1),
  })
  .refine((v) => v.piecesAcross <= v.pieceCount, {
    path: ['piecesAcross'],
    message: 'Pieces side by side cannot be more than the pieces in the bundle',
  });
export type StockCut = z.input<typeof stockCutSchema>;
export type StockCutParsed = z.output<typeof stockCutSchema>;
