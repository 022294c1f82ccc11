/**
 * The Stripe-shaped fake, driven by the real Stripe SDK (stripe-node 23.1.0) through its host/port/protocol
 * settings: the calls Ohmstead makes round-trip with state, errors arrive as the SDK's typed errors,
 * idempotency keys replay, the pages pay or decline, and the events it sends verify with the SDK's own
 * `constructEvent` under the webhook secret.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEnv } from '../env.ts';
import { planPrices, startDevelopmentStripeFake, startStripeFake, TEST_CARDS, type StripeFake } from './stripe-fake.ts';

const SECRET = 'sk_test_fake_suite';
const WHSEC = 'whsec_fake_suite';
const API_VERSION = '2026-10-28.endive';

let fake: StripeFake;
let stripe: Stripe;
let receiver: Server;
const received: Array<{ event: Stripe.Event | null; error: string | null }> = [];

async function readBody(req: IncomingMessage): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

beforeAll(async () => {
  // A minimal webhook endpoint that verifies exactly as a production receiver does.
  receiver = createServer(async (req, res) => {
    const body = await readBody(req);
    try {
      received.push({ event: Stripe.webhooks.constructEvent(body, String(req.headers['stripe-signature']), WHSEC), error: null });
      res.writeHead(200).end('{}');
    } catch (error) {
      received.push({ event: null, error: (error as Error).message });
      res.writeHead(400).end();
    }
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  fake = await startStripeFake({
    secretKey: SECRET,
    webhookSecret: WHSEC,
    webhookUrl: `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/hook`,
    prices: planPrices({ builder: 'price_suite_builder', scale: 'price_suite_scale' }),
    apiVersion: API_VERSION,
    retryDelayMs: 10,
  });
  stripe = new Stripe(SECRET, { apiVersion: API_VERSION, host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
});

afterAll(async () => {
  await fake.close();
  await new Promise<void>((resolve) => receiver.close(() => resolve()));
});

async function post(url: string, fields: Record<string, string>) {
  const r = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(fields), redirect: 'manual' });
  return { status: r.status, location: r.headers.get('location'), body: await r.text() };
}

async function checkout(priceId = 'price_suite_builder') {
  const customer = await stripe.customers.create({ email: 'owner@shop.example', metadata: { organization_id: 'org-1' } });
  const session = await stripe.checkout.sessions.create({
    mode: 'subscription',
    customer: customer.id,
    client_reference_id: 'org-1',
    line_items: [{ price: priceId, quantity: 1 }],
    success_url: 'http://console.example/billing?session_id={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://console.example/billing?checkout=canceled',
    subscription_data: { metadata: { organization_id: 'org-1' } },
  });
  return { customer, session };
}

describe('the API, through the real SDK', () => {
  it('when a customer is created, then it can be fetched back with its metadata', async () => {
    const created = await stripe.customers.create({ name: 'Shop', email: 'owner@shop.example', metadata: { organization_id: 'abc' } });
    expect(created.id).toMatch(/^cus_/);
    const fetched = await stripe.customers.retrieve(created.id);
    expect(fetched).toMatchObject({ id: created.id, email: 'owner@shop.example', metadata: { organization_id: 'abc' } });
  });

  it('when the key is wrong, then the SDK raises an authentication error', async () => {
    const wrong = new Stripe('sk_test_wrong', { apiVersion: API_VERSION, host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
    await expect(wrong.customers.create({})).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('when a checkout names an unknown price, then the SDK raises an invalid-request error naming the parameter', async () => {
    const customer = await stripe.customers.create({});
    const error = await stripe.checkout.sessions
      .create({ mode: 'subscription', customer: customer.id, line_items: [{ price: 'price_nope', quantity: 1 }], success_url: 'http://x.example/' })
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((error as Stripe.errors.StripeInvalidRequestError).param).toBe('line_items[0][price]');
  });

  it('when an unknown subscription is fetched, then it is a resource_missing error', async () => {
    const error = await stripe.subscriptions.retrieve('sub_missing').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((error as Stripe.errors.StripeInvalidRequestError).code).toBe('resource_missing');
  });

  it('when a create is repeated with the same idempotency key, then the first answer is replayed; other parameters under it are refused', async () => {
    const a = await stripe.customers.create({ email: 'same@shop.example' }, { idempotencyKey: 'suite-key-1' });
    const b = await stripe.customers.create({ email: 'same@shop.example' }, { idempotencyKey: 'suite-key-1' });
    expect(b.id).toBe(a.id);
    await expect(stripe.customers.create({ email: 'other@shop.example' }, { idempotencyKey: 'suite-key-1' })).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });

  it('when a checkout session is created, then it carries our reference, a hosted URL and the success URL with its id', async () => {
    const { customer, session } = await checkout();
    expect(session).toMatchObject({ object: 'checkout.session', mode: 'subscription', status: 'open', customer: customer.id, client_reference_id: 'org-1' });
    expect(session.url).toBe(`${fake.url}/checkout/${session.id}`);
    expect(session.success_url).toBe(`http://console.example/billing?session_id=${session.id}`);
    expect((await stripe.checkout.sessions.retrieve(session.id)).id).toBe(session.id);
  });
});

describe('the hosted checkout page', () => {
  it('when a declining card is entered, then the page says so and nothing is created', async () => {
    const { customer, session } = await checkout();
    const page = await (await fetch(session.url!)).text();
    expect(page).toContain('<label for="card">Card number</label>');
    const before = fake.events.length;
    const declined = await post(session.url!, { card: TEST_CARDS.declined });
    expect(declined.status).toBe(402);
    expect(declined.body).toContain('The card was declined.');
    expect(fake.events.length).toBe(before);
    expect((await stripe.subscriptions.list({ customer: customer.id })).data).toHaveLength(0);
  });

  it('when a paying card is entered, then the browser goes to the success URL and signed events follow in order', async () => {
    const { customer, session } = await checkout();
    const before = received.length;
    const paid = await post(session.url!, { card: '4242 4242 4242 4242' });
    expect(paid.status).toBe(303);
    expect(paid.location).toBe(session.success_url);
    await fake.settle();
    const events = received.slice(before);
    expect(events.every((e) => e.error === null)).toBe(true);
    expect(events.map((e) => e.event!.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    const completed = events[2]!.event!.data.object as Stripe.Checkout.Session;
    expect(completed).toMatchObject({ status: 'complete', payment_status: 'paid', client_reference_id: 'org-1', customer: customer.id });
    const sub = await stripe.subscriptions.retrieve(String(completed.subscription));
    expect(sub.status).toBe('active');
    expect(sub.items.data[0]!.price.id).toBe('price_suite_builder');
    expect(sub.metadata).toEqual({ organization_id: 'org-1' });
    expect(events[0]!.event!.api_version).toBe(API_VERSION);
    const invoice = events[1]!.event!.data.object as Stripe.Invoice;
    expect(invoice.parent?.subscription_details?.subscription).toBe(sub.id);
    expect(invoice.amount_paid).toBe(4900);
  });

  it('when the page is paid twice, then the second attempt changes nothing', async () => {
    const { session } = await checkout();
    await post(session.url!, { card: TEST_CARDS.pays });
    const count = fake.events.length;
    expect((await post(session.url!, { card: TEST_CARDS.pays })).status).toBe(409);
    expect(fake.events.length).toBe(count);
  });
});

describe('renewals, the portal and the subscription calls', () => {
  it('when the card on file fails at renewal, then the invoice fails and the subscription is past_due; a new card pays it', async () => {
    const { customer, session } = await checkout();
    await post(session.url!, { card: TEST_CARDS.pays });
    const subId = String((await stripe.checkout.sessions.retrieve(session.id)).subscription);
    const firstEnd = (await stripe.subscriptions.retrieve(subId)).items.data[0]!.current_period_end;
    fake.setCard(customer.id, TEST_CARDS.failsLater);
    const before = fake.events.length;
    fake.renew(subId);
    expect(fake.events.slice(before).map((e) => e.type)).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
    const pastDue = await stripe.subscriptions.retrieve(subId);
    expect(pastDue.status).toBe('past_due');
    expect(pastDue.items.data[0]!.current_period_start).toBe(firstEnd);

    const portal = await stripe.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://console.example/billing' });
    expect(portal.url).toBe(`${fake.url}/portal/${portal.id}`);
    const fixed = await post(`${portal.url}/card`, { card: TEST_CARDS.pays });
    expect(fixed.status).toBe(200);
    expect(fixed.body).toContain('the open invoice is paid');
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('active');
    const invoices = await stripe.invoices.list({ customer: customer.id });
    expect(invoices.data.map((i) => i.status)).toEqual(['paid', 'paid']);
    await fake.settle();
  });

  it('when the plan is changed and the subscription canceled through the API, then the events say so', async () => {
    const { session } = await checkout();
    await post(session.url!, { card: TEST_CARDS.pays });
    const subId = String((await stripe.checkout.sessions.retrieve(session.id)).subscription);
    const sub = await stripe.subscriptions.retrieve(subId);
    const before = fake.events.length;
    const updated = await stripe.subscriptions.update(subId, { items: [{ id: sub.items.data[0]!.id, price: 'price_suite_scale' }], cancel_at_period_end: true });
    expect(updated.items.data[0]!.price.id).toBe('price_suite_scale');
    expect(updated.cancel_at_period_end).toBe(true);
    const canceled = await stripe.subscriptions.cancel(subId);
    expect(canceled.status).toBe('canceled');
    const types = fake.events.slice(before).map((e) => e.type);
    expect(types).toEqual(['customer.subscription.updated', 'customer.subscription.deleted']);
    const update = fake.events[before]!;
    expect(Object.keys(update.data.previous_attributes ?? {}).sort()).toEqual(['cancel_at', 'cancel_at_period_end', 'items']);
    await fake.settle();
  });

  it('when a subscription set to cancel reaches its period end, then it is deleted', async () => {
    const { customer, session } = await checkout();
    await post(session.url!, { card: TEST_CARDS.pays });
    const subId = String((await stripe.checkout.sessions.retrieve(session.id)).subscription);
    const portal = await stripe.billingPortal.sessions.create({ customer: customer.id });
    expect((await post(`${portal.url}/cancel`, { when: 'period_end' })).status).toBe(200);
    expect((await stripe.subscriptions.retrieve(subId)).cancel_at_period_end).toBe(true);
    fake.renew(subId);
    expect(fake.events.at(-1)!.type).toBe('customer.subscription.deleted');
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('canceled');
    await fake.settle();
  });

  it('when invoices are listed with a limit, then they page with starting_after', async () => {
    const { customer, session } = await checkout();
    await post(session.url!, { card: TEST_CARDS.pays });
    const subId = String((await stripe.checkout.sessions.retrieve(session.id)).subscription);
    fake.renew(subId);
    fake.renew(subId);
    const first = await stripe.invoices.list({ customer: customer.id, limit: 2 });
    expect(first.data).toHaveLength(2);
    expect(first.has_more).toBe(true);
    const rest = await stripe.invoices.list({ customer: customer.id, limit: 2, starting_after: first.data[1]!.id });
    expect(rest.data).toHaveLength(1);
    expect(new Set([...first.data, ...rest.data].map((i) => i.id)).size).toBe(3);
    await fake.settle();
  });
});

describe('webhook signatures', () => {
  it('when an event is signed by the fake, then constructEvent accepts it, and rejects it under another secret or with a changed body', () => {
    const event = fake.events[0]!;
    const { payload, header } = fake.sign(event);
    expect(Stripe.webhooks.constructEvent(payload, header, WHSEC).id).toBe(event.id);
    expect(() => Stripe.webhooks.constructEvent(payload, header, 'whsec_other')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => Stripe.webhooks.constructEvent(payload.replace(event.id, 'evt_forged'), header, WHSEC)).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });

  it('when every delivery is counted, then each reached the receiver once with a 200', async () => {
    await fake.settle();
    expect(received.filter((r) => r.error !== null)).toEqual([]);
    expect(fake.deliveries.every((d) => d.status === 200 && d.attempt === 1)).toBe(true);
  });
});

describe('development start', () => {
  it('when started for development, then it serves on the configured port and keeps its state across a restart', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'ohmstead-stripe-fake-'));
    const stateFile = join(dir, 'state.json');
    const probe = createServer();
    await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
    const port = (probe.address() as AddressInfo).port;
    await new Promise<void>((resolve) => probe.close(() => resolve()));
    const env = parseEnv({ DATABASE_URL: 'postgres://unused', STRIPE_API_PORT: String(port) });
    const lines: string[] = [];
    try {
      const first = await startDevelopmentStripeFake(env, (l) => lines.push(l), stateFile);
      expect(first?.url).toBe(`http://127.0.0.1:${port}`);
      const client = new Stripe(env.STRIPE_SECRET_KEY, { apiVersion: API_VERSION, host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 });
      const customer = await client.customers.create({ email: 'kept@shop.example' });
      // A second one on the same port steps aside instead of failing the start.
      expect(await startDevelopmentStripeFake(env, (l) => lines.push(l), stateFile)).toBeNull();
      expect(lines.at(-1)).toMatch(/is taken/);
      await first!.close();
      const second = await startDevelopmentStripeFake(env, () => undefined, stateFile);
      expect((await client.customers.retrieve(customer.id)).id).toBe(customer.id);
      await second!.close();
      // Pointed at another host (real test-mode keys), nothing starts.
      expect(await startDevelopmentStripeFake(parseEnv({ DATABASE_URL: 'postgres://unused', STRIPE_API_HOST: 'api.stripe.com', STRIPE_API_PORT: '443', STRIPE_API_PROTOCOL: 'https' }), () => undefined, stateFile)).toBeNull();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
