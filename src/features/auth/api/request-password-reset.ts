import { useMutation } from '@tanstack/react-query';
import { AcceptedSchema, type EmailInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const requestPasswordReset = (input: EmailInput) => apiRequest(apiPaths.forgotPassword, { method: 'POST', body: input, schema: AcceptedSchema });

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
