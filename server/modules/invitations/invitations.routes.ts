import { Router } from 'express';
import { CreateInvitationInputSchema, InvitationListSchema, InvitationPreviewSchema, InvitationSchema, SessionInfoSchema, TokenInputSchema, UuidSchema } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody } from '../../http/validate.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { buildSessionInfo } from '../auth/session-info.ts';
import { organizationAuth, requireRole, requireSession, sessionAuth } from '../auth/session.ts';
import { acceptInvitation, invite, listInvitations, previewInvitation, revoke } from './invitations.service.ts';

/** /invitations: invite by e-mail with a role; preview and accept a link; revoke. */
export function invitationsRouter(deps: AccountsDeps) {
  const router = Router();

  router.get('/invitations', requireRole('owner', 'admin'), async (_req, res) => {
    res.json(InvitationListSchema.parse({ invitations: await listInvitations(deps, organizationAuth(res).organizationId) }));
  });

  router.post('/invitations', requireRole('owner', 'admin'), async (req, res) => {
    const input = parseJsonBody(CreateInvitationInputSchema, req);
    res.status(201).json(InvitationSchema.parse(await invite(deps, req, organizationAuth(res), input)));
  });

  // Token routes come before '/invitations/:invitationId' so their names are not taken for ids.
  router.post('/invitations/preview', async (req, res) => {
    const { token } = parseJsonBody(TokenInputSchema, req);
    res.json(InvitationPreviewSchema.parse(await previewInvitation(deps, token)));
  });

  router.post('/invitations/accept', requireSession, async (req, res) => {
    const auth = sessionAuth(res);
    const { token } = parseJsonBody(TokenInputSchema, req);
    const organizationId = await acceptInvitation(deps, req, auth, token);
    res.json(SessionInfoSchema.parse(await buildSessionInfo(deps.db, deps.env, { userId: auth.user.id, organizationId, expiresAt: auth.expiresAt })));
  });

  router.delete('/invitations/:invitationId', requireRole('owner', 'admin'), async (req, res) => {
    const parsed = UuidSchema.safeParse(req.params.invitationId);
    if (!parsed.success) throw new AppError('not-found', 'No open invitation with this id in your organization.');
    await revoke(deps, req, organizationAuth(res), parsed.data);
    res.status(204).end();
  });

  return router;
}
