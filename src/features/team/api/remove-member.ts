import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { membersQueryOptions } from './get-members.ts';

export const removeMember = (userId: string) => apiRequest(apiPaths.member(userId), { method: 'DELETE' });

export function useRemoveMember() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: removeMember, onSuccess: () => queryClient.invalidateQueries(membersQueryOptions()) });
}
