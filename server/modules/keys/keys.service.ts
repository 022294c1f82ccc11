/**
 * API key life cycle: create (the secret is returned once, only its keyed hash is stored), revoke, rotate
 * (a new key now; the old one keeps working until the overlap ends). Limits on the number of keys and
 * embed origins come from the organization's plan.
 */
import { effectiveLimits } from '#shared/plans.ts';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { organizations } from '../../db/schema/index.ts';
import { AppError } from '../../http/problem.ts';
import { generateApiKey, hashApiKey, keyDisplayParts, type ApiKeyKind } from './key-format.ts';
import { countActiveKeys, findKey, insertKey, markKeyReplaced, revokeKeyRow, type ApiKeyRow } from './keys.queries.ts';

export interface CreateKeyInput {
  organizationId: string;
  createdByUserId: string | null;
  name: string;
  kind: ApiKeyKind;
  allowedOrigins?: string[];
  expiresAt?: Date | null;
}

/** Normalizes an origin to scheme://host[:port]; rejects anything else (paths, wildcards, "null"). */
export function normalizeOrigin(value: string): string {
  let url: URL;
  try {
    url = new URL(value);
  } catch {
    throw new AppError('validation-error', `"${value}" is not an origin such as https://shop.example.`);
  }
  if (!['http:', 'https:'].includes(url.protocol) || url.origin === 'null' || url.pathname.length > 1 || url.search || url.hash || url.username) {
    throw new AppError('validation-error', `"${value}" is not an origin (scheme://host[:port], no path).`);
  }
  return url.origin;
}

/** Runs inside the change's transaction (audit entries), so the log never records a rolled-back change. */
type InTransaction<T> = (tx: Tx, result: T) => Promise<void>;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export async function createKey(
  db: Db,
  hashSecret: string,
  input: CreateKeyInput,
  at = new Date(),
  inTransaction?: InTransaction<{ key: ApiKeyRow }>,
): Promise<{ key: ApiKeyRow; secret: string }> {
  const origins = [...new Set((input.allowedOrigins ?? []).map(normalizeOrigin))];
  if (input.kind === 'embed' && origins.length === 0) {
    throw new AppError('validation-error', 'An embed key needs at least one allowed origin (the sites it may be used from).', {
      errors: [{ pointer: '#/allowedOrigins', detail: 'At least one origin is required for an embed key.' }],
    });
  }
  if (input.kind === 'server' && origins.length > 0) {
    throw new AppError('validation-error', 'Server keys are not used from browsers and take no allowed origins.', {
      errors: [{ pointer: '#/allowedOrigins', detail: 'Only embed keys list origins.' }],
    });
  }
  return db.transaction(async (tx) => {
    const [org] = await tx.select().from(organizations).where(eq(organizations.id, input.organizationId)).for('update');
    if (!org) throw new AppError('not-found', 'No such organization.');
    const { plan } = effectiveLimits(org);
    if ((await countActiveKeys(tx, org.id, at)) >= plan.maxKeys) {
      throw new AppError('conflict', `The ${plan.name} plan allows ${plan.maxKeys} active keys. Revoke one or change plan.`);
    }
    if (origins.length > plan.maxEmbedOrigins) {
      throw new AppError('validation-error', `The ${plan.name} plan allows ${plan.maxEmbedOrigins} origins per embed key.`, {
        errors: [{ pointer: '#/allowedOrigins', detail: `At most ${plan.maxEmbedOrigins} origins.` }],
      });
    }
    const secret = generateApiKey(input.kind);
    const key = await insertKey(tx, {
      organizationId: org.id,
      createdByUserId: input.createdByUserId,
      name: input.name,
      kind: input.kind,
      keyHash: hashApiKey(secret, hashSecret),
      ...keyDisplayParts(secret),
      allowedOrigins: origins,
      expiresAt: input.expiresAt ?? null,
    });
    await inTransaction?.(tx, { key });
    return { key, secret };
  });
}

export async function revokeKey(
  db: Db,
  organizationId: string,
  keyId: string,
  at = new Date(),
  inTransaction?: InTransaction<{ key: ApiKeyRow }>,
): Promise<ApiKeyRow> {
  return db.transaction(async (tx) => {
    const row = await revokeKeyRow(tx, organizationId, keyId, at);
    if (row) {
      await inTransaction?.(tx, { key: row });
      return row;
    }
    const existing = await findKey(tx, organizationId, keyId);
    if (!existing) throw new AppError('not-found', 'No such key in this organization.');
    throw new AppError('conflict', 'This key is already revoked.');
  });
}

/**
 * Rotation: a new key with the same name, kind and origins; the old key expires after the overlap (or
 * sooner if it was already due to), so clients can switch without downtime.
 */
export async function rotateKey(
  db: Db,
  hashSecret: string,
  input: { organizationId: string; keyId: string; actorUserId: string | null; overlapS: number },
  at = new Date(),
  inTransaction?: InTransaction<{ key: ApiKeyRow; previous: ApiKeyRow }>,
): Promise<{ key: ApiKeyRow; secret: string; previous: ApiKeyRow }> {
  return db.transaction(async (tx) => {
    const old = await findKey(tx, input.organizationId, input.keyId);
    if (!old) throw new AppError('not-found', 'No such key in this organization.');
    if (old.revokedAt || (old.expiresAt && old.expiresAt <= at)) throw new AppError('conflict', 'Only an active key can be rotated.');
    if (old.replacedByKeyId) throw new AppError('conflict', 'This key has already been rotated.');
    const secret = generateApiKey(old.kind);
    const key = await insertKey(tx, {
      organizationId: old.organizationId,
      createdByUserId: input.actorUserId,
      name: old.name,
      kind: old.kind,
      keyHash: hashApiKey(secret, hashSecret),
      ...keyDisplayParts(secret),
      allowedOrigins: old.allowedOrigins,
    });
    const overlapEnds = new Date(at.getTime() + input.overlapS * 1000);
    await markKeyReplaced(tx, old.id, key.id, overlapEnds);
    const previous = (await findKey(tx, input.organizationId, old.id))!;
    await inTransaction?.(tx, { key, previous });
    return { key, secret, previous };
  });
}
