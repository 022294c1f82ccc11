import { useMutation } from '@tanstack/react-query';
import { SignUpResultSchema, type SignUpInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const signUp = (input: SignUpInput) => apiRequest(apiPaths.signUp, { method: 'POST', body: input, schema: SignUpResultSchema });

export const useSignUp = () => useMutation({ mutationFn: signUp });
