/**
 * Colours for sites on charts: the Okabe–Ito set (Okabe & Ito, "Color Universal Design", 2008), readable by the
 * common kinds of colour blindness, in a fixed order. A site's slot comes from the API (`siteMarkSlots` in the
 * domain: its place among the company's sites), so it keeps its colour on every chart and for every reader; each
 * slot also has its own point shape, so a line is told apart without colour (SITE_MARKS = 8 colours × 4 shapes).
 * Yellow comes last: it is the faintest on paper.
 */
export const OKABE_ITO = [
  { name: 'blue', hex: '#0072B2' },
  { name: 'vermillion', hex: '#D55E00' },
  { name: 'bluish green', hex: '#009E73' },
  { name: 'orange', hex: '#E69F00' },
  { name: 'reddish purple', hex: '#CC79A7' },
  { name: 'sky blue', hex: '#56B4E9' },
  { name: 'black', hex: '#000000' },
  { name: 'yellow', hex: '#F0E442' },
] as const;

export const POINT_SHAPES = ['circle', 'square', 'triangle', 'diamond'] as const;
export type PointShape = (typeof POINT_SHAPES)[number];

export function siteColour(slot: number): string {
  return OKABE_ITO[slot % OKABE_ITO.length]!.hex;
}

/** The shape steps on with every slot, and once more each time the colours come round, so no two of the first 32 slots match. */
export function siteShape(slot: number): PointShape {
  return POINT_SHAPES[(slot + Math.floor(slot / OKABE_ITO.length)) % POINT_SHAPES.length]!;
}

/** Stop categories have their own fixed colours (the same set, so a stacked bar stays readable). */
export const CATEGORY_COLOURS = [
  '#0072B2',
  '#D55E00',
  '#009E73',
  '#E69F00',
  '#CC79A7',
  '#56B4E9',
  '#000000',
  '#F0E442',
] as const;
