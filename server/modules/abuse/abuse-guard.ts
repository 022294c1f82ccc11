/**
 * Limits on the API traffic the metering does not limit (OWASP API4:2023 Unrestricted Resource
 * Consumption, API2:2023 brute force against authentication). Metered calculation calls that succeed are
 * already limited per organization, exactly and across instances, by the plan's per-minute rate and
 * monthly quota (metering). Everything else is limited here, per minute:
 *
 *   policy          counted per              what is counted                                   default
 *   auth-failures   client address            /v1 answers 4xx without an authenticated key      120
 *                                             (401 floods, junk bodies, unknown routes) and
 *                                             console 401s (bad sessions, failed sign-ins)
 *   key-failures    API key                   4xx answers to its calculation calls              120
 *   key-reads       API key                   its unmetered calls: reference data, /v1/usage    300
 *   console         session, or client        every /console-api request                        600
 *                   address without one
 *
 * Over a limit, the request is answered 429 (problem `rate-limited`, `Retry-After`, `RateLimit` and
 * `RateLimit-Policy` in the draft-8 form the metering uses, `violated-policies`) before any key, session,
 * body or database work. An address over its auth-failures limit is still served for a /v1 call that
 * carries a key this instance already holds as valid (so a flood from a shared address does not lock out
 * working clients behind it). Addresses are IPv4, or IPv6 cut to /56 (as the sign-in throttle does).
 *
 * Counts live in each instance's memory, in fixed one-minute windows (window-counter.ts), on purpose:
 * the guard protects this instance's CPU, connections and database pool, which are per instance; it
 * costs a map lookup, never a database round trip (a flood of random keys must not become a flood of
 * queries); and exactness does not matter here, unlike the bill. With N instances behind a load balancer
 * a client can get up to N × the limit. /healthz and /readyz, the OpenAPI document, the problem pages
 * and the console's static files are not limited.
 */
import type { ErrorRequestHandler, Request, RequestHandler, Response } from 'express';
import { ZodError } from 'zod';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import { addressThrottleKey, clientAddress } from '../auth/request-meta.ts';
import type { KeyResolver } from '../keys/key-resolver.ts';
import { WindowCounter, type WindowState } from './window-counter.ts';

export interface AbuseLimits {
  addressFailuresPerMinute: number;
  keyFailuresPerMinute: number;
  keyReadsPerMinute: number;
  consoleRequestsPerMinute: number;
}

export function abuseLimits(env: Env): AbuseLimits {
  return {
    addressFailuresPerMinute: env.ABUSE_ADDRESS_FAILURES_PER_MINUTE,
    keyFailuresPerMinute: env.ABUSE_KEY_FAILURES_PER_MINUTE,
    keyReadsPerMinute: env.ABUSE_KEY_READS_PER_MINUTE,
    consoleRequestsPerMinute: env.ABUSE_CONSOLE_REQUESTS_PER_MINUTE,
  };
}

type PolicyName = 'auth-failures' | 'key-failures' | 'key-reads' | 'console';

const BEARER = /^Bearer[ ]+(\S+)\s*$/i;
/** The console's session cookie, under either of its names (session.ts: `__Host-` prefixed when Secure). */
const SESSION_COOKIE = /(?:^|;\s*)(?:__Host-)?ohs_session=([^;\s]+)/;

/** Adds one policy to the RateLimit / RateLimit-Policy lists of a response (draft-ietf-httpapi-ratelimit-headers, draft-8 form). */
function announce(res: Response, name: PolicyName, state: WindowState): void {
  const policy = `"${name}";q=${state.limit};w=60`;
  const current = `"${name}";r=${state.remaining};t=${state.resetS}`;
  const existing = res.getHeader('RateLimit-Policy');
  if (typeof existing === 'string' && existing.length > 0 && !existing.includes(`"${name}"`)) {
    res.setHeader('RateLimit-Policy', `${existing}, ${policy}`);
    res.setHeader('RateLimit', `${String(res.getHeader('RateLimit') ?? '')}, ${current}`.replace(/^, /, ''));
  } else {
    res.setHeader('RateLimit-Policy', policy);
    res.setHeader('RateLimit', current);
  }
}

function refuse(name: PolicyName, state: WindowState, detail: string): AppError {
  return new AppError('rate-limited', `${detail} Retry after ${state.resetS} s.`, {
    headers: { 'RateLimit-Policy': `"${name}";q=${state.limit};w=60`, RateLimit: `"${name}";r=0;t=${state.resetS}`, 'Retry-After': String(state.resetS) },
    extensions: { 'violated-policies': [name] },
  });
}

/** The state after the failure being answered now is counted (it is counted when the answer finishes). */
const afterOneMore = (s: WindowState): WindowState => ({ ...s, count: s.count + 1, remaining: Math.max(0, s.remaining - 1) });

