/** Builds the real app against this run's migrated database, for supertest. */
import { createApp } from '../../server/app.ts';
import { createDb } from '../../server/db/client.ts';
import { parseEnv } from '../../server/env.ts';
import { createLogger } from '../../server/logger.ts';

export function createTestApp(overrides: Record<string, string> = {}) {
  const env = parseEnv({ ...process.env, CONSOLE_DIST_DIR: '.data/no-console', ...overrides });
  const { db, pool } = createDb(env.DATABASE_URL, { max: 4 });
  const app = createApp({ env, db, pool, logger: createLogger(env.LOG_LEVEL) });
  const close = async () => {
    await app.platform?.close();
    await pool.end();
  };
  return { app, db, pool, env, close };
}
