import { useMutation, useQueryClient } from '@tanstack/react-query';
import { OrganizationSchema, type UpdateOrganizationInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';
import { organizationQueryOptions } from './get-organization.ts';

export const updateOrganization = (input: UpdateOrganizationInput) => apiRequest(apiPaths.organization, { method: 'PATCH', body: input, schema: OrganizationSchema });

export function useUpdateOrganization() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateOrganization,
    onSuccess: (org) => {
      queryClient.setQueryData(organizationQueryOptions().queryKey, org);
      void queryClient.invalidateQueries(sessionQueryOptions());
    },
  });
}
