import { and, desc, eq, like, lt } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { auditEvents, users } from '../../db/schema/index.ts';

export async function listAuditEvents(db: Db, organizationId: string, q: { limit: number; before?: number; action?: string }) {
  const rows = await db
    .select({
      id: auditEvents.id,
      action: auditEvents.action,
      actorId: users.id,
      actorEmail: users.email,
      actorName: users.name,
      targetType: auditEvents.targetType,
      targetId: auditEvents.targetId,
      ip: auditEvents.ip,
      userAgent: auditEvents.userAgent,
      details: auditEvents.details,
      createdAt: auditEvents.createdAt,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorUserId))
    .where(
      and(
        eq(auditEvents.organizationId, organizationId),
        q.before ? lt(auditEvents.id, q.before) : undefined,
        q.action ? (q.action.endsWith('.') ? like(auditEvents.action, `${q.action.replaceAll('_', '\\_')}%`) : eq(auditEvents.action, q.action)) : undefined,
      ),
    )
    .orderBy(desc(auditEvents.id))
    .limit(q.limit + 1);
  const page = rows.slice(0, q.limit);
  return {
    events: page.map((r) => ({
      id: r.id,
      action: r.action,
      actor: r.actorId ? { id: r.actorId, email: r.actorEmail!, name: r.actorName! } : null,
      targetType: r.targetType,
      targetId: r.targetId,
      ip: r.ip,
      userAgent: r.userAgent,
      details: r.details,
      createdAt: r.createdAt.toISOString(),
    })),
    nextCursor: rows.length > q.limit ? page[page.length - 1]!.id : null,
  };
}
