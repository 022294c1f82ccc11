import { queryOptions, useQuery } from '@tanstack/react-query';
import { AccountSessionListSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getAccountSessions = () => apiRequest(apiPaths.accountSessions, { schema: AccountSessionListSchema });

export const accountSessionsQueryOptions = () => queryOptions({ queryKey: ['account', 'sessions'], queryFn: getAccountSessions });

export const useAccountSessions = () => useQuery(accountSessionsQueryOptions());
