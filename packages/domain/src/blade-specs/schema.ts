import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { currencySchema } from '../sites/schema.js';
import { BLADE_MATERIALS } from '../checks/schema.js';
import { pitchSchema } from '../teeth-in-work/schema.js';
import { moneyMinorSchema, queryFlagSchema } from '../records/schema.js';

/**
 * A blade spec describes a blade product line generically: band size, tooth pitch, tooth form and set, blade
 * material and unit cost. The catalogue has two parts: fleet-wide specs (`siteId` null) kept by admins and
 * offered to every site, and a site's own additions (`siteId` set) kept by that site's admins.
 */

/** Tooth forms the trade names: regular (0° rake), hook (positive rake, coarse cuts), skip (wide gullet). */
export const TOOTH_FORMS = ['regular', 'hook', 'skip', 'other'] as const;
export type ToothForm = (typeof TOOTH_FORMS)[number];
export const TOOTH_FORM_LABELS: Record<ToothForm, string> = {
  regular: 'Regular',
  hook: 'Hook',
  skip: 'Skip',
  other: 'Other',
};

/** Tooth set patterns the trade names. */
export const TOOTH_SETS = ['raker', 'wavy', 'alternate', 'other'] as const;
export type ToothSet = (typeof TOOTH_SETS)[number];
export const TOOTH_SET_LABELS: Record<ToothSet, string> = {
  raker: 'Raker',
  wavy: 'Wavy',
  alternate: 'Alternate',
  other: 'Other',
};

export const BLADE_MATERIAL_LABELS: Record<(typeof BLADE_MATERIALS)[number], string> = {
  carbon: 'Carbon steel',
  bimetal: 'Bi-metal',
  carbide_tipped: 'Carbide tipped',
};

const mm = (label: string, max: number) =>
  z
    .number({ message: `${label} must be a number (mm)` })
    .positive({ message: `${label} must be greater than 0` })
    .max(max, { message: `${label} must be at most ${max} mm` });

export const bladeSpecSchema = z.object({
  id: idSchema,
  /** Null: a fleet-wide spec; set: a spec the site added for itself. */
  siteId: idSchema.nullable(),
  name: z.string(),
  widthMm: z.number(),
  thicknessMm: z.number(),
  lengthMm: z.number(),
  pitch: pitchSchema,
  toothForm: z.enum(TOOTH_FORMS),
  toothSet: z.enum(TOOTH_SETS),
  material: z.enum(BLADE_MATERIALS),
  unitCostMinor: z.number().int(),
  currency: z.string(),
  supplier: z.string().nullable(),
  /** Archived specs stay on the records that used them but are no longer offered for new blades. */
  archived: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type BladeSpec = z.infer<typeof bladeSpecSchema>;

const bladeSpecFieldShapes = {
  siteId: idSchema.nullable(),
  name: text(120),
  widthMm: mm('Width', 200),
  thicknessMm: mm('Thickness', 5),
  lengthMm: mm('Length', 30000),
  pitch: pitchSchema,
  toothForm: z.enum(TOOTH_FORMS, { message: `Tooth form must be one of ${TOOTH_FORMS.join(', ')}` }),
  toothSet: z.enum(TOOTH_SETS, { message: `Tooth set must be one of ${TOOTH_SETS.join(', ')}` }),
  material: z.enum(BLADE_MATERIALS, { message: `Blade material must be one of ${BLADE_MATERIALS.join(', ')}` }),
  unitCostMinor: moneyMinorSchema('Unit cost'),
  currency: currencySchema,
  supplier: text(120).nullable(),
  archived: z.boolean({ message: 'archived must be true or false' }),
};

function specIssues(v: { widthMm?: number; thicknessMm?: number }): { path: string; message: string }[] {
  if (v.widthMm !== undefined && v.thicknessMm !== undefined && v.thicknessMm >= v.widthMm)
    return [{ path: 'thicknessMm', message: 'Thickness must be smaller than the width' }];
  return [];
}
export { specIssues as bladeSpecIssues };

export const bladeSpecCreateSchema = z
  .object({
    ...bladeSpecFieldShapes,
    siteId: bladeSpecFieldShapes.siteId.default(null),
    supplier: bladeSpecFieldShapes.supplier.default(null),
    archived: bladeSpecFieldShapes.archived.default(false),
  })
  .superRefine((v, ctx) => {
    for (const i of specIssues(v)) ctx.addIssue({ code: 'custom', path: [i.path], message: i.message });
  });
export type BladeSpecCreate = z.input<typeof bladeSpecCreateSchema>;
export type BladeSpecCreateParsed = z.output<typeof bladeSpecCreateSchema>;

/** Any subset of the fields except the owner: a spec stays fleet-wide or stays with its site. */
export const bladeSpecUpdateSchema = z
  .object(bladeSpecFieldShapes)
  .omit({ siteId: true })
  .partial()
  .strict()
  .superRefine((v, ctx) => {
    for (const i of specIssues(v)) ctx.addIssue({ code: 'custom', path: [i.path], message: i.message });
  });
export type BladeSpecUpdate = z.infer<typeof bladeSpecUpdateSchema>;

export const bladeSpecListQuerySchema = pageQuerySchema.extend({
  /** The specs a site can use: the fleet-wide ones and that site's own. */
  siteId: idSchema.optional(),
  material: z.enum(BLADE_MATERIALS).optional(),
  /** Matches the name or the supplier, case-insensitively. */
  q: z.string().trim().max(80).optional(),
  includeArchived: queryFlagSchema.default(false),
});
export type BladeSpecListQuery = z.infer<typeof bladeSpecListQuerySchema>;

/** A spec as other records name it in lists. */
export const bladeSpecRefSchema = bladeSpecSchema.pick({
  id: true,
  siteId: true,
  name: true,
  widthMm: true,
  thicknessMm: true,
  lengthMm: true,
  pitch: true,
  material: true,
});
export type BladeSpecRef = z.infer<typeof bladeSpecRefSchema>;

/** "4/6 TPI" or "3 TPI". */
export function pitchLabel(pitch: z.infer<typeof pitchSchema>): string {
  return pitch.kind === 'constant' ? `${pitch.tpi} TPI` : `${pitch.coarseTpi}/${pitch.fineTpi} TPI`;
}
