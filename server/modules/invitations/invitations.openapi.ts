import { z } from 'zod';
import { CreateInvitationInputSchema, InvitationListSchema, InvitationPreviewSchema, InvitationSchema, SessionInfoSchema, TokenInputSchema } from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

const tokenProblems = 'The link is unknown, already accepted, withdrawn or expired (`errors[0].code`: token_invalid, token_used, token_revoked, token_expired).';

registerConsolePath({
  method: 'get',
  path: '/invitations',
  summary: 'Open invitations',
  description: 'Invitations not yet accepted or revoked, newest first; each pending or expired.',
  access: ['owner', 'admin'],
  response: { status: 200, description: 'The invitations.', schema: InvitationListSchema },
});

registerConsolePath({
  method: 'post',
  path: '/invitations',
  summary: 'Invite someone',
  description: 'E-mails a link valid for 7 days, replacing any open invitation for the same address.',
  access: ['owner', 'admin'],
  body: CreateInvitationInputSchema,
  response: { status: 201, description: 'Invited.', schema: InvitationSchema },
  problems: { 409: 'The address already belongs to a member.' },
});

registerConsolePath({
  method: 'delete',
  path: '/invitations/{invitationId}',
  summary: 'Revoke an invitation',
  description: 'The link stops working at once.',
  access: ['owner', 'admin'],
  params: z.object({ invitationId: z.uuid() }),
  response: { status: 204, description: 'Revoked.' },
  problems: { 404: 'No open invitation with this id in your organization.' },
});

registerConsolePath({
  method: 'post',
  path: '/invitations/preview',
  summary: 'What an invitation offers',
  description: 'Organization, role and invited address of an invitation link, before accepting.',
  access: 'public',
  body: TokenInputSchema,
  response: { status: 200, description: 'The invitation.', schema: InvitationPreviewSchema },
  problems: { 422: tokenProblems },
});

registerConsolePath({
  method: 'post',
  path: '/invitations/accept',
  summary: 'Accept an invitation',
  description: 'Joins the organization with the invited role and makes it the active one. The signed-in address must be the invited one.',
  access: 'session',
  body: TokenInputSchema,
  response: { status: 200, description: 'Joined.', schema: SessionInfoSchema },
  problems: { 403: 'Signed in with another address than the invited one, or a cross-site request.', 409: 'Already a member.', 422: tokenProblems },
});
