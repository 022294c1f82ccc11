import { useMutation, useQueryClient } from '@tanstack/react-query';
import { MemberSchema, type UpdateMemberInput } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';
import { membersQueryOptions } from './get-members.ts';

export const updateMemberRole = ({ userId, role }: { userId: string } & UpdateMemberInput) =>
  apiRequest(apiPaths.member(userId), { method: 'PATCH', body: { role }, schema: MemberSchema });

export function useUpdateMemberRole() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateMemberRole, onSuccess: () => queryClient.invalidateQueries(membersQueryOptions()) });
}
