import { Router } from 'express';
import {
  AcceptedSchema,
  EmailInputSchema,
  ResetPasswordInputSchema,
  SessionInfoSchema,
  SignInInputSchema,
  SignUpInputSchema,
  SignUpResultSchema,
  SwitchOrganizationInputSchema,
  TokenInputSchema,
  VerifiedEmailSchema,
} from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody } from '../../http/validate.ts';
import { audit } from '../audit/audit.ts';
import { findMembership } from '../organizations/organizations.queries.ts';
import { requestPasswordReset, resendVerification, resetPassword, signIn, signUp, verifyEmail } from './auth.service.ts';
import type { AccountsDeps } from './auth.types.ts';
import { requestMeta } from './request-meta.ts';
import { buildSessionInfo } from './session-info.ts';
import { clearSessionCookie, endSession, requireSession, sessionAuth, setActiveOrganization } from './session.ts';

const accepted = (detail: string) => AcceptedSchema.parse({ status: 'accepted', detail });

/** /auth/* (signed out) and /session (signed in). */
export function authRouter(deps: AccountsDeps) {
  const { db, env } = deps;
  const router = Router();

  router.post('/auth/sign-up', async (req, res) => {
    const input = parseJsonBody(SignUpInputSchema, req);
    res.status(201).json(SignUpResultSchema.parse(await signUp(deps, req, input)));
  });

  router.post('/auth/sign-in', async (req, res) => {
    const input = parseJsonBody(SignInInputSchema, req);
    res.json(SessionInfoSchema.parse(await signIn(deps, req, res, input)));
  });

  router.post('/auth/sign-out', async (req, res) => {
    const auth = res.locals.auth;
    if (auth) {
      await endSession(db, auth.sessionId);
      await audit(db, { ...requestMeta(req), organizationId: auth.organizationId, actorUserId: auth.user.id, action: 'auth.signed_out', targetType: 'user', targetId: auth.user.id });
    }
    clearSessionCookie(env, res);
    res.status(204).end();
  });

  router.post('/auth/verify-email', async (req, res) => {
    const { token } = parseJsonBody(TokenInputSchema, req);
    res.json(VerifiedEmailSchema.parse(await verifyEmail(deps, req, token)));
  });

  router.post('/auth/resend-verification', async (req, res) => {
    const { email } = parseJsonBody(EmailInputSchema, req);
    await resendVerification(deps, req, email);
    res.status(202).json(accepted(`If ${email} has an account waiting for confirmation, a new link is on its way.`));
  });

  router.post('/auth/forgot-password', async (req, res) => {
    const { email } = parseJsonBody(EmailInputSchema, req);
    await requestPasswordReset(deps, req, email);
    res.status(202).json(accepted(`If ${email} has an account, a password reset link is on its way. It works once and for an hour.`));
  });

  router.post('/auth/reset-password', async (req, res) => {
    const input = parseJsonBody(ResetPasswordInputSchema, req);
    await resetPassword(deps, req, input);
    res.status(204).end();
  });

  router.get('/session', requireSession, async (_req, res) => {
    const auth = sessionAuth(res);
    res.json(SessionInfoSchema.parse(await buildSessionInfo(db, env, { userId: auth.user.id, organizationId: auth.organizationId, expiresAt: auth.expiresAt })));
  });

  router.put('/session/organization', requireSession, async (req, res) => {
    const auth = sessionAuth(res);
    const { organizationId } = parseJsonBody(SwitchOrganizationInputSchema, req);
    if (!(await findMembership(db, organizationId, auth.user.id))) {
      throw new AppError('not-found', 'No organization with this id among yours.');
    }
    await setActiveOrganization(db, auth.sessionId, organizationId);
    res.json(SessionInfoSchema.parse(await buildSessionInfo(db, env, { userId: auth.user.id, organizationId, expiresAt: auth.expiresAt })));
  });

  return router;
}
