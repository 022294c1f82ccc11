import { useMutation } from '@tanstack/react-query';
import type { ResetPasswordInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const resetPassword = (input: ResetPasswordInput) => apiRequest(apiPaths.resetPassword, { method: 'POST', body: input });

export const useResetPassword = () => useMutation({ mutationFn: resetPassword });
