import { and, asc, eq, sql } from 'drizzle-orm';
import { memberships, sessions, users } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';

const roleRank = sql`case ${memberships.role} when 'owner' then 0 when 'admin' then 1 when 'developer' then 2 else 3 end`;

export async function listMembers(db: Executor, organizationId: string) {
  return db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .orderBy(roleRank, asc(users.name), asc(users.email));
}

export async function findMember(db: Executor, organizationId: string, userId: string) {
  const [row] = await db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.userId, userId)));
  return row;
}

export async function findMemberByEmail(db: Executor, organizationId: string, email: string) {
  const [row] = await db
    .select({ userId: users.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), sql`lower(${users.email}) = lower(${email})`));
  return row;
}

export async function deleteMembership(db: Executor, organizationId: string, userId: string) {
  await db.delete(memberships).where(and(eq(memberships.organizationId, organizationId), eq(memberships.userId, userId)));
  // Sessions that had this organization open fall back to another one on their next request.
  await db
    .update(sessions)
    .set({ activeOrganizationId: null })
    .where(and(eq(sessions.userId, userId), eq(sessions.activeOrganizationId, organizationId)));
}
