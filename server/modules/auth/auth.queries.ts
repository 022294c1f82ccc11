import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import { emailTokens, memberships, organizations, users } from '../../db/schema/index.ts';
import type { Executor } from './auth.types.ts';

export type EmailTokenPurpose = 'verify_email' | 'reset_password';

export async function findUserByEmail(db: Executor, email: string) {
  const [user] = await db
    .select()
    .from(users)
    .where(sql`lower(${users.email}) = lower(${email})`);
  return user;
}

export async function findUserById(db: Executor, id: string) {
  const [user] = await db.select().from(users).where(eq(users.id, id));
  return user;
}

export async function insertUser(db: Executor, values: { email: string; name: string; passwordHash: string }) {
  const [user] = await db.insert(users).values(values).returning();
  return user!;
}

export async function setPasswordHash(db: Executor, userId: string, passwordHash: string) {
  await db.update(users).set({ passwordHash }).where(eq(users.id, userId));
}

export async function markEmailVerified(db: Executor, userId: string, email: string) {
  await db
    .update(users)
    .set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())` })
    .where(and(eq(users.id, userId), sql`lower(${users.email}) = lower(${email})`));
}

export async function updateUserName(db: Executor, userId: string, name: string) {
  const [user] = await db.update(users).set({ name }).where(eq(users.id, userId)).returning();
  return user!;
}

/** The organizations a user belongs to, oldest membership first, with the role in each. */
export async function listUserOrganizations(db: Executor, userId: string) {
  return db
    .select({ id: organizations.id, name: organizations.name, slug: organizations.slug, role: memberships.role })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt), asc(organizations.name));
}

export async function insertEmailToken(
  db: Executor,
  values: { tokenHash: string; userId: string; purpose: EmailTokenPurpose; email: string; expiresAt: Date },
) {
  await db.insert(emailTokens).values(values);
}

/** Ends every unused link of a purpose for a user (a newer one replaces them). */
export async function retireEmailTokens(db: Executor, userId: string, purpose: EmailTokenPurpose) {
  await db
    .update(emailTokens)
    .set({ expiresAt: sql`least(${emailTokens.expiresAt}, now())` })
    .where(and(eq(emailTokens.userId, userId), eq(emailTokens.purpose, purpose), isNull(emailTokens.usedAt)));
}

export async function findEmailToken(db: Executor, tokenHash: string, purpose: EmailTokenPurpose) {
  const [row] = await db
    .select()
    .from(emailTokens)
    .where(and(eq(emailTokens.tokenHash, tokenHash), eq(emailTokens.purpose, purpose)));
  return row;
}

/** Marks a link used if it is still usable; returns it, or undefined when it was not (used, expired, unknown). */
export async function consumeEmailToken(db: Executor, tokenHash: string, purpose: EmailTokenPurpose) {
  const [row] = await db
    .update(emailTokens)
    .set({ usedAt: sql`now()` })
    .where(and(eq(emailTokens.tokenHash, tokenHash), eq(emailTokens.purpose, purpose), isNull(emailTokens.usedAt), sql`${emailTokens.expiresAt} > now()`))
    .returning();
  return row;
}
