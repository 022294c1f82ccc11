/**
 * Password hashing: argon2id with the OWASP Password Storage Cheat Sheet's minimum parameters
 * (m = 19456 KiB, t = 2, p = 1), stored as a PHC string so the parameters can be raised later and old
 * hashes upgraded at the next sign-in. Passwords are NFKC-normalized first (NIST SP 800-63B-4 §3.1.1.2
 * recommends normalizing before hashing so the same password typed on another keyboard still matches).
 */
import argon2 from 'argon2';

const params = { type: argon2.argon2id, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

const normalize = (password: string) => password.normalize('NFKC');

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(normalize(password), params);
}

// A hash of a random password, computed once: verifying against it when the account does not exist
// takes as long as a real check, so timing does not tell which addresses have accounts.
let dummyHash: Promise<string> | undefined;

/** Verifies a password against a stored hash (or, when there is none, against a dummy at equal cost). */
export async function verifyPassword(hash: string | null, password: string): Promise<{ ok: boolean; needsRehash: boolean }> {
  dummyHash ??= argon2.hash(`no account ${Math.random()}`, params);
  const target = hash ?? (await dummyHash);
  let ok = false;
  try {
    ok = await argon2.verify(target, normalize(password));
  } catch {
    ok = false;
  }
  return { ok: ok && hash !== null, needsRehash: ok && hash !== null && argon2.needsRehash(hash, params) };
}
