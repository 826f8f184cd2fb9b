import { z } from 'zod';
import { UNIT_SYSTEMS } from '../sites/schema.js';

/** Material groups the band speed table covers. */
export const MATERIAL_GROUPS = [
  'carbon_steel',
  'alloy_steel',
  'stainless_steel',
  'tool_steel',
  'aluminium',
  'copper_alloy',
  'cast_iron',
] as const;
export type MaterialGroup = (typeof MATERIAL_GROUPS)[number];

/** Names shown to users. */
export const MATERIAL_GROUP_LABELS: Record<MaterialGroup, string> = {
  carbon_steel: 'carbon steel',
  alloy_steel: 'alloy steel',
  stainless_steel: 'stainless steel',
  tool_steel: 'tool steel',
  aluminium: 'aluminium',
  copper_alloy: 'copper alloys',
  cast_iron: 'cast iron',
};

export const materialGroupSchema = z.enum(MATERIAL_GROUPS, {
  message: `Choose a material group: ${MATERIAL_GROUPS.map((g) => MATERIAL_GROUP_LABELS[g]).join(', ')}`,
});

const speed = (label: string) =>
  z
    .number({ message: `${label} must be a number (m/min)` })
    .positive({ message: `${label} must be greater than 0` })
    .max(5000, { message: `${label} must be at most 5000 m/min` });

/** A saw's band speed range, m/min. */
export const sawSpeedRangeSchema = z
  .object({ minMPerMin: speed('Lowest band speed'), maxMPerMin: speed('Highest band speed') })
  .refine((v) => v.minMPerMin <= v.maxMPerMin, {
    path: ['maxMPerMin'],
    message: 'Highest band speed must not be below the lowest',
  });
export type SawSpeedRange = z.infer<typeof sawSpeedRangeSchema>;

/** Band speed check: material, the speed set (m/min) and the saw's range; the unit system only shapes the wording. */
export const bandSpeedCheckInputSchema = z.object({
  materialGroup: materialGroupSchema,
  speedMPerMin: speed('Band speed'),
  sawRange: sawSpeedRangeSchema,
  unitSystem: z.enum(UNIT_SYSTEMS, { message: 'Choose metric or imperial' }).default('metric'),
});
export type BandSpeedCheckForm = z.input<typeof bandSpeedCheckInputSchema>;
