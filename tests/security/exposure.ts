/**
 * Excessive data exposure (OWASP API3:2023): nothing a client receives may carry a password hash, an
 * API-key hash, a session or e-mailed-link token hash, a stored secret or a server-side secret. Two checks
 * on every body: the exact values stored in the database and the configuration (so a leak is found
 * whatever the field is called), and the shapes of such values and of the fields that hold them.
 */
import { sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client.ts';
import type { Env } from '../../server/env.ts';
import { keyHashSecret } from '../../server/modules/metering/platform.ts';

/** Every secret value the server holds, from the database and the configuration. */
export async function collectSecrets(db: Db, env: Env): Promise<string[]> {
  const { rows } = await db.execute<{ v: string }>(sql`
    select password_hash as v from users where password_hash is not null
    union all select key_hash from api_keys
    union all select token_hash from sessions
    union all select token_hash from email_tokens
    union all select token_hash from invitations`);
  const configured = [keyHashSecret(env), env.STRIPE_SECRET_KEY, env.STRIPE_WEBHOOK_SECRET, env.SMTP_PASSWORD].filter((v): v is string => Boolean(v));
  return [...rows.map((r) => r.v), ...configured].filter((v) => v.length >= 16);
}

const shapes: Array<[RegExp, string]> = [
  [/\$argon2(id|i|d)\$/, 'an argon2 password hash'],
  [/"(password_?hash|key_?hash|token_?hash|secret_?hash|request_?hash)"\s*:/i, 'a hash field'],
  [/"password"\s*:/i, 'a password field'],
  [/whsec_[A-Za-z0-9_]+/, 'a Stripe webhook signing secret'],
  [/\b(sk|rk)_(test|live)_[A-Za-z0-9_]+/, 'a Stripe secret key'],
];

/**
 * What in a response body looks like a leaked secret. `allowApiKeySecret`: the body is the one answer that
 * hands out a new key (create, rotate), which may carry that one secret.
 */
export function findLeaks(body: string, secrets: Iterable<string>, options: { allowApiKeySecret?: boolean; valuesOnly?: boolean } = {}): string[] {
  const found: string[] = [];
  if (!options.valuesOnly) for (const [pattern, what] of shapes) if (pattern.test(body)) found.push(what);
  if (!options.allowApiKeySecret && /ohs_srv_[A-Za-z0-9]{32,}/.test(body)) found.push('a server key secret');
  for (const secret of secrets) if (body.includes(secret)) found.push(`a stored secret (${secret.slice(0, 6)}…)`);
  return found;
}
