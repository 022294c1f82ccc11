import { useMutation, useQueryClient } from '@tanstack/react-query';
import { OrganizationSummarySchema, type CreateOrganizationInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const createOrganization = (input: CreateOrganizationInput) =>
  apiRequest(apiPaths.organizations, { method: 'POST', body: input, schema: OrganizationSummarySchema });

export function useCreateOrganization() {
  const queryClient = useQueryClient();
  // The new organization becomes the active one: drop what was cached for the previous.
  return useMutation({ mutationFn: createOrganization, onSuccess: () => queryClient.clear() });
}
