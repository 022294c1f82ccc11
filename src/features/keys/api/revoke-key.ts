import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { ApiKeySchema } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { organizationKeysQueryOptions } from '../../../lib/organization-keys.ts';
import { keyPaths } from './keys-paths.ts';

export const revokeKey = (id: string) => apiRequest(keyPaths.revoke(id), { method: 'POST', body: {}, schema: z.object({ key: ApiKeySchema }) });

export function useRevokeKey() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: revokeKey, onSuccess: () => queryClient.invalidateQueries(organizationKeysQueryOptions()) });
}
