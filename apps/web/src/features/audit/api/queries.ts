import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { auditEntrySchema, auditListQuerySchema, type AuditListQuery } from '@kerfline/domain/audit/schema';
import { api } from '../../../lib/api-client';
import { auditKeys } from './keys';

const auditPageSchema = pageOf(auditEntrySchema);

/** The list query with its defaults, so equal filters give equal keys. */
export function parseAuditListQuery(input: Partial<Record<keyof AuditListQuery, unknown>>): AuditListQuery {
  return auditListQuerySchema.parse(input);
}

/** A page of the audit trail the user may read (admins, and a site admin for their own site), newest first. */
export function auditListQuery(q: AuditListQuery) {
  return queryOptions({
    queryKey: auditKeys.list(q),
    queryFn: ({ signal }) => api.get('/audit', auditPageSchema, { query: q, signal }),
  });
}
