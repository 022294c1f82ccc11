/**
 * Billing: an organization pays for a plan through a Stripe subscription.
 *
 * - Upgrading goes through a Checkout Session in subscription mode, for the organization's own Stripe
 *   customer (one per organization), with `client_reference_id` = the organization id. The plan is
 *   provisioned from the webhook, never from the success redirect (Stripe: most subscription activity is
 *   asynchronous).
 * - Changing plan, the card, or cancelling happen in the billing portal.
 * - Webhooks are verified with the signing secret (`constructEvent`); each event id is recorded in the same
 *   transaction as its effect, so a second delivery changes nothing. Events are triggers only: the
 *   subscription is fetched from Stripe under the organization's row lock, so deliveries in any order
 *   converge on Stripe's present state, and the plan follows the subscription's status and price
 *   (billing.rules.ts).
 * - A failed payment starts a grace period (BILLING_GRACE_DAYS) with a banner in the console and an e-mail
 *   to the owners; when it runs out the organization falls back to the free plan; a later paid invoice
 *   restores the paid plan. Every plan change is audited as `plan.changed`.
 */
import Stripe from 'stripe';
import { effectiveLimits, isPlanId, planIds, plans, type PlanId } from '#shared/plans.ts';
import type { BillingOverview, Invoice, PlanView } from '#shared/schemas/billing.ts';
import type { Db } from '../../db/client.ts';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import type { Logger } from '../../logger.ts';
import { audit, type AuditEntry } from '../audit/audit.ts';
import type { Executor } from '../auth/auth.types.ts';
import { publicOrigin } from '../mail/links.ts';
import type { Mailer } from '../mail/mailer.ts';
import { monthlyCalls } from '../usage/usage.queries.ts';
import { paymentFailedMail } from './billing.mail.ts';
import {
  accountsWithGraceEnded,
  findAccount,
  findAccountByCustomer,
  findOrganizationPlan,
  finishEvent,
  linkCustomer,
  listSubscriptions,
  lockAccount,
  ownerEmails,
  recordEvent,
  replaceCustomer,
  savePaymentState,
  setOrganizationPlan,
  upsertSubscription,
  type BillingSubscriptionRow,
} from './billing.queries.ts';
import { entitledPlan, nextPaymentState, samePaymentState, TERMINAL_STATUSES, type PaymentState, type SubscriptionState } from './billing.rules.ts';
import { pricePlans, STRIPE_API_VERSION } from './stripe-client.ts';

export interface BillingServiceDeps {
  env: Env;
  db: Db;
  logger: Logger;
  stripe: Stripe;
  mailer?: Mailer;
  /** Called after a committed plan change, so this instance's key cache picks it up at once. */
  onPlanChanged?: () => void;
  clock?: () => Date;
}

type AuditMeta = Pick<AuditEntry, 'ip' | 'userAgent'>;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
const fromUnix = (s: number | null | undefined) => (typeof s === 'number' ? new Date(s * 1000) : null);

/** An id from a field that holds either the id or the expanded object. */
function idOf(value: unknown): string | null {
  if (typeof value === 'string') return value;
  if (value && typeof value === 'object' && typeof (value as { id?: unknown }).id === 'string') return (value as { id: string }).id;
  return null;
}

const planView = (id: PlanId): PlanView => {
  const p = plans[id];
  return {
    id: p.id,
    name: p.name,
    summary: p.summary,
    monthlyQuotaCalls: p.monthlyQuotaCalls,
    ratePerMinuteCalls: p.ratePerMinuteCalls,
    maxKeys: p.maxKeys,
    maxEmbedOrigins: p.maxEmbedOrigins,
    priceUsdPerMonth: p.priceUsdPerMonth,
  };
};

/** Stripe failures the caller cannot fix become a 503 problem; nothing of Stripe's message leaks. */
function providerUnavailable(error: unknown): AppError {
  return new AppError('service-unavailable', 'The payment provider could not be reached or refused the request. Nothing was changed; try again in a minute.', {
    extensions: { provider: 'stripe', providerError: error instanceof Stripe.errors.StripeError ? error.type : 'unknown' },
    headers: { 'Retry-After': '30' },
  });
}

