/**
 * Demo API access for the invented demo organization: its server key and, for benchmarks, its custom
 * limits. The key is OHMSTEAD_DEMO_SERVER_KEY when set; otherwise one is generated on first start and
 * kept in `.data/demo-server-key` (a development convenience on the local machine only: the database
 * holds only its keyed hash), so `npm start` can print it every time.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { apiKeys, organizations } from '../../db/schema/index.ts';
import { generateApiKey, hashApiKey, KEY_PATTERN, keyDisplayParts } from './key-format.ts';

export const DEMO_HIGH_LIMITS = { monthlyQuotaCalls: 10_000_000, ratePerMinuteCalls: 1_000_000 };

export function demoServerKey(fromEnv: string | undefined, keyFile: string): string {
  if (fromEnv) return fromEnv;
  if (existsSync(keyFile)) {
    const saved = readFileSync(keyFile, 'utf8').trim();
    if (KEY_PATTERN.test(saved) && saved.startsWith('ohs_srv_')) return saved;
  }
  const key = generateApiKey('server');
  mkdirSync(dirname(keyFile), { recursive: true });
  writeFileSync(keyFile, `${key}\n`, { mode: 0o600 });
  return key;
}

export async function seedDemoApiAccess(
  db: Db,
  input: { organizationId: string; ownerUserId: string | null; serverKey: string; hashSecret: string; highLimits: boolean },
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .update(organizations)
      .set(
        input.highLimits
          ? { customMonthlyQuotaCalls: DEMO_HIGH_LIMITS.monthlyQuotaCalls, customRatePerMinuteCalls: DEMO_HIGH_LIMITS.ratePerMinuteCalls }
          : { customMonthlyQuotaCalls: null, customRatePerMinuteCalls: null },
      )
      .where(eq(organizations.id, input.organizationId));
    const keyHash = hashApiKey(input.serverKey, input.hashSecret);
    await tx
      .insert(apiKeys)
      .values({
        organizationId: input.organizationId,
        createdByUserId: input.ownerUserId,
        name: 'Demo server key',
        kind: 'server',
        keyHash,
        ...keyDisplayParts(input.serverKey),
      })
      .onConflictDoUpdate({ target: apiKeys.keyHash, set: { revokedAt: null, expiresAt: null } });
  });
}
