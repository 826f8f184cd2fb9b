/** The shop calculators, in the order they are offered; `slug` is the last part of each one's address. */
export const CALCULATORS = [
  {
    slug: 'teeth-in-work',
    title: 'Teeth in the work and pitch',
    short: 'Teeth in work',
    summary: 'How many teeth cut at once in a stock size, and the pitches that suit it best.',
  },
  {
    slug: 'band-length',
    title: 'Band length',
    short: 'Band length',
    summary: 'The band length two wheels take, or the centre distance a band needs.',
  },
  {
    slug: 'band-speed',
    title: 'Band speed for a material',
    short: 'Band speed',
    summary: 'The band speed range for a material, and whether a set speed is in it.',
  },
  {
    slug: 'stock-area',
    title: 'Cut area of a stock shape',
    short: 'Cut area',
    summary: 'The area of the cut face of one piece or a bundle, the measure of blade life.',
  },
  {
    slug: 'break-in',
    title: 'Break-in plan',
    short: 'Break-in',
    summary: 'The feed steps that bring a new blade up to normal cutting, by time or by area cut.',
  },
  {
    slug: 'check-targets',
    title: 'Check targets',
    short: 'Check targets',
    summary: 'Target and tolerance of each maintenance check for a band; pass or fail for a reading.',
  },
] as const;

export type CalculatorSlug = (typeof CALCULATORS)[number]['slug'];

export function isCalculatorSlug(value: string | undefined): value is CalculatorSlug {
  return CALCULATORS.some((calculator) => calculator.slug === value);
}
