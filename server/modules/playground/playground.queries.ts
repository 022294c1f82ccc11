import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { apiKeys, organizations } from '../../db/schema/index.ts';

/** A key of the organization, by id, with the fields of the organization its limits come from. */
export async function findKeyWithOrganization(db: Db, organizationId: string, keyId: string) {
  const rows = await db
    .select({
      key: apiKeys,
      organization: {
        id: organizations.id,
        planId: organizations.planId,
        customMonthlyQuotaCalls: organizations.customMonthlyQuotaCalls,
        customRatePerMinuteCalls: organizations.customRatePerMinuteCalls,
      },
    })
    .from(apiKeys)
    .innerJoin(organizations, eq(organizations.id, apiKeys.organizationId))
    .where(and(eq(apiKeys.organizationId, organizationId), eq(apiKeys.id, keyId)))
    .limit(1);
  return rows[0];
}