function statusOf(err: unknown): number {
  if (err instanceof AppError) return err.status;
  if (err instanceof ZodError) return 422;
  const status = (err as { status?: unknown } | null)?.status;
  return typeof status === 'number' ? status : 500;
}

export function createAbuseGuard(deps: { limits: AbuseLimits; resolver: KeyResolver; clock?: () => number }) {
  const { limits, resolver, clock } = deps;
  const addressFailures = new WindowCounter(limits.addressFailuresPerMinute, 60_000, clock);
  const keyFailures = new WindowCounter(limits.keyFailuresPerMinute, 60_000, clock);
  const keyReads = new WindowCounter(limits.keyReadsPerMinute, 60_000, clock);
  const consoleRequests = new WindowCounter(limits.consoleRequestsPerMinute, 60_000, clock);
  const addressOf = (req: Request) => addressThrottleKey(clientAddress(req));

  /** A /v1 call carrying a key this instance has cached as valid (no hashing, no database). */
  function holdsKnownGoodKey(req: Request): boolean {
    const presented = BEARER.exec(req.get('authorization') ?? '')?.[1];
    const key = presented ? resolver.resolveCached(presented) : undefined;
    return Boolean(key && !key.revokedAt && !(key.expiresAt && key.expiresAt.getTime() <= Date.now()));
  }

  /**
   * App-level, before body parsing, for /v1 and /console-api: the per-address limits, and the counting of
   * failures when the answer is finished.
   */
  const addressGuard: RequestHandler = (req, res, next) => {
    const path = req.path;
    const v1 = path.startsWith('/v1/');
    if (!v1 && !path.startsWith('/console-api/')) {
      next();
      return;
    }
    // The hot path: a /v1 call with a key this instance holds as valid is exempt from the address limit,
    // so its address is worked out only if the call fails.
    const knownGood = v1 && holdsKnownGoodKey(req);
    let address: string | undefined;
    if (!knownGood) {
      address = addressOf(req);
      if (!v1) {
        // Per session when the request brings one (colleagues behind one office address do not share a
        // budget), per address otherwise. A made-up cookie is a 401, which the auth-failures limit counts.
        const session = SESSION_COOKIE.exec(req.headers.cookie ?? '')?.[1];
        const state = consoleRequests.hit(session ? `session:${session}` : address);
        announce(res, 'console', state);
        if (state.exceeded) throw refuse('console', state, `Too many console requests from ${session ? 'this session' : 'your network address'} in this minute.`);
      }
      if (addressFailures.isExhausted(address)) {
        throw refuse('auth-failures', addressFailures.peek(address), 'Too many unauthenticated or refused requests from your network address in this minute.');
      }
    }
    res.once('finish', () => {
      const status = res.statusCode;
      if (status < 400 || status >= 500 || status === 429) return;
      if (!v1) {
        if (status === 401) addressFailures.hit(address ?? addressOf(req));
        return;
      }
      const key = res.locals.apiKey;
      if (!key) addressFailures.hit(address ?? addressOf(req));
      else if (req.method === 'POST') keyFailures.hit(key.id);
    });
    next();
  };

  /** In the /v1 router after the key check: the per-key limits. */
  const keyGuard: RequestHandler = (req, res, next) => {
    const key = res.locals.apiKey;
    if (!key) {
      next();
      return;
    }
    if (req.method === 'POST') {
      // Successful calculations are limited by the metering; refused ones here.
      if (keyFailures.isExhausted(key.id)) {
        throw refuse('key-failures', keyFailures.peek(key.id), `More than ${limits.keyFailuresPerMinute} calls with this key were refused in this minute; fix the requests before sending more.`);
      }
      next();
      return;
    }
    const state = keyReads.hit(key.id);
    announce(res, 'key-reads', state);
    if (state.exceeded) throw refuse('key-reads', state, `More than ${limits.keyReadsPerMinute} unmetered calls (reference data, usage) with this key in this minute; cache the reference data.`);
    next();
  };

  /** After the /v1 and console routers: announces the failure budget a refused call is counted against. */
  const announceFailure: ErrorRequestHandler = (err, req, res, next) => {
    const status = statusOf(err);
    if (status >= 400 && status < 500 && status !== 429 && !res.headersSent) {
      const key = res.locals.apiKey;
      if (key && req.method === 'POST') announce(res, 'key-failures', afterOneMore(keyFailures.peek(key.id)));
      else if (!key && (req.baseUrl.startsWith('/v1') || status === 401)) announce(res, 'auth-failures', afterOneMore(addressFailures.peek(addressOf(req))));
    }
    next(err);
  };

  return { addressGuard, keyGuard, announceFailure, limits };
}

export type AbuseGuard = ReturnType<typeof createAbuseGuard>;
