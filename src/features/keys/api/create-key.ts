import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CreatedApiKeySchema, type CreateApiKeyInput } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { organizationKeysQueryOptions } from '../../../lib/organization-keys.ts';
import { keyPaths } from './keys-paths.ts';

export const createKey = (input: CreateApiKeyInput) => apiRequest(keyPaths.keys, { method: 'POST', body: input, schema: CreatedApiKeySchema });

export function useCreateKey() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createKey, onSuccess: () => queryClient.invalidateQueries(organizationKeysQueryOptions()) });
}
