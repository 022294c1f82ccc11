/**
 * createApp(): the Express application, without listening. Middleware order: request id and logging,
 * security headers, body parsing, module routers, the console, then 404 and the one error handler.
 */
import express from 'express';
import helmet from 'helmet';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pinoHttp } from 'pino-http';
import type pg from 'pg';
import type { Db } from './db/client.ts';
import type { Env } from './env.ts';
import { errorHandler, notFoundHandler } from './http/error-handler.ts';
import { jsonBody } from './http/json-body.ts';
import type { Logger } from './logger.ts';
import { healthRouter } from './modules/health/health.routes.ts';
import { problemsRouter } from './modules/problems/problems.routes.ts';
import { createPlatform, type Platform } from './modules/metering/platform.ts';
import type { MeteringHooks } from './modules/metering/metering.ts';
import { v1Router } from './modules/v1.routes.ts';
import { accountsConsoleRouter, consoleSecurity } from './modules/console/accounts-console.routes.ts';
import { keysConsoleRouter } from './modules/keys/keys.routes.ts';
import { createMailer, type Mailer } from './modules/mail/mailer.ts';
import { createQuotaNotifier } from './modules/usage/quota-notifier.ts';
import { usageConsoleRouter } from './modules/usage/usage-console.routes.ts';
import { playgroundConsoleRouter } from './modules/playground/playground.routes.ts';
import { catalogConsoleRouter, catalogUploadRouter } from './modules/catalog/catalog.routes.ts';
import { widgetsRouter } from './modules/widgets/widgets.routes.ts';
import { createBilling } from './modules/billing/billing.ts';
import { buildOpenApiDocument } from './openapi/document.ts';
import { abuseLimits, createAbuseGuard } from './modules/abuse/abuse-guard.ts';

export interface AppDeps {
  env: Env;
  db: Db;
  pool: pg.Pool;
  logger: Logger;
  meteringHooks?: MeteringHooks;
  mailer?: Mailer;
}

declare global {
  namespace Express {
    interface Application {
      /** This instance's metering platform; closed by the server on shutdown. */
      platform?: Platform;
    }
  }
}

const REQUEST_ID = /^[A-Za-z0-9._-]{8,128}$/;

/** Paths owned by the API; everything else that is a GET for a page falls through to the console. */
const API_PREFIXES = ['/v1', '/console-api', '/problems', '/openapi.json', '/healthz', '/readyz'];

export function createApp(deps: AppDeps) {
  const { env, db, pool, logger } = deps;
  const app = express();
  const mailer = deps.mailer ?? createMailer(env, logger);
  const consoleUrl = env.PUBLIC_URL?.replace(/\/$/, '') ?? `http://${env.HOST}:${env.PORT}`;
  const platform = createPlatform({
    env,
    db,
    pool,
    logger,
    hooks: deps.meteringHooks ?? { onCounted: createQuotaNotifier({ db, mailer, logger, consoleUrl }) },
  });
  app.platform = platform;
  const billing = createBilling({ env, db, pool, logger, resolver: platform.resolver, mailer });
  app.billing = billing;
  const abuse = createAbuseGuard({ limits: abuseLimits(env), resolver: platform.resolver });
  const openApiDocument = buildOpenApiDocument();
  app.disable('x-powered-by');
  // Weak ETags hash every JSON body; API answers are not cached by validators, so skip the work.
  app.set('etag', false);
  app.set('query parser', 'simple');
  if (env.TRUST_PROXY_HOPS > 0) app.set('trust proxy', env.TRUST_PROXY_HOPS);

  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const incoming = req.headers['x-request-id'];
        const id = typeof incoming === 'string' && REQUEST_ID.test(incoming) ? incoming : randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      // Completed requests are logged at info; below that level they are not even put together.
      autoLogging: logger.isLevelEnabled('info') ? { ignore: (req) => req.url === '/healthz' } : false,
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          // Served over plain HTTP on loopback; a TLS-terminating proxy in front adds HSTS and upgrades.
          'upgrade-insecure-requests': null,
        },
      },
      strictTransportSecurity: false,
    }),
  );
  // Per-address limits for /v1 and /console-api, before any body, key or session work.
  app.use(abuse.addressGuard);
  // Stripe webhooks need the raw body to verify its signature: before the JSON parser.
  app.use(billing.webhookRouter);
  app.use(jsonBody({ limit: env.BODY_LIMIT_BYTES }));

  // The public API first: its calls are the hot path and pass no other router on their way.
  app.use('/v1', v1Router({ db, platform, documentedPaths: openApiDocument.paths ?? {}, abuse }), abuse.announceFailure);
  app.use(healthRouter(db));
  app.use(problemsRouter());
  // The console API: CSRF defence, no-store and the session context for all of it, then the routers.
  // The catalog's CSV upload is multipart, which consoleSecurity refuses: it brings the same defences itself.
  app.use('/console-api', catalogUploadRouter({ env, db }));
  app.use('/console-api', ...consoleSecurity({ env, db }));
  app.use('/console-api', accountsConsoleRouter({ env, db, logger, mailer }));
  app.use('/console-api', keysConsoleRouter({ db, hashSecret: platform.hashSecret, resolver: platform.resolver }));
  app.use('/console-api', usageConsoleRouter({ db }));
  app.use('/console-api', billing.consoleRouter);
  app.use('/console-api', playgroundConsoleRouter({ db, platform }));
  app.use('/console-api', catalogConsoleRouter({ db }));
  app.use('/console-api', abuse.announceFailure);
  // The embeddable widget bundle (versioned and major-alias paths) and its access check.
  app.use(widgetsRouter({ resolver: platform.resolver }));

  const openApiJson = JSON.stringify(openApiDocument);
  app.get('/openapi.json', (_req, res) => {
    res.type('application/json').send(openApiJson);
  });

  const distDir = resolve(env.CONSOLE_DIST_DIR);
  const indexHtml = join(distDir, 'index.html');
  if (existsSync(indexHtml)) {
    app.use(express.static(distDir, { index: false, maxAge: '1h', immutable: false }));
    app.get('/{*path}', (req, res, next) => {
      if (API_PREFIXES.some((p) => req.path === p || req.path.startsWith(`${p}/`)) || !req.accepts('html')) {
        next();
        return;
      }
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(indexHtml);
    });
  }

  app.use(notFoundHandler);
  app.use(errorHandler);
  return app;
}
