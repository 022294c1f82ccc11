import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const signOutEverywhere = () => apiRequest(apiPaths.signOutEverywhere, { method: 'POST' });

export function useSignOutEverywhere() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOutEverywhere,
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, null);
    },
  });
}
