/**
 * Cross-site request forgery defence for every state-changing /console-api request, layered as the OWASP
 * CSRF Prevention Cheat Sheet describes for JSON APIs (api-conventions §10):
 *   1. the session cookie is SameSite=Lax (session.ts);
 *   2. a custom header (`X-Ohmstead-CSRF: 1`) is required: a cross-origin page can only send it after a
 *      CORS preflight, which this API never grants;
 *   3. a body must be `application/json` (the "simple" form and text types a cross-site form can send
 *      are refused);
 *   4. Fetch Metadata: when the browser sends `Sec-Fetch-Site`, it must be `same-origin`; otherwise an
 *      `Origin`, when present, must be the console's own.
 * Sign-in and sign-up are covered as well (login CSRF). Safe methods (GET, HEAD, OPTIONS) change nothing.
 */
import type { Request, RequestHandler } from 'express';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

function hasBody(req: Request): boolean {
  const length = req.headers['content-length'];
  return req.headers['transfer-encoding'] !== undefined || (length !== undefined && length !== '0');
}

export function allowedConsoleOrigins(env: Env, req: Request): Set<string> {
  const origins = new Set<string>([`${req.protocol}://${req.get('host') ?? ''}`]);
  if (env.PUBLIC_URL) origins.add(new URL(env.PUBLIC_URL).origin);
  for (const o of env.CONSOLE_ORIGINS.split(',').map((s) => s.trim()).filter(Boolean)) origins.add(o.replace(/\/$/, ''));
  return origins;
}

export function csrfProtection(env: Env): RequestHandler {
  return (req, res, next) => {
    if (SAFE.has(req.method)) {
      next();
      return;
    }
    const site = req.get('sec-fetch-site');
    if (site !== undefined && site !== 'same-origin') {
      throw new AppError('forbidden', `Cross-site request refused: console requests must come from the console itself (Sec-Fetch-Site: ${site}).`, {
        extensions: { reason: 'csrf' },
      });
    }
    const origin = req.get('origin');
    if (origin !== undefined && !allowedConsoleOrigins(env, req).has(origin)) {
      throw new AppError('forbidden', `Cross-site request refused: the origin ${origin} may not send console requests.`, { extensions: { reason: 'csrf' } });
    }
    if (req.get(CSRF_HEADER) !== CSRF_HEADER_VALUE) {
      throw new AppError('forbidden', `Missing the ${CSRF_HEADER}: ${CSRF_HEADER_VALUE} header that every state-changing console request carries (it protects against cross-site request forgery).`, {
        errors: [{ header: CSRF_HEADER, detail: `Send ${CSRF_HEADER}: ${CSRF_HEADER_VALUE}`, code: 'csrf_header_missing' }],
        extensions: { reason: 'csrf' },
      });
    }
    if (hasBody(req) && !req.is('application/json')) {
      throw new AppError('unsupported-media-type', 'Console requests send their body as JSON with Content-Type: application/json.', {
        headers: { 'Accept-Post': 'application/json' },
      });
    }
    next();
  };
}

/** Console answers are per-user: never stored by browsers or shared caches. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};
