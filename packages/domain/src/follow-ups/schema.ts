import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { notesSchema, personRefSchema } from '../records/schema.js';
import { PEER_METRICS, peerMetricSchema } from '../outliers/peer-review.js';
import { monthSchema } from '../fleet/period.js';

/**
 * A follow-up: work a regional lead asks a site to do about one saw, usually from an outlier flag. It has a
 * person at the site, a due date, a state (open, in progress, done) and a running history of what happened;
 * done follow-ups stay in that history.
 */
export const FOLLOW_UP_STATES = ['open', 'in_progress', 'done'] as const;
export type FollowUpState = (typeof FOLLOW_UP_STATES)[number];

export const FOLLOW_UP_STATE_LABELS: Record<FollowUpState, string> = {
  open: 'Open',
  in_progress: 'In progress',
  done: 'Done',
};

/** A calendar date `YYYY-MM-DD` (the due day, read in the site's time zone). */
export const dayDateSchema = z.iso.date({ message: 'must be a date such as 2026-12-18' });

/** What the flag said when the follow-up was opened, kept as it was. */
export const followUpFlagSchema = z.object({
  metric: z.enum(PEER_METRICS),
  value: z.number(),
  peerMedian: z.number().nullable(),
  modifiedZ: z.number().nullable(),
  peerCount: z.number().int(),
  method: z.string(),
  period: z.object({ from: z.string(), to: z.string() }),
  reportingCurrency: z.string(),
});
export type FollowUpFlag = z.infer<typeof followUpFlagSchema>;

export const FOLLOW_UP_ENTRY_KINDS = ['opened', 'state', 'note', 'assigned', 'due'] as const;
export type FollowUpEntryKind = (typeof FOLLOW_UP_ENTRY_KINDS)[number];

export const followUpEntrySchema = z.object({
  id: idSchema,
  kind: z.enum(FOLLOW_UP_ENTRY_KINDS),
  /** What happened, in words (`In progress → Done`, the note itself, `Due 2026-12-18 → 2026-12-22`). */
  text: z.string(),
  by: personRefSchema,
  at: z.string(),
});
export type FollowUpEntry = z.infer<typeof followUpEntrySchema>;

export const followUpSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  siteName: z.string(),
  sawId: idSchema,
  sawAssetTag: z.string(),
  sawName: z.string(),
  title: z.string(),
  flag: followUpFlagSchema.nullable(),
  assignee: personRefSchema,
  dueOn: z.string(),
  state: z.enum(FOLLOW_UP_STATES),
  /** Not done and past its due day in the site's time zone. */
  overdue: z.boolean(),
  createdBy: personRefSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  doneAt: z.string().nullable(),
  /** Newest first; filled by the detail read, empty in lists. */
  entries: z.array(followUpEntrySchema),
});
export type FollowUp = z.infer<typeof followUpSchema>;

export const followUpCreateSchema = z
  .object({
    sawId: idSchema,
    title: text(160),
    assigneeId: idSchema,
    dueOn: dayDateSchema,
    notes: notesSchema.optional().default(null),
    /** The flag the follow-up comes from: the figure and the period it was judged over. */
    fromFlag: z
      .object({ metric: peerMetricSchema, from: monthSchema, to: monthSchema })
      .strict()
      .nullable()
      .optional()
      .default(null),
  })
  .strict();
export type FollowUpCreate = z.input<typeof followUpCreateSchema>;
export type FollowUpCreateParsed = z.output<typeof followUpCreateSchema>;

export const followUpUpdateSchema = z
  .object({
    state: z.enum(FOLLOW_UP_STATES, { message: 'State must be open, in_progress or done' }).optional(),
    assigneeId: idSchema.optional(),
    dueOn: dayDateSchema.optional(),
    /** A note added to the history (notes are never edited or removed). */
    note: notesSchema.optional(),
  })
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined && x !== null), {
    message: 'Change the state, the person, the due date, or add a note',
  });
export type FollowUpUpdate = z.infer<typeof followUpUpdateSchema>;

/** `active` = open or in progress. */
export const FOLLOW_UP_FILTERS = [...FOLLOW_UP_STATES, 'active'] as const;

export const followUpListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  sawId: idSchema.optional(),
  state: z.enum(FOLLOW_UP_FILTERS).optional(),
});
export type FollowUpListQuery = z.infer<typeof followUpListQuerySchema>;

/** People a follow-up at a site can be given to: the site's active site admins and technicians. */
export const followUpAssigneeSchema = z.object({ id: idSchema, name: z.string(), role: z.string() });
export type FollowUpAssignee = z.infer<typeof followUpAssigneeSchema>;
