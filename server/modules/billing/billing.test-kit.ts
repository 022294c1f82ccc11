/**
 * Test helpers for billing: the Stripe-shaped fake on a free port with test-only secrets and prices, the
 * environment that points the app's Stripe client at it, and a real SDK client for arranging state.
 */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import Stripe from 'stripe';
import type { Db } from '../../db/client.ts';
import { planPrices, startStripeFake, type StripeFake } from '../../fakes/stripe-fake.ts';
import { linkCustomer } from './billing.queries.ts';
import { STRIPE_API_VERSION } from './stripe-client.ts';

export const TEST_STRIPE = {
  secretKey: 'sk_test_ohmstead_tests',
  webhookSecret: 'whsec_ohmstead_tests',
  priceBuilder: 'price_test_builder',
  priceScale: 'price_test_scale',
} as const;

export interface BillingFake {
  fake: StripeFake;
  /** Environment overrides for createTestApp / startConsoleKit. */
  env: Record<string, string>;
  /** A real SDK client talking to the fake (for arranging state in tests). */
  stripe: Stripe;
  close(): Promise<void>;
}

export async function startBillingFake(options: { webhookUrl?: string | null } = {}): Promise<BillingFake> {
  const fake = await startStripeFake({
    secretKey: TEST_STRIPE.secretKey,
    webhookSecret: TEST_STRIPE.webhookSecret,
    webhookUrl: options.webhookUrl ?? null,
    prices: planPrices({ builder: TEST_STRIPE.priceBuilder, scale: TEST_STRIPE.priceScale }),
    apiVersion: STRIPE_API_VERSION,
    retryDelayMs: 20,
  });
  const env = {
    STRIPE_SECRET_KEY: TEST_STRIPE.secretKey,
    STRIPE_WEBHOOK_SECRET: TEST_STRIPE.webhookSecret,
    STRIPE_API_HOST: fake.host,
    STRIPE_API_PORT: String(fake.port),
    STRIPE_API_PROTOCOL: 'http',
    STRIPE_PRICE_BUILDER: TEST_STRIPE.priceBuilder,
    STRIPE_PRICE_SCALE: TEST_STRIPE.priceScale,
  };
  const stripe = new Stripe(TEST_STRIPE.secretKey, { apiVersion: STRIPE_API_VERSION, host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
  return { fake, env, stripe, close: () => fake.close() };
}

/** Gives an organization a billing account with a customer at the fake (as a first checkout would). */
export async function giveBillingAccount(db: Db, stripe: Stripe, organizationId: string): Promise<string> {
  const customer = await stripe.customers.create({ name: 'Test customer', metadata: { organization_id: organizationId } });
  return linkCustomer(db, organizationId, customer.id);
}

/** Listens on a free loopback port so the fake can deliver webhooks to the app; returns the webhook URL. */
export async function listenForWebhooks(app: { listen: (port: number, host: string) => Server }): Promise<{ url: string; close: () => Promise<void> }> {
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/v1/webhooks/stripe`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

/** Submits a form on one of the fake's pages, as a browser would; returns the status, Location and body. */
export async function submitForm(url: string, fields: Record<string, string>) {
  const response = await fetch(url, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(fields).toString(),
    redirect: 'manual',
  });
  return { status: response.status, location: response.headers.get('location'), body: await response.text() };
}