const isMissing = (error: unknown, param?: string) =>
  error instanceof Stripe.errors.StripeInvalidRequestError && error.code === 'resource_missing' && (param === undefined || error.param === param);

/** What an event points at: the customer, the subscription, and for a checkout the organization it was started for. */
interface EventTarget {
  customerId: string | null;
  subscriptionId: string | null;
  organizationId: string | null;
}

const SUBSCRIPTION_EVENTS = new Set([
  'customer.subscription.created',
  'customer.subscription.updated',
  'customer.subscription.deleted',
  'customer.subscription.paused',
  'customer.subscription.resumed',
]);
const INVOICE_EVENTS = new Set(['invoice.paid', 'invoice.payment_succeeded', 'invoice.payment_failed', 'invoice.payment_action_required']);

function targetOf(event: Stripe.Event): EventTarget | null {
  const object = event.data.object as unknown as Record<string, unknown>;
  if (event.type === 'checkout.session.completed') {
    if (object.mode !== 'subscription') return null;
    return { customerId: idOf(object.customer), subscriptionId: idOf(object.subscription), organizationId: typeof object.client_reference_id === 'string' ? object.client_reference_id : null };
  }
  if (SUBSCRIPTION_EVENTS.has(event.type)) return { customerId: idOf(object.customer), subscriptionId: idOf(object.id), organizationId: null };
  if (INVOICE_EVENTS.has(event.type)) {
    // Since the 2025-03-31 ("basil") versions the link is parent.subscription_details.subscription; older
    // payloads carried a top-level `subscription`.
    const parent = object.parent as { subscription_details?: { subscription?: unknown } } | null | undefined;
    const subscriptionId = idOf(parent?.subscription_details?.subscription) ?? idOf(object.subscription);
    if (!subscriptionId) return null;
    return { customerId: idOf(object.customer), subscriptionId, organizationId: null };
  }
  return null;
}

