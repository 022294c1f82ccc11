import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { invitationsQueryOptions } from './get-invitations.ts';

export const revokeInvitation = (id: string) => apiRequest(apiPaths.invitation(id), { method: 'DELETE' });

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: revokeInvitation, onSuccess: () => queryClient.invalidateQueries(invitationsQueryOptions()) });
}
