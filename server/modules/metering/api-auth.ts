/**
 * Authentication of /v1 calls by API key, and CORS for embed keys.
 *
 * - `Authorization: Bearer <key>` only (never a query parameter). Missing, malformed, unknown, revoked or
 *   expired → 401 with `WWW-Authenticate: Bearer`.
 * - Embed keys (`ohs_emb_…`) are public: they work only on calculation endpoints and only with an
 *   `Origin` their owner listed (403 otherwise). Server keys (`ohs_srv_…`) are secret: a call carrying a
 *   cross-site browser `Origin` is refused, so a leaked-into-a-page server key fails loudly.
 * - CORS is answered for exactly the origins listed on active embed keys; credentials are never allowed.
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { AppError } from '../../http/problem.ts';
import { keyKindOf } from '../keys/key-format.ts';
import type { KeyResolver, ResolvedKey } from '../keys/key-resolver.ts';

declare global {
  namespace Express {
    interface Locals {
      apiKey?: ResolvedKey;
    }
  }
}

const BEARER = /^Bearer[ ]+([^\s]+)\s*$/i;
const EXPOSED_HEADERS = 'RateLimit, RateLimit-Policy, Retry-After, X-Request-Id, Idempotent-Replayed';
const ALLOWED_HEADERS = 'Authorization, Content-Type, Idempotency-Key, X-Request-Id';

function unauthorized(detail: string): AppError {
  return new AppError('unauthorized', detail, { headers: { 'WWW-Authenticate': 'Bearer realm="ohmstead"' } });
}

/** CORS for the public API: preflights and response headers for origins listed on active embed keys. */
export function v1Cors(resolver: KeyResolver): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    const origin = req.get('origin');
    if (!origin) {
      next();
      return;
    }
    return answerCors(resolver, origin, req, res, next);
  };
}

async function answerCors(resolver: KeyResolver, origin: string, req: Request, res: Response, next: NextFunction) {
  res.vary('Origin');
  const listed = (await resolver.embedOrigins()).has(origin);
  if (listed) {
    res.setHeader('Access-Control-Allow-Origin', origin);
    res.setHeader('Access-Control-Expose-Headers', EXPOSED_HEADERS);
  }
  if (req.method === 'OPTIONS') {
    if (!listed) throw new AppError('forbidden', `The origin ${origin} is not listed on any embed key.`);
    res.setHeader('Access-Control-Allow-Methods', 'GET, POST');
    res.setHeader('Access-Control-Allow-Headers', ALLOWED_HEADERS);
    res.setHeader('Access-Control-Max-Age', '7200');
    res.status(204).end();
    return;
  }
  next();
}

/**
 * Requires a valid API key. `calculation` marks the metered calculation endpoints, the only ones an
 * embed key may call.
 */
export function requireApiKey(resolver: KeyResolver, options: { calculation: boolean }): RequestHandler {
  const admit = (req: Request, res: Response, next: NextFunction, key: ResolvedKey | null) => {
    if (!key) throw unauthorized('This API key is not recognised.');
    if (key.revokedAt) throw unauthorized('This API key has been revoked.');
    if (key.expiresAt && key.expiresAt.getTime() <= Date.now()) throw unauthorized('This API key has expired.');

    const origin = req.get('origin');
    if (key.kind === 'embed') {
      if (!options.calculation) throw new AppError('forbidden', 'Embed keys may only call calculation endpoints. Use a server key from your own servers.');
      if (!origin) throw new AppError('forbidden', 'An embed key works only from a web page on one of its listed origins (no Origin header was sent).');
      if (!key.allowedOrigins.includes(origin)) throw new AppError('forbidden', `This embed key is not allowed from ${origin}. Add the origin to the key in the console.`);
    } else if (origin && !isSameOrigin(req, origin)) {
      throw new AppError('forbidden', 'Server keys are secret and must not be used from web pages on other sites. Use an embed key there.');
    }
    res.locals.apiKey = key;
    next();
  };
  return (req, res, next) => {
    const header = req.get('authorization');
    if (!header) throw unauthorized('Send your API key as "Authorization: Bearer <key>".');
    const presented = BEARER.exec(header)?.[1];
    if (!presented) throw unauthorized('The Authorization header must read "Bearer <key>".');
    if (!keyKindOf(presented)) throw unauthorized('That is not an Ohmstead API key (they start with ohs_srv_ or ohs_emb_).');
    // A fresh cached key is checked without a promise; otherwise the database is asked.
    const cached = resolver.resolveCached(presented);
    if (cached !== undefined) return admit(req, res, next, cached);
    return resolver.resolve(presented).then((key) => admit(req, res, next, key));
  };
}

function isSameOrigin(req: Request, origin: string): boolean {
  try {
    return new URL(origin).host === req.get('host');
  } catch {
    return false;
  }
}
