import { z } from 'zod';

/** Which test flags a saw: the modified z-score, Tukey's fences, either of them, or both together. */
export const OUTLIER_RULES = ['modified_z', 'fences', 'either', 'both'] as const;
export type OutlierRule = (typeof OUTLIER_RULES)[number];

/** What to do when the median absolute deviation is 0 (more than half the group shares one value). */
export const MAD_ZERO_POLICIES = ['mean_absolute_deviation', 'no_flags'] as const;
export type MadZeroPolicy = (typeof MAD_ZERO_POLICIES)[number];

export const OUTLIER_DEFAULTS = {
  /** Iglewicz & Hoaglin (1993): flag |M| > 3.5 (NIST/SEMATECH e-Handbook §1.3.5.17). */
  threshold: 3.5,
  /** Tukey's inner fences at 1.5 × IQR beyond the quartiles. */
  fenceMultiplier: 1.5,
  /** Our choice: fewer than 5 comparable saws are too few to call one of them unusual. */
  minGroupSize: 5,
  rule: 'modified_z' as OutlierRule,
  madZero: 'mean_absolute_deviation' as MadZeroPolicy,
} as const;

export const outlierInputSchema = z
  .object({
    /** One value per saw, e.g. blades used per 1 000 operating hours; the group must be comparable saws. */
    items: z.array(
      z.object({
        id: z.string().min(1, { message: 'Each item needs an id' }),
        value: z.number({ message: 'Each value must be a finite number' }),
      }),
      { message: 'Items must be a list of { id, value }' },
    ),
    minGroupSize: z
      .number()
      .int()
      .min(3, { message: 'Minimum group size must be at least 3' })
      .max(1000)
      .default(OUTLIER_DEFAULTS.minGroupSize),
    threshold: z.number().positive({ message: 'Threshold must be greater than 0' }).default(OUTLIER_DEFAULTS.threshold),
    fenceMultiplier: z
      .number()
      .positive({ message: 'Fence multiplier must be greater than 0' })
      .default(OUTLIER_DEFAULTS.fenceMultiplier),
    rule: z
      .enum(OUTLIER_RULES, { message: `Rule must be one of ${OUTLIER_RULES.join(', ')}` })
      .default(OUTLIER_DEFAULTS.rule),
    madZero: z
      .enum(MAD_ZERO_POLICIES, { message: `MAD-zero policy must be one of ${MAD_ZERO_POLICIES.join(', ')}` })
      .default(OUTLIER_DEFAULTS.madZero),
  })
  .refine((v) => new Set(v.items.map((i) => i.id)).size === v.items.length, {
    path: ['items'],
    message: 'Each item id must appear once',
  });
export type OutlierInput = z.input<typeof outlierInputSchema>;
