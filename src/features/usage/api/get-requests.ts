import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { RequestLogPageSchema } from '#shared/schemas/keys.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { keyPaths } from '../../keys/api/keys-paths.ts';

export interface RequestFilters {
  keyId?: string;
  endpoint?: string;
  status?: '2xx' | '4xx' | '5xx';
}

export function getRequests(filters: RequestFilters, before?: number) {
  const query = new URLSearchParams({ limit: '25' });
  for (const [k, v] of Object.entries(filters)) if (v) query.set(k, v);
  if (before) query.set('before', String(before));
  return apiRequest(`${keyPaths.requests}?${query}`, { schema: RequestLogPageSchema });
}

export const requestsQueryOptions = (filters: RequestFilters) =>
  infiniteQueryOptions({
    queryKey: ['requests', filters],
    queryFn: ({ pageParam }) => getRequests(filters, pageParam),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });

export const useRequests = (filters: RequestFilters) => useInfiniteQuery(requestsQueryOptions(filters));
