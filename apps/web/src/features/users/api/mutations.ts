import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { userSchema, type User, type UserCreateParsed, type UserUpdate } from '@kerfline/domain/users/schema';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

export type { UserCreateParsed };

function storeSaved(queryClient: QueryClient, user: User) {
  queryClient.setQueryData(userKeys.detail(user.id), user);
  return queryClient.invalidateQueries({ queryKey: userKeys.lists() });
}

/**
 * Adds a person with a typed first password (administrators only, a fallback to inviting); an e-mail address
 * already in use answers 409. The input carries the new person's password, so the finished mutation is
 * dropped from the mutation cache as soon as nothing watches it (`gcTime: 0`), and nothing of the input is
 * written to the query cache: the answer has no password.
 */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UserCreateParsed) => api.post('/users', input, userSchema),
    onSuccess: (user) => storeSaved(queryClient, user),
    gcTime: 0,
  });
}

/** Changes a person's name, role and where it applies. */
export function useUpdateUser(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UserUpdate) => api.patch(`/users/${encodeURIComponent(id)}`, input, userSchema),
    onSuccess: (user) => storeSaved(queryClient, user),
  });
}

/** Deactivates (`active: false`) or reactivates a person; deactivating ends their sessions on the server. */
export function useSetUserActive(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (active: boolean) =>
      api.post(`/users/${encodeURIComponent(id)}/${active ? 'reactivate' : 'deactivate'}`, undefined, userSchema),
    onSuccess: (user) => storeSaved(queryClient, user),
  });
}
