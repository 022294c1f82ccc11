import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { ApiKeySchema, CreatedApiKeySchema } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { organizationKeysQueryOptions } from '../../../lib/organization-keys.ts';
import { keyPaths } from './keys-paths.ts';

const RotatedSchema = CreatedApiKeySchema.extend({ previous: ApiKeySchema });

export const rotateKey = ({ id, overlapHours }: { id: string; overlapHours: number }) =>
  apiRequest(keyPaths.rotate(id), { method: 'POST', body: { overlapHours }, schema: RotatedSchema });

export function useRotateKey() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: rotateKey, onSuccess: () => queryClient.invalidateQueries(organizationKeysQueryOptions()) });
}
