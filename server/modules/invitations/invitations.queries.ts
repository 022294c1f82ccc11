import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { invitations, organizations, users } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';

/** Open invitations (not accepted, not revoked) of an organization, newest first, with who sent them. */
export async function listOpenInvitations(db: Executor, organizationId: string) {
  return db
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      createdAt: invitations.createdAt,
      expiresAt: invitations.expiresAt,
      inviterName: users.name,
      inviterEmail: users.email,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(and(eq(invitations.organizationId, organizationId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt));
}

/** Revokes the open invitation for an address, if any (a new one replaces it). */
export async function revokeOpenInvitationFor(db: Executor, organizationId: string, email: string) {
  await db
    .update(invitations)
    .set({ revokedAt: sql`now()` })
    .where(and(eq(invitations.organizationId, organizationId), sql`lower(${invitations.email}) = lower(${email})`, isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
}

export async function insertInvitation(
  db: Executor,
  values: { organizationId: string; email: string; role: 'admin' | 'developer' | 'viewer'; tokenHash: string; invitedByUserId: string; expiresAt: Date },
) {
  const [row] = await db.insert(invitations).values(values).returning();
  return row!;
}

/** Revokes one open invitation of an organization; undefined when there is none with that id there. */
export async function revokeInvitation(db: Executor, organizationId: string, id: string) {
  const [row] = await db
    .update(invitations)
    .set({ revokedAt: sql`now()` })
    .where(and(eq(invitations.id, id), eq(invitations.organizationId, organizationId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .returning();
  return row;
}

export async function findInvitationByTokenHash(db: Executor, tokenHash: string) {
  const [row] = await db
    .select({
      id: invitations.id,
      organizationId: invitations.organizationId,
      organizationName: organizations.name,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      inviterName: users.name,
    })
    .from(invitations)
    .innerJoin(organizations, eq(organizations.id, invitations.organizationId))
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(eq(invitations.tokenHash, tokenHash));
  return row;
}

/** Marks an invitation accepted if it is still open and unexpired; undefined otherwise. */
export async function markInvitationAccepted(db: Executor, id: string, userId: string) {
  const [row] = await db
    .update(invitations)
    .set({ acceptedAt: sql`now()`, acceptedByUserId: userId })
    .where(and(eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), sql`${invitations.expiresAt} > now()`))
    .returning();
  return row;
}
