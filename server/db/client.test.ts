/**
 * When the database cuts the connections a server holds (a restart, an administrator, a failover), the
 * server keeps running and serves again once the database answers: node-postgres emits the error of an
 * idle pooled connection on the pool, which would end the process without a listener.
 */
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../app.ts';
import { parseEnv } from '../env.ts';
import { createLogger } from '../logger.ts';
import { createDb } from './client.ts';

const url = new URL(process.env.DATABASE_URL!);
url.searchParams.set('application_name', `ohmstead_cut_${process.pid}`);
const cut: Error[] = [];
const { db, pool } = createDb(url.toString(), { max: 3, onIdleError: (err) => cut.push(err) });
const env = parseEnv({ ...process.env, CONSOLE_DIST_DIR: '.data/no-console' });
const app = createApp({ env, db, pool, logger: createLogger('silent') });
const { db: admin, pool: adminPool } = createDb(process.env.DATABASE_URL!, { max: 1 });
afterAll(async () => {
  await app.platform?.close();
  await pool.end();
  await adminPool.end();
});

describe('database connections cut under the server', () => {
  it('when every idle connection of the pool is terminated, then the process survives and the next request is served', async () => {
    // Fill the pool with idle connections.
    await Promise.all([1, 2, 3].map(() => db.execute(sql`select pg_sleep(0.05)`)));
    expect(pool.idleCount).toBeGreaterThan(0);
    const { rows } = await admin.execute<{ n: number }>(
      sql`select count(pg_terminate_backend(pid))::int as n from pg_stat_activity where application_name = ${url.searchParams.get('application_name')}`,
    );
    expect(rows[0]!.n).toBeGreaterThan(0);
    await expect.poll(() => cut.length).toBeGreaterThan(0);
    expect(cut[0]!.message).toMatch(/terminating connection/);
    const res = await request(app).get('/readyz');
    expect(res.status).toBe(200);
  });
});
