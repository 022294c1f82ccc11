import { and, eq, notInArray } from 'drizzle-orm';
import { billingSubscriptions } from '../../db/schema/index.ts';
import { randomBytes } from 'node:crypto';
import type { Organization } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { audit, type AuditEntry } from '../audit/audit.ts';
import type { Executor, Tx } from '../auth/auth.types.ts';
import { deleteOrganization, findMembership, findOrganization, insertMembership, insertOrganization, renameOrganization, setMemberRole } from './organizations.queries.ts';

type Meta = Pick<AuditEntry, 'ip' | 'userAgent'>;

function slugify(name: string): string {
  const base = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);
  return base || 'organization';
}

/** Creates an organization owned by `ownerUserId` (inside the caller's transaction). */
export async function createOrganization(tx: Tx, name: string, ownerUserId: string, meta: Meta) {
  const base = slugify(name);
  let org = await insertOrganization(tx, { name, slug: base });
  for (let attempt = 0; !org && attempt < 5; attempt++) {
    org = await insertOrganization(tx, { name, slug: `${base}-${randomBytes(3).toString('hex')}` });
  }
  if (!org) throw new AppError('conflict', 'Could not find a free short name for this organization; try another name.');
  await insertMembership(tx, { organizationId: org.id, userId: ownerUserId, role: 'owner' });
  await audit(tx, { ...meta, organizationId: org.id, actorUserId: ownerUserId, action: 'organization.created', targetType: 'organization', targetId: org.id, details: { name } });
  return org;
}

export async function getOrganization(db: Executor, organizationId: string): Promise<Organization> {
  const org = await findOrganization(db, organizationId);
  if (!org) throw new AppError('not-found', 'No such organization.');
  return { ...org, createdAt: org.createdAt.toISOString() };
}

export async function renameOrganizationAudited(tx: Tx, organizationId: string, actorUserId: string, name: string, meta: Meta) {
  const before = await getOrganization(tx, organizationId);
  if (before.name === name) return before;
  await renameOrganization(tx, organizationId, name);
  await audit(tx, { ...meta, organizationId, actorUserId, action: 'organization.renamed', targetType: 'organization', targetId: organizationId, details: { from: before.name, to: name } });
  return { ...before, name };
}

/** Deletes an organization and everything it owns. The record of the deletion outlives it (no organization). */
export async function deleteOrganizationAudited(tx: Tx, organizationId: string, actorUserId: string, confirmName: string, meta: Meta) {
  const org = await getOrganization(tx, organizationId);
  if (confirmName !== org.name) {
    throw new AppError('validation-error', `Type the organization's name exactly ("${org.name}") to confirm.`, {
      errors: [{ pointer: '#/confirmName', detail: 'Does not match the organization name', code: 'confirm_mismatch' }],
    });
  }
  // A live subscription would go on being charged after its organization is gone: it is cancelled first.
  const live = await tx
    .select({ id: billingSubscriptions.stripeSubscriptionId })
    .from(billingSubscriptions)
    .where(and(eq(billingSubscriptions.organizationId, organizationId), notInArray(billingSubscriptions.status, ['canceled', 'incomplete_expired'])));
  if (live.length > 0) {
    throw new AppError('conflict', 'This organization has a paid subscription. Cancel it on the Billing page (Manage billing) before deleting the organization, so it is not charged again.', {
      extensions: { reason: 'subscription_active' },
    });
  }
  await audit(tx, { ...meta, organizationId: null, actorUserId, action: 'organization.deleted', targetType: 'organization', targetId: organizationId, details: { name: org.name, slug: org.slug } });
  try {
    await deleteOrganization(tx, organizationId);
  } catch (error) {
    if ((error as { cause?: { code?: string }; code?: string }).cause?.code === '23503' || (error as { code?: string }).code === '23503') {
      throw new AppError('conflict', 'This organization still has records that must be closed first (for example an active subscription).');
    }
    throw error;
  }
}

/** Makes another member the owner; the previous owner becomes an admin. */
export async function transferOwnership(tx: Tx, organizationId: string, ownerUserId: string, newOwnerUserId: string, meta: Meta) {
  if (newOwnerUserId === ownerUserId) {
    throw new AppError('validation-error', 'You already own this organization; choose another member.', {
      errors: [{ pointer: '#/userId', detail: 'Choose another member', code: 'same_user' }],
    });
  }
  const target = await findMembership(tx, organizationId, newOwnerUserId);
  if (!target) throw new AppError('not-found', 'No member with this id in your organization.');
  await setMemberRole(tx, organizationId, newOwnerUserId, 'owner');
  await setMemberRole(tx, organizationId, ownerUserId, 'admin');
  await audit(tx, {
    ...meta,
    organizationId,
    actorUserId: ownerUserId,
    action: 'organization.ownership_transferred',
    targetType: 'user',
    targetId: newOwnerUserId,
    details: { previousOwnerUserId: ownerUserId, previousRole: target.role },
  });
}
