import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

/** Signs out so the invited person can sign in with the invited address. */
export const signOutToSwitch = () => apiRequest(apiPaths.signOut, { method: 'POST' });

export function useSignOutToSwitch() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOutToSwitch,
    onSettled: () => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, null);
    },
  });
}
