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
 * The password rule every form states. The length is checked here (in the browser and the API alike); the
 * API also refuses a password that is easy to guess — a common password, a word or name with digits, a
 * keyboard run, the person's own name or address — using zxcvbn-ts and the word lists its packs ship.
 */
export const PASSWORD_HINT =
  'At least 12 characters, and not easy to guess: a few unrelated words work well, a common password or your own name does not.';

/**
 * zxcvbn's score (0–4) a new password must reach. 3 means "safely unguessable": more than 10^8 guesses by its
 * estimate, far beyond what the sign-in limits allow, and a safe margin against guessing a stolen hash offline.
 */
export const PASSWORD_MIN_SCORE = 3;

/** The message for a password the strength check refused, with zxcvbn's warning (in English) when it gives one. */
export function passwordTooGuessable(warning: string | null | undefined): string {
  const why = warning ? ` (${warning.replace(/\.$/, '').replace(/^./, (c) => c.toLowerCase())})` : '';
  return `is too easy to guess${why}; use three or four unrelated words, or a longer mix of words and digits`;
}

/** The parts of a person that say where their role applies. */
export type Assignment = {
  role: Role;
  siteId: string | null;
  regionId: string | null;
  managedSiteIds: string[];
  allSites: boolean;
};

/**
 * Which assignment each role needs: site admins and technicians one home site, regional leads one region,
 * managers a list of sites or all sites, admins nothing. Shared by adding, inviting and editing a person,
 * so the three never disagree.
 */
export function assignmentIssues(v: Assignment): { path: string; message: string }[] {
  const issues: { path: string; message: string }[] = [];
  const needsSite = v.role === 'site_admin' || v.role === 'technician';
  if (needsSite && !v.siteId) issues.push({ path: 'siteId', message: 'a site admin or technician needs a home site' });
  if (!needsSite && v.siteId)
    issues.push({ path: 'siteId', message: 'only site admins and technicians have a home site' });
  if (v.role === 'regional_lead' && !v.regionId)
    issues.push({ path: 'regionId', message: 'a regional lead needs a region' });
  if (v.role !== 'regional_lead' && v.regionId)
    issues.push({ path: 'regionId', message: 'only regional leads have a region' });
  if (v.role === 'manager' && !v.allSites && v.managedSiteIds.length === 0)
    issues.push({ path: 'managedSiteIds', message: 'a manager needs at least one site, or all sites' });
  if (v.role !== 'manager' && (v.allSites || v.managedSiteIds.length > 0))
    issues.push({ path: 'managedSiteIds', message: 'only managers are assigned a list of sites' });
  return issues;
}

const assignmentShape = {
  role: z.enum(ROLES, { message: 'choose a role' }),
  siteId: idSchema.nullable().default(null),
  regionId: idSchema.nullable().default(null),
  managedSiteIds: z.array(idSchema).max(500).default([]),
  allSites: z.boolean().default(false),
};

function refineAssignment(v: Assignment, ctx: z.RefinementCtx): void {
  for (const issue of assignmentIssues(v)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
}

/**
 * An account made with a typed first password: kept for administrators only, as a fallback where no mail
 * server is set up. Inviting by e-mail is the usual way.
 */
export const userCreateSchema = z
  .object({
    email: emailSchema,
    name: text(120),
    password: passwordSchema,
    ...assignmentShape,
  })
  .superRefine(refineAssignment);
export type UserCreate = z.input<typeof userCreateSchema>;
/** A new person's input once checked, defaults applied: what the API's service receives. */
export type UserCreateParsed = z.output<typeof userCreateSchema>;

export const USER_STATES = ['active', 'inactive'] as const;

export const userListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  role: z.enum(ROLES).optional(),
  /** Leave out to list everyone; people are never deleted, only deactivated. */
  state: z.enum(USER_STATES).optional(),
});

/**
 * A change to a person: their name, and their role with the assignment it needs. The e-mail address is
 * their sign-in and is not changed here. Every field is optional; the service checks the merged record.
 */
export const userUpdateSchema = z
  .object({
    name: text(120),
    role: z.enum(ROLES, { message: 'choose a role' }),
    siteId: idSchema.nullable(),
    regionId: idSchema.nullable(),
    managedSiteIds: z.array(idSchema).max(500),
    allSites: z.boolean(),
  })
  .partial()
  .strict();
export type UserUpdate = z.infer<typeof userUpdateSchema>;
export type UserListQuery = z.infer<typeof userListQuerySchema>;
