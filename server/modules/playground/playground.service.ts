/**
 * The key check of a playground call. The console never holds a server key's secret (it is shown once
 * and stored only as a keyed hash), so the signed-in member names one of the organization's keys by id
 * and the call runs under it: the same conditions as the v1 key check (the key exists in this
 * organization, is not revoked, not expired) plus the playground's own (a server key: embed keys are for
 * the sites they list). The limits are the organization's, exactly as the v1 resolver reads them.
 */
import { effectiveLimits } from '#shared/plans.ts';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';
import type { ResolvedKey } from '../keys/key-resolver.ts';
import { findKeyWithOrganization } from './playground.queries.ts';

function keyProblem(detail: string, code: string): AppError {
  return new AppError('validation-error', detail, { errors: [{ pointer: '#/keyId', detail, code }] });
}

export async function resolvePlaygroundKey(db: Db, organizationId: string, keyId: string, now = new Date()): Promise<ResolvedKey> {
  const row = await findKeyWithOrganization(db, organizationId, keyId);
  if (!row) throw new AppError('not-found', 'No such key in this organization.', { errors: [{ pointer: '#/keyId', detail: 'No such key in this organization.', code: 'key_not_found' }] });
  const { key } = row;
  if (key.kind !== 'server') {
    throw keyProblem('The playground runs calls under a server key. Embed keys work only from the sites they list.', 'key_not_server');
  }
  if (key.revokedAt) throw keyProblem(`The key "${key.name}" has been revoked. Choose another key, or create one on the Keys page.`, 'key_revoked');
  if (key.expiresAt && key.expiresAt.getTime() <= now.getTime()) {
    throw keyProblem(`The key "${key.name}" has expired. Choose another key, or create one on the Keys page.`, 'key_expired');
  }
  const limits = effectiveLimits(row.organization);
  return {
    id: key.id,
    organizationId: key.organizationId,
    kind: key.kind,
    name: key.name,
    allowedOrigins: key.allowedOrigins,
    revokedAt: key.revokedAt,
    expiresAt: key.expiresAt,
    planId: limits.plan.id,
    monthlyQuotaCalls: limits.monthlyQuotaCalls,
    ratePerMinuteCalls: limits.ratePerMinuteCalls,
  };
}
