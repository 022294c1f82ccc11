/**
 * The billing walk, end to end: the real app (listening, so the fake can deliver webhooks to it), the real
 * Stripe SDK inside it, the Stripe-shaped fake, a real database and a real SMTP catcher. A free
 * organization upgrades through the hosted checkout; the plan and quota are raised only when the signed
 * checkout.session.completed (and its companions) arrive; a failed renewal starts the grace period (banner
 * and e-mail), the end of the grace period (at an injected time) moves it to the free plan, a new card
 * restores the plan, and cancelling returns it to the free plan. Limits are read the way metering reads
 * them: GET /v1/usage with the organization's key.
 */
import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '#shared/schemas/accounts.ts';
import { BillingOverviewSchema } from '#shared/schemas/billing.ts';
import { plans } from '#shared/plans.ts';
import { createTestKey } from '../../../tests/setup/fixtures.ts';
import { auditEvents, billingAccounts, organizations } from '../../db/schema/index.ts';
import { TEST_CARDS } from '../../fakes/stripe-fake.ts';
import { publicOrigin } from '../mail/links.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';
import { listenForWebhooks, startBillingFake, submitForm, type BillingFake } from './billing.test-kit.ts';

let billing: BillingFake;
let kit: ConsoleKit;
let hook: { url: string; close: () => Promise<void> };

beforeAll(async () => {
  billing = await startBillingFake();
  kit = await startConsoleKit({ ...billing.env, BILLING_GRACE_DAYS: '7' });
  hook = await listenForWebhooks(kit.app);
  billing.fake.setWebhookUrl(hook.url);
});

afterAll(async () => {
  await hook.close();
  await kit.close();
  await billing.close();
});

