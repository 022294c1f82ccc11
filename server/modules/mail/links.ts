import type { Env } from '../../env.ts';

/**
 * The console's public origin for e-mailed links: PUBLIC_URL, or http://HOST:PORT. Never the request's
 * Host header, which a client controls (a forged Host would otherwise put an attacker's domain in a
 * password-reset link).
 */
export function publicOrigin(env: Env): string {
  return env.PUBLIC_URL ? new URL(env.PUBLIC_URL).origin : `http://${env.HOST.includes(':') ? `[${env.HOST}]` : env.HOST}:${env.PORT}`;
}

/** A console link whose token travels in the fragment (#token=…), which browsers never send to a server. */
export function tokenLink(env: Env, path: string, token: string): string {
  return `${publicOrigin(env)}${path}#token=${token}`;
}
