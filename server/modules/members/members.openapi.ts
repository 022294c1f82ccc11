import { z } from 'zod';
import { MemberListSchema, MemberSchema, UpdateMemberInputSchema } from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

const Params = z.object({ userId: z.uuid().meta({ description: 'The member’s user id.' }) });

registerConsolePath({
  method: 'get',
  path: '/members',
  summary: 'Members',
  description: 'The active organization’s members and their roles, owner first.',
  access: ['owner', 'admin', 'developer', 'viewer'],
  response: { status: 200, description: 'The members.', schema: MemberListSchema },
});

registerConsolePath({
  method: 'patch',
  path: '/members/{userId}',
  summary: 'Change a member’s role',
  description: 'To admin, developer or viewer. Not your own role, and not the owner’s (ownership moves by transfer).',
  access: ['owner', 'admin'],
  params: Params,
  body: UpdateMemberInputSchema,
  response: { status: 200, description: 'Changed.', schema: MemberSchema },
  problems: { 403: 'Your role does not allow this, or the member is you or the owner.', 404: 'No such member in your organization.' },
});

registerConsolePath({
  method: 'delete',
  path: '/members/{userId}',
  summary: 'Remove a member, or leave',
  description: 'Owners and admins remove others (not the owner); anyone but the owner may remove themselves to leave.',
  access: ['owner', 'admin', 'developer', 'viewer'],
  params: Params,
  response: { status: 204, description: 'Removed.' },
  problems: { 403: 'Your role does not allow removing others, or the member is the owner.', 404: 'No such member in your organization.', 409: 'The owner must transfer ownership before leaving.' },
});
