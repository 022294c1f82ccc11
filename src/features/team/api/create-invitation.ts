import { useMutation, useQueryClient } from '@tanstack/react-query';
import { InvitationSchema, type CreateInvitationInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { invitationsQueryOptions } from './get-invitations.ts';

export const createInvitation = (input: CreateInvitationInput) => apiRequest(apiPaths.invitations, { method: 'POST', body: input, schema: InvitationSchema });

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createInvitation, onSuccess: () => queryClient.invalidateQueries(invitationsQueryOptions()) });
}
