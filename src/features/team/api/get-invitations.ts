import { queryOptions, useQuery } from '@tanstack/react-query';
import { InvitationListSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getInvitations = () => apiRequest(apiPaths.invitations, { schema: InvitationListSchema });

export const invitationsQueryOptions = () => queryOptions({ queryKey: ['invitations'], queryFn: getInvitations });

export const useInvitations = (options: { enabled?: boolean } = {}) => useQuery({ ...invitationsQueryOptions(), ...options });
