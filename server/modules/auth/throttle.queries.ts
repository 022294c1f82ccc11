import { and, eq, gt, inArray, isNull, lt, or, sql } from 'drizzle-orm';
import { authThrottles } from '../../db/schema/index.ts';
import type { Executor } from './auth.types.ts';

/** The blocked keys among `keys`, with when each block ends. */
export async function findBlocked(db: Executor, keys: string[]) {
  return db
    .select({ key: authThrottles.key, blockedUntil: authThrottles.blockedUntil })
    .from(authThrottles)
    .where(and(inArray(authThrottles.key, keys), gt(authThrottles.blockedUntil, sql`now()`)));
}

/**
 * One more consecutive failure for an account key. From the `free`-th failure on, the key is blocked
 * for 30 s, doubling each time, at most 15 minutes. A day without failures starts the count again.
 */
export async function addConsecutiveFailure(db: Executor, key: string, free: number) {
  const failures = sql`(case when ${authThrottles.lastFailureAt} < now() - interval '24 hours' then 1 else ${authThrottles.failures} + 1 end)`;
  const blockFor = (n: ReturnType<typeof sql>) =>
    sql`(case when ${n} >= ${free}::int then now() + least(interval '30 seconds' * power(2, ${n} - ${free}::int), interval '15 minutes') else null end)`;
  const [row] = await db
    .insert(authThrottles)
    .values({ key, failures: 1, blockedUntil: blockFor(sql`1`) })
    .onConflictDoUpdate({ target: authThrottles.key, set: { failures, lastFailureAt: sql`now()`, blockedUntil: blockFor(failures) } })
    .returning({ failures: authThrottles.failures, blockedUntil: authThrottles.blockedUntil });
  return row!;
}

/**
 * One more event in a fixed window for a key (failed sign-ins per address; mail-sending requests per
 * address). When the count reaches `max`, the key is blocked until the window ends.
 */
export async function addWindowedEvent(db: Executor, key: string, max: number, windowMinutes: number) {
  const window = sql`make_interval(mins => ${windowMinutes}::int)`;
  const expired = sql`${authThrottles.windowStartedAt} <= now() - ${window}`;
  const start = sql`(case when ${expired} then now() else ${authThrottles.windowStartedAt} end)`;
  const count = sql`(case when ${expired} then 1 else ${authThrottles.failures} + 1 end)`;
  const [row] = await db
    .insert(authThrottles)
    .values({ key, failures: 1, blockedUntil: max <= 1 ? sql`now() + ${window}` : null })
    .onConflictDoUpdate({
      target: authThrottles.key,
      set: {
        windowStartedAt: start,
        failures: count,
        lastFailureAt: sql`now()`,
        blockedUntil: sql`(case when ${count} >= ${max}::int then ${start} + ${window} else null end)`,
      },
    })
    .returning({ failures: authThrottles.failures, blockedUntil: authThrottles.blockedUntil });
  return row!;
}

export async function clearThrottle(db: Executor, key: string) {
  await db.delete(authThrottles).where(eq(authThrottles.key, key));
}

/** Removes rows with nothing left to remember (no failure for a day, no block in force). */
export async function pruneThrottles(db: Executor) {
  await db
    .delete(authThrottles)
    .where(and(lt(authThrottles.lastFailureAt, sql`now() - interval '24 hours'`), or(isNull(authThrottles.blockedUntil), lt(authThrottles.blockedUntil, sql`now()`))));
}
