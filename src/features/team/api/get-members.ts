import { queryOptions, useQuery } from '@tanstack/react-query';
import { MemberListSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getMembers = () => apiRequest(apiPaths.members, { schema: MemberListSchema });

export const membersQueryOptions = () => queryOptions({ queryKey: ['members'], queryFn: getMembers });

export const useMembers = () => useQuery(membersQueryOptions());
