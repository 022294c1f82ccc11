import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../../tests/setup/app.ts';
import { verifyPassword } from '../modules/auth/password.ts';
import { memberships, users } from './schema/index.ts';
import { demo, seedDemo } from './seed.ts';

const { db, close } = createTestApp();
afterAll(() => close());

describe('the demo seed', () => {
  it('when run twice, then it changes nothing the second time and the demo people can sign in with the printed passphrase', async () => {
    const first = await seedDemo(db);
    const second = await seedDemo(db);
    expect(second).toEqual(first);
    const team = await db.select({ email: users.email, role: memberships.role, hash: users.passwordHash }).from(memberships).innerJoin(users, eq(users.id, memberships.userId)).where(eq(memberships.organizationId, first.organizationId));
    expect(team.map((t) => [t.email, t.role]).sort()).toEqual(
      [[demo.owner.email, 'owner'], ...demo.team.map((m) => [m.email, m.role])].sort(),
    );
    for (const person of team) expect((await verifyPassword(person.hash, demo.password)).ok).toBe(true);
    expect([...demo.password].length).toBeGreaterThanOrEqual(15);
  });
});
