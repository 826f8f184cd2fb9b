import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { mailPreferenceSchema, type MailPreference, type MailPreferenceUpdate } from '@kerfline/domain/mail/schema';
import { api } from '../../../lib/api-client';
import { mailKeys } from './keys';

/**
 * Turns one kind of the signed-in person's optional mail on or off. The switch moves at once; if the server
 * refuses, it moves back and the error is shown.
 */
export function useSetMailPreference() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MailPreferenceUpdate) =>
      api.patch('/me/mail-preferences', input, z.array(mailPreferenceSchema)),
    onMutate: async (input) => {
      await queryClient.cancelQueries({ queryKey: mailKeys.preferences() });
      const before = queryClient.getQueryData<MailPreference[]>(mailKeys.preferences());
      queryClient.setQueryData<MailPreference[]>(mailKeys.preferences(), (current) =>
        current?.map((p) => (p.kind === input.kind ? { ...p, enabled: input.enabled } : p)),
      );
      return { before };
    },
    onError: (_error, _input, context) => queryClient.setQueryData(mailKeys.preferences(), context?.before),
    onSuccess: (preferences) => queryClient.setQueryData(mailKeys.preferences(), preferences),
  });
}
