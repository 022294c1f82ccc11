import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TransferOwnershipInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const transferOwnership = (input: TransferOwnershipInput) => apiRequest(apiPaths.transferOwnership, { method: 'POST', body: input });

export function useTransferOwnership() {
  const queryClient = useQueryClient();
  // The caller's role changes: every cached view may be out of date.
  return useMutation({ mutationFn: transferOwnership, onSuccess: () => queryClient.invalidateQueries() });
}
