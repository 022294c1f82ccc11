/**
 * The audit log: security-relevant actions with actor, time, address and target, visible to an
 * organization's owners and admins. Append-only. Write through `audit()`, inside the transaction of the
 * change it records when there is one, so the log never claims a change that was rolled back.
 *
 * Action names are `<area>.<verb_in_past_tense>`: auth.signed_in, auth.sign_in_failed, auth.signed_out,
 * auth.signed_out_everywhere, account.email_verified, account.password_changed, account.password_reset,
 * organization.created, organization.renamed, organization.deleted, organization.ownership_transferred,
 * member.joined, member.role_changed, member.removed, member.left, invitation.created,
 * invitation.revoked, invitation.accepted — and, from other modules, api_key.created, api_key.revoked,
 * api_key.rotated, api_key.updated, plan.changed, billing.checkout_started, billing.portal_opened,
 * billing.payment_failed, billing.payment_recovered.
 */
import type { Request, Response } from 'express';
import { sql } from 'drizzle-orm';
import { auditEvents, memberships } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';
import { requestMeta } from '../auth/request-meta.ts';

export interface AuditEntry {
  organizationId: string | null;
  actorUserId: string | null;
  action: string;
  targetType?: string | null;
  targetId?: string | null;
  ip?: string | null;
  userAgent?: string | null;
  details?: Record<string, unknown>;
}

/** Appends one event to the audit log. Pass a transaction to record it with the change itself. */
export async function audit(db: Executor, entry: AuditEntry): Promise<void> {
  await db.insert(auditEvents).values({
    organizationId: entry.organizationId,
    actorUserId: entry.actorUserId,
    action: entry.action,
    targetType: entry.targetType ?? null,
    targetId: entry.targetId ?? null,
    ip: entry.ip ?? null,
    userAgent: entry.userAgent ?? null,
    details: entry.details ?? {},
  });
}

/**
 * The usual fields of an event caused by a signed-in console request: its organization, actor, address
 * and browser. Spread it and add action and target:
 *   await audit(tx, { ...auditContext(req, res), action: 'api_key.created', targetType: 'api_key', targetId: key.id });
 */
export function auditContext(req: Request, res: Response): Pick<AuditEntry, 'organizationId' | 'actorUserId' | 'ip' | 'userAgent'> {
  const auth = res.locals.auth;
  return { organizationId: auth?.organizationId ?? null, actorUserId: auth?.user.id ?? null, ...requestMeta(req) };
}

/**
 * Records an event about a user in every organization they belong to (a failed sign-in, a password
 * reset), so each organization's owners and admins see it; with no membership, it is kept without one.
 */
export async function auditForUser(db: Executor, userId: string, entry: Omit<AuditEntry, 'organizationId'>): Promise<void> {
  const result = await db.execute(sql`
    insert into ${auditEvents} (organization_id, actor_user_id, action, target_type, target_id, ip, user_agent, details)
    select m.organization_id, ${entry.actorUserId}, ${entry.action}, ${entry.targetType ?? null}, ${entry.targetId ?? null},
           ${entry.ip ?? null}, ${entry.userAgent ?? null}, ${JSON.stringify(entry.details ?? {})}::jsonb
    from ${memberships} m where m.user_id = ${userId}`);
  if (!result.rowCount) await audit(db, { ...entry, organizationId: null });
}
