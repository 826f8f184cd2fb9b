import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  invitationSchema,
  type InvitationAccept,
  type InvitationCreateParsed,
} from '@kerfline/domain/invitations/schema';
import { api } from '../../../lib/api-client';
import { invitationKeys } from './keys';

export type { InvitationCreateParsed };

/** Invites someone by e-mail; the server mails the link. */
export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreateParsed) => api.post('/invitations', input, invitationSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.lists() }),
  });
}

/** Sends an invitation again with a new link (`resend`) or withdraws it (`revoke`). */
export function useInvitationAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, action }: { id: string; action: 'resend' | 'revoke' }) =>
      api.post(`/invitations/${encodeURIComponent(id)}/${action}`, undefined, invitationSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.lists() }),
  });
}

/** The invited person sets their name and password; the password is never cached. */
export function useAcceptInvitation() {
  return useMutation({
    mutationFn: (input: InvitationAccept) => api.post('/invitations/accept', input, z.object({ email: z.string() })),
    gcTime: 0,
  });
}
