import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { mailboxQueryOptions } from './get-mailbox.ts';

export const clearMailbox = () => apiRequest(apiPaths.devMailbox, { method: 'DELETE' });

export function useClearMailbox() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: clearMailbox, onSuccess: () => queryClient.invalidateQueries(mailboxQueryOptions()) });
}
