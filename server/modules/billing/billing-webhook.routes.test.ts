/**
 * POST /v1/webhooks/stripe with events the Stripe-shaped fake produced (captured, not delivered, so each
 * test chooses what arrives, how often and in which order): signatures are checked on the raw body, each
 * event id changes things once, and deliveries out of order converge on Stripe's present state.
 */
import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../../../tests/setup/app.ts';
import { createOrganization } from '../../../tests/setup/fixtures.ts';
import { auditEvents, billingAccounts, organizations, stripeEvents } from '../../db/schema/index.ts';
import { TEST_CARDS, type FakeEvent } from '../../fakes/stripe-fake.ts';
import { giveBillingAccount, startBillingFake, submitForm, TEST_STRIPE, type BillingFake } from './billing.test-kit.ts';

let billing: BillingFake;
let t: ReturnType<typeof createTestApp>;

beforeAll(async () => {
  billing = await startBillingFake({ webhookUrl: null });
  t = createTestApp(billing.env);
});

afterAll(async () => {
  await t.close();
  await billing.close();
});

function post(payload: string, header?: string, app = t.app) {
  const r = request(app).post('/v1/webhooks/stripe').set('Content-Type', 'application/json');
  return (header === undefined ? r : r.set('Stripe-Signature', header)).send(payload);
}

/** Delivers an event as Stripe would: the exact bytes, signed now with the endpoint's secret. */
function deliver(event: FakeEvent, app = t.app) {
  const { payload, header } = billing.fake.sign(event);
  return post(payload, header, app);
}

const planOf = async (organizationId: string) => (await t.db.select().from(organizations).where(eq(organizations.id, organizationId)))[0]!.planId;
const planChangeCount = async (organizationId: string) =>
  (await t.db.select().from(auditEvents).where(and(eq(auditEvents.organizationId, organizationId), eq(auditEvents.action, 'plan.changed')))).length;
const eventRows = async (id: string) => t.db.select().from(stripeEvents).where(eq(stripeEvents.id, id));

/** A free organization with a billing customer that completes a checkout; returns the events it caused (undelivered). */
async function paidCheckout(priceId: string = TEST_STRIPE.priceBuilder) {
  const org = await createOrganization(t.db);
  const customerId = await giveBillingAccount(t.db, billing.stripe, org.id);
  const session = await billing.stripe.checkout.sessions.create({
    mode: 'subscription',
    customer: customerId,
    client_reference_id: org.id,
    line_items: [{ price: priceId, quantity: 1 }],
    success_url: 'http://127.0.0.1:3000/billing?checkout=success',
  });
  const from = billing.fake.events.length;
  expect((await submitForm(session.url!, { card: TEST_CARDS.pays })).status).toBe(303);
  const events = billing.fake.events.slice(from);
  const byType = (type: string) => events.find((e) => e.type === type)!;
  const subscriptionId = String((await billing.stripe.checkout.sessions.retrieve(session.id)).subscription);
  return { org, customerId, subscriptionId, events, byType };
}

describe('signature verification', () => {
  it('when the signature is wrong, stale, missing or the body was changed, then 400 and nothing changes; the genuine delivery then applies', async () => {
    const { org, byType } = await paidCheckout();
    const event = byType('checkout.session.completed');
    const { payload, header } = billing.fake.sign(event);
    const attempts = [
      ['another secret', post(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_someone_else' }))],
      ['a changed body', post(payload.replace('"livemode": false', '"livemode": true'), header)],
      ['no signature', post(payload)],
      ['a timestamp ten minutes old', post(payload, billing.fake.sign(event, Math.floor(Date.now() / 1000) - 600).header)],
      ['a garbage header', post(payload, 'v1=deadbeef')],
    ] as const;
    for (const [what, attempt] of attempts) {
      const res = await attempt;
      expect(res.status, what).toBe(400);
      expect(res.headers['content-type'], what).toMatch(/^application\/problem\+json/);
    }
    expect(await eventRows(event.id)).toEqual([]);
    expect(await planOf(org.id)).toBe('free');

    const genuine = await post(payload, header);
    expect(genuine.status).toBe(200);
    expect(genuine.body).toEqual({ received: true, duplicate: false });
    expect(await planOf(org.id)).toBe('builder');
  });

  it('when a correctly signed body is not JSON, then 400', async () => {
    const payload = 'not json at all';
    const res = await post(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: TEST_STRIPE.webhookSecret }));
    expect(res.status).toBe(400);
  });
});

