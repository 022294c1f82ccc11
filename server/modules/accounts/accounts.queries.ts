import { and, desc, eq, gt, sql } from 'drizzle-orm';
import { sessions } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';

/** A user's live sessions, most recently used first. */
export async function listLiveSessions(db: Executor, userId: string, idleMinutes: number) {
  return db
    .select({ id: sessions.tokenHash, createdAt: sessions.createdAt, lastSeenAt: sessions.lastSeenAt, expiresAt: sessions.expiresAt, ip: sessions.ip, userAgent: sessions.userAgent })
    .from(sessions)
    .where(and(eq(sessions.userId, userId), gt(sessions.expiresAt, sql`now()`), gt(sessions.lastSeenAt, sql`now() - make_interval(mins => ${idleMinutes}::int)`)))
    .orderBy(desc(sessions.lastSeenAt));
}
