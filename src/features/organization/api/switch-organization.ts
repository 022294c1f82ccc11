import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SessionInfoSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const switchOrganization = (organizationId: string) =>
  apiRequest(apiPaths.sessionOrganization, { method: 'PUT', body: { organizationId }, schema: SessionInfoSchema });

export function useSwitchOrganization() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: switchOrganization,
    onSuccess: (session) => {
      // Everything cached belongs to the previous organization.
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
