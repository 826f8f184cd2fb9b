import type { MailLogQuery } from '@kerfline/domain/mail/schema';

/** Query keys for mail: the record of sends (`/api/mail-log`), the outbox and a person's own choices. */
export const mailKeys = {
  log: (q: MailLogQuery) => ['mail-log', q] as const,
  outbox: (offset: number) => ['outbox', offset] as const,
  preferences: () => ['me', 'mail-preferences'] as const,
};
