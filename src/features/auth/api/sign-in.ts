import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SessionInfoSchema, type SignInInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const signIn = (input: SignInInput) => apiRequest(apiPaths.signIn, { method: 'POST', body: input, schema: SessionInfoSchema });

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => {
      // A new person may be signed in: nothing cached for the previous one may show.
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
