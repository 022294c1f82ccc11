/**
 * The invented demo scenario: "Larkspur Power Supply", a fictional regional retailer, with its owner and
 * two team members. Idempotent: running it again changes nothing (a password or role changed in the
 * console stays as it is). All names, addresses and the passphrase here are made up.
 */
import { sql } from 'drizzle-orm';
import { hashPassword } from '../modules/auth/password.ts';
import { seedDemoCatalog } from '../modules/catalog/catalog.seed.ts';
import type { Db } from './client.ts';
import { memberships, organizations, users } from './schema/index.ts';

export const demo = {
  organization: { name: 'Larkspur Power Supply', slug: 'larkspur-power-supply', planId: 'builder' },
  owner: { email: 'owner@larkspur-power.example', name: 'Wren Okafor' },
  /** The demo sign-in passphrase for every demo person: invented, for the local demo only. */
  password: 'amber-lantern-over-the-marsh',
  team: [
    { email: 'tobias.ferrand@larkspur-power.example', name: 'Tobias Ferrand', role: 'admin' },
    { email: 'imani.castell@larkspur-power.example', name: 'Imani Castell', role: 'developer' },
  ],
} as const;

export async function seedDemo(db: Db): Promise<{ organizationId: string; ownerUserId: string }> {
  const passwordHash = await hashPassword(demo.password);
  return db.transaction(async (tx) => {
    const [org] = await tx
      .insert(organizations)
      .values(demo.organization)
      .onConflictDoUpdate({ target: organizations.slug, set: { name: demo.organization.name } })
      .returning({ id: organizations.id });

    /** The person with this address, created verified with the demo passphrase when missing. */
    async function person(p: { email: string; name: string }): Promise<string> {
      const [existing] = await tx
        .select({ id: users.id, passwordHash: users.passwordHash })
        .from(users)
        .where(sql`lower(${users.email}) = lower(${p.email})`);
      if (existing) {
        // Demo data seeded before sign-in existed has no password yet.
        if (!existing.passwordHash) await tx.update(users).set({ passwordHash }).where(sql`${users.id} = ${existing.id}`);
        return existing.id;
      }
      return (await tx.insert(users).values({ ...p, passwordHash, emailVerifiedAt: new Date() }).returning({ id: users.id }))[0]!.id;
    }

    const ownerUserId = await person(demo.owner);
    await tx.insert(memberships).values({ organizationId: org!.id, userId: ownerUserId, role: 'owner' }).onConflictDoNothing();
    for (const member of demo.team) {
      const userId = await person(member);
      await tx.insert(memberships).values({ organizationId: org!.id, userId, role: member.role }).onConflictDoNothing();
    }
    await seedDemoCatalog(tx, org!.id);
    return { organizationId: org!.id, ownerUserId };
  });
}
