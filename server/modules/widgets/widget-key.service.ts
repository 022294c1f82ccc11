/**
 * Renaming a key and editing an embed key's allowed origins (the Widgets page edits them beside its
 * preview; `PATCH /console-api/keys/{keyId}` in keys.routes.ts). The same rules as creating one: origins are
 * normalized to scheme://host[:port], an embed key keeps at least one and at most its plan's number, a
 * server key lists none. Revoked and expired keys are not changed.
 */
import { effectiveLimits } from '#shared/plans.ts';
import type { UpdateApiKeyInput } from '#shared/schemas/widgets.ts';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { organizations } from '../../db/schema/index.ts';
import { AppError } from '../../http/problem.ts';
import type { Tx } from '../auth/auth.types.ts';
import { findKey, type ApiKeyRow } from '../keys/keys.queries.ts';
import { normalizeOrigin } from '../keys/keys.service.ts';
import { updateKeyRow } from './widget-key.queries.ts';

export interface KeyChange {
  name?: { from: string; to: string };
  allowedOrigins?: { added: string[]; removed: string[] };
}

export async function updateKeyDetails(
  db: Db,
  input: { organizationId: string; keyId: string; change: UpdateApiKeyInput },
  at = new Date(),
  inTransaction?: (tx: Tx, result: { key: ApiKeyRow; change: KeyChange }) => Promise<void>,
): Promise<ApiKeyRow> {
  const origins = input.change.allowedOrigins ? [...new Set(input.change.allowedOrigins.map(normalizeOrigin))] : undefined;
  return db.transaction(async (tx) => {
    const [org] = await tx.select().from(organizations).where(eq(organizations.id, input.organizationId)).for('update');
    if (!org) throw new AppError('not-found', 'No such organization.');
    const key = await findKey(tx, input.organizationId, input.keyId);
    if (!key) throw new AppError('not-found', 'No such key in this organization.');
    if (key.revokedAt || (key.expiresAt && key.expiresAt <= at)) throw new AppError('conflict', 'Revoked and expired keys cannot be changed.');
    if (origins && key.kind === 'server' && origins.length > 0) {
      throw new AppError('validation-error', 'Server keys are not used from browsers and take no allowed origins.', { errors: [{ pointer: '#/allowedOrigins', detail: 'Only embed keys list origins.' }] });
    }
    if (origins && key.kind === 'embed') {
      if (origins.length === 0) {
        throw new AppError('validation-error', 'An embed key needs at least one allowed origin (revoke it to stop it working everywhere).', { errors: [{ pointer: '#/allowedOrigins', detail: 'At least one origin is required for an embed key.' }] });
      }
      const { plan } = effectiveLimits(org);
      if (origins.length > plan.maxEmbedOrigins) {
        throw new AppError('validation-error', `The ${plan.name} plan allows ${plan.maxEmbedOrigins} origins per embed key.`, { errors: [{ pointer: '#/allowedOrigins', detail: `At most ${plan.maxEmbedOrigins} origins.` }] });
      }
    }
    const name = input.change.name ?? key.name;
    const allowedOrigins = origins ?? key.allowedOrigins;
    const row = (await updateKeyRow(tx, input.organizationId, key.id, { name, allowedOrigins }))!;
    const change: KeyChange = {};
    if (name !== key.name) change.name = { from: key.name, to: name };
    const added = allowedOrigins.filter((o) => !key.allowedOrigins.includes(o));
    const removed = key.allowedOrigins.filter((o) => !allowedOrigins.includes(o));
    if (added.length || removed.length) change.allowedOrigins = { added, removed };
    await inTransaction?.(tx, { key: row, change });
    return row;
  });
}
