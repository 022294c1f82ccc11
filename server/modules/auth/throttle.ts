/**
 * Sign-in throttling, shared by all instances through PostgreSQL (OWASP Authentication and Credential
 * Stuffing Cheat Sheets; NIST SP 800-63B-4 §3.2.2 limits consecutive failed attempts per account):
 *   - per account (the typed e-mail address, whether or not an account exists, so the answer reveals
 *     nothing): growing delays after SIGNIN_ACCOUNT_FREE_FAILURES consecutive failures, reset by a
 *     success. Delays rather than a hard lock-out, which would let anyone lock a victim out;
 *   - per address (IPv4, or IPv6 /56): at most SIGNIN_ADDRESS_MAX_FAILURES failures per window,
 *     whatever the accounts tried (password spraying), not reset by a success;
 *   - requests that send e-mail (sign-up, resend, reset): MAIL_REQUESTS_PER_ADDRESS_PER_HOUR per address.
 * A refused attempt is a 429 problem with Retry-After and a message saying how long to wait.
 */
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import type { Executor } from './auth.types.ts';
import { addConsecutiveFailure, addWindowedEvent, clearThrottle, findBlocked, pruneThrottles } from './throttle.queries.ts';

export const accountKey = (email: string) => `account:${email.trim().toLowerCase()}`;
export const signInAddressKey = (address: string) => `signin-address:${address}`;
export const mailAddressKey = (address: string) => `mail-address:${address}`;

function wait(seconds: number): string {
  if (seconds < 90) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

function refuse(key: string, blockedUntil: Date): never {
  const seconds = Math.max(1, Math.ceil((blockedUntil.getTime() - Date.now()) / 1000));
  const detail = key.startsWith('account:')
    ? `Too many failed sign-ins for this account. Wait ${wait(seconds)} and try again, or reset your password.`
    : key.startsWith('signin-address:')
      ? `Too many failed sign-ins from your network address. Wait ${wait(seconds)} and try again.`
      : `Too many requests that send e-mail from your network address. Wait ${wait(seconds)} and try again.`;
  throw new AppError('rate-limited', detail, { headers: { 'Retry-After': String(seconds) }, extensions: { retryAfterSeconds: seconds } });
}

/** 429 when any of the keys is blocked now. */
export async function assertNotThrottled(db: Executor, keys: string[]): Promise<void> {
  const blocked = await findBlocked(db, keys);
  const worst = blocked.sort((a, b) => b.blockedUntil!.getTime() - a.blockedUntil!.getTime())[0];
  if (worst) refuse(worst.key, worst.blockedUntil!);
}

export async function recordSignInFailure(db: Executor, env: Env, email: string, address: string): Promise<void> {
  await addConsecutiveFailure(db, accountKey(email), env.SIGNIN_ACCOUNT_FREE_FAILURES);
  await addWindowedEvent(db, signInAddressKey(address), env.SIGNIN_ADDRESS_MAX_FAILURES, env.SIGNIN_ADDRESS_WINDOW_MINUTES);
  // Now and then, forget what no longer matters.
  if (Math.random() < 0.02) await pruneThrottles(db);
}

export async function recordSignInSuccess(db: Executor, email: string): Promise<void> {
  await clearThrottle(db, accountKey(email));
}

/** Counts a request that sends e-mail; 429 when the address has sent too many this hour. */
export async function throttleMailRequest(db: Executor, env: Env, address: string): Promise<void> {
  const key = mailAddressKey(address);
  await assertNotThrottled(db, [key]);
  await addWindowedEvent(db, key, env.MAIL_REQUESTS_PER_ADDRESS_PER_HOUR, 60);
}
