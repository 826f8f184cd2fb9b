import PgBoss from 'pg-boss';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { isoWeekKey, previousMonthKey, type MailKind } from '@kerfline/domain/mail/schema';
import type { Role } from '@kerfline/domain/users/schema';
import { MailLog, MailPreference } from '../modules/mail/mail-log.model.js';
import { User } from '../modules/users/user.model.js';
import { SecretBox } from '../security/link-tokens.js';
import { createMailSender, type MailSender, type SmtpSettings } from '../mail/transport.js';
import { renderMail } from '../mail/templates.js';
import { buildMail } from './mail-content.js';
import type { MailQueue, QueuedMail } from './mail-queue.js';
import { wallClockIn } from './zoned.js';
import { onPrimary } from '../db/read-routing.js';

/** pg-boss queues: one for sending single mails, one per schedule that fans out to the recipients. */
export const QUEUES = {
  send: 'mail-send',
  weeklyDigest: 'mail-weekly-digest',
  monthlySummary: 'mail-monthly-summary',
} as const;

export type JobsOptions = {
  connectionString: string;
  /** Seals link secrets while they wait in the queue (the session secret). */
  secret: string;
  publicUrl: string;
  smtp: SmtpSettings;
  /** Attempts after the first; waits start at retryDelaySeconds and double each time. */
  retryLimit: number;
  retryDelaySeconds: number;
  schedule: { weeklyDigestCron: string; monthlySummaryCron: string; timeZone: string };
  /** How often idle workers look for jobs (pg-boss's minimum is 0.5 s); tests go faster than production. */
  pollingIntervalSeconds?: number;
  /** How often pg-boss checks the schedules (default 30 s) and hands due ones to their queues (default 5 s). */
  cronMonitorIntervalSeconds?: number;
  cronWorkerIntervalSeconds?: number;
  log?: (level: 'info' | 'warn' | 'error', message: string, detail?: unknown) => void;
};

type SendJob = { mailId: string };

/**
 * The job runtime on PostgreSQL (pg-boss 10): any number of API processes may run it side by side. A job is
 * fetched by one worker only (FOR UPDATE SKIP LOCKED), a schedule fires once per slot whichever process sees
 * it first, and each mail's row in `mail_log` has a unique dedupe key and is claimed before sending, so no
 * mail goes out twice.
 *
 * Every process can queue mail (`enqueue`); processes that also `startWorkers()` send it and run the
 * schedules.
 */
export class Jobs implements MailQueue {
  readonly boss: PgBoss;
  private readonly box: SecretBox;
  private ready: Promise<void> | undefined;
  private sender: MailSender | undefined;
  private working = false;

  constructor(
    private readonly sequelize: Sequelize,
    private readonly options: JobsOptions,
    mode: { workers: boolean } = { workers: false },
  ) {
    this.box = new SecretBox(options.secret);
    this.boss = new PgBoss({
      connectionString: options.connectionString,
      max: mode.workers ? 4 : 2,
      application_name: 'kerfline-jobs',
      // Only working processes watch the schedules and tidy the queue tables.
      schedule: mode.workers,
      supervise: mode.workers,
      ...(options.cronMonitorIntervalSeconds ? { cronMonitorIntervalSeconds: options.cronMonitorIntervalSeconds } : {}),
      ...(options.cronWorkerIntervalSeconds ? { cronWorkerIntervalSeconds: options.cronWorkerIntervalSeconds } : {}),
    });
    this.boss.on('error', (error) => options.log?.('error', 'job queue error', error));
  }

  /** Starts pg-boss (creating or migrating its schema) and its queues, once. */
  start(): Promise<void> {
    this.ready ??= (async () => {
      await this.boss.start();
      // Processes starting together on a new database create the same queues at once; pg-boss's function for it
      // can then deadlock with itself (40P01). The queue exists afterwards either way: try again.
      for (const name of Object.values(QUEUES)) {
        for (let attempt = 1; ; attempt += 1) {
          try {
            await this.boss.createQueue(name, { name, policy: 'standard' });
            break;
          } catch (error) {
            if ((error as { code?: string }).code !== '40P01' || attempt === 5) throw error;
            await new Promise((resolve) => setTimeout(resolve, 50 * attempt));
          }
        }
      }
    })();
    return this.ready;
  }

