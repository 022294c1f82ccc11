/** Test fixtures that write real rows: organizations and API keys, each unique to the test that asks. */
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../../server/db/client.ts';
import { organizations } from '../../server/db/schema/index.ts';
import { createKey } from '../../server/modules/keys/keys.service.ts';

export async function createOrganization(db: Db, values: Partial<typeof organizations.$inferInsert> = {}) {
  const suffix = randomBytes(4).toString('hex');
  const [org] = await db
    .insert(organizations)
    .values({ name: `Test Organization ${suffix}`, slug: `test-org-${suffix}`, ...values })
    .returning();
  return org!;
}

export async function setLimits(db: Db, organizationId: string, limits: { monthly?: number | null; perMinute?: number | null; planId?: string }) {
  await db
    .update(organizations)
    .set({
      ...(limits.monthly !== undefined ? { customMonthlyQuotaCalls: limits.monthly } : {}),
      ...(limits.perMinute !== undefined ? { customRatePerMinuteCalls: limits.perMinute } : {}),
      ...(limits.planId ? { planId: limits.planId } : {}),
    })
    .where(eq(organizations.id, organizationId));
}

export async function createTestKey(
  db: Db,
  hashSecret: string,
  organizationId: string,
  options: { kind?: 'server' | 'embed'; allowedOrigins?: string[]; name?: string; expiresAt?: Date | null } = {},
) {
  return createKey(db, hashSecret, {
    organizationId,
    createdByUserId: null,
    name: options.name ?? 'test key',
    kind: options.kind ?? 'server',
    allowedOrigins: options.allowedOrigins,
    expiresAt: options.expiresAt,
  });
}
