import { queryOptions, useQuery } from '@tanstack/react-query';
import { InvitationPreviewSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

/** What an invitation link offers (a POST: the token goes in the body, never in a URL). */
export const previewInvitation = (token: string) => apiRequest(apiPaths.invitationPreview, { method: 'POST', body: { token }, schema: InvitationPreviewSchema });

export const invitationPreviewQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitation-preview', token], queryFn: () => previewInvitation(token), retry: false, enabled: token !== '' });

export const useInvitationPreview = (token: string) => useQuery(invitationPreviewQueryOptions(token));