describe('each event id changes things once', () => {
  it('when the same event is delivered twice, then the second is acknowledged as a duplicate and the plan changed once', async () => {
    const { org, byType } = await paidCheckout();
    const event = byType('customer.subscription.created');
    const first = await deliver(event);
    const second = await deliver(event);
    expect([first.status, second.status]).toEqual([200, 200]);
    expect([first.body.duplicate, second.body.duplicate]).toEqual([false, true]);
    expect(await planOf(org.id)).toBe('builder');
    expect(await planChangeCount(org.id)).toBe(1);
    expect(await eventRows(event.id)).toHaveLength(1);
  });

  it('when the same event arrives twice at the same moment, then exactly one delivery applies it', async () => {
    const { org, byType } = await paidCheckout();
    const event = byType('checkout.session.completed');
    const results = await Promise.all([deliver(event), deliver(event), deliver(event)]);
    expect(results.map((r) => r.status)).toEqual([200, 200, 200]);
    expect(results.filter((r) => r.body.duplicate === false)).toHaveLength(1);
    expect(await planChangeCount(org.id)).toBe(1);
  });

  it('when processing fails because Stripe cannot be reached, then 503, the id is not recorded, and a later delivery applies', async () => {
    const { org, byType } = await paidCheckout();
    const event = byType('customer.subscription.created');
    const cut = createTestApp({ ...billing.env, STRIPE_API_PORT: '1' });
    try {
      const res = await deliver(event, cut.app);
      expect(res.status).toBe(503);
    } finally {
      await cut.close();
    }
    expect(await eventRows(event.id)).toEqual([]);
    expect(await planOf(org.id)).toBe('free');
    expect((await deliver(event)).body).toEqual({ received: true, duplicate: false });
    expect(await planOf(org.id)).toBe('builder');
  }, 60_000);
});

