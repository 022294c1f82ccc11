import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangePasswordInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { accountSessionsQueryOptions } from './get-account-sessions.ts';

export const changePassword = (input: ChangePasswordInput) => apiRequest(apiPaths.accountPassword, { method: 'POST', body: input });

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: changePassword, onSuccess: () => queryClient.invalidateQueries(accountSessionsQueryOptions()) });
}
