/**
 * Sign-up, sign-in, e-mail verification and password reset: the flows, read top to bottom. Routes parse
 * and send; SQL is in *.queries.ts.
 */
import type { Request, Response } from 'express';
import type { ResetPasswordInput, SignInInput, SignUpInput, SignUpResult, SessionInfo, VerifiedEmail } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { audit, auditForUser } from '../audit/audit.ts';
import { tokenLink } from '../mail/links.ts';
import { passwordResetMail, verificationMail } from '../mail/templates.ts';
import { createOrganization } from '../organizations/organizations.service.ts';
import type { AccountsDeps, Executor } from './auth.types.ts';
import {
  consumeEmailToken,
  findEmailToken,
  findUserByEmail,
  findUserById,
  insertEmailToken,
  insertUser,
  listUserOrganizations,
  markEmailVerified,
  retireEmailTokens,
  setPasswordHash,
  type EmailTokenPurpose,
} from './auth.queries.ts';
import { hashPassword, verifyPassword } from './password.ts';
import { checkPasswordPolicy, type PasswordContext } from './password-policy.ts';
import { addressThrottleKey, requestMeta } from './request-meta.ts';
import { endUserSessions, startSession } from './session.ts';
import { buildSessionInfo } from './session-info.ts';
import { accountKey, assertNotThrottled, recordSignInFailure, recordSignInSuccess, signInAddressKey, throttleMailRequest } from './throttle.ts';
import { hashToken, randomToken } from './tokens.ts';

export const VERIFY_LINK_HOURS = 24;
export const RESET_LINK_MINUTES = 60;

/** 422 naming the password field when the policy refuses a new password. */
export function assertPasswordAllowed(password: string, context: PasswordContext, pointer = '#/password') {
  const errors = checkPasswordPolicy(password, context, pointer);
  if (errors.length) throw new AppError('validation-error', errors[0]!.detail, { errors });
}

const uniqueViolation = (error: unknown) =>
  (error as { code?: string }).code === '23505' || (error as { cause?: { code?: string } }).cause?.code === '23505';

async function issueEmailToken(db: Executor, userId: string, email: string, purpose: EmailTokenPurpose, ttlMs: number): Promise<string> {
  await retireEmailTokens(db, userId, purpose);
  const token = randomToken();
  await insertEmailToken(db, { tokenHash: hashToken(token), userId, purpose, email, expiresAt: new Date(Date.now() + ttlMs) });
  return token;
}

const tokenProblem = (code: 'token_invalid' | 'token_used' | 'token_expired' | 'token_revoked', what: string, again: string) => {
  const detail = {
    token_invalid: `This ${what} link is not valid. Open the most recent link from the e-mail, copying all of it, or ${again}.`,
    token_used: `This ${what} link has already been used; each link works once. ${again[0]!.toUpperCase()}${again.slice(1)} if you need another.`,
    token_expired: `This ${what} link has expired. ${again[0]!.toUpperCase()}${again.slice(1)}.`,
    token_revoked: `This ${what} has been withdrawn by the organization. Ask them for a new one.`,
  }[code];
  return new AppError('validation-error', detail, { errors: [{ pointer: '#/token', detail, code }] });
};

/** Why a link is unusable, as a 422 problem (it was unknown, already used, or expired). */
async function explainUnusableToken(db: Executor, tokenHash: string, purpose: EmailTokenPurpose): Promise<never> {
  const row = await findEmailToken(db, tokenHash, purpose);
  const [what, again] = purpose === 'verify_email' ? ['confirmation', 'ask for a new confirmation e-mail'] : ['password reset', 'ask for a new reset e-mail'];
  if (!row) throw tokenProblem('token_invalid', what, again);
  if (row.usedAt) throw tokenProblem('token_used', what, again);
  throw tokenProblem('token_expired', what, again);
}

export async function signUp(deps: AccountsDeps, req: Request, input: SignUpInput): Promise<SignUpResult> {
  const { db, env, mailer } = deps;
  const meta = requestMeta(req);
  assertPasswordAllowed(input.password, { email: input.email, name: input.name });
  await throttleMailRequest(db, env, addressThrottleKey(meta.ip));
  if (await findUserByEmail(db, input.email)) throw duplicateEmail();
  const passwordHash = await hashPassword(input.password);
  let created;
  try {
    created = await db.transaction(async (tx) => {
      const user = await insertUser(tx, { email: input.email, name: input.name, passwordHash });
      if (input.organizationName) await createOrganization(tx, input.organizationName, user.id, meta);
      const token = await issueEmailToken(tx, user.id, user.email, 'verify_email', VERIFY_LINK_HOURS * 3_600_000);
      return { user, token };
    });
  } catch (error) {
    if (uniqueViolation(error)) throw duplicateEmail();
    throw error;
  }
  const { user, token } = created;
  await mailer.send(verificationMail(user.email, user.name, tokenLink(env, '/verify-email', token), VERIFY_LINK_HOURS));
  return { user: { id: user.id, email: user.email, name: user.name, emailVerified: false }, verificationSentTo: user.email };
}

function duplicateEmail() {
  return new AppError('conflict', 'An account with this e-mail address already exists. Sign in, or reset your password if you have forgotten it.', {
    errors: [{ pointer: '#/email', detail: 'An account with this e-mail address already exists', code: 'email_taken' }],
  });
}

