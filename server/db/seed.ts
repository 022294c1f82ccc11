/**
 * The invented demo scenario: "Larkspur Power Supply", a fictional regional retailer. Idempotent: running
 * it again changes nothing. All names here are made up.
 */
import { sql } from 'drizzle-orm';
import type { Db } from './client.ts';
import { memberships, organizations, users } from './schema/index.ts';

export const demo = {
  organization: { name: 'Larkspur Power Supply', slug: 'larkspur-power-supply', planId: 'builder' },
  owner: { email: 'owner@larkspur-power.example', name: 'Wren Okafor' },
} as const;

export async function seedDemo(db: Db): Promise<{ organizationId: string; ownerUserId: string }> {
  return db.transaction(async (tx) => {
    const [org] = await tx
      .insert(organizations)
      .values(demo.organization)
      .onConflictDoUpdate({ target: organizations.slug, set: { name: demo.organization.name } })
      .returning({ id: organizations.id });
    const existing = await tx
      .select({ id: users.id })
      .from(users)
      .where(sql`lower(${users.email}) = lower(${demo.owner.email})`);
    const ownerUserId =
      existing[0]?.id ??
      (await tx.insert(users).values({ ...demo.owner, emailVerifiedAt: new Date() }).returning({ id: users.id }))[0]!.id;
    await tx
      .insert(memberships)
      .values({ organizationId: org!.id, userId: ownerUserId, role: 'owner' })
      .onConflictDoNothing();
    return { organizationId: org!.id, ownerUserId };
  });
}
