import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { assignmentIssues, emailSchema, passwordSchema, ROLES } from '../users/schema.js';
import { linkTokenSchema } from '../auth/schema.js';

/** How long an invitation link works after it was (last) sent. */
export const INVITATION_VALID_DAYS = 7;

/**
 * pending: sent, not yet used, still valid; accepted: the person set their password; expired: not used in time
 * (a resend gives it a new link and a new term); revoked: withdrawn by whoever manages the site.
 */
export const INVITATION_STATES = ['pending', 'accepted', 'expired', 'revoked'] as const;
export type InvitationState = (typeof INVITATION_STATES)[number];

export const INVITATION_STATE_LABELS: Record<InvitationState, string> = {
  pending: 'Waiting for an answer',
  accepted: 'Accepted',
  expired: 'Link expired',
  revoked: 'Withdrawn',
};

export const invitationSchema = z.object({
  id: idSchema,
  email: z.string(),
  /** The name the inviter typed, if any; the person may change it when they accept. */
  name: z.string().nullable(),
  role: z.enum(ROLES),
  siteId: idSchema.nullable(),
  regionId: idSchema.nullable(),
  managedSiteIds: z.array(idSchema),
  allSites: z.boolean(),
  state: z.enum(INVITATION_STATES),
  expiresAt: z.iso.datetime(),
  invitedById: idSchema,
  invitedByName: z.string(),
  createdAt: z.iso.datetime(),
  lastSentAt: z.iso.datetime(),
  sentCount: z.number().int().min(1),
  acceptedAt: z.iso.datetime().nullable(),
  revokedAt: z.iso.datetime().nullable(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const invitationCreateSchema = z
  .object({
    email: emailSchema,
    name: text(120).nullable().default(null),
    role: z.enum(ROLES, { message: 'choose a role' }),
    siteId: idSchema.nullable().default(null),
    regionId: idSchema.nullable().default(null),
    managedSiteIds: z.array(idSchema).max(500).default([]),
    allSites: z.boolean().default(false),
  })
  .superRefine((v, ctx) => {
    for (const issue of assignmentIssues(v))
      ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
  });
export type InvitationCreate = z.input<typeof invitationCreateSchema>;
export type InvitationCreateParsed = z.output<typeof invitationCreateSchema>;

export const invitationListQuerySchema = pageQuerySchema.extend({
  state: z.enum(INVITATION_STATES).optional(),
  siteId: idSchema.optional(),
});
export type InvitationListQuery = z.output<typeof invitationListQuerySchema>;

export const invitationLookupSchema = z.object({ token: linkTokenSchema });

/** What the accept page shows before the person answers: enough to know it is meant for them. */
export const invitationPreviewSchema = z.object({
  email: z.string(),
  name: z.string().nullable(),
  role: z.enum(ROLES),
  siteName: z.string().nullable(),
  regionName: z.string().nullable(),
  invitedByName: z.string(),
  expiresAt: z.iso.datetime(),
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

export const invitationAcceptSchema = z.object({
  token: linkTokenSchema,
  name: text(120),
  password: passwordSchema,
});
export type InvitationAccept = z.infer<typeof invitationAcceptSchema>;
