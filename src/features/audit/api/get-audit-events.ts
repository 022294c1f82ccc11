import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { AuditEventPageSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getAuditEvents = (params: { before?: number; action?: string; limit?: number }) => {
  const query = new URLSearchParams();
  if (params.before) query.set('before', String(params.before));
  if (params.action) query.set('action', params.action);
  query.set('limit', String(params.limit ?? 50));
  return apiRequest(`${apiPaths.auditEvents}?${query}`, { schema: AuditEventPageSchema });
};

export const auditEventsQueryOptions = (action: string) =>
  infiniteQueryOptions({
    queryKey: ['audit-events', action],
    queryFn: ({ pageParam }) => getAuditEvents({ before: pageParam, action: action || undefined }),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export const useAuditEvents = (action: string) => useInfiniteQuery(auditEventsQueryOptions(action));
