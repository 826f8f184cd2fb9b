import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  meSchema,
  type PasswordChange,
  type PasswordReset,
  type PasswordResetRequest,
  type SignIn,
} from '@kerfline/domain/auth/schema';
import { api } from '../../../lib/api-client';
import { meKeys } from './keys';

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignIn) => api.post('/auth/sign-in', input, meSchema),
    onSuccess: (me) => {
      // A new identity: nothing cached for whoever used this tab before may be shown to this user.
      queryClient.removeQueries();
      queryClient.setQueryData(meKeys.all, me);
    },
  });
}

/** Ends the session. The caller leaves the signed-in screens first, then drops the cache (see the shell). */
export function useSignOut() {
  return useMutation({
    mutationFn: () => api.post('/auth/sign-out', undefined, null),
  });
}

/** Changes the signed-in person's own password; their other sessions end on the server. Nothing is cached. */
export function useChangePassword() {
  return useMutation({
    mutationFn: (input: PasswordChange) => api.post('/me/password', input, null),
    gcTime: 0,
  });
}

/** Asks for a reset link; the answer is the same whether or not an account uses the address. */
export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (input: PasswordResetRequest) =>
      api.post('/auth/password-reset/request', input, z.object({ message: z.string() })),
  });
}

/** Sets a new password from a reset link; every session of that person ends. Nothing is cached. */
export function useResetPassword() {
  return useMutation({
    mutationFn: (input: PasswordReset) => api.post('/auth/password-reset', input, null),
    gcTime: 0,
  });
}
