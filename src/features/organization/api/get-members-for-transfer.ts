import { queryOptions, useQuery } from '@tanstack/react-query';
import { MemberListSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

/** The members an owner may hand the organization to (same endpoint and cache as the team list). */
export const getMembersForTransfer = () => apiRequest(apiPaths.members, { schema: MemberListSchema });

export const membersForTransferQueryOptions = () => queryOptions({ queryKey: ['members'], queryFn: getMembersForTransfer });

export const useMembersForTransfer = (enabled: boolean) => useQuery({ ...membersForTransferQueryOptions(), enabled });