async function owner() {
  const { org, members } = await createOrganizationWith(kit.db, 'billing', ['owner', 'admin']);
  const cookie = await sessionCookie(kit.db, members.owner!.id, org.id);
  const { secret } = await createTestKey(kit.db, kit.app.platform!.hashSecret, org.id);
  const console = {
    get: (path: string) => request(kit.app).get(path).set('Cookie', cookie),
    post: (path: string, body?: object) => {
      const r = request(kit.app).post(path).set('Cookie', cookie).set(CSRF_HEADER, '1');
      return body ? r.send(body) : r;
    },
  };
  /** The limits metering applies to the organization's key (the key cache is invalidated on a plan change). */
  const meteredLimits = async () => {
    const res = await request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${secret}`);
    expect(res.status).toBe(200);
    return { plan: res.body.data.plan as string, quota: res.body.data.quota as number };
  };
  const overview = async () => {
    const res = await console.get('/console-api/billing');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return BillingOverviewSchema.parse(res.body);
  };
  return { org, members, console, meteredLimits, overview };
}

const planChanges = async (organizationId: string) =>
  (await kit.db.select().from(auditEvents).where(and(eq(auditEvents.organizationId, organizationId), eq(auditEvents.action, 'plan.changed'))).orderBy(auditEvents.id)).map(
    (e) => `${String(e.details.from)}→${String(e.details.to)} (${String(e.details.reason)})`,
  );

async function subscribe(o: Awaited<ReturnType<typeof owner>>, planId: 'builder' | 'scale') {
  const started = await o.console.post('/console-api/billing/checkout', { planId });
  expect(started.status, JSON.stringify(started.body)).toBe(201);
  const paid = await submitForm(started.body.url, { card: TEST_CARDS.pays });
  expect(paid.status).toBe(303);
  await billing.fake.settle();
  return { checkoutUrl: started.body.url as string, successUrl: paid.location! };
}

async function portal(o: Awaited<ReturnType<typeof owner>>) {
  const res = await o.console.post('/console-api/billing/portal');
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.url as string;
}

describe('the billing walk: checkout, failed payment and grace, recovery, cancellation', () => {
  it('when an owner upgrades, pays late and cancels, then plan and quota follow Stripe at every step', async () => {
    const o = await owner();

    // A free organization.
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });
    const start = await o.overview();
    expect(start).toMatchObject({ plan: { id: 'free' }, subscription: null, paymentIssue: null, canOpenPortal: false });
    expect(start.plans.map((p) => p.id)).toEqual(['free', 'builder', 'scale']);

    // Checkout: the URL is the provider's hosted page; nothing changes before the provider confirms.
    const started = await o.console.post('/console-api/billing/checkout', { planId: 'builder' });
    expect(started.status).toBe(201);
    expect(started.body.url).toMatch(new RegExp(`^${billing.fake.url}/checkout/cs_test_`));
    const page = await (await fetch(started.body.url)).text();
    expect(page).toContain('Subscribe to Builder');
    expect(page).toContain('$49.00');
    const declined = await submitForm(started.body.url, { card: TEST_CARDS.declined });
    expect(declined.status).toBe(402);
    await billing.fake.settle();
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });

    const paid = await submitForm(started.body.url, { card: TEST_CARDS.pays });
    expect(paid.status).toBe(303);
    expect(paid.location).toMatch(new RegExp(`^${publicOrigin(kit.env).replaceAll('.', '\\.')}/billing\\?checkout=success&session_id=cs_test_`));
    await billing.fake.settle();
    const delivered = billing.fake.deliveries.filter((d) => d.status === 200).map((d) => d.type);
    expect(delivered).toEqual(expect.arrayContaining(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']));

    // Plan and quota raised, as metering sees them.
    expect(await o.meteredLimits()).toEqual({ plan: 'builder', quota: plans.builder.monthlyQuotaCalls });
    const upgraded = await o.overview();
    expect(upgraded).toMatchObject({ plan: { id: 'builder' }, limits: { monthlyQuotaCalls: 100_000, ratePerMinuteCalls: 600 }, subscription: { status: 'active', planId: 'builder', cancelAtPeriodEnd: false }, paymentIssue: null, canOpenPortal: true });
    expect(await planChanges(o.org.id)).toEqual(['free→builder (customer.subscription.created)']);
    // A second checkout while subscribed is refused: plan changes go through the portal.
    const again = await o.console.post('/console-api/billing/checkout', { planId: 'scale' });
    expect(again.status).toBe(409);
    expect(again.body.manageWith).toBe('portal');

    // The renewal fails: a card on file that cannot be charged, then the next period is billed.
    const portalUrl = await portal(o);
    expect((await submitForm(`${portalUrl}/card`, { card: TEST_CARDS.failsLater })).status).toBe(200);
    const renewed = await submitForm(`${portalUrl}/renew`, {});
    expect(renewed.body).toContain('now past_due');
    await billing.fake.settle();
    const failing = await o.overview();
    expect(failing.plan.id).toBe('builder');
    expect(failing.subscription!.status).toBe('past_due');
    expect(failing.paymentIssue).not.toBeNull();
    const failedAt = Date.parse(failing.paymentIssue!.failedAt);
    expect(Date.parse(failing.paymentIssue!.graceEndsAt) - failedAt).toBe(7 * 86_400_000);
    expect(failing.paymentIssue!.graceExpired).toBe(false);
    expect(await o.meteredLimits()).toEqual({ plan: 'builder', quota: plans.builder.monthlyQuotaCalls });
    const mail = await kit.catcher.waitForMessage((m) => m.to.includes(o.members.owner!.email) && /payment .* failed/.test(m.subject));
    expect(mail.text).toContain(failing.paymentIssue!.graceEndsAt.slice(0, 10));

    // The grace period runs out (the time is injected: eight days on).
    const later = new Date(Date.now() + 8 * 86_400_000);
    // The sweep covers every organization in the database (other test files share it): this one is among them.
    expect(await kit.app.billing!.service.expireGracePeriods(later)).toContain(o.org.id);
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });
    const downgraded = await o.overview();
    expect(downgraded.plan.id).toBe('free');
    expect(downgraded.paymentIssue).toMatchObject({ graceExpired: true });
    expect(downgraded.subscription!.status).toBe('past_due');
    // A later sync of the same past_due subscription (at the real time) does not lift the downgrade.
    expect(await kit.app.billing!.service.expireGracePeriods(later)).not.toContain(o.org.id);

    // A working card pays the open invoice: invoice.paid clears the issue and restores the plan.
    expect((await submitForm(`${portalUrl}/card`, { card: TEST_CARDS.pays })).body).toContain('the open invoice is paid');
    await billing.fake.settle();
    expect(await o.meteredLimits()).toEqual({ plan: 'builder', quota: plans.builder.monthlyQuotaCalls });
    expect(await o.overview()).toMatchObject({ plan: { id: 'builder' }, paymentIssue: null, subscription: { status: 'active' } });

    // Invoices: the first month and the renewal, both paid in the end.
    const invoices = await o.console.get('/console-api/billing/invoices');
    expect(invoices.status).toBe(200);
    expect(invoices.body.items.map((i: { status: string; amountDueCents: number }) => [i.status, i.amountDueCents])).toEqual([
      ['paid', 4900],
      ['paid', 4900],
    ]);

    // Cancellation: the subscription ends and the organization is on the free plan.
    expect((await submitForm(`${portalUrl}/cancel`, { when: 'now' })).status).toBe(200);
    await billing.fake.settle();
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });
    expect(await o.overview()).toMatchObject({ plan: { id: 'free' }, subscription: { status: 'canceled' }, paymentIssue: null });

    expect(await planChanges(o.org.id)).toEqual([
      'free→builder (customer.subscription.created)',
      'builder→free (payment_grace_period_ended)',
      'free→builder (invoice.paid)',
      'builder→free (customer.subscription.deleted)',
    ]);
    const [org] = await kit.db.select().from(organizations).where(eq(organizations.id, o.org.id));
    expect(org!.planId).toBe('free');
  });

  it('when the plan is switched in the portal, then the new plan applies; set to cancel, it lasts until the period ends', async () => {
    const o = await owner();
    await subscribe(o, 'builder');
    const portalUrl = await portal(o);
    expect((await submitForm(`${portalUrl}/plan`, { price: billing.env.STRIPE_PRICE_SCALE! })).status).toBe(200);
    await billing.fake.settle();
    expect(await o.meteredLimits()).toEqual({ plan: 'scale', quota: plans.scale.monthlyQuotaCalls });

    expect((await submitForm(`${portalUrl}/cancel`, { when: 'period_end' })).status).toBe(200);
    await billing.fake.settle();
    expect(await o.overview()).toMatchObject({ plan: { id: 'scale' }, subscription: { status: 'active', cancelAtPeriodEnd: true } });
    expect(await o.meteredLimits()).toEqual({ plan: 'scale', quota: plans.scale.monthlyQuotaCalls });

    await submitForm(`${portalUrl}/renew`, {});
    await billing.fake.settle();
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });
    expect(await planChanges(o.org.id)).toEqual([
      'free→builder (customer.subscription.created)',
      'builder→scale (customer.subscription.updated)',
      'scale→free (customer.subscription.deleted)',
    ]);
  });

  it('when the browser comes back from a checkout it did not pay, then nothing changes', async () => {
    const o = await owner();
    const started = await o.console.post('/console-api/billing/checkout', { planId: 'scale' });
    expect(started.status).toBe(201);
    // The success URL alone grants nothing: only the provider's signed events do.
    expect(await o.meteredLimits()).toEqual({ plan: 'free', quota: plans.free.monthlyQuotaCalls });
    expect(await o.overview()).toMatchObject({ plan: { id: 'free' }, subscription: null, canOpenPortal: true });
  });

  it('when there is no billing account yet, then the portal is refused with 409 and invoices are empty', async () => {
    const o = await owner();
    const res = await o.console.post('/console-api/billing/portal');
    expect(res.status).toBe(409);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    const invoices = await o.console.get('/console-api/billing/invoices');
    expect(invoices.body).toEqual({ items: [] });
  });

  it('when the checkout body names the free plan or an unknown field, then it is a 422 with pointers', async () => {
    const o = await owner();
    const free = await o.console.post('/console-api/billing/checkout', { planId: 'free' });
    expect(free.status).toBe(422);
    expect(free.body.errors[0].pointer).toBe('#/planId');
    const extra = await o.console.post('/console-api/billing/checkout', { planId: 'builder', coupon: 'x' });
    expect(extra.status).toBe(422);
  });

  it('when the payment provider is unreachable, then checkout is a 503 problem and nothing is stored', async () => {
    const other = await startConsoleKit({ ...billing.env, STRIPE_API_PORT: '1' });
    try {
      const { org, members } = await createOrganizationWith(other.db, 'down', ['owner']);
      const cookie = await sessionCookie(other.db, members.owner!.id, org.id);
      const res = await request(other.app).post('/console-api/billing/checkout').set('Cookie', cookie).set(CSRF_HEADER, '1').send({ planId: 'builder' });
      expect(res.status).toBe(503);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(JSON.stringify(res.body)).not.toMatch(/sk_test/);
      expect(await other.db.select().from(billingAccounts).where(eq(billingAccounts.organizationId, org.id))).toEqual([]);
    } finally {
      await other.close();
    }
  }, 60_000);
});
