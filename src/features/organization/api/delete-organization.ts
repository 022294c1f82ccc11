import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeleteOrganizationInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const deleteOrganization = (input: DeleteOrganizationInput) => apiRequest(apiPaths.organization, { method: 'DELETE', body: input });

export function useDeleteOrganization() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deleteOrganization, onSuccess: () => queryClient.clear() });
}