export function createBillingService(deps: BillingServiceDeps) {
  const { env, db, logger, stripe } = deps;
  const prices = pricePlans(env);
  const clock = deps.clock ?? (() => new Date());
  const origin = publicOrigin(env);

  const subscriptionState = (row: BillingSubscriptionRow): SubscriptionState => ({
    status: row.status,
    planId: row.planId && isPlanId(row.planId) ? row.planId : null,
  });

  /**
   * Recomputes the organization's payment state and plan from its stored subscriptions (the account row
   * is locked by the caller) and writes what changed, with audit events. Returns whether the plan changed.
   */
  async function reconcile(
    tx: Executor,
    organizationId: string,
    now: Date,
    cause: { failedAt?: Date; reason: string; stripeEventId?: string; stripeSubscriptionId?: string | null },
  ): Promise<{ planChanged: boolean; paymentFailed: PaymentState | null }> {
    const account = (await findAccount(tx, organizationId))!;
    const subs = (await listSubscriptions(tx, organizationId)).map(subscriptionState);
    const before: PaymentState = { paymentFailedAt: account.paymentFailedAt, graceEndsAt: account.graceEndsAt, graceExpiredAt: account.graceExpiredAt };
    const payment = nextPaymentState(subs, before, now, env.BILLING_GRACE_DAYS, cause.failedAt);
    const details = { reason: cause.reason, ...(cause.stripeEventId ? { stripeEventId: cause.stripeEventId } : {}), ...(cause.stripeSubscriptionId ? { stripeSubscriptionId: cause.stripeSubscriptionId } : {}) };
    let paymentFailed: PaymentState | null = null;
    if (!samePaymentState(before, payment)) {
      await savePaymentState(tx, organizationId, payment);
      if (!before.paymentFailedAt && payment.paymentFailedAt) {
        paymentFailed = payment;
        await audit(tx, { organizationId, actorUserId: null, action: 'billing.payment_failed', targetType: 'organization', targetId: organizationId, details: { ...details, graceEndsAt: iso(payment.graceEndsAt) } });
      } else if (before.paymentFailedAt && !payment.paymentFailedAt) {
        await audit(tx, { organizationId, actorUserId: null, action: 'billing.payment_recovered', targetType: 'organization', targetId: organizationId, details });
      }
    }
    const plan = entitledPlan(subs, payment);
    const org = await findOrganizationPlan(tx, organizationId);
    if (!org || org.planId === plan) return { planChanged: false, paymentFailed };
    await setOrganizationPlan(tx, organizationId, plan);
    await audit(tx, { organizationId, actorUserId: null, action: 'plan.changed', targetType: 'organization', targetId: organizationId, details: { from: org.planId, to: plan, ...details } });
    logger.info({ organizationId, from: org.planId, to: plan, reason: cause.reason }, 'plan changed');
    return { planChanged: true, paymentFailed };
  }

  /** Tells the owners about a failed payment (after the change is committed; a failed send is logged only). */
  async function notifyPaymentFailed(organizationId: string, payment: PaymentState) {
    if (!deps.mailer || !payment.graceEndsAt) return;
    const org = await findOrganizationPlan(db, organizationId);
    for (const email of await ownerEmails(db, organizationId)) {
      await deps.mailer.send(paymentFailedMail(email, { organizationName: org?.name ?? 'Your organization', planName: plans[isPlanId(org?.planId ?? '') ? (org!.planId as PlanId) : 'free'].name, graceEndsAt: payment.graceEndsAt, billingUrl: `${origin}/billing` }));
    }
  }

  async function afterCommit(organizationId: string | null, result: { planChanged: boolean; paymentFailed: PaymentState | null }) {
    if (result.planChanged) deps.onPlanChanged?.();
    if (organizationId && result.paymentFailed) {
      await notifyPaymentFailed(organizationId, result.paymentFailed).catch((err: unknown) => logger.warn({ err, organizationId }, 'payment-failure e-mail failed'));
    }
  }

  /** The subscription as Stripe has it now; for a deleted one Stripe no longer returns, the event's own copy. */
  async function fetchSubscription(subscriptionId: string, event: Stripe.Event): Promise<Stripe.Subscription | null> {
    try {
      return await stripe.subscriptions.retrieve(subscriptionId);
    } catch (error) {
      // A 503 makes Stripe deliver the event again later; the transaction (and the event id) rolls back.
      if (!isMissing(error)) throw providerUnavailable(error);
      const object = event.data.object as unknown as Stripe.Subscription;
      return event.type === 'customer.subscription.deleted' && object.id === subscriptionId ? object : null;
    }
  }

  function subscriptionValues(organizationId: string, sub: Stripe.Subscription, eventCreatedAt: Date, now: Date) {
    const item = sub.items?.data?.[0];
    const priceId = item?.price?.id ?? null;
    return {
      stripeSubscriptionId: sub.id,
      organizationId,
      stripeCustomerId: idOf(sub.customer)!,
      status: sub.status,
      stripePriceId: priceId,
      planId: prices.planFor(priceId),
      cancelAtPeriodEnd: Boolean(sub.cancel_at_period_end),
      currentPeriodEnd: fromUnix(item?.current_period_end),
      canceledAt: fromUnix(sub.canceled_at),
      lastEventCreatedAt: eventCreatedAt,
      syncedAt: now,
    };
  }

  const service = {
    /** Verifies a webhook delivery: the exact bytes received, the Stripe-Signature header, the signing secret. */
    verifyEvent(rawBody: unknown, signature: string | undefined): Stripe.Event {
      if (!Buffer.isBuffer(rawBody) || rawBody.length === 0) {
        throw new AppError('malformed-request', 'A Stripe event is delivered as a JSON body (Content-Type: application/json).', { status: 400 });
      }
      if (!signature) throw new AppError('malformed-request', 'The Stripe-Signature header is missing.', { status: 400, errors: [{ header: 'Stripe-Signature', detail: 'Required' }] });
      try {
        return stripe.webhooks.constructEvent(rawBody, signature, env.STRIPE_WEBHOOK_SECRET);
      } catch (error) {
        if (error instanceof Stripe.errors.StripeSignatureVerificationError) {
          throw new AppError('malformed-request', 'The Stripe-Signature header does not verify against this body and the signing secret (or its timestamp is too old).', {
            status: 400,
            errors: [{ header: 'Stripe-Signature', detail: 'Signature verification failed' }],
          });
        }
        throw new AppError('malformed-request', 'The body is not a Stripe event.', { status: 400 });
      }
    },

    /** Processes one verified event at most once. */
    async handleEvent(event: Stripe.Event): Promise<{ duplicate: boolean; outcome: string }> {
      const now = clock();
      const createdAt = new Date(event.created * 1000);
      if (event.api_version && event.api_version !== STRIPE_API_VERSION) {
        // Objects are re-fetched with our pinned version; only the ids in the payload are read.
        logger.warn({ eventId: event.id, apiVersion: event.api_version }, 'Stripe event of another API version: pin the webhook endpoint to ours');
      }
      let organizationId: string | null = null;
      let effect: { planChanged: boolean; paymentFailed: PaymentState | null } = { planChanged: false, paymentFailed: null };
      const result = await db.transaction(async (tx) => {
        if (!(await recordEvent(tx, { id: event.id, type: event.type, createdAt }))) return { duplicate: true, outcome: 'duplicate' };
        const finish = async (outcome: string) => {
          await finishEvent(tx, event.id, outcome, organizationId);
          return { duplicate: false, outcome };
        };
        const target = targetOf(event);
        if (!target || !target.customerId) return finish('ignored: not an event billing acts on');

        organizationId = (await findAccountByCustomer(tx, target.customerId))?.organizationId ?? null;
        if (target.organizationId) {
          if (organizationId && organizationId !== target.organizationId) {
            logger.error({ eventId: event.id }, 'checkout completed for a customer of another organization');
            organizationId = null;
            return finish('ignored: the customer belongs to another organization');
          }
          // A checkout for a customer not linked yet (Stripe created it during checkout): link it now.
          if (!organizationId && UUID.test(target.organizationId) && (await findOrganizationPlan(tx, target.organizationId))) {
            organizationId = target.organizationId;
          }
        }
        if (!organizationId) return finish('ignored: unknown customer');
        const orgId = organizationId;
        const account = await lockAccount(tx, orgId);
        if (!account.stripeCustomerId) await linkCustomer(tx, orgId, target.customerId);
        else if (account.stripeCustomerId !== target.customerId) return finish('ignored: the organization has another customer');

        if (target.subscriptionId) {
          const sub = await fetchSubscription(target.subscriptionId, event);
          if (!sub) return finish('ignored: no such subscription');
          if (idOf(sub.customer) !== target.customerId) return finish('ignored: the subscription belongs to another customer');
          await upsertSubscription(tx, subscriptionValues(orgId, sub, createdAt, now));
        }
        effect = await reconcile(tx, orgId, now, {
          reason: event.type,
          stripeEventId: event.id,
          stripeSubscriptionId: target.subscriptionId,
          failedAt: event.type === 'invoice.payment_failed' ? createdAt : undefined,
        });
        return finish('applied');
      });
      await afterCommit(organizationId, effect);
      return result;
    },

    /** Moves every organization whose grace period has ended to the free plan (run periodically). */
    /** Downgrades every organization whose grace period has ended; returns the ids whose plan changed. */
    async expireGracePeriods(now: Date = clock()): Promise<string[]> {
      const changed: string[] = [];
      for (const organizationId of await accountsWithGraceEnded(db, now)) {
        const effect = await db.transaction(async (tx) => {
          await lockAccount(tx, organizationId);
          return reconcile(tx, organizationId, now, { reason: 'payment_grace_period_ended' });
        });
        if (effect.planChanged) changed.push(organizationId);
        await afterCommit(organizationId, effect);
      }
      return changed;
    },

    /** The billing page: plan, limits, use this month, subscription, payment issue, plan cards. */
    async overview(organizationId: string, now: Date = clock()): Promise<BillingOverview> {
      const pending = await findAccount(db, organizationId);
      if (pending?.graceEndsAt && pending.graceEndsAt <= now && !pending.graceExpiredAt) {
        // Between two sweeps: apply the end of the grace period before showing the page.
        const effect = await db.transaction(async (tx) => {
          await lockAccount(tx, organizationId);
          return reconcile(tx, organizationId, now, { reason: 'payment_grace_period_ended' });
        });
        await afterCommit(organizationId, effect);
      }
      const org = await findOrganizationPlan(db, organizationId);
      if (!org) throw new AppError('not-found', 'No such organization.');
      const limits = effectiveLimits(org);
      const monthStart = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1));
      const nextMonth = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() + 1, 1));
      const used = await monthlyCalls(db, organizationId, monthStart.toISOString().slice(0, 10));
      const account = await findAccount(db, organizationId);
      const subs = await listSubscriptions(db, organizationId);
      const current = subs.find((s) => !TERMINAL_STATUSES.has(s.status)) ?? subs[0] ?? null;
      return {
        plan: planView(limits.plan.id),
        limits: {
          monthlyQuotaCalls: limits.monthlyQuotaCalls,
          ratePerMinuteCalls: limits.ratePerMinuteCalls,
          custom: org.customMonthlyQuotaCalls !== null || org.customRatePerMinuteCalls !== null,
        },
        usage: {
          month: monthStart.toISOString().slice(0, 7),
          usedCalls: used,
          remainingCalls: Math.max(0, limits.monthlyQuotaCalls - used),
          resetsAt: nextMonth.toISOString(),
        },
        subscription: current
          ? {
              status: current.status,
              planId: current.planId && isPlanId(current.planId) ? current.planId : null,
              cancelAtPeriodEnd: current.cancelAtPeriodEnd,
              currentPeriodEnd: iso(current.currentPeriodEnd),
              canceledAt: iso(current.canceledAt),
            }
          : null,
        paymentIssue:
          account?.paymentFailedAt && account.graceEndsAt
            ? { failedAt: account.paymentFailedAt.toISOString(), graceEndsAt: account.graceEndsAt.toISOString(), graceExpired: account.graceExpiredAt !== null }
            : null,
        canOpenPortal: Boolean(account?.stripeCustomerId),
        plans: planIds.map(planView),
      };
    },

    /** Creates a Checkout Session for a paid plan; returns the URL to send the browser to. */
    async startCheckout(input: {
      organizationId: string;
      planId: Exclude<PlanId, 'free'>;
      user: { id: string; email: string };
      /** Makes a retried request return the same session (the request id, which a client may send). */
      requestKey: string;
      meta: AuditMeta;
    }): Promise<{ url: string }> {
      const { organizationId, planId, user } = input;
      const subs = await listSubscriptions(db, organizationId);
      if (subs.some((s) => !TERMINAL_STATUSES.has(s.status))) {
        throw new AppError('conflict', 'This organization already has a subscription: change the plan, the card or cancel in the billing portal.', {
          extensions: { manageWith: 'portal' },
        });
      }
      const org = await findOrganizationPlan(db, organizationId);
      if (!org) throw new AppError('not-found', 'No such organization.');

      const createCustomer = async () => {
        try {
          const customer = await stripe.customers.create(
            { name: org.name, email: user.email, metadata: { organization_id: organizationId } },
            { idempotencyKey: `ohmstead-customer-${organizationId}-${user.id}` },
          );
          return customer.id;
        } catch (error) {
          throw providerUnavailable(error);
        }
      };
      let customerId = (await findAccount(db, organizationId))?.stripeCustomerId ?? null;
      if (!customerId) customerId = await linkCustomer(db, organizationId, await createCustomer());

      const createSession = (customer: string) =>
        stripe.checkout.sessions.create(
          {
            mode: 'subscription',
            customer,
            client_reference_id: organizationId,
            line_items: [{ price: prices.priceFor(planId), quantity: 1 }],
            success_url: `${origin}/billing?checkout=success&session_id={CHECKOUT_SESSION_ID}`,
            cancel_url: `${origin}/billing?checkout=canceled`,
            subscription_data: { metadata: { organization_id: organizationId } },
            metadata: { organization_id: organizationId, plan_id: planId, started_by_user_id: user.id },
          },
          { idempotencyKey: `ohmstead-checkout-${organizationId}-${customer}-${planId}-${input.requestKey}`.slice(0, 255) },
        );
      let session: Stripe.Checkout.Session;
      try {
        session = await createSession(customerId);
      } catch (error) {
        if (!isMissing(error, 'customer')) throw providerUnavailable(error);
        // The customer was deleted at Stripe: make a new one for the organization and try once more.
        const fresh = await createCustomer();
        await replaceCustomer(db, organizationId, customerId, fresh);
        customerId = fresh;
        try {
          session = await createSession(customerId);
        } catch (again) {
          throw providerUnavailable(again);
        }
      }
      if (!session.url) throw providerUnavailable(new Error('checkout session without url'));
      await audit(db, {
        ...input.meta,
        organizationId,
        actorUserId: user.id,
        action: 'billing.checkout_started',
        targetType: 'organization',
        targetId: organizationId,
        details: { planId, stripeCheckoutSessionId: session.id },
      });
      return { url: session.url };
    },

    /** A billing-portal session for the organization's customer; returns its URL. */
    async openPortal(input: { organizationId: string; userId: string; meta: AuditMeta }): Promise<{ url: string }> {
      const customerId = (await findAccount(db, input.organizationId))?.stripeCustomerId;
      if (!customerId) {
        throw new AppError('conflict', 'There is no billing account for this organization yet: choose a paid plan first.', { extensions: { manageWith: 'checkout' } });
      }
      let portal: Stripe.BillingPortal.Session;
      try {
        portal = await stripe.billingPortal.sessions.create({ customer: customerId, return_url: `${origin}/billing` });
      } catch (error) {
        if (isMissing(error, 'customer')) {
          throw new AppError('conflict', 'The payment provider no longer knows this billing account: choose a paid plan to start a new one.', { extensions: { manageWith: 'checkout' } });
        }
        throw providerUnavailable(error);
      }
      await audit(db, { ...input.meta, organizationId: input.organizationId, actorUserId: input.userId, action: 'billing.portal_opened', targetType: 'organization', targetId: input.organizationId });
      return { url: portal.url };
    },

    /** The organization's invoices, newest first, from Stripe (the record of what was billed). */
    async listInvoices(organizationId: string): Promise<Invoice[]> {
      const customerId = (await findAccount(db, organizationId))?.stripeCustomerId;
      if (!customerId) return [];
      let page: Stripe.ApiList<Stripe.Invoice>;
      try {
        page = await stripe.invoices.list({ customer: customerId, limit: 24 });
      } catch (error) {
        if (isMissing(error)) return [];
        throw providerUnavailable(error);
      }
      return page.data.map((inv) => ({
        id: inv.id ?? '',
        number: inv.number ?? null,
        status: inv.status ?? null,
        currency: inv.currency,
        amountDueCents: inv.amount_due,
        amountPaidCents: inv.amount_paid,
        createdAt: new Date(inv.created * 1000).toISOString(),
        periodStart: iso(fromUnix(inv.period_start)),
        periodEnd: iso(fromUnix(inv.period_end)),
        hostedInvoiceUrl: inv.hosted_invoice_url ?? null,
      }));
    },
  };
  return service;
}

export type BillingService = ReturnType<typeof createBillingService>;
