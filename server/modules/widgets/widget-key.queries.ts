import { and, eq } from 'drizzle-orm';
import { apiKeys } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';

/** Sets a key's name and allowed origins; the organization scopes the change. */
export async function updateKeyRow(db: Executor, organizationId: string, keyId: string, values: { name: string; allowedOrigins: string[] }) {
  const [row] = await db
    .update(apiKeys)
    .set(values)
    .where(and(eq(apiKeys.organizationId, organizationId), eq(apiKeys.id, keyId)))
    .returning();
  return row;
}
