import { createHash } from 'node:crypto';
import type { Request, Response } from 'express';
import type { AccountSession, ChangePasswordInput } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { audit, auditForUser } from '../audit/audit.ts';
import { findUserById, setPasswordHash } from '../auth/auth.queries.ts';
import { assertPasswordAllowed } from '../auth/auth.service.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { hashPassword, verifyPassword } from '../auth/password.ts';
import { requestMeta } from '../auth/request-meta.ts';
import type { ConsoleAuth } from '../auth/session.ts';
import { endUserSessions, startSession } from '../auth/session.ts';
import { accountKey, assertNotThrottled, recordSignInFailure, recordSignInSuccess } from '../auth/throttle.ts';
import { addressThrottleKey } from '../auth/request-meta.ts';
import { publicOrigin } from '../mail/links.ts';
import { passwordChangedMail } from '../mail/templates.ts';
import { listLiveSessions } from './accounts.queries.ts';

/**
 * Changes the password after checking the current one (which counts towards sign-in throttling). Every
 * other session of the account ends, and this browser gets a new session token.
 */
export async function changePassword(deps: AccountsDeps, req: Request, res: Response, auth: ConsoleAuth, input: ChangePasswordInput) {
  const { db, env, mailer } = deps;
  const meta = requestMeta(req);
  const address = addressThrottleKey(meta.ip);
  await assertNotThrottled(db, [accountKey(auth.user.email)]);
  const user = await findUserById(db, auth.user.id);
  if (!user) throw new AppError('unauthorized', 'Sign in to use the console: your session is missing or has ended.');
  const check = await verifyPassword(user.passwordHash, input.currentPassword);
  if (!check.ok) {
    await recordSignInFailure(db, env, user.email, address);
    await auditForUser(db, user.id, { ...meta, actorUserId: user.id, action: 'auth.sign_in_failed', targetType: 'user', targetId: user.id, details: { reason: 'wrong_current_password' } });
    throw new AppError('validation-error', 'The current password is not right.', {
      errors: [{ pointer: '#/currentPassword', detail: 'The current password is not right', code: 'credentials_invalid' }],
    });
  }
  await recordSignInSuccess(db, user.email);
  assertPasswordAllowed(input.newPassword, { email: user.email, name: user.name }, '#/newPassword');
  const passwordHash = await hashPassword(input.newPassword);
  await db.transaction(async (tx) => {
    await setPasswordHash(tx, user.id, passwordHash);
    const ended = await endUserSessions(tx, user.id);
    await startSession(tx, env, req, res, user.id, auth.organizationId);
    await auditForUser(tx, user.id, { ...meta, actorUserId: user.id, action: 'account.password_changed', targetType: 'user', targetId: user.id, details: { otherSessionsEnded: Math.max(0, ended - 1) } });
  });
  await mailer.send(passwordChangedMail(user.email, `${publicOrigin(env)}/forgot-password`));
}

/**
 * The id a session is shown under: derived one-way from the stored token hash, never the hash itself
 * (the hash is the lookup key of the cookie's token; it stays on the server, OWASP API3:2023).
 */
export function publicSessionId(tokenHash: string): string {
  return createHash('sha256').update(`session-id:${tokenHash}`).digest('base64url').slice(0, 22);
}

export async function listSessions(deps: AccountsDeps, auth: ConsoleAuth): Promise<AccountSession[]> {
  const rows = await listLiveSessions(deps.db, auth.user.id, deps.env.SESSION_IDLE_MINUTES);
  return rows.map((r) => ({
    id: publicSessionId(r.id),
    current: r.id === auth.sessionId,
    createdAt: r.createdAt.toISOString(),
    lastSeenAt: r.lastSeenAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    ip: r.ip,
    userAgent: r.userAgent,
  }));
}

/** Ends every session of the account, this one included. */
export async function signOutEverywhere(deps: AccountsDeps, req: Request, auth: ConsoleAuth) {
  await deps.db.transaction(async (tx) => {
    const ended = await endUserSessions(tx, auth.user.id);
    await audit(tx, { ...requestMeta(req), organizationId: auth.organizationId, actorUserId: auth.user.id, action: 'auth.signed_out_everywhere', targetType: 'user', targetId: auth.user.id, details: { sessionsEnded: ended } });
  });
}
