import type { Transaction } from 'sequelize';
import type { MailKind } from '@kerfline/domain/mail/schema';

/** A mail to send, as a service hands it over inside its own transaction. */
export type QueuedMail = {
  kind: MailKind;
  toAddress: string;
  /** The person it is for, when they have an account. */
  userId: string | null;
  invitationId?: string | null;
  /**
   * Makes the send happen at most once, however many processes or retries try: e.g.
   * `weekly_digest:<person>:2026-W49` or `invitation:<id>:<how many times sent>`.
   */
  dedupeKey: string;
  /** What the worker needs to build the mail (ids, the period); never a secret in the clear. */
  payload?: Record<string, unknown>;
  /** A link's secret: sealed before it is stored, dropped once the mail has gone. */
  secret?: string;
  /** Record the mail as not sent, with this reason, instead of queueing it (an opted-out person, say). */
  skipReason?: string;
};

/**
 * Where services put mail. The record and the job are written in the caller's transaction, so a mail is
 * queued exactly when the change that asked for it commits.
 */
export interface MailQueue {
  /** The mail_log id, or null when a mail with the same dedupe key was already queued. */
  enqueue(transaction: Transaction, mail: QueuedMail): Promise<string | null>;
}
