import { createHash, randomBytes } from 'node:crypto';

/** 32 random bytes (256 bits), base64url: for session cookies and e-mailed links. */
export function randomToken(): string {
  return randomBytes(32).toString('base64url');
}

/**
 * SHA-256 of a token, hex. A single fast hash is right for high-entropy random tokens (they cannot be
 * guessed, so slow hashing adds nothing; OWASP Password Storage Cheat Sheet), and it makes the lookup one
 * indexed equality.
 */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
