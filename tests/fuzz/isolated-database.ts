/**
 * A database of one's own for tests that compare the whole database before and after a call (the fuzzers):
 * other test files run at the same time on the run's shared database and would change its row counts.
 * Created next to the run's database on the same server, migrated like it, dropped afterwards.
 */
import { randomBytes } from 'node:crypto';
import { sql, getTableName, is } from 'drizzle-orm';
import { PgTable } from 'drizzle-orm/pg-core';
import { dropDatabase, ensureDatabase, ensurePostgres } from '../../scripts/lib/postgres.ts';
import type { Db } from '../../server/db/client.ts';
import { runMigrations } from '../../server/db/migrate.ts';
import * as schema from '../../server/db/schema/index.ts';

export async function createIsolatedDatabase(label: string): Promise<{ url: string; drop: () => Promise<void> }> {
  // DATABASE_URL names this run's database (tests/setup/env.ts): the handle reuses its server.
  const handle = await ensurePostgres({ port: Number(process.env.OHMSTEAD_PG_PORT ?? 54329) });
  const name = `ohmstead_${label}_${process.pid}_${randomBytes(3).toString('hex')}`;
  const url = await ensureDatabase(handle, name);
  await runMigrations(url);
  return { url, drop: () => dropDatabase(handle, name) };
}

/** Every table of the Drizzle schema, by its SQL name. */
export const schemaTables: string[] = (Object.values(schema) as unknown[])
  .filter((value): value is PgTable => is(value, PgTable))
  .map((table) => getTableName(table))
  .sort();

/**
 * Tables a rejected request may legitimately write, and why:
 * - request_log: the diagnostic list of recent /v1 calls (with their 4xx statuses) shown in the console;
 *   it is not the bill and records rejected calls on purpose.
 * - auth_throttles: the record of failed sign-ins and mail requests is what the throttle counts.
 */
export const writableOnRejection = new Set(['request_log', 'auth_throttles']);

/**
 * Rows a rejected request may add to an otherwise watched table: the security audit record of a failed
 * sign-in or password check (OWASP ASVS V7: log authentication failures) is written on the refusal itself.
 */
const writableRowsOnRejection: Record<string, string> = {
  audit_events: "where action <> 'auth.sign_in_failed'",
};

/**
 * Columns that change on reads by design and are left out of the row fingerprints: a session's
 * last_seen_at (refreshed at most once a minute by any request) and a key's last_used_at.
 */
const volatileColumns = ['last_seen_at', 'last_used_at'];

export type Snapshot = Map<string, { rows: number; fingerprint: string }>;

/**
 * Row count and a fingerprint of the contents (sum of row hashes, volatile columns left out) of every
 * table that a rejected request must not change, in one statement.
 */
export async function snapshot(db: Db): Promise<Snapshot> {
  const watched = schemaTables.filter((t) => !writableOnRejection.has(t));
  const minus = volatileColumns.map((c) => ` - '${c}'`).join('');
  const query = watched
    .map((t) => `select '${t}' as t, count(*)::int as rows, coalesce(sum(hashtextextended((to_jsonb(x)${minus})::text, 0)), 0)::text as fingerprint from "${t}" x ${writableRowsOnRejection[t] ?? ''}`)
    .join(' union all ');
  const { rows } = await db.execute<{ t: string; rows: number; fingerprint: string }>(sql.raw(query));
  return new Map(rows.map((r) => [r.t, { rows: r.rows, fingerprint: r.fingerprint }]));
}

/** Tables whose row count or contents differ between two snapshots. */
export function changedTables(before: Snapshot, after: Snapshot): string[] {
  return [...before.keys()].filter((t) => before.get(t)!.rows !== after.get(t)?.rows || before.get(t)!.fingerprint !== after.get(t)?.fingerprint);
}

/** Tables in the database's public schema (to check that the Drizzle schema lists all of them). */
export async function databaseTables(db: Db): Promise<string[]> {
  const { rows } = await db.execute<{ name: string }>(sql`select tablename as name from pg_tables where schemaname = 'public' order by 1`);
  return rows.map((r) => r.name);
}
