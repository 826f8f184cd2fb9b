import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import type { Role } from '../users/schema.js';

/**
 * Every kind of mail Kerfline sends. Invitations and password resets answer something a person did and
 * cannot be turned off; the scheduled and notice kinds can, per person, on their account page.
 */
export const MAIL_KINDS = ['invitation', 'password_reset', 'weekly_digest', 'monthly_summary', 'low_stock'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

export type MailKindInfo = {
  label: string;
  description: string;
  /** Whether a person may turn this kind off. */
  optional: boolean;
  /** Roles that receive it (empty: sent to whoever asked for it). */
  roles: readonly Role[];
};

export const MAIL_KIND_INFO: Record<MailKind, MailKindInfo> = {
  invitation: {
    label: 'Invitation',
    description: 'A link to set up an account, sent when someone invites you.',
    optional: false,
    roles: [],
  },
  password_reset: {
    label: 'Password reset',
    description: 'A link to choose a new password, sent when you ask for one.',
    optional: false,
    roles: [],
  },
  weekly_digest: {
    label: 'Weekly region digest',
    description: 'Monday morning: the sites and saws of your region, and what needs a look.',
    optional: true,
    roles: ['regional_lead'],
  },
  monthly_summary: {
    label: 'Monthly summary',
    description: 'On the first of the month: your sites at a glance for the month just ended.',
    optional: true,
    roles: ['manager'],
  },
  low_stock: {
    label: 'Low blade stock',
    description: 'When a blade spec at your site falls below its reorder point.',
    optional: true,
    roles: ['site_admin'],
  },
};

/** The kinds a person of `role` can turn on or off. */
export function optionalMailKindsFor(role: Role): MailKind[] {
  return MAIL_KINDS.filter((kind) => MAIL_KIND_INFO[kind].optional && MAIL_KIND_INFO[kind].roles.includes(role));
}

export const mailPreferenceSchema = z.object({
  kind: z.enum(MAIL_KINDS),
  label: z.string(),
  description: z.string(),
  enabled: z.boolean(),
});
export type MailPreference = z.infer<typeof mailPreferenceSchema>;

export const mailPreferenceUpdateSchema = z.object({
  kind: z.enum(MAIL_KINDS, { message: 'choose a kind of mail' }),
  enabled: z.boolean({ message: 'must be true or false' }),
});
export type MailPreferenceUpdate = z.infer<typeof mailPreferenceUpdateSchema>;

/**
 * queued: waiting for a worker; sending: a worker has it; retrying: the last attempt failed and another is
 * scheduled; sent: the mail server took it; failed: every attempt failed; skipped: not sent on purpose (the
 * person turned the kind off, was deactivated, or there was nothing to report).
 */
export const MAIL_STATUSES = ['queued', 'sending', 'retrying', 'sent', 'failed', 'skipped'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

export const mailLogEntrySchema = z.object({
  id: idSchema,
  kind: z.enum(MAIL_KINDS),
  toAddress: z.string(),
  userId: idSchema.nullable(),
  userName: z.string().nullable(),
  subject: z.string().nullable(),
  status: z.enum(MAIL_STATUSES),
  attempts: z.number().int().min(0),
  lastError: z.string().nullable(),
  createdAt: z.iso.datetime(),
  sentAt: z.iso.datetime().nullable(),
});
export type MailLogEntry = z.infer<typeof mailLogEntrySchema>;

export const mailLogQuerySchema = pageQuerySchema.extend({
  kind: z.enum(MAIL_KINDS).optional(),
  status: z.enum(MAIL_STATUSES).optional(),
});
export type MailLogQuery = z.output<typeof mailLogQuerySchema>;

/** A message the local mail catcher received (development and tests only). */
export const caughtMailSchema = z.object({
  id: z.string(),
  receivedAt: z.iso.datetime(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});
export type CaughtMail = z.infer<typeof caughtMailSchema>;

export const outboxSchema = z.object({
  /** False where Kerfline sends through a real mail server and keeps no local copy. */
  enabled: z.boolean(),
  items: z.array(caughtMailSchema),
  total: z.number().int().min(0),
  limit: z.number().int(),
  offset: z.number().int(),
});
export type Outbox = z.infer<typeof outboxSchema>;

/**
 * The ISO 8601 week of a calendar date, e.g. `2026-W49`: weeks start on Monday and week 1 holds the year's
 * first Thursday. `date` is read in UTC; pass a date already moved to the time zone that matters.
 */
export function isoWeekKey(date: Date): string {
  const d = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate()));
  const weekday = d.getUTCDay() === 0 ? 7 : d.getUTCDay();
  // The Thursday of this week decides the week-numbering year.
  d.setUTCDate(d.getUTCDate() + 4 - weekday);
  const yearStart = Date.UTC(d.getUTCFullYear(), 0, 1);
  const week = Math.floor((d.getTime() - yearStart) / 86_400_000 / 7) + 1;
  return `${d.getUTCFullYear()}-W${String(week).padStart(2, '0')}`;
}

/** The calendar month before `date` (UTC), e.g. `2026-11` for any day of December 2026. */
export function previousMonthKey(date: Date): string {
  const d = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth() - 1, 1));
  return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
}
