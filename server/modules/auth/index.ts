/**
 * What other console modules use from accounts:
 *   router.post('/keys', requireRole('owner', 'admin', 'developer'), async (req, res) => {
 *     const auth = organizationAuth(res);            // { user, organizationId, role, sessionId }
 *     …
 *     await audit(tx, { ...auditContext(req, res), action: 'api_key.created', targetType: 'api_key', targetId: key.id });
 *   });
 * CSRF protection and the session context are already applied to all of /console-api in app.ts.
 */
export { requireSession, requireRole, sessionAuth, organizationAuth, type ConsoleAuth, type OrganizationAuth } from './session.ts';
export { csrfProtection } from './csrf.ts';
export { audit, auditContext, auditForUser, type AuditEntry } from '../audit/audit.ts';
export { requestMeta, clientAddress } from './request-meta.ts';
export type { Executor, Tx } from './auth.types.ts';
