import { useMutation, useQueryClient } from '@tanstack/react-query';
import { userSchema, type UserCreateParsed } from '@kerfline/domain/users/schema';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

export type { UserCreateParsed };

/**
 * Adds a person (administrators only); an e-mail address already in use answers 409. The input carries the
 * new person's password, so the finished mutation is dropped from the mutation cache as soon as nothing
 * watches it (`gcTime: 0`), and nothing of the input is written to the query cache: the answer has no password.
 */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UserCreateParsed) => api.post('/users', input, userSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
    gcTime: 0,
  });
}
