import { useMutation } from '@tanstack/react-query';
import { VerifiedEmailSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const verifyEmail = (token: string) => apiRequest(apiPaths.verifyEmail, { method: 'POST', body: { token }, schema: VerifiedEmailSchema });

export const useVerifyEmail = () => useMutation({ mutationFn: verifyEmail });
