import type { InvitationListQuery } from '@kerfline/domain/invitations/schema';

/** Query keys for invitations; the first segment is the API path segment (`/api/invitations`). */
export const invitationKeys = {
  all: ['invitations'] as const,
  lists: () => [...invitationKeys.all, 'list'] as const,
  list: (q: InvitationListQuery) => [...invitationKeys.lists(), q] as const,
  /** The invited person's view of one link; keyed by the link's secret, never cached past the page. */
  preview: (token: string) => [...invitationKeys.all, 'preview', token] as const,
};
