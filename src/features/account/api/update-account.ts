import { useMutation, useQueryClient } from '@tanstack/react-query';
import { UserSchema, type UpdateAccountInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { sessionQueryOptions } from '../../../lib/session.ts';

export const updateAccount = (input: UpdateAccountInput) => apiRequest(apiPaths.account, { method: 'PATCH', body: input, schema: UserSchema });

export function useUpdateAccount() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateAccount, onSuccess: () => queryClient.invalidateQueries(sessionQueryOptions()) });
}
