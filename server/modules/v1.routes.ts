/**
 * The public API, /v1, as one gateway. In front of every operation: CORS for embed-key origins, the request
 * log, the route check (an unknown path is 404 and a wrong method 405 before any key is asked for), API-key
 * authentication and the per-key abuse limits; for calculations (POST) also the CSV body reader,
 * idempotency and metering. Calculation handlers answer through `res.locals.sendMetered`. Reference data
 * and usage (GET) need a key but are not metered.
 *
 * Modules declare their operations as a table (`V1Route`); the gateway looks the path up once and runs the
 * checks and the operation's handlers as one precomposed chain. A metered call is the API's hot path: one
 * table lookup instead of a walk through a router per module and a layer per check (measured with
 * `npm run bench`, see DEVELOPERS.md).
 */
import express, { type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import type { Db } from '../db/client.ts';
import { AppError } from '../http/problem.ts';
import { requireApiKey, v1Cors } from './metering/api-auth.ts';
import type { Platform } from './metering/platform.ts';
import type { AbuseGuard } from './abuse/abuse-guard.ts';
import type { V1Route } from './v1-route.ts';
import { CSV_LIMIT_BYTES, capacityTestsRoutes } from './capacity-tests/capacity-tests.routes.ts';
import { usageRoutes } from './usage/usage.routes.ts';
import { packsRoutes } from './packs/packs.routes.ts';
import { runtimeRoutes } from './runtime/runtime.routes.ts';
import { chargeRoutes } from './charge/charge.routes.ts';
import { chemistriesRoutes } from './chemistries/chemistries.routes.ts';
import { wiresRoutes } from './wires/wires.routes.ts';
import { fusesRoutes } from './fuses/fuses.routes.ts';
import { parallelRoutes } from './parallel/parallel.routes.ts';
import { compatibilityRoutes } from './compatibility/compatibility.routes.ts';
import { conductorsRoutes } from './conductors/conductors.routes.ts';
import { catalogApiRoutes } from './catalog/catalog.routes.ts';

/**
 * Read-only GET paths an embed key may call (from its listed origins, like a calculation): the public
 * data its widgets show. Every other GET (usage, reference data) still needs a server key.
 */
const EMBED_READABLE_PATHS = new Set(['/catalog']);

/**
 * Browsers send no Origin on a same-origin GET (the console's widget preview reading the catalog); there
 * the browser-set `Sec-Fetch-Site: same-origin` stands for this server's own origin, which the key must
 * list like any other. A read-only view over `req` (it is not changed).
 */
function withOwnOrigin(req: Request): Request {
  if (req.get('origin') || req.get('sec-fetch-site') !== 'same-origin') return req;
  const own = `${req.protocol}://${req.get('host') ?? ''}`;
  return Object.create(req, { get: { value: (name: string) => (name.toLowerCase() === 'origin' ? own : req.get(name)) } }) as Request;
}

/**
 * Runs handlers in order as Express would: each gets a `next`; a thrown error or a rejected promise goes
 * to `out` (the application's error handlers), and so does the end of the chain.
 */
function runChain(handlers: readonly RequestHandler[], req: Request, res: Response, out: NextFunction): void {
  let index = 0;
  const next = (error?: unknown): void => {
    if (error !== undefined && error !== null) {
      out(error);
      return;
    }
    const handler = handlers[index++];
    if (!handler) {
      out();
      return;
    }
    try {
      const returned: unknown = handler(req, res, next);
      if (returned instanceof Promise) returned.catch((reason: unknown) => out(reason ?? new Error('Rejected promise')));
    } catch (thrown) {
      out(thrown);
    }
  };
  next();
}

/** Every /v1 operation, one line per module. */
function v1Routes(db: Db): V1Route[] {
  return [
    ...usageRoutes(db),
    ...packsRoutes(),
    ...runtimeRoutes(),
    ...chargeRoutes(),
    ...capacityTestsRoutes(),
    ...chemistriesRoutes(),
    ...wiresRoutes(),
    ...fusesRoutes(),
    ...parallelRoutes(),
    ...compatibilityRoutes(),
    ...conductorsRoutes(),
    ...catalogApiRoutes({ db }),
  ];
}

export function v1Router(deps: { db: Db; platform: Platform; documentedPaths: Record<string, object>; abuse?: AbuseGuard }) {
  const { db, platform } = deps;
  const calculationKey = requireApiKey(platform.resolver, { calculation: true });
  const referenceKey = requireApiKey(platform.resolver, { calculation: false });
  const embedReadableKey: RequestHandler = (req, res, next) => calculationKey(withOwnOrigin(req), res, next);
  const keyGuard: RequestHandler[] = deps.abuse ? [deps.abuse.keyGuard] : [];
  // CSV bodies (capacity-test logs) are read before idempotency hashes the payload.
  const csvText = express.text({ type: 'text/csv', limit: CSV_LIMIT_BYTES });
  const readCsv: RequestHandler = (req, res, next) => (req.headers['content-type']?.startsWith('text/csv') ? csvText(req, res, next) : next());

  // path → method → the whole chain after the route check: key, per-key limits, then for calculations
  // the CSV reader, idempotency and metering, then the operation's own handlers.
  const table = new Map<string, Map<string, RequestHandler[]>>();
  for (const route of v1Routes(db)) {
    if (!deps.documentedPaths[`/v1${route.path}`]) throw new Error(`/v1${route.path} is served but not in the OpenAPI document`);
    const methods = table.get(route.path) ?? new Map<string, RequestHandler[]>();
    if (methods.has(route.method)) throw new Error(`${route.method} /v1${route.path} is declared twice`);
    const auth = route.method === 'POST' ? calculationKey : EMBED_READABLE_PATHS.has(route.path) ? embedReadableKey : referenceKey;
    const metered = route.method === 'POST' ? [readCsv, platform.metering.idempotency, platform.metering.meterCalls] : [];
    methods.set(route.method, [auth, ...keyGuard, ...metered, ...route.handlers]);
    table.set(route.path, methods);
  }

  /** The route check: an unknown path is 404, a known path with another method 405. */
  const dispatch: RequestHandler = (req, res, next) => {
    const path = req.path.length > 1 && req.path.endsWith('/') ? req.path.slice(0, -1) : req.path;
    const methods = table.get(path);
    if (!methods) throw new AppError('not-found', `No route matches ${req.method} ${req.baseUrl}${req.path}.`);
    const chain = methods.get(req.method);
    if (chain) {
      runChain(chain, req, res, next);
      return;
    }
    const allowed = [...methods.keys()].join(', ');
    if (req.method !== 'OPTIONS') {
      throw new AppError('method-not-allowed', `${req.baseUrl}${req.path} accepts ${allowed}, not ${req.method}.`, { headers: { Allow: allowed } });
    }
    // OPTIONS without an Origin (CORS preflights, which carry one, were answered above): the methods, as
    // the OpenAPI document lists them anyway.
    res.setHeader('Allow', allowed);
    res.status(204).end();
  };

  const front: RequestHandler[] = [v1Cors(platform.resolver), platform.requestLog.middleware(), dispatch];
  const gateway: RequestHandler = (req, res, next) => runChain(front, req, res, next);
  // The operations it serves, for the route inventory (methods in lower case, as Express lists them).
  const routes = [...table].flatMap(([path, methods]) => [...methods.keys()].map((method) => ({ method: method.toLowerCase(), path })));
  return Object.assign(gateway, { routes });
}
