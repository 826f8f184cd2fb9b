import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { mailPreferenceSchema, type MailPreferenceUpdate } from '@kerfline/domain/mail/schema';
import { api } from '../../../lib/api-client';
import { mailKeys } from './keys';

/** Turns one kind of the signed-in person's optional mail on or off; the answer replaces the cached list. */
export function useSetMailPreference() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MailPreferenceUpdate) =>
      api.patch('/me/mail-preferences', input, z.array(mailPreferenceSchema)),
    onSuccess: (preferences) => queryClient.setQueryData(mailKeys.preferences(), preferences),
  });
}
