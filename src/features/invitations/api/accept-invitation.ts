import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SessionInfoSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const acceptInvitation = (token: string) => apiRequest(apiPaths.invitationAccept, { method: 'POST', body: { token }, schema: SessionInfoSchema });

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (session) => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
