import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index.ts';

export function createDb(databaseUrl: string, options: { max?: number; onIdleError?: (err: Error) => void } = {}) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: options.max ?? 10 });
  // A connection idle in the pool is cut when the database restarts or ends it ("terminating connection due
  // to administrator command"). The pool drops that client and opens a new one when next asked; without a
  // listener, node-postgres emits the error on the pool and the process dies (see DEVELOPERS.md, Operating).
  pool.on('error', (err) => options.onIdleError?.(err));
  const db = drizzle({ client: pool, schema, casing: 'snake_case' });
  return { db, pool };
}

export type Db = ReturnType<typeof createDb>['db'];