export async function signIn(deps: AccountsDeps, req: Request, res: Response, input: SignInInput): Promise<SessionInfo> {
  const { db, env } = deps;
  const meta = requestMeta(req);
  const address = addressThrottleKey(meta.ip);
  await assertNotThrottled(db, [accountKey(input.email), signInAddressKey(address)]);
  const user = await findUserByEmail(db, input.email);
  // Always run one argon2 verification, against a dummy hash when there is no such account.
  const check = await verifyPassword(user?.passwordHash ?? null, input.password);
  if (!user || !check.ok) {
    await recordSignInFailure(db, env, input.email, address);
    if (user) await auditForUser(db, user.id, { ...meta, actorUserId: user.id, action: 'auth.sign_in_failed', targetType: 'user', targetId: user.id, details: { reason: 'wrong_password' } });
    throw new AppError('unauthorized', 'The e-mail address or the password is not right.', {
      errors: [{ pointer: '#/password', detail: 'The e-mail address or the password is not right', code: 'credentials_invalid' }],
    });
  }
  await recordSignInSuccess(db, input.email);
  if (!user.emailVerifiedAt) {
    throw new AppError('forbidden', `Confirm your e-mail address first: follow the link we sent to ${user.email}, or ask for a new one.`, {
      extensions: { reason: 'email_unverified' },
    });
  }
  if (check.needsRehash) await setPasswordHash(db, user.id, await hashPassword(input.password));
  const organizations = await listUserOrganizations(db, user.id);
  const activeOrganizationId = organizations[0]?.id ?? null;
  const session = await db.transaction(async (tx) => {
    const started = await startSession(tx, env, req, res, user.id, activeOrganizationId);
    await audit(tx, { ...meta, organizationId: activeOrganizationId, actorUserId: user.id, action: 'auth.signed_in', targetType: 'user', targetId: user.id });
    return started;
  });
  return buildSessionInfo(db, env, { userId: user.id, organizationId: activeOrganizationId, expiresAt: session.expiresAt });
}

export async function verifyEmail(deps: AccountsDeps, req: Request, token: string): Promise<VerifiedEmail> {
  const { db } = deps;
  const tokenHash = hashToken(token);
  const email = await db.transaction(async (tx) => {
    const row = await consumeEmailToken(tx, tokenHash, 'verify_email');
    if (!row) return null;
    await markEmailVerified(tx, row.userId, row.email);
    await auditForUser(tx, row.userId, { ...requestMeta(req), actorUserId: row.userId, action: 'account.email_verified', targetType: 'user', targetId: row.userId, details: { email: row.email } });
    return row.email;
  });
  if (!email) return explainUnusableToken(db, tokenHash, 'verify_email');
  return { email, emailVerified: true };
}

/** Sends a new confirmation link when the address has an unconfirmed account; says the same either way. */
export async function resendVerification(deps: AccountsDeps, req: Request, email: string): Promise<void> {
  const { db, env, mailer } = deps;
  await throttleMailRequest(db, env, addressThrottleKey(requestMeta(req).ip));
  const user = await findUserByEmail(db, email);
  if (!user || user.emailVerifiedAt) return;
  const token = await issueEmailToken(db, user.id, user.email, 'verify_email', VERIFY_LINK_HOURS * 3_600_000);
  await mailer.send(verificationMail(user.email, user.name, tokenLink(env, '/verify-email', token), VERIFY_LINK_HOURS));
}

/** Sends a reset link when the address has an account; says the same either way (no account discovery). */
export async function requestPasswordReset(deps: AccountsDeps, req: Request, email: string): Promise<void> {
  const { db, env, mailer } = deps;
  await throttleMailRequest(db, env, addressThrottleKey(requestMeta(req).ip));
  const user = await findUserByEmail(db, email);
  if (!user) return;
  const token = await issueEmailToken(db, user.id, user.email, 'reset_password', RESET_LINK_MINUTES * 60_000);
  await mailer.send(passwordResetMail(user.email, tokenLink(env, '/reset-password', token), RESET_LINK_MINUTES));
}

/**
 * Sets a new password from a reset link: the link is used up, every session of the account ends, and the
 * address counts as confirmed (the link proved it).
 */
export async function resetPassword(deps: AccountsDeps, req: Request, input: ResetPasswordInput): Promise<void> {
  const { db } = deps;
  const tokenHash = hashToken(input.token);
  const pending = await findEmailToken(db, tokenHash, 'reset_password');
  const user = pending && !pending.usedAt && pending.expiresAt > new Date() ? await findUserById(db, pending.userId) : undefined;
  if (!pending || !user) return explainUnusableToken(db, tokenHash, 'reset_password');
  assertPasswordAllowed(input.password, { email: user.email, name: user.name });
  const passwordHash = await hashPassword(input.password);
  const done = await db.transaction(async (tx) => {
    const row = await consumeEmailToken(tx, tokenHash, 'reset_password');
    if (!row) return false;
    await setPasswordHash(tx, row.userId, passwordHash);
    await retireEmailTokens(tx, row.userId, 'reset_password');
    await markEmailVerified(tx, row.userId, row.email);
    const ended = await endUserSessions(tx, row.userId);
    await auditForUser(tx, row.userId, { ...requestMeta(req), actorUserId: row.userId, action: 'account.password_reset', targetType: 'user', targetId: row.userId, details: { sessionsEnded: ended } });
    return true;
  });
  if (!done) return explainUnusableToken(db, tokenHash, 'reset_password');
}
