import { and, count, eq, sql } from 'drizzle-orm';
import { memberships, organizations } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';

export async function insertOrganization(db: Executor, values: { name: string; slug: string }) {
  const [org] = await db.insert(organizations).values(values).onConflictDoNothing({ target: organizations.slug }).returning();
  return org;
}

export async function insertMembership(db: Executor, values: { organizationId: string; userId: string; role: 'owner' | 'admin' | 'developer' | 'viewer' }) {
  await db.insert(memberships).values(values);
}

export async function findOrganization(db: Executor, id: string) {
  const [org] = await db
    .select({
      id: organizations.id,
      name: organizations.name,
      slug: organizations.slug,
      planId: organizations.planId,
      createdAt: organizations.createdAt,
      memberCount: sql<number>`(select ${count()}::int from ${memberships} where ${memberships.organizationId} = ${organizations.id})`,
    })
    .from(organizations)
    .where(eq(organizations.id, id));
  return org;
}

export async function renameOrganization(db: Executor, id: string, name: string) {
  await db.update(organizations).set({ name }).where(eq(organizations.id, id));
}

export async function deleteOrganization(db: Executor, id: string) {
  await db.delete(organizations).where(eq(organizations.id, id));
}

export async function findMembership(db: Executor, organizationId: string, userId: string) {
  const [m] = await db
    .select()
    .from(memberships)
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.userId, userId)));
  return m;
}

export async function setMemberRole(db: Executor, organizationId: string, userId: string, role: 'owner' | 'admin' | 'developer' | 'viewer') {
  await db
    .update(memberships)
    .set({ role })
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.userId, userId)));
}
