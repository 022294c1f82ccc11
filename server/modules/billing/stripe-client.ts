/**
 * The Stripe client, configured once from the environment: secret key, API host/port/protocol, a pinned
 * API version (so object shapes do not change under us; the webhook endpoint is pinned to the same one),
 * bounded retries and timeouts. Also the two-way map between our paid plans and Stripe price ids.
 */
import Stripe from 'stripe';
import type { PlanId } from '#shared/plans.ts';
import { EnvError, type Env } from '../../env.ts';

/** The API version we speak; stripe-node 23.1.0's own. Events of another version are still read (see webhook handling). */
export const STRIPE_API_VERSION = '2026-10-28.endive' satisfies Stripe.LatestApiVersion;

const DEVELOPMENT_SECRET_KEY = 'sk_test_ohmstead_development';
const DEVELOPMENT_WEBHOOK_SECRET = 'whsec_ohmstead_development';

/** Refuses the development defaults in production (they are published in the repository). */
export function assertStripeConfiguration(env: Env): void {
  if (env.NODE_ENV !== 'production') return;
  const missing = [
    env.STRIPE_SECRET_KEY === DEVELOPMENT_SECRET_KEY ? '  STRIPE_SECRET_KEY: required in production' : null,
    env.STRIPE_WEBHOOK_SECRET === DEVELOPMENT_WEBHOOK_SECRET ? '  STRIPE_WEBHOOK_SECRET: required in production' : null,
  ].filter(Boolean);
  if (missing.length) throw new EnvError(`Invalid configuration:\n${missing.join('\n')}`);
}

export function createStripeClient(env: Env): Stripe {
  assertStripeConfiguration(env);
  return new Stripe(env.STRIPE_SECRET_KEY, {
    apiVersion: STRIPE_API_VERSION,
    host: env.STRIPE_API_HOST,
    port: env.STRIPE_API_PORT,
    protocol: env.STRIPE_API_PROTOCOL,
    // Retries reuse one idempotency key, so a retried create never creates twice.
    maxNetworkRetries: 2,
    timeout: 10_000,
    appInfo: { name: 'Ohmstead', version: '0.1.0' },
  });
}

export interface PricePlans {
  priceFor(planId: Exclude<PlanId, 'free'>): string;
  /** The plan a price stands for; null for a price we do not sell. */
  planFor(priceId: string | null | undefined): PlanId | null;
}

export function pricePlans(env: Env): PricePlans {
  const prices: Record<Exclude<PlanId, 'free'>, string> = { builder: env.STRIPE_PRICE_BUILDER, scale: env.STRIPE_PRICE_SCALE };
  const plans = new Map(Object.entries(prices).map(([plan, price]) => [price, plan as PlanId]));
  return {
    priceFor: (planId) => prices[planId],
    planFor: (priceId) => (priceId ? (plans.get(priceId) ?? null) : null),
  };
}
