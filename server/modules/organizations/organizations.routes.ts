import { Router } from 'express';
import {
  CreateOrganizationInputSchema,
  DeleteOrganizationInputSchema,
  OrganizationSchema,
  OrganizationSummarySchema,
  TransferOwnershipInputSchema,
  UpdateOrganizationInputSchema,
} from '#shared/schemas/accounts.ts';
import { parseJsonBody } from '../../http/validate.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { requestMeta } from '../auth/request-meta.ts';
import { organizationAuth, requireRole, requireSession, sessionAuth, setActiveOrganization } from '../auth/session.ts';
import { createOrganization, deleteOrganizationAudited, getOrganization, renameOrganizationAudited, transferOwnership } from './organizations.service.ts';

const everyone = ['owner', 'admin', 'developer', 'viewer'] as const;

/** POST /organizations (any signed-in user) and /organization: the active organization. */
export function organizationsRouter({ db }: AccountsDeps) {
  const router = Router();

  router.post('/organizations', requireSession, async (req, res) => {
    const auth = sessionAuth(res);
    const { name } = parseJsonBody(CreateOrganizationInputSchema, req);
    const org = await db.transaction(async (tx) => {
      const created = await createOrganization(tx, name, auth.user.id, requestMeta(req));
      await setActiveOrganization(tx, auth.sessionId, created.id);
      return created;
    });
    res.status(201).json(OrganizationSummarySchema.parse({ id: org.id, name: org.name, slug: org.slug, role: 'owner' }));
  });

  router.get('/organization', requireRole(...everyone), async (_req, res) => {
    res.json(OrganizationSchema.parse(await getOrganization(db, organizationAuth(res).organizationId)));
  });

  router.patch('/organization', requireRole('owner', 'admin'), async (req, res) => {
    const auth = organizationAuth(res);
    const { name } = parseJsonBody(UpdateOrganizationInputSchema, req);
    const org = await db.transaction((tx) => renameOrganizationAudited(tx, auth.organizationId, auth.user.id, name, requestMeta(req)));
    res.json(OrganizationSchema.parse(org));
  });

  router.delete('/organization', requireRole('owner'), async (req, res) => {
    const auth = organizationAuth(res);
    const { confirmName } = parseJsonBody(DeleteOrganizationInputSchema, req);
    await db.transaction((tx) => deleteOrganizationAudited(tx, auth.organizationId, auth.user.id, confirmName, requestMeta(req)));
    res.status(204).end();
  });

  router.post('/organization/transfer-ownership', requireRole('owner'), async (req, res) => {
    const auth = organizationAuth(res);
    const { userId } = parseJsonBody(TransferOwnershipInputSchema, req);
    await db.transaction((tx) => transferOwnership(tx, auth.organizationId, auth.user.id, userId, requestMeta(req)));
    res.status(204).end();
  });

  return router;
}
