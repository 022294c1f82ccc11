/**
 * Invitations: an owner or admin invites an address with a role; the e-mailed link (single use, 7 days)
 * lets the person with that address join, signing up first if they have no account. Accepting needs a
 * session for the invited address; the link also proves the address, so it counts as confirmed.
 */
import type { Request } from 'express';
import type { CreateInvitationInput, Invitation, InvitationPreview } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { audit } from '../audit/audit.ts';
import { markEmailVerified } from '../auth/auth.queries.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { requestMeta } from '../auth/request-meta.ts';
import { setActiveOrganization, type ConsoleAuth, type OrganizationAuth } from '../auth/session.ts';
import { hashToken, randomToken } from '../auth/tokens.ts';
import { tokenLink } from '../mail/links.ts';
import { invitationMail } from '../mail/templates.ts';
import { findMemberByEmail } from '../members/members.queries.ts';
import { findMembership, findOrganization, insertMembership } from '../organizations/organizations.queries.ts';
import {
  findInvitationByTokenHash,
  insertInvitation,
  listOpenInvitations,
  markInvitationAccepted,
  revokeInvitation,
  revokeOpenInvitationFor,
} from './invitations.queries.ts';

export const INVITATION_DAYS = 7;

const uniqueViolation = (error: unknown) =>
  (error as { code?: string }).code === '23505' || (error as { cause?: { code?: string } }).cause?.code === '23505';

function toInvitation(row: Awaited<ReturnType<typeof listOpenInvitations>>[number], now = new Date()): Invitation {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    status: row.expiresAt > now ? 'pending' : 'expired',
    invitedBy: row.inviterName !== null && row.inviterEmail !== null ? { name: row.inviterName, email: row.inviterEmail } : null,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
  };
}

export async function listInvitations(deps: AccountsDeps, organizationId: string): Promise<Invitation[]> {
  return (await listOpenInvitations(deps.db, organizationId)).map((r) => toInvitation(r));
}

/** Invites an address (replacing any open invitation for it) and e-mails the link. */
export async function invite(deps: AccountsDeps, req: Request, auth: OrganizationAuth, input: CreateInvitationInput): Promise<Invitation> {
  const { db, env, mailer } = deps;
  if (await findMemberByEmail(db, auth.organizationId, input.email)) {
    throw new AppError('conflict', `${input.email} is already a member of this organization.`, {
      errors: [{ pointer: '#/email', detail: 'Already a member', code: 'already_member' }],
    });
  }
  const token = randomToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  let row;
  try {
    row = await db.transaction(async (tx) => {
      await revokeOpenInvitationFor(tx, auth.organizationId, input.email);
      const created = await insertInvitation(tx, { organizationId: auth.organizationId, email: input.email, role: input.role, tokenHash: hashToken(token), invitedByUserId: auth.user.id, expiresAt });
      await audit(tx, { ...requestMeta(req), organizationId: auth.organizationId, actorUserId: auth.user.id, action: 'invitation.created', targetType: 'invitation', targetId: created.id, details: { email: input.email, role: input.role } });
      return created;
    });
  } catch (error) {
    if (uniqueViolation(error)) throw new AppError('conflict', `An invitation for ${input.email} was sent at the same moment; refresh the list.`);
    throw error;
  }
  const org = await findOrganization(db, auth.organizationId);
  await mailer.send(invitationMail(input.email, org?.name ?? 'an organization', auth.user.name || auth.user.email, input.role, tokenLink(env, '/invitations/accept', token), INVITATION_DAYS));
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    status: 'pending',
    invitedBy: { name: auth.user.name, email: auth.user.email },
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
  };
}

export async function revoke(deps: AccountsDeps, req: Request, auth: OrganizationAuth, invitationId: string): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const row = await revokeInvitation(tx, auth.organizationId, invitationId);
    if (!row) throw new AppError('not-found', 'No open invitation with this id in your organization.');
    await audit(tx, { ...requestMeta(req), organizationId: auth.organizationId, actorUserId: auth.user.id, action: 'invitation.revoked', targetType: 'invitation', targetId: row.id, details: { email: row.email, role: row.role } });
  });
}

function tokenProblem(code: 'token_invalid' | 'token_used' | 'token_expired' | 'token_revoked') {
  const detail = {
    token_invalid: 'This invitation link is not valid. Open it again from the e-mail, copying all of it.',
    token_used: 'This invitation has already been accepted; each invitation works once. Sign in to reach the organization.',
    token_expired: 'This invitation has expired. Ask the organization for a new one.',
    token_revoked: 'This invitation was withdrawn by the organization. Ask them for a new one.',
  }[code];
  return new AppError('validation-error', detail, { errors: [{ pointer: '#/token', detail, code }] });
}

async function openInvitation(deps: AccountsDeps, token: string) {
  const row = await findInvitationByTokenHash(deps.db, hashToken(token));
  if (!row) throw tokenProblem('token_invalid');
  if (row.acceptedAt) throw tokenProblem('token_used');
  if (row.revokedAt) throw tokenProblem('token_revoked');
  if (row.expiresAt <= new Date()) throw tokenProblem('token_expired');
  return row;
}

/** What a link offers, for the page shown before accepting (no session needed: the token is the proof). */
export async function previewInvitation(deps: AccountsDeps, token: string): Promise<InvitationPreview> {
  const row = await openInvitation(deps, token);
  return { organizationName: row.organizationName, email: row.email, role: row.role, invitedByName: row.inviterName, expiresAt: row.expiresAt.toISOString() };
}

/** Joins the invited organization with the invited role and makes it the session's active one. */
export async function acceptInvitation(deps: AccountsDeps, req: Request, auth: ConsoleAuth, token: string): Promise<string> {
  const row = await openInvitation(deps, token);
  if (row.email.toLowerCase() !== auth.user.email.toLowerCase()) {
    throw new AppError('forbidden', `This invitation is for ${row.email}, but you are signed in as ${auth.user.email}. Sign out, then sign in or sign up with ${row.email}.`, {
      extensions: { reason: 'invitation_email_mismatch' },
    });
  }
  await deps.db.transaction(async (tx) => {
    if (await findMembership(tx, row.organizationId, auth.user.id)) {
      throw new AppError('conflict', `You are already a member of ${row.organizationName}.`);
    }
    if (!(await markInvitationAccepted(tx, row.id, auth.user.id))) throw tokenProblem('token_used');
    await insertMembership(tx, { organizationId: row.organizationId, userId: auth.user.id, role: row.role });
    await markEmailVerified(tx, auth.user.id, row.email);
    await setActiveOrganization(tx, auth.sessionId, row.organizationId);
    const meta = requestMeta(req);
    await audit(tx, { ...meta, organizationId: row.organizationId, actorUserId: auth.user.id, action: 'invitation.accepted', targetType: 'invitation', targetId: row.id, details: { email: row.email, role: row.role } });
    await audit(tx, { ...meta, organizationId: row.organizationId, actorUserId: auth.user.id, action: 'member.joined', targetType: 'user', targetId: auth.user.id, details: { email: row.email, role: row.role } });
  });
  return row.organizationId;
}
