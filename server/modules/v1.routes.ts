/**
 * The public API, /v1. In front of every module: CORS for embed-key origins, the request log, the route
 * check (an unknown path is 404 and a wrong method 405 before any key is asked for), API-key
 * authentication, and for calculations (POST) idempotency and metering. Calculation handlers answer through
 * `res.locals.sendMetered`. Reference data and usage (GET) need a key but are not metered.
 */
import express, { Router, type Request, type RequestHandler } from 'express';
import type { Db } from '../db/client.ts';
import { AppError } from '../http/problem.ts';
import { requireApiKey, v1Cors } from './metering/api-auth.ts';
import type { Platform } from './metering/platform.ts';
import type { AbuseGuard } from './abuse/abuse-guard.ts';
import { CSV_LIMIT_BYTES } from './capacity-tests/capacity-tests.routes.ts';
import { usageRouter } from './usage/usage.routes.ts';
import { packsRouter } from './packs/packs.routes.ts';
import { runtimeRouter } from './runtime/runtime.routes.ts';
import { chargeRouter } from './charge/charge.routes.ts';
import { capacityTestsRouter } from './capacity-tests/capacity-tests.routes.ts';
import { chemistriesRouter } from './chemistries/chemistries.routes.ts';
import { wiresRouter } from './wires/wires.routes.ts';
import { fusesRouter } from './fuses/fuses.routes.ts';
import { parallelRouter } from './parallel/parallel.routes.ts';
import { compatibilityRouter } from './compatibility/compatibility.routes.ts';
import { conductorsRouter } from './conductors/conductors.routes.ts';
import { catalogApiRouter } from './catalog/catalog.routes.ts';

/** Checks the path and method against the routes documented in the OpenAPI document. */
function knownRoutesOnly(documentedPaths: Record<string, object>): RequestHandler {
  const routes = new Map<string, Set<string>>();
  for (const [path, operations] of Object.entries(documentedPaths)) {
    if (!path.startsWith('/v1/')) continue;
    routes.set(path.slice(3), new Set(Object.keys(operations).map((m) => m.toUpperCase())));
  }
  return (req, _res, next) => {
    const methods = routes.get(req.path.replace(/\/$/, '') || '/');
    if (!methods) throw new AppError('not-found', `No route matches ${req.method} ${req.baseUrl}${req.path}.`);
    if (!methods.has(req.method) && req.method !== 'OPTIONS') {
      throw new AppError('method-not-allowed', `${req.baseUrl}${req.path} accepts ${[...methods].join(', ')}, not ${req.method}.`, {
        headers: { Allow: [...methods].join(', ') },
      });
    }
    next();
  };
}

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

export function v1Router(deps: { db: Db; platform: Platform; documentedPaths: Record<string, object>; abuse?: AbuseGuard }) {
  const { db, platform } = deps;
  const router = Router();
  router.use(v1Cors(platform.resolver));
  router.use(platform.requestLog.middleware());
  router.use(knownRoutesOnly(deps.documentedPaths));
  const calculationKey = requireApiKey(platform.resolver, { calculation: true });
  const referenceKey = requireApiKey(platform.resolver, { calculation: false });
  router.use((req, res, next) => {
    if (req.method === 'GET' && EMBED_READABLE_PATHS.has(req.path)) return calculationKey(withOwnOrigin(req), res, next);
    return (req.method === 'POST' ? calculationKey : referenceKey)(req, res, next);
  });
  // Per-key limits on what the metering does not limit: refused calculations, unmetered reads.
  if (deps.abuse) router.use(deps.abuse.keyGuard);
  // CSV bodies (capacity-test logs) are read here, before idempotency hashes the payload.
  const csvText = express.text({ type: 'text/csv', limit: CSV_LIMIT_BYTES });
  const readCsv: RequestHandler = (req, res, next) => (req.headers['content-type']?.startsWith('text/csv') ? csvText(req, res, next) : next());
  router.post('/*path', readCsv, platform.metering.idempotency, platform.metering.meterCalls);

  router.use(usageRouter(db));
  // Calculation and reference modules, one line each:
  router.use(packsRouter());
  router.use(runtimeRouter());
  router.use(chargeRouter());
  router.use(capacityTestsRouter());
  router.use(chemistriesRouter());
  router.use(wiresRouter());
  router.use(fusesRouter());
  router.use(parallelRouter());
  router.use(compatibilityRouter());
  router.use(conductorsRouter());
  router.use(catalogApiRouter({ db }));
  return router;
}
