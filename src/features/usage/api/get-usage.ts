import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { ConsoleUsageSchema } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { keyPaths } from '../../keys/api/keys-paths.ts';

export const getUsage = (month?: string) => apiRequest(month ? `${keyPaths.usage}?month=${encodeURIComponent(month)}` : keyPaths.usage, { schema: ConsoleUsageSchema });

export const usageQueryOptions = (month?: string) => queryOptions({ queryKey: ['usage', month ?? 'current'], queryFn: () => getUsage(month) });

export const useUsage = (month?: string) => useQuery({ ...usageQueryOptions(month), placeholderData: keepPreviousData });
