/**
 * A throwaway database for the load scripts (bench, soak): dropped and created fresh, migrated, seeded with
 * the demo organization on high custom limits (still metered) and a new server key for it.
 */
import { runMigrations } from '../../server/db/migrate.ts';
import { createDb } from '../../server/db/client.ts';
import { seedDemo } from '../../server/db/seed.ts';
import { parseEnv } from '../../server/env.ts';
import { generateApiKey } from '../../server/modules/keys/key-format.ts';
import { seedDemoApiAccess } from '../../server/modules/keys/keys.seed.ts';
import { keyHashSecret } from '../../server/modules/metering/platform.ts';
import { dropDatabase, ensureDatabase, type PostgresHandle } from './postgres.ts';

export async function prepareLoadDatabase(pgHandle: PostgresHandle, dbName: string) {
  await dropDatabase(pgHandle, dbName);
  const databaseUrl = await ensureDatabase(pgHandle, dbName);
  await runMigrations(databaseUrl);
  const env = parseEnv({ ...process.env, DATABASE_URL: databaseUrl });
  const serverKey = generateApiKey('server');
  const { db, pool } = createDb(databaseUrl, { max: 1 });
  try {
    const { organizationId, ownerUserId } = await seedDemo(db);
    await seedDemoApiAccess(db, { organizationId, ownerUserId, serverKey, hashSecret: keyHashSecret(env), highLimits: true });
    return { databaseUrl, env, serverKey, organizationId };
  } finally {
    await pool.end();
  }
}