  /** Starts the workers and the schedules in this process. */
  async startWorkers(): Promise<void> {
    await this.start();
    if (this.working) return;
    this.working = true;
    this.sender = createMailSender(this.options.smtp);
    const polling = {
      pollingIntervalSeconds: this.options.pollingIntervalSeconds ?? 2,
      includeMetadata: true,
    } as const;
    await this.boss.work<SendJob>(QUEUES.send, polling, async ([job]) => {
      if (job) await onPrimary(() => this.deliver(job.data.mailId, job.retryCount, job.retryLimit));
    });
    await this.boss.work(QUEUES.weeklyDigest, polling, async ([job]) => {
      if (job) await onPrimary(() => this.fanOut('weekly_digest', job.createdOn));
    });
    await this.boss.work(QUEUES.monthlySummary, polling, async ([job]) => {
      if (job) await onPrimary(() => this.fanOut('monthly_summary', job.createdOn));
    });
    const tz = { tz: this.options.schedule.timeZone };
    await this.boss.schedule(QUEUES.weeklyDigest, this.options.schedule.weeklyDigestCron, {}, tz);
    await this.boss.schedule(QUEUES.monthlySummary, this.options.schedule.monthlySummaryCron, {}, tz);
  }

  async stop(): Promise<void> {
    if (this.ready) {
      await this.ready.catch(() => undefined);
      await this.boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    }
    this.sender?.close();
  }

  async enqueue(transaction: Transaction, mail: QueuedMail): Promise<string | null> {
    await this.start();
    const payload = { ...(mail.payload ?? {}), ...(mail.secret ? { sealedSecret: this.box.seal(mail.secret) } : {}) };
    const [row] = await this.sequelize.query<{ id: string }>(
      `INSERT INTO mail_log (kind, user_id, invitation_id, to_address, dedupe_key, payload, status, last_error)
       VALUES (:kind, :userId, :invitationId, :toAddress, :dedupeKey, :payload, :status, :lastError)
       ON CONFLICT (dedupe_key) DO NOTHING
       RETURNING id`,
      {
        transaction,
        type: QueryTypes.SELECT,
        replacements: {
          kind: mail.kind,
          userId: mail.userId,
          invitationId: mail.invitationId ?? null,
          toAddress: mail.toAddress,
          dedupeKey: mail.dedupeKey,
          payload: JSON.stringify(mail.skipReason ? (mail.payload ?? {}) : payload),
          status: mail.skipReason ? 'skipped' : 'queued',
          lastError: mail.skipReason ?? null,
        },
      },
    );
    if (!row) return null;
    if (mail.skipReason) return row.id;
    // The job row is written on the transaction's own connection, so it commits (or not) with the change.
    await this.boss.send(QUEUES.send, { mailId: row.id } satisfies SendJob, {
      retryLimit: this.options.retryLimit,
      retryDelay: this.options.retryDelaySeconds,
      retryBackoff: true,
      expireInSeconds: 5 * 60,
      db: onTransaction(transaction),
    });
    return row.id;
  }

