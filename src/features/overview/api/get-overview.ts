/** What the overview reads: this month's usage against the plan, and the recent failed calls. */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { ConsoleUsageSchema, RequestLogPageSchema, type RequestLogPage } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';

export const overviewPaths = {
  usage: '/console-api/usage',
  requests: (status: '4xx' | '5xx', limit: number) => `/console-api/requests?status=${status}&limit=${limit}`,
} as const;

export const getUsage = () => apiRequest(overviewPaths.usage, { schema: ConsoleUsageSchema });

export const usageQueryOptions = () => queryOptions({ queryKey: ['overview', 'usage'], queryFn: getUsage, staleTime: 0, refetchOnMount: 'always' });
export const useUsage = () => useQuery(usageQueryOptions());

/** The most recent client (4xx) and server (5xx) errors together, newest first. */
export async function getRecentErrors(limit = 8): Promise<RequestLogPage['items']> {
  const [client, server] = await Promise.all([
    apiRequest(overviewPaths.requests('4xx', limit), { schema: RequestLogPageSchema }),
    apiRequest(overviewPaths.requests('5xx', limit), { schema: RequestLogPageSchema }),
  ]);
  return [...client.items, ...server.items].sort((a, b) => b.id - a.id).slice(0, limit);
}

export const recentErrorsQueryOptions = () => queryOptions({ queryKey: ['overview', 'recent-errors'], queryFn: () => getRecentErrors(), staleTime: 0, refetchOnMount: 'always' });
export const useRecentErrors = () => useQuery(recentErrorsQueryOptions());
