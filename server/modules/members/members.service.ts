import type { Member, Role } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { audit, type AuditEntry } from '../audit/audit.ts';
import type { Tx } from '../auth/auth.types.ts';
import type { OrganizationAuth } from '../auth/session.ts';
import { setMemberRole } from '../organizations/organizations.queries.ts';
import { deleteMembership, findMember } from './members.queries.ts';

type Meta = Pick<AuditEntry, 'ip' | 'userAgent'>;

const toMember = (m: { userId: string; email: string; name: string; role: Role; joinedAt: Date }): Member => ({ ...m, joinedAt: m.joinedAt.toISOString() });

async function memberOrNotFound(tx: Tx, organizationId: string, userId: string) {
  const member = await findMember(tx, organizationId, userId);
  // Another organization's people are simply not found here: 404, never 403.
  if (!member) throw new AppError('not-found', 'No member with this id in your organization.');
  return member;
}

/** Changes a member's role (owners and admins). The owner's role moves only by transfer; nobody changes their own. */
export async function changeMemberRole(tx: Tx, auth: OrganizationAuth, userId: string, role: Exclude<Role, 'owner'>, meta: Meta): Promise<Member> {
  const member = await memberOrNotFound(tx, auth.organizationId, userId);
  if (userId === auth.user.id) throw new AppError('forbidden', 'You cannot change your own role. Another owner or admin can, or the owner can transfer ownership.');
  if (member.role === 'owner') throw new AppError('forbidden', "The owner's role changes only when the owner transfers ownership.");
  if (member.role === role) return toMember(member);
  await setMemberRole(tx, auth.organizationId, userId, role);
  await audit(tx, { ...meta, organizationId: auth.organizationId, actorUserId: auth.user.id, action: 'member.role_changed', targetType: 'user', targetId: userId, details: { email: member.email, from: member.role, to: role } });
  return toMember({ ...member, role });
}

/**
 * Removes a member (owners and admins), or lets anyone but the owner leave. The owner transfers ownership
 * before leaving, so an organization always has one.
 */
export async function removeMember(tx: Tx, auth: OrganizationAuth, userId: string, meta: Meta): Promise<void> {
  const leaving = userId === auth.user.id;
  if (!leaving && auth.role !== 'owner' && auth.role !== 'admin') {
    throw new AppError('forbidden', `Your role in this organization (${auth.role}) cannot remove members; it needs owner or admin.`, {
      extensions: { role: auth.role, requiredRoles: ['owner', 'admin'] },
    });
  }
  const member = await memberOrNotFound(tx, auth.organizationId, userId);
  if (member.role === 'owner') {
    throw leaving
      ? new AppError('conflict', 'Transfer ownership to another member before you leave this organization.')
      : new AppError('forbidden', 'The owner cannot be removed; the owner can transfer ownership and then be removed.');
  }
  await deleteMembership(tx, auth.organizationId, userId);
  await audit(tx, {
    ...meta,
    organizationId: auth.organizationId,
    actorUserId: auth.user.id,
    action: leaving ? 'member.left' : 'member.removed',
    targetType: 'user',
    targetId: userId,
    details: { email: member.email, role: member.role },
  });
}

export { toMember };
