import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';

export const ROLES = ['admin', 'manager', 'regional_lead', 'site_admin', 'technician'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  manager: 'Operations manager',
  regional_lead: 'Regional maintenance lead',
  site_admin: 'Site admin',
  technician: 'Saw technician',
};

export const userSchema = z.object({
  id: idSchema,
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  /** Home site of a site admin or technician; null for the other roles. */
  siteId: idSchema.nullable(),
  /** Region of a regional lead; null for the other roles. */
  regionId: idSchema.nullable(),
  /** Sites assigned to a manager; empty with `allSites` true means every site. */
  managedSiteIds: z.array(idSchema),
  allSites: z.boolean(),
  active: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'must be an e-mail address' }));

export const passwordSchema = z
  .string()
  .min(12, { message: 'must be at least 12 characters' })
  .max(200, { message: 'must be at most 200 characters' });

/**
 * Which assignment each role needs: site admins and technicians one home site, regional leads one region,
 * managers a list of sites or all sites, admins nothing.
 */
export const userCreateSchema = z
  .object({
    email: emailSchema,
    name: text(120),
    role: z.enum(ROLES, { message: 'choose a role' }),
    password: passwordSchema,
    siteId: idSchema.nullable().default(null),
    regionId: idSchema.nullable().default(null),
    managedSiteIds: z.array(idSchema).default([]),
    allSites: z.boolean().default(false),
  })
  .superRefine((v, ctx) => {
    const needsSite = v.role === 'site_admin' || v.role === 'technician';
    if (needsSite && !v.siteId)
      ctx.addIssue({ code: 'custom', path: ['siteId'], message: 'a site admin or technician needs a home site' });
    if (!needsSite && v.siteId)
      ctx.addIssue({ code: 'custom', path: ['siteId'], message: 'only site admins and technicians have a home site' });
    if (v.role === 'regional_lead' && !v.regionId)
      ctx.addIssue({ code: 'custom', path: ['regionId'], message: 'a regional lead needs a region' });
    if (v.role !== 'regional_lead' && v.regionId)
      ctx.addIssue({ code: 'custom', path: ['regionId'], message: 'only regional leads have a region' });
    if (v.role === 'manager' && !v.allSites && v.managedSiteIds.length === 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['managedSiteIds'],
        message: 'a manager needs at least one site, or all sites',
      });
    }
    if (v.role !== 'manager' && (v.allSites || v.managedSiteIds.length > 0)) {
      ctx.addIssue({ code: 'custom', path: ['managedSiteIds'], message: 'only managers are assigned a list of sites' });
    }
  });
export type UserCreate = z.input<typeof userCreateSchema>;
/** A new person's input once checked, defaults applied: what the API's service receives. */
export type UserCreateParsed = z.output<typeof userCreateSchema>;

export const userListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  role: z.enum(ROLES).optional(),
});
export type UserListQuery = z.infer<typeof userListQuerySchema>;
