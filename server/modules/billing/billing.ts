/**
 * The billing module of one server instance: the Stripe client, the service, the console router, the
 * webhook router (mounted before express.json()), and a periodic check that moves organizations whose
 * grace period after a failed payment has ended to the free plan.
 */
import type pg from 'pg';
import type { Db } from '../../db/client.ts';
import type { Env } from '../../env.ts';
import type { Logger } from '../../logger.ts';
import type { KeyResolver } from '../keys/key-resolver.ts';
import type { Mailer } from '../mail/mailer.ts';
import { billingWebhookRouter } from './billing-webhook.routes.ts';
import { billingConsoleRouter } from './billing.routes.ts';
import { createBillingService } from './billing.service.ts';
import { createStripeClient } from './stripe-client.ts';

/** How often an instance looks for grace periods that have ended. */
const GRACE_CHECK_INTERVAL_MS = 5 * 60_000;

export function createBilling(deps: { env: Env; db: Db; pool: pg.Pool; logger: Logger; resolver: KeyResolver; mailer?: Mailer }) {
  const { env, db, pool, logger, resolver } = deps;
  const service = createBillingService({ env, db, logger, mailer: deps.mailer, stripe: createStripeClient(env), onPlanChanged: () => resolver.invalidate() });
  const timer = setInterval(() => {
    // The pool ends when the server shuts down; the check stops with it.
    if (pool.ending) {
      clearInterval(timer);
      return;
    }
    service.expireGracePeriods().catch((err: unknown) => logger.warn({ err }, 'grace-period check failed'));
  }, GRACE_CHECK_INTERVAL_MS);
  timer.unref();
  return {
    service,
    consoleRouter: billingConsoleRouter(service),
    webhookRouter: billingWebhookRouter(service),
    close() {
      clearInterval(timer);
    },
  };
}

export type Billing = ReturnType<typeof createBilling>;

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Application {
      /** This instance's billing module (its service is what tests drive with an injected time). */
      billing?: Billing;
    }
  }
}
