import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  INVITATION_STATES,
  invitationListQuerySchema,
  invitationPreviewSchema,
  invitationSchema,
  type InvitationListQuery,
  type InvitationState,
} from '@kerfline/domain/invitations/schema';
import { api } from '../../../lib/api-client';
import { invitationKeys } from './keys';

const invitationPageSchema = pageOf(invitationSchema);

const isState = (value: string): value is InvitationState => (INVITATION_STATES as readonly string[]).includes(value);

/** The invitations list's query from the URL (`invitations` = state, `invitationsOffset`). */
export function invitationListQueryFromSearch(params: URLSearchParams): InvitationListQuery {
  const state = params.get('invitations') ?? 'pending';
  const offset = Number(params.get('invitationsOffset') ?? '0');
  return invitationListQuerySchema.parse({
    state: isState(state) ? state : undefined,
    limit: 20,
    offset: Number.isInteger(offset) && offset >= 0 ? offset : 0,
  });
}

export function invitationListQuery(q: InvitationListQuery) {
  return queryOptions({
    queryKey: invitationKeys.list(q),
    queryFn: ({ signal }) => api.get('/invitations', invitationPageSchema, { query: q, signal }),
  });
}

/** What an invitation link offers; the secret goes in the body, never in an address. */
export function invitationPreviewQuery(token: string) {
  return queryOptions({
    queryKey: invitationKeys.preview(token),
    queryFn: () => api.post('/invitations/preview', { token }, invitationPreviewSchema),
    retry: false,
    gcTime: 0,
    staleTime: Infinity,
  });
}
