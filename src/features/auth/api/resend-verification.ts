import { useMutation } from '@tanstack/react-query';
import { AcceptedSchema, type EmailInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const resendVerification = (input: EmailInput) => apiRequest(apiPaths.resendVerification, { method: 'POST', body: input, schema: AcceptedSchema });

export const useResendVerification = () => useMutation({ mutationFn: resendVerification });