describe('deliveries out of order', () => {
  it('when updated (to Scale) arrives before created (as Builder), then the organization ends on Scale', async () => {
    const { org, subscriptionId, byType } = await paidCheckout();
    const sub = await billing.stripe.subscriptions.retrieve(subscriptionId);
    const from = billing.fake.events.length;
    await billing.stripe.subscriptions.update(subscriptionId, { items: [{ id: sub.items.data[0]!.id, price: TEST_STRIPE.priceScale }] });
    const updated = billing.fake.events.slice(from).find((e) => e.type === 'customer.subscription.updated')!;
    const created = byType('customer.subscription.created');
    expect(((created.data.object.items as { data: Array<{ price: { id: string } }> }).data[0]!.price.id)).toBe(TEST_STRIPE.priceBuilder);

    expect((await deliver(updated)).status).toBe(200);
    expect(await planOf(org.id)).toBe('scale');
    expect((await deliver(created)).status).toBe(200);
    expect(await planOf(org.id)).toBe('scale');
    expect((await deliver(byType('checkout.session.completed'))).status).toBe(200);
    expect((await deliver(byType('invoice.paid'))).status).toBe(200);
    expect(await planOf(org.id)).toBe('scale');
    expect(await planChangeCount(org.id)).toBe(1);
  });

  it('when deleted arrives before created and updated, then the organization stays on the free plan', async () => {
    const { org, subscriptionId, byType } = await paidCheckout(TEST_STRIPE.priceScale);
    const from = billing.fake.events.length;
    await billing.stripe.subscriptions.update(subscriptionId, { cancel_at_period_end: true });
    await billing.stripe.subscriptions.cancel(subscriptionId);
    const later = billing.fake.events.slice(from);
    const deleted = later.find((e) => e.type === 'customer.subscription.deleted')!;
    const updated = later.find((e) => e.type === 'customer.subscription.updated')!;
    for (const event of [deleted, byType('customer.subscription.created'), updated, byType('checkout.session.completed')]) {
      expect((await deliver(event)).status).toBe(200);
      expect(await planOf(org.id)).toBe('free');
    }
    expect(await planChangeCount(org.id)).toBe(0);
  });

  it('when a payment failure arrives after the invoice was paid after all, then no grace period starts', async () => {
    const { org, customerId, subscriptionId, byType } = await paidCheckout();
    await deliver(byType('customer.subscription.created'));
    billing.fake.setCard(customerId, TEST_CARDS.failsLater);
    const from = billing.fake.events.length;
    billing.fake.renew(subscriptionId);
    billing.fake.setCard(customerId, TEST_CARDS.pays);
    billing.fake.renew(subscriptionId); // the retry of the open invoice succeeds
    const later = billing.fake.events.slice(from);
    const failed = later.find((e) => e.type === 'invoice.payment_failed')!;
    // Newest news first, the stale failure last.
    for (const event of [later.find((e) => e.type === 'invoice.paid')!, failed]) expect((await deliver(event)).status).toBe(200);
    const [account] = await t.db.select().from(billingAccounts).where(eq(billingAccounts.organizationId, org.id));
    expect(account!.paymentFailedAt).toBeNull();
    expect(await planOf(org.id)).toBe('builder');
  });

  it('when the failure arrives first, then the grace period counts from the failure event, not from its delivery', async () => {
    const { org, customerId, subscriptionId, byType } = await paidCheckout();
    await deliver(byType('customer.subscription.created'));
    billing.fake.setCard(customerId, TEST_CARDS.failsLater);
    const from = billing.fake.events.length;
    billing.fake.renew(subscriptionId);
    const failed = billing.fake.events.slice(from).find((e) => e.type === 'invoice.payment_failed')!;
    expect((await deliver(failed)).status).toBe(200);
    const [account] = await t.db.select().from(billingAccounts).where(eq(billingAccounts.organizationId, org.id));
    expect(account!.paymentFailedAt!.getTime()).toBe(failed.created * 1000);
    expect(account!.graceEndsAt!.getTime()).toBe(failed.created * 1000 + 7 * 86_400_000);
    expect(await planOf(org.id)).toBe('builder');
  });
});

describe('events billing does not act on', () => {
  it('when an event names a customer we do not know, or is of another type, then 200 and nothing changes', async () => {
    const org = await createOrganization(t.db);
    const stranger = await billing.stripe.customers.create({ name: 'Not ours' });
    const foreign = {
      id: `evt_foreign_${Date.now()}`,
      object: 'event',
      api_version: '2026-10-28.endive',
      created: Math.floor(Date.now() / 1000),
      type: 'customer.subscription.updated',
      data: { object: { id: 'sub_unknown', object: 'subscription', customer: stranger.id, status: 'active' } },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
    };
    const a = billing.fake.sign(foreign);
    expect((await post(a.payload, a.header)).body).toEqual({ received: true, duplicate: false });
    expect((await eventRows(foreign.id))[0]!.outcome).toBe('ignored: unknown customer');
    const other = { ...foreign, id: `evt_other_${Date.now()}`, type: 'customer.created', data: { object: { id: stranger.id, object: 'customer' } } };
    const b = billing.fake.sign(other);
    expect((await post(b.payload, b.header)).status).toBe(200);
    expect((await eventRows(other.id))[0]!.outcome).toBe('ignored: not an event billing acts on');
    expect(await planOf(org.id)).toBe('free');
  });

  it('when a checkout names one organization but its customer belongs to another, then it is ignored', async () => {
    const { org, byType } = await paidCheckout();
    const victim = await createOrganization(t.db);
    const event = byType('checkout.session.completed');
    const forged = { ...event, id: `${event.id}_x`, data: { object: { ...event.data.object, client_reference_id: victim.id } } };
    const { payload, header } = billing.fake.sign(forged);
    expect((await post(payload, header)).status).toBe(200);
    expect((await eventRows(forged.id))[0]!.outcome).toBe('ignored: the customer belongs to another organization');
    expect(await planOf(victim.id)).toBe('free');
    expect(await planOf(org.id)).toBe('free');
  });
});
