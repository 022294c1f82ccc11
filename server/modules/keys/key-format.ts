/**
 * API key format and hashing. A key is a kind prefix (`ohs_srv_` server, `ohs_emb_` embed) and 40
 * characters from [A-Za-z0-9] drawn uniformly from the OS CSPRNG (≈ 238 bits). Keys are stored only as
 * HMAC-SHA-256 under a server-side secret: a fast keyed hash suits high-entropy secrets (there is nothing
 * to guess), and it allows one indexed lookup per call. argon2 is for passwords.
 */
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

export type ApiKeyKind = 'server' | 'embed';

export const keyPrefixes: Record<ApiKeyKind, string> = { server: 'ohs_srv_', embed: 'ohs_emb_' };
export const KEY_PATTERN = /^ohs_(srv|emb)_[A-Za-z0-9]{32,}$/;
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';
const BODY_LENGTH = 40;

/** A new random key of the given kind. */
export function generateApiKey(kind: ApiKeyKind): string {
  let body = '';
  while (body.length < BODY_LENGTH) {
    for (const byte of randomBytes(64)) {
      // Rejection sampling: 248 = 4 × 62 keeps every character equally likely.
      if (byte < 248 && body.length < BODY_LENGTH) body += ALPHABET[byte % 62];
    }
  }
  return `${keyPrefixes[kind]}${body}`;
}

export function keyKindOf(key: string): ApiKeyKind | undefined {
  const m = KEY_PATTERN.exec(key);
  if (!m) return undefined;
  return m[1] === 'srv' ? 'server' : 'embed';
}

export function hashApiKey(key: string, secret: string): string {
  return createHmac('sha256', secret).update(key).digest('hex');
}

/** Constant-time equality of two hex digests. */
export function hashesEqual(a: string, b: string): boolean {
  const x = Buffer.from(a, 'hex');
  const y = Buffer.from(b, 'hex');
  return x.length === y.length && timingSafeEqual(x, y);
}

/** What may be shown of a key after creation: the kind prefix and four characters, and the last four. */
export function keyDisplayParts(key: string): { displayPrefix: string; last4: string } {
  return { displayPrefix: key.slice(0, 12), last4: key.slice(-4) };
}
