/**
 * The server half of the password rules (the length rules live in shared/schemas/accounts.ts and run in
 * the console too). NIST SP 800-63B-4 §3.1.1.2: verifiers SHALL compare a new password against a
 * blocklist of "passwords obtained from previous breach corpuses, dictionary words, repetitive or
 * sequential characters, and context-specific words (the name of the service, the username and
 * derivatives)", and SHALL NOT impose composition rules. We refuse:
 *   - any password on the shipped list (data/common-passwords.txt), ignoring case;
 *   - a listed password or a context word padded with digits and symbols ("dragon!!!!!!!!!2024");
 *   - a short unit repeated ("passwordpassword", "abcabcabcabcabc"), or fewer than 5 distinct characters;
 *   - a run of consecutive characters ("123456789012345", "abcdefghijklmnop").
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { FieldError } from '../../http/problem.ts';

let blocklist: Set<string> | undefined;

function commonPasswords(): Set<string> {
  blocklist ??= new Set(
    readFileSync(fileURLToPath(new URL('./data/common-passwords.txt', import.meta.url)), 'utf8')
      .split('\n')
      .filter((line) => line && !line.startsWith('#')),
  );
  return blocklist;
}

export interface PasswordContext {
  email?: string;
  name?: string;
}

const SERVICE_WORDS = ['ohmstead', 'ohmsteadconsole', 'ohmsteadapi'];

/** Strips leading and trailing digits, punctuation and spaces: "!!dragon2024!!" → "dragon". */
const core = (s: string) => s.replace(/^[\d\p{P}\p{S}\s]+|[\d\p{P}\p{S}\s]+$/gu, '');

function isSequential(chars: string[]): boolean {
  if (chars.length < 3) return false;
  const codes = chars.map((c) => c.codePointAt(0)!);
  const isDigitRun = chars.every((c) => /\d/.test(c));
  const step = (a: number, b: number) => (isDigitRun ? (((b - a) % 10) + 10) % 10 : b - a);
  const first = step(codes[0]!, codes[1]!);
  if (!(first === 1 || (isDigitRun ? first === 9 : first === -1))) return false;
  return codes.every((c, i) => i === 0 || step(codes[i - 1]!, c) === first);
}

/** Why a new password is refused, as field errors at `pointer`; empty when it is acceptable. */
export function checkPasswordPolicy(password: string, context: PasswordContext, pointer = '#/password'): FieldError[] {
  const normalized = password.normalize('NFKC').toLowerCase();
  const chars = [...normalized];
  const refuse = (code: string, detail: string): FieldError[] => [{ pointer, code, detail }];
  const list = commonPasswords();

  if (list.has(normalized) || list.has(normalized.replace(/\s+/g, ''))) {
    return refuse('password_common', 'This password appears in lists of common or breached passwords. Choose another, such as a phrase of unrelated words.');
  }
  const stripped = core(normalized);
  if (stripped !== normalized && stripped.length > 0 && list.has(stripped)) {
    return refuse('password_common', 'This is a common password with digits or symbols added, which guessing tools try first. Choose another.');
  }
  if (new Set(chars).size < 5 || /^(.+?)\1+$/su.test(normalized)) {
    return refuse('password_repetitive', 'This password repeats the same few characters. Choose one with more variety, such as a phrase of unrelated words.');
  }
  if (isSequential(chars.filter((c) => c.trim() !== ''))) {
    return refuse('password_sequential', 'This password is a run of consecutive characters. Choose another.');
  }
  const local = context.email?.split('@')[0]?.toLowerCase();
  const contextWords = [
    ...SERVICE_WORDS,
    ...(context.email ? [context.email.toLowerCase()] : []),
    ...(local && local.length >= 3 ? [local] : []),
    ...(context.name && context.name.trim().length >= 3 ? [context.name.trim().toLowerCase(), context.name.replace(/\s+/g, '').toLowerCase()] : []),
  ];
  const squashed = normalized.replace(/[\s\p{P}\p{S}\d]+/gu, '');
  if (contextWords.some((w) => w === normalized || w === stripped || w.replace(/[\s\p{P}\p{S}\d]+/gu, '') === squashed)) {
    return refuse('password_context', 'This password is made from your name, your e-mail address or the name of this service. Choose something unrelated.');
  }
  return [];
}
