import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  mailLogEntrySchema,
  mailLogQuerySchema,
  mailPreferenceSchema,
  outboxSchema,
  type MailLogQuery,
} from '@kerfline/domain/mail/schema';
import { api } from '../../../lib/api-client';
import { mailKeys } from './keys';

const mailLogPageSchema = pageOf(mailLogEntrySchema);

export function mailLogQueryFromSearch(params: URLSearchParams): MailLogQuery {
  const offset = Number(params.get('offset') ?? '0');
  return mailLogQuerySchema.parse({ limit: 25, offset: Number.isInteger(offset) && offset >= 0 ? offset : 0 });
}

export function mailLogQuery(q: MailLogQuery) {
  return queryOptions({
    queryKey: mailKeys.log(q),
    queryFn: ({ signal }) => api.get('/mail-log', mailLogPageSchema, { query: q, signal }),
  });
}

export function outboxQuery(offset = 0) {
  return queryOptions({
    queryKey: mailKeys.outbox(offset),
    queryFn: ({ signal }) => api.get('/outbox', outboxSchema, { query: { limit: 10, offset }, signal }),
  });
}

export function mailPreferencesQuery() {
  return queryOptions({
    queryKey: mailKeys.preferences(),
    queryFn: ({ signal }) => api.get('/me/mail-preferences', z.array(mailPreferenceSchema), { signal }),
  });
}
