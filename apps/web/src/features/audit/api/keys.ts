import type { AuditListQuery } from '@kerfline/domain/audit/schema';

/** Query keys for the audit trail; the first segment is the API path segment (`/api/audit`). */
export const auditKeys = {
  all: ['audit'] as const,
  lists: () => [...auditKeys.all, 'list'] as const,
  list: (q: AuditListQuery) => [...auditKeys.lists(), q] as const,
};
