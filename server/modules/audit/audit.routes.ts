import { Router } from 'express';
import { AuditEventPageSchema, AuditQuerySchema } from '#shared/schemas/accounts.ts';
import { parseQuery } from '../../http/validate.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import { listAuditEvents } from './audit.queries.ts';

/** GET /audit-events: the active organization's audit log, newest first (owners and admins). */
export function auditRouter({ db }: AccountsDeps) {
  const router = Router();
  router.get('/audit-events', requireRole('owner', 'admin'), async (req, res) => {
    const query = parseQuery(AuditQuerySchema, req);
    const page = await listAuditEvents(db, organizationAuth(res).organizationId, query);
    res.json(AuditEventPageSchema.parse(page));
  });
  return router;
}
