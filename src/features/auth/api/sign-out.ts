import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const signOut = () => apiRequest(apiPaths.signOut, { method: 'POST' });

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, null);
    },
  });
}