  /**
   * Sends one queued mail. The row is claimed first (only a queued or retrying row, or one left `sending` by
   * a worker that died long ago), so a second worker or a late retry finds nothing to do.
   */
  async deliver(mailId: string, retryCount: number, retryLimit: number): Promise<void> {
    const [claimed] = await this.sequelize.query<{ id: string }>(
      `UPDATE mail_log SET status = 'sending', attempts = attempts + 1, updated_at = now()
       WHERE id = :mailId
         AND (status IN ('queued', 'retrying') OR (status = 'sending' AND updated_at < now() - interval '10 minutes'))
       RETURNING id`,
      { type: QueryTypes.SELECT, replacements: { mailId } },
    );
    if (!claimed) return;
    const row = (await MailLog.findByPk(mailId))!;
    const finish = (values: Partial<Record<'status' | 'subject' | 'lastError' | 'messageId', string | null>>) =>
      this.sequelize.query(
        `UPDATE mail_log SET status = :status, subject = coalesce(:subject, subject), last_error = :lastError,
           message_id = coalesce(:messageId, message_id), updated_at = now(),
           sent_at = CASE WHEN :status = 'sent' THEN now() ELSE NULL END,
           payload = CASE WHEN :status IN ('sent', 'skipped', 'failed') THEN payload - 'sealedSecret' ELSE payload END
         WHERE id = :mailId`,
        {
          replacements: {
            mailId,
            status: values.status ?? 'failed',
            subject: values.subject ?? null,
            lastError: values.lastError ?? null,
            messageId: values.messageId ?? null,
          },
        },
      );
    let subject: string | null = null;
    try {
      const built = await buildMail(row, { publicUrl: this.options.publicUrl, box: this.box });
      if ('skip' in built) {
        await finish({ status: 'skipped', lastError: built.skip });
        return;
      }
      const rendered = renderMail(built.view);
      subject = rendered.subject;
      const { messageId } = await this.sender!.send({ to: row.toAddress, ...rendered });
      await finish({ status: 'sent', subject, messageId });
    } catch (error) {
      const last = retryCount >= retryLimit;
      const message = error instanceof Error ? error.message : String(error);
      await finish({ status: last ? 'failed' : 'retrying', subject, lastError: message.slice(0, 500) });
      this.options.log?.(last ? 'error' : 'warn', `mail ${mailId} not sent (attempt ${retryCount + 1})`, message);
      // pg-boss retries the job after its (doubling) delay; after the last attempt the row stays failed.
      if (!last) throw error;
    }
  }

  /**
   * A schedule fired: queue one mail per person who gets this kind, for the period it covers. The dedupe key
   * names the person and the period, so the same digest is never queued twice for a week, whichever process
   * or retry runs this.
   */
  async fanOut(kind: Extract<MailKind, 'weekly_digest' | 'monthly_summary'>, firedAt: Date): Promise<number> {
    const local = wallClockIn(firedAt, this.options.schedule.timeZone);
    const period = kind === 'weekly_digest' ? isoWeekKey(local) : previousMonthKey(local);
    const role: Role = kind === 'weekly_digest' ? 'regional_lead' : 'manager';
    const recipients = await User.findAll({ where: { role, active: true }, order: [['id', 'ASC']] });
    const optedOut = new Set(
      (
        await MailPreference.findAll({
          where: { kind, enabled: false, userId: recipients.map((r) => r.id) },
          attributes: ['userId'],
        })
      ).map((p) => p.userId),
    );
    let queued = 0;
    for (const person of recipients) {
      await this.sequelize.transaction(async (transaction) => {
        const id = await this.enqueue(transaction, {
          kind,
          userId: person.id,
          toAddress: person.email,
          dedupeKey: `${kind}:${person.id}:${period}`,
          payload: { period },
          ...(optedOut.has(person.id) ? { skipReason: 'turned off by the person' } : {}),
        });
        if (id) queued += 1;
      });
    }
    return queued;
  }

  /** Sends the schedule's job now, as if it had fired (for the admins' "send now" and the tests). */
  async fire(queue: (typeof QUEUES)['weeklyDigest' | 'monthlySummary']): Promise<void> {
    await this.start();
    await this.boss.send(queue, {});
  }
}

/** pg-boss's database hook on the pg client that runs a Sequelize transaction. */
function onTransaction(transaction: Transaction): PgBoss.Db {
  const client = (transaction as unknown as { connection: { query: PgBoss.Db['executeSql'] } }).connection;
  return { executeSql: (text, values) => client.query(text, values) };
}
