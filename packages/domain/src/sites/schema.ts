import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';

export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z
  .string()
  .trim()
  .refine(isTimeZone, { message: 'must be an IANA time zone such as Europe/Berlin or America/Chicago' });

/** ISO 4217 alphabetic code. */
export const currencySchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z]{3}$/, { message: 'must be a three-letter ISO 4217 currency code such as EUR or USD' });

export const siteSchema = z.object({
  id: idSchema,
  regionId: idSchema,
  code: z.string(),
  name: z.string(),
  city: z.string().nullable(),
  timeZone: z.string(),
  currency: z.string(),
  unitSystem: z.enum(UNIT_SYSTEMS),
  /** Saws at the site that are not retired; filled by list and detail reads. */
  activeSawCount: z.number().int().min(0),
  /** When the site was retired: it keeps its history but leaves pickers and lists. Null while in use. */
  retiredAt: z.iso.datetime().nullable(),
});
export type Site = z.infer<typeof siteSchema>;

/** Editable fields without defaults, so an update leaves what it does not name alone. */
const siteEditableShapes = {
  name: text(120),
  city: text(120).nullable(),
  timeZone: timeZoneSchema,
  currency: currencySchema,
  unitSystem: z.enum(UNIT_SYSTEMS),
};

export const siteCreateSchema = z.object({
  ...siteEditableShapes,
  regionId: idSchema,
  code: text(12).regex(/^[A-Z0-9-]+$/, { message: 'use capital letters, digits and dashes only' }),
  city: siteEditableShapes.city.default(null),
});
export type SiteCreate = z.infer<typeof siteCreateSchema>;

/** Fields a site admin may change at their own site; moving a site to another region is for administrators. */
export const SITE_ADMIN_EDITABLE_FIELDS = ['name', 'city', 'timeZone', 'currency', 'unitSystem'] as const;

export const siteUpdateSchema = z
  .object({ ...siteEditableShapes, regionId: idSchema })
  .partial()
  .strict();
export type SiteUpdate = z.infer<typeof siteUpdateSchema>;

export const siteListQuerySchema = pageQuerySchema.extend({
  regionId: idSchema.optional(),
  /** Retired sites are left out unless asked for. */
  includeRetired: z.union([z.boolean(), z.enum(['true', 'false']).transform((v) => v === 'true')]).default(false),
});
export type SiteListQuery = z.infer<typeof siteListQuerySchema>;
