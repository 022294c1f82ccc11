/**
 * Console API for keys (session, CSRF-protected): list, create (the secret is in this one answer only),
 * revoke, rotate. Owners and admins manage every key of the organization; developers create keys and
 * manage the ones they created; viewers only list. Another organization's key is 404.
 */
import { Router, type Response } from 'express';
import { ApiKeySchema, CreateApiKeyInputSchema, RotateApiKeyInputSchema, type ApiKeyView } from '#shared/schemas/keys.ts';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody } from '../../http/validate.ts';
import { audit, auditContext } from '../audit/audit.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import type { KeyResolver } from './key-resolver.ts';
import { findKey, listKeys, type ApiKeyRow } from './keys.queries.ts';
import { createKey, revokeKey, rotateKey } from './keys.service.ts';
import { UpdateApiKeyInputSchema } from '#shared/schemas/widgets.ts';
import { updateKeyDetails } from '../widgets/widget-key.service.ts';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function toKeyView(row: ApiKeyRow, now = new Date()): ApiKeyView {
  const status = row.revokedAt ? 'revoked' : row.expiresAt && row.expiresAt <= now ? 'expired' : row.expiresAt ? 'expiring' : 'active';
  return ApiKeySchema.parse({
    id: row.id,
    name: row.name,
    kind: row.kind,
    displayPrefix: row.displayPrefix,
    last4: row.last4,
    allowedOrigins: row.allowedOrigins,
    createdByUserId: row.createdByUserId,
    createdAt: row.createdAt.toISOString(),
    lastUsedAt: iso(row.lastUsedAt),
    expiresAt: iso(row.expiresAt),
    revokedAt: iso(row.revokedAt),
    replacedByKeyId: row.replacedByKeyId,
    status,
  });
}

/** Developers may manage only the keys they created; owners and admins any key of the organization. */
async function assertMayManage(db: Db, res: Response, keyId: string): Promise<void> {
  const auth = organizationAuth(res);
  const key = await findKey(db, auth.organizationId, keyId);
  if (!key) throw new AppError('not-found', 'No such key in this organization.');
  if (auth.role === 'developer' && key.createdByUserId !== auth.user.id) {
    throw new AppError('forbidden', 'Developers can revoke and rotate only the keys they created. Ask an owner or admin.');
  }
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
function keyIdParam(value: string | string[] | undefined): string {
  const id = String(value ?? '');
  if (!UUID.test(id)) throw new AppError('not-found', 'No such key in this organization.');
  return id;
}

export function keysConsoleRouter(deps: { db: Db; hashSecret: string; resolver: KeyResolver }) {
  const { db, hashSecret, resolver } = deps;
  const router = Router();

  router.get('/keys', requireRole('owner', 'admin', 'developer', 'viewer'), async (_req, res) => {
    const rows = await listKeys(db, organizationAuth(res).organizationId);
    res.json({ items: rows.map((r) => toKeyView(r)) });
  });

  router.post('/keys', requireRole('owner', 'admin', 'developer'), async (req, res) => {
    const input = parseJsonBody(CreateApiKeyInputSchema, req);
    const auth = organizationAuth(res);
    const { key, secret } = await createKey(
      db,
      hashSecret,
      {
        organizationId: auth.organizationId,
        createdByUserId: auth.user.id,
        name: input.name,
        kind: input.kind,
        allowedOrigins: input.allowedOrigins,
        expiresAt: input.expiresInDays ? new Date(Date.now() + input.expiresInDays * 86_400_000) : null,
      },
      new Date(),
      (tx, { key: k }) =>
        audit(tx, { ...auditContext(req, res), action: 'api_key.created', targetType: 'api_key', targetId: k.id, details: { name: k.name, kind: k.kind } }),
    );
    resolver.invalidate();
    res.status(201).json({ key: toKeyView(key), secret });
  });

  router.post('/keys/:keyId/revoke', requireRole('owner', 'admin', 'developer'), async (req, res) => {
    const keyId = keyIdParam(req.params.keyId);
    await assertMayManage(db, res, keyId);
    const row = await revokeKey(db, organizationAuth(res).organizationId, keyId, new Date(), (tx, { key }) =>
      audit(tx, { ...auditContext(req, res), action: 'api_key.revoked', targetType: 'api_key', targetId: key.id, details: { name: key.name } }),
    );
    resolver.invalidate();
    res.json({ key: toKeyView(row) });
  });

  router.post('/keys/:keyId/rotate', requireRole('owner', 'admin', 'developer'), async (req, res) => {
    const keyId = keyIdParam(req.params.keyId);
    const input = parseJsonBody(RotateApiKeyInputSchema, req);
    await assertMayManage(db, res, keyId);
    const auth = organizationAuth(res);
    const result = await rotateKey(
      db,
      hashSecret,
      { organizationId: auth.organizationId, keyId, actorUserId: auth.user.id, overlapS: Math.round(input.overlapHours * 3600) },
      new Date(),
      (tx, { key, previous }) =>
        audit(tx, {
          ...auditContext(req, res),
          action: 'api_key.rotated',
          targetType: 'api_key',
          targetId: previous.id,
          details: { replacedBy: key.id, overlapHours: input.overlapHours },
        }),
    );
    resolver.invalidate();
    res.status(201).json({ key: toKeyView(result.key), secret: result.secret, previous: toKeyView(result.previous) });
  });

  // Rename a key, or set an embed key's allowed origins (the Widgets page edits them beside its preview).
  router.patch('/keys/:keyId', requireRole('owner', 'admin', 'developer'), async (req, res) => {
    const keyId = keyIdParam(req.params.keyId);
    const input = parseJsonBody(UpdateApiKeyInputSchema, req);
    await assertMayManage(db, res, keyId);
    const row = await updateKeyDetails(db, { organizationId: organizationAuth(res).organizationId, keyId, change: input }, new Date(), (tx, { key, change }) =>
      audit(tx, { ...auditContext(req, res), action: 'api_key.updated', targetType: 'api_key', targetId: key.id, details: { ...change } }),
    );
    resolver.invalidate();
    res.json({ key: toKeyView(row) });
  });

  return router;
}
