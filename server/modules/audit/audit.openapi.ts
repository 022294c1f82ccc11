import { AuditEventPageSchema, AuditQuerySchema } from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registerConsolePath({
  method: 'get',
  path: '/audit-events',
  summary: 'Audit log',
  description: 'Security-relevant actions in the active organization (sign-ins and failures, member, role and invitation changes, keys, plan), with actor, time, address and target. Newest first; page with `before`; filter with `action` (a name, or a prefix ending in ".").',
  access: ['owner', 'admin'],
  query: AuditQuerySchema,
  response: { status: 200, description: 'A page of events.', schema: AuditEventPageSchema },
  problems: { 400: 'A query parameter is invalid.' },
});
